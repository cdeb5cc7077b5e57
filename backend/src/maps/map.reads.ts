import { Injectable } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import { type MapDetail, type MapListItem, type MapListResponse, type MapSetup, type MapSortKey, type MapVersionSummary, type ResultCounts, setupFingerprint } from '@fieldbound/shared';
import { isoTime, personFromColumns, selectRows } from '../common/sql-reads';
import type { TeamRole } from '../teams/team-role';

export interface MapListQuery {
  search?: string;
  tag?: string;
  sort: MapSortKey;
  order: 'asc' | 'desc';
  limit: number;
  offset: number;
}

/** The columns of a map as its list item and detail need them, with the people and summary joined. */
const MAP_COLUMNS = `
  m.id, m.team_id, m.title, m.description, m.tags, m.version, m.setup, m.created_at, m.updated_at,
  cu.id as created_by_id, cu.display_name as created_by_name,
  uu.id as updated_by_id, uu.display_name as updated_by_name,
  s.engine_version as summary_engine_version, s.setup_fingerprint as summary_fingerprint, s.counts as summary_counts,
  s.computation_ms as summary_computation_ms, s.computed_at as summary_computed_at,
  sc.id as summary_by_id, sc.display_name as summary_by_name,
  t.updated_at as thumbnail_updated_at`;

const MAP_JOINS = `
  left join users cu on cu.id = m.created_by_id
  left join users uu on uu.id = m.updated_by_id
  left join map_result_summaries s on s.map_id = m.id
  left join users sc on sc.id = s.computed_by_id
  left join map_thumbnails t on t.map_id = m.id`;

interface MapRow {
  id: string;
  team_id: string;
  title: string;
  description: string;
  tags: string[];
  version: number;
  setup: MapSetup;
  created_at: Date | string;
  updated_at: Date | string;
  created_by_id: string | null;
  created_by_name: string | null;
  updated_by_id: string | null;
  updated_by_name: string | null;
  summary_engine_version: string | null;
  summary_fingerprint: string | null;
  summary_counts: ResultCounts | null;
  summary_computation_ms: number | string | null;
  summary_computed_at: Date | string | null;
  summary_by_id: string | null;
  summary_by_name: string | null;
  thumbnail_updated_at: Date | string | null;
}

/** The same list item as `toMapListItem` builds from entities (map.views.ts), from one joined row. */
function listItemFromRow(row: MapRow): MapListItem {
  return {
    id: row.id,
    teamId: row.team_id,
    title: row.title,
    description: row.description,
    tags: row.tags,
    version: row.version,
    createdAt: isoTime(row.created_at),
    createdBy: personFromColumns(row.created_by_id, row.created_by_name),
    updatedAt: isoTime(row.updated_at),
    updatedBy: personFromColumns(row.updated_by_id, row.updated_by_name),
    summary:
      row.summary_engine_version && row.summary_computed_at
        ? {
            engineVersion: row.summary_engine_version,
            setupFingerprint: row.summary_fingerprint!,
            counts: row.summary_counts!,
            computationMs: Number(row.summary_computation_ms),
            computedAt: isoTime(row.summary_computed_at),
            computedBy: personFromColumns(row.summary_by_id, row.summary_by_name),
            matchesCurrentSetup: row.summary_fingerprint === setupFingerprint(row.setup),
          }
        : null,
    thumbnailUrl: row.thumbnail_updated_at ? `/api/maps/${row.id}/thumbnail?v=${new Date(row.thumbnail_updated_at).getTime()}` : null,
  };
}

export interface MapAccessContext {
  mapId: string;
  teamId: string;
  mapTitle: string;
  role: TeamRole | null;
  caller: { id: string; email: string; displayName: string };
}

const SORT_COLUMNS: Record<MapListQuery['sort'], string> = { updatedAt: 'm.updated_at', createdAt: 'm.created_at', title: 'm.title' };

/** Read-only queries of maps for the busiest routes (see common/sql-reads.ts for why plain SQL). */
@Injectable()
export class MapReads {
  constructor(private readonly em: EntityManager) {}

