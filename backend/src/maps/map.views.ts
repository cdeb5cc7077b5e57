import { type MapDetail, type MapListItem, MAP_LIMITS, type DeletedMapItem, type MapVersionDetail, type MapVersionSummary, type PersonRef, type ResultSummary, setupFingerprint } from '@fieldbound/shared';
import type { User } from '../users/user.entity';
import type { SavedMap } from './map.entity';
import type { MapVersion } from './map-version.entity';

export function personRef(user: User | null | undefined): PersonRef | null {
  return user ? { id: user.id, displayName: user.displayName } : null;
}

function summaryView(map: SavedMap): ResultSummary | null {
  const summary = map.summary?.unwrap();
  if (!summary || !summary.engineVersion) return null;
  return {
    engineVersion: summary.engineVersion,
    setupFingerprint: summary.setupFingerprint,
    counts: summary.counts,
    computationMs: summary.computationMs,
    computedAt: summary.computedAt.toISOString(),
    computedBy: personRef(summary.computedBy),
    matchesCurrentSetup: summary.setupFingerprint === setupFingerprint(map.setup),
  };
}

export function toMapListItem(map: SavedMap): MapListItem {
  const thumbnail = map.thumbnail?.unwrap();
  return {
    id: map.id,
    teamId: map.team.id,
    title: map.title,
    description: map.description,
    tags: map.tags,
    version: map.version,
    createdAt: map.createdAt.toISOString(),
    createdBy: personRef(map.createdBy),
    updatedAt: map.updatedAt.toISOString(),
    updatedBy: personRef(map.updatedBy),
    summary: summaryView(map),
    thumbnailUrl: thumbnail?.updatedAt ? `/api/maps/${map.id}/thumbnail?v=${thumbnail.updatedAt.getTime()}` : null,
  };
}

export function toMapDetail(map: SavedMap): MapDetail {
  return { ...toMapListItem(map), setup: map.setup };
}

export function toDeletedMapItem(map: SavedMap): DeletedMapItem {
  const deletedAt = map.deletedAt!;
  return {
    id: map.id,
    title: map.title,
    deletedAt: deletedAt.toISOString(),
    deletedBy: personRef(map.deletedBy),
    restorableUntil: new Date(deletedAt.getTime() + MAP_LIMITS.restoreWindowDays * 86_400_000).toISOString(),
  };
}

export function toVersionSummary(version: MapVersion): MapVersionSummary {
  return {
    number: version.number,
    title: version.title,
    createdAt: version.createdAt.toISOString(),
    createdBy: personRef(version.createdBy),
    restoredFrom: version.restoredFrom,
    duplicatedFrom: version.duplicatedFromMapId ? { mapId: version.duplicatedFromMapId, version: version.duplicatedFromVersion ?? 1 } : null,
  };
}

export function toVersionDetail(version: MapVersion): MapVersionDetail {
  return { ...toVersionSummary(version), description: version.description, tags: version.tags, setup: version.setup };
}
