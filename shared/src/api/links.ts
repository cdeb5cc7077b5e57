import type { MapSetup } from '../setup/mapSetup.js';
import type { PersonRef } from './common.js';
import type { PinGeometry, PinStatus } from './pins.js';

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

/** `GET /api/view/:token` (no sign-in): the map's title, description, setup and, if the link allows, its pins. */
export interface SharedMapView {
  title: string;
  description: string;
  setup: MapSetup;
  pins: SharedPin[] | null;
}
