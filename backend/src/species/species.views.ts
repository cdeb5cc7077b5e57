import type { SharedSpecies, SpeciesEntry, SpeciesListView } from '@fieldbound/shared';
import type { CatalogueSpecies } from './catalogue-species.entity';
import type { SpeciesList } from './species-list.entity';
import type { TeamSpecies } from './team-species.entity';

export function catalogueEntry(s: CatalogueSpecies): SpeciesEntry {
  return {
    id: `catalogue:${s.symbol}`,
    origin: 'catalogue',
    list: null,
    symbol: s.symbol,
    name: s.name,
    atomicNumber: s.atomicNumber,
    polarizability: { value: s.polarizabilityA0, uncertainty: s.polarizabilityUncertaintyA0, entered: null, source: s.polarizabilitySource, status: s.polarizabilityStatus },
    electronAffinity: {
      valueEv: s.electronAffinityEv,
      uncertaintyEv: s.electronAffinityUncertaintyEv,
      stableAnion: s.electronAffinityEv !== null,
      source: s.electronAffinitySource,
      status: s.electronAffinityStatus,
      note: s.electronAffinityNote,
    },
    massNumber: s.massNumber,
    massSource: s.massSource,
  };
}

/** Built from an entity or from a plain-SQL row with the same fields (species.reads.ts). */
export function teamEntry(s: Omit<TeamSpecies, 'list'>, list: Pick<SpeciesList, 'id' | 'name'>): SpeciesEntry {
  return {
    id: s.id,
    origin: 'team',
    list: { id: list.id, name: list.name },
    symbol: null,
    name: s.name,
    atomicNumber: null,
    polarizability: {
      value: s.polarizabilityA0,
      uncertainty: s.polarizabilityUncertaintyA0,
      entered: s.enteredUnit === 'a0^3' ? null : { value: s.enteredValue, uncertainty: s.enteredUncertainty, unit: s.enteredUnit },
      source: s.source,
      status: null,
    },
    electronAffinity: { valueEv: s.electronAffinityEv, uncertaintyEv: null, stableAnion: s.electronAffinityEv !== null, source: s.electronAffinityEv === null ? null : s.source, status: null, note: null },
    massNumber: s.massNumber,
    massSource: s.source,
  };
}

/** What a viewing-link holder sees of an entry: everything but the ids of the team's rows and lists. */
export function sharedSpecies(entry: SpeciesEntry): SharedSpecies {
  const { id: _id, list, ...data } = entry;
  return { ...data, list: list ? { name: list.name } : null };
}

export function listView(list: SpeciesList, speciesCount: number): SpeciesListView {
  return {
    id: list.id,
    teamId: list.team.id,
    name: list.name,
    fileName: list.fileName,
    speciesCount,
    createdAt: list.createdAt.toISOString(),
    createdBy: list.createdBy ? { id: list.createdBy.id, displayName: list.createdBy.displayName } : null,
  };
}
