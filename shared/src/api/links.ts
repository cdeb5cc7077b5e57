import type { MapSetup } from '../setup/mapSetup.js';
import type { PersonRef } from './common.js';
import type { PinGeometry, PinStatus } from './pins.js';
import type { SpeciesEntry } from './species.js';

/** A viewing link as listed to the map's editors; the token itself is never shown again after creation. */
export interface ViewingLinkView {
  id: string;
  mapId: string;
  createdBy: PersonRef | null;
  createdAt: string;
  expiresAt: string | null;
  includePins: boolean;
  viewCount: number;
  lastViewedAt: string | null;
  revokedAt: string | null;
}

/** `POST /api/maps/:mapId/viewing-links` */
export interface CreateViewingLinkRequest {
  /** ISO 8601, in the future; omitted or null for a link that does not expire. */
  expiresAt?: string | null;
  includePins?: boolean;
}

/** Answer of the creation: the only time the token is shown. */
export interface CreatedViewingLink {
  link: ViewingLinkView;
  token: string;
  /** App path that opens the read-only view, e.g. `/view/<token>`. */
  path: string;
}

/** A pin as a link holder sees it: no authors, no thread. */
export interface SharedPin {
  /** Stable id, so live events can move or remove the pin in a shared view. */
  id: string;
  geometry: PinGeometry;
  title: string;
  body: string;
  status: PinStatus;
  category: string | null;
}

/**
 * A species of the map's overlay as a link holder sees it: the same data and sources as a `SpeciesEntry`, without the
 * ids of the team's rows and lists (a team list is shown by its name only).
 */
export type SharedSpecies = Omit<SpeciesEntry, 'id' | 'list'> & { list: { name: string } | null };

/** `GET /api/view/:token` (no sign-in): the map's title, description, setup, the species its overlay names and, if the link allows, its pins. */
export interface SharedMapView {
  title: string;
  description: string;
  setup: MapSetup;
  /**
   * The entries `setup.species` names, matched as the map page matches them (a catalogue atom by its name or symbol,
   * a species of the map's team lists by its name; exact text), in the catalogue's order and then the lists' (by
   * name, rows in file order). Names that match nothing are absent. Empty when the overlay names none.
   */
  species: SharedSpecies[];
  pins: SharedPin[] | null;
}