  /**
   * A live map with the caller's role in its team, in one statement: null when there is no such live map,
   * and `role: null` when the caller is not a member (callers answer both with the same 404).
   */
  async detailWithRole(mapId: string, userId: string): Promise<{ detail: MapDetail; role: TeamRole | null } | null> {
    const rows = await selectRows<MapRow & { role: TeamRole | null }>(
      this.em,
      `select ${MAP_COLUMNS}, ms.role
       from maps m ${MAP_JOINS}
       left join memberships ms on ms.team_id = m.team_id and ms.user_id = ?
       where m.id = ? and m.deleted_at is null`,
      [userId, mapId],
    );
    const row = rows[0];
    return row ? { detail: { ...listItemFromRow(row), setup: row.setup }, role: row.role } : null;
  }

  /**
   * What a route needs to act on a live map without loading it: its team, its title, the caller's role in the team
   * (null: not a member) and the caller's name and address (for views and mention mails). Null: no such live map.
   */
  async accessContext(mapId: string, userId: string): Promise<MapAccessContext | null> {
    const rows = await selectRows<{ team_id: string; title: string; role: TeamRole | null; email: string | null; display_name: string | null }>(
      this.em,
      `select m.team_id, m.title, ms.role, u.email, u.display_name from maps m
       left join memberships ms on ms.team_id = m.team_id and ms.user_id = ?
       left join users u on u.id = ?
       where m.id = ? and m.deleted_at is null`,
      [userId, userId, mapId],
    );
    const row = rows[0];
    if (!row) return null;
    return { mapId, teamId: row.team_id, mapTitle: row.title, role: row.role, caller: { id: userId, email: row.email ?? '', displayName: row.display_name ?? '' } };
  }

  /** Live maps of a team, searched in title and tags (case-insensitive), with a tag if given, sorted and paged. */
  async listForTeam(teamId: string, query: MapListQuery): Promise<MapListResponse> {
    const where = ['m.team_id = ?', 'm.deleted_at is null'];
    const params: unknown[] = [teamId];
    if (query.search) {
      const pattern = `%${query.search.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
      where.push(`(m.title ilike ? or array_to_string(m.tags, ' ') ilike ?)`);
      params.push(pattern, pattern);
    }
    if (query.tag) {
      where.push('m.tags @> array[?]::text[]');
      params.push(query.tag);
    }
    const direction = query.order === 'asc' ? 'asc' : 'desc';
    // The total rides along as a window count, so one statement answers both; a page past the end has no
    // rows to carry it and counts separately.
    const rows = await selectRows<MapRow & { total: number | string }>(
      this.em,
      `select ${MAP_COLUMNS}, count(*) over () as total
       from maps m ${MAP_JOINS}
       where ${where.join(' and ')}
       order by ${SORT_COLUMNS[query.sort]} ${direction}, m.id asc
       limit ? offset ?`,
      [...params, query.limit, query.offset],
    );
    let total = rows.length ? Number(rows[0].total) : 0;
    if (!rows.length && query.offset > 0) {
      const counted = await selectRows<{ total: number | string }>(this.em, `select count(*) as total from maps m where ${where.join(' and ')}`, params);
      total = Number(counted[0].total);
    }
    return { items: rows.map(listItemFromRow), total };
  }

  /** A map's versions, newest first, without their setups. */
  async versionSummaries(mapId: string): Promise<MapVersionSummary[]> {
    const rows = await selectRows<{
      number: number;
      title: string;
      created_at: Date | string;
      created_by_id: string | null;
      created_by_name: string | null;
      restored_from: number | null;
      duplicated_from_map_id: string | null;
      duplicated_from_version: number | null;
    }>(
      this.em,
      `select v.number, v.title, v.created_at, u.id as created_by_id, u.display_name as created_by_name,
              v.restored_from, v.duplicated_from_map_id, v.duplicated_from_version
       from map_versions v left join users u on u.id = v.created_by_id
       where v.map_id = ? order by v.number desc`,
      [mapId],
    );
    return rows.map((v) => ({
      number: v.number,
      title: v.title,
      createdAt: isoTime(v.created_at),
      createdBy: personFromColumns(v.created_by_id, v.created_by_name),
      restoredFrom: v.restored_from,
      duplicatedFrom: v.duplicated_from_map_id ? { mapId: v.duplicated_from_map_id, version: v.duplicated_from_version ?? 1 } : null,
    }));
  }
}
