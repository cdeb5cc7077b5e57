import type { MapSetup } from '../setup/mapSetup.js';
import type { PersonRef } from './common.js';

/** Limits the server enforces on a map's own fields (the setup has its own, see SETUP_LIMITS). */
export const MAP_LIMITS = {
  maxTitleLength: 200,
  maxDescriptionLength: 10_000,
  maxTags: 20,
  maxTagLength: 40,
  /** Thumbnail PNG upload, bytes. */
  maxThumbnailBytes: 256 * 1024,
  /** Days a deleted map can be restored by an owner before it is purged. */
  restoreWindowDays: 30,
  maxPageSize: 200,
} as const;

export const MAP_SORT_KEYS = ['updatedAt', 'createdAt', 'title'] as const;
export type MapSortKey = (typeof MAP_SORT_KEYS)[number];

/** States per region class in the last computation the client attached. */
export interface ResultCounts {
  bound: number;
  resonance: number;
  unbound: number;
}

/** `PUT /api/maps/:mapId/summary` body. */
export interface PutResultSummaryRequest {
  engineVersion: string;
  /** `setupFingerprint(setup)` of the setup that was computed. */
  setupFingerprint: string;
  counts: ResultCounts;
  computationMs: number;
}

export interface ResultSummary extends PutResultSummaryRequest {
  computedAt: string;
  computedBy: PersonRef | null;
  /** False when the map's setup has changed since (the fingerprints differ). */
  matchesCurrentSetup: boolean;
}

/** One map in the team's list. */
export interface MapListItem {
  id: string;
  teamId: string;
  title: string;
  description: string;
  tags: string[];
  version: number;
  createdAt: string;
  createdBy: PersonRef | null;
  updatedAt: string;
  updatedBy: PersonRef | null;
  summary: ResultSummary | null;
  /** API path of the thumbnail PNG (needs the access token), or null when none was uploaded. */
  thumbnailUrl: string | null;
}

/** A map with its setup (`GET /api/maps/:mapId`). */
export interface MapDetail extends MapListItem {
  setup: MapSetup;
}

/** `GET /api/teams/:teamId/maps` */
export interface MapListResponse {
  items: MapListItem[];
  total: number;
}

/** `POST /api/teams/:teamId/maps` */
export interface CreateMapRequest {
  title: string;
  description?: string;
  tags?: string[];
  setup: MapSetup;
}

/**
 * `PATCH /api/maps/:mapId`: `expectedVersion` is the version the client last read. When the map has moved on,
 * the answer is 409 with `current` holding the map as it is now; nothing is overwritten.
 */
export interface UpdateMapRequest {
  expectedVersion: number;
  title?: string;
  description?: string;
  tags?: string[];
  setup?: MapSetup;
}

/** Body of a 409 on a stale write (maps and pins alike). */
export interface VersionConflictBody<T> {
  statusCode: 409;
  code: 'version_conflict';
  message: string;
  current: T;
}

/** `POST /api/maps/:mapId/duplicate` */
export interface DuplicateMapRequest {
  /** Target team (default: the map's own team); the caller must be an editor or owner there. */
  teamId?: string;
  title?: string;
}

/** A saved version in the list (`GET /api/maps/:mapId/versions`). */
export interface MapVersionSummary {
  number: number;
  title: string;
  createdAt: string;
  createdBy: PersonRef | null;
  /** Set when this version was made by restoring an earlier one. */
  restoredFrom: number | null;
  /** Set when this map was made by duplicating another map. */
  duplicatedFrom: { mapId: string; version: number } | null;
}

/** `GET /api/maps/:mapId/versions/:number` */
export interface MapVersionDetail extends MapVersionSummary {
  description: string;
  tags: string[];
  setup: MapSetup;
}

/** One changed value between two versions: a dotted path (`setup.alphaAxis.min`, `title`, `tags`) with both values. */
export interface MapChange {
  path: string;
  /** Absent (undefined) when the path did not exist in the older version. */
  before?: unknown;
  after?: unknown;
}

/** `GET /api/maps/:mapId/diff?from=&to=` */
export interface MapDiffResponse {
  from: number;
  to: number;
  changes: MapChange[];
}

/** `POST /api/maps/:mapId/versions/:number/restore` */
export interface RestoreVersionRequest {
  expectedVersion: number;
}

/** A soft-deleted map in `GET /api/teams/:teamId/maps/deleted`. */
export interface DeletedMapItem {
  id: string;
  title: string;
  deletedAt: string;
  deletedBy: PersonRef | null;
  /** After this instant the map can no longer be restored and is purged. */
  restorableUntil: string;
}
