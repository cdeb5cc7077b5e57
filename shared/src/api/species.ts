import type { AlphaUnit } from '../setup/mapSetup.js';

export const SPECIES_UPLOAD_LIMITS = {
  maxBytes: 1024 * 1024,
  maxRows: 2000,
  maxNameLength: 80,
  maxSourceLength: 500,
  maxListNameLength: 100,
} as const;

/** The columns of a species-list CSV, in order; the header row names them (case, spaces and `_` are ignored). */
export const SPECIES_CSV_COLUMNS = ['name', 'polarizability', 'uncertainty', 'unit', 'mass_number', 'electron_affinity_ev', 'source'] as const;
export type SpeciesCsvColumn = (typeof SPECIES_CSV_COLUMNS)[number];

/** One species, from the built-in catalogue or a team's list: the same shape either way. */
export interface SpeciesEntry {
  /** `catalogue:<symbol>` for built-in atoms, the row's id for team species. */
  id: string;
  origin: 'catalogue' | 'team';
  /** The team list it came from; null for the catalogue. */
  list: { id: string; name: string } | null;
  symbol: string | null;
  name: string;
  atomicNumber: number | null;
  polarizability: {
    /** a₀³ */
    value: number;
    /** One standard uncertainty, a₀³; null when none was given. */
    uncertainty: number | null;
    /** What was entered, when it was in another unit. */
    entered: { value: number; uncertainty: number | null; unit: AlphaUnit } | null;
    source: string;
    /** Catalogue only: "confirmed" (seen in a public document while the data were compiled) or "from memory" (to be checked); null for team species. */
    status: string | null;
  };
  electronAffinity: {
    /** eV; null means no stable anion (none known / none given). */
    valueEv: number | null;
    uncertaintyEv: number | null;
    /** False when the neutral atom has no stable negative ion (valueEv is then null). */
    stableAnion: boolean;
    source: string | null;
    /** Catalogue only, as for the polarizability. */
    status: string | null;
    /** Catalogue only: remarks of the compilation (e.g. metastable anion states that are not binding energies). */
    note: string | null;
  };
  massNumber: number;
  massSource: string | null;
}

/** `GET /api/species/catalogue` and `GET /api/teams/:teamId/species` */
export interface SpeciesListResponse {
  items: SpeciesEntry[];
}

export interface SpeciesListView {
  id: string;
  teamId: string;
  name: string;
  fileName: string | null;
  speciesCount: number;
  createdAt: string;
  createdBy: { id: string; displayName: string } | null;
}

/** `GET /api/teams/:teamId/species-lists/:listId` */
export interface SpeciesListDetail extends SpeciesListView {
  species: SpeciesEntry[];
}

/** One problem in an uploaded CSV: 1-based line, the column's name (null for the whole line or file). */
export interface CsvIssue {
  line: number | null;
  column: SpeciesCsvColumn | null;
  message: string;
}

/** 400 answer of a rejected upload: nothing was imported. */
export interface CsvRejectedBody {
  statusCode: 400;
  code: 'csv_rejected';
  message: string;
  issues: CsvIssue[];
}
