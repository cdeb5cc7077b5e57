import { EntityRepository, type FilterQuery, raw } from '@mikro-orm/postgresql';
import type { MapSortKey } from '@fieldbound/shared';
import type { SavedMap } from './map.entity';

export interface MapListQuery {
  search?: string;
  tag?: string;
  sort: MapSortKey;
  order: 'asc' | 'desc';
  limit: number;
  offset: number;
}

/** Queries of the map aggregate (maps with their summary and thumbnail). */
export class MapRepository extends EntityRepository<SavedMap> {
  /** A map that is not in the bin, or null. */
  findLive(id: string): Promise<SavedMap | null> {
    return this.findOne({ id, deletedAt: null } as FilterQuery<SavedMap>, { populate: ['createdBy', 'updatedBy', 'summary', 'summary.computedBy', 'thumbnail'] });
  }

  /** A map whatever its state (restore, purge). */
  findAny(id: string): Promise<SavedMap | null> {
    return this.findOne({ id } as FilterQuery<SavedMap>, { populate: ['createdBy', 'updatedBy', 'deletedBy', 'summary', 'summary.computedBy', 'thumbnail'] });
  }

  /** Live maps of a team, searched in title and tags (case-insensitive), sorted and paged. */
  async listForTeam(teamId: string, query: MapListQuery): Promise<[SavedMap[], number]> {
    const orderBy = query.sort === 'title' ? { title: query.order, id: 'asc' } : { [query.sort]: query.order, id: 'asc' };
    // find and count separately rather than findAndCount: findAndCount passes the populate/joined/orderBy options to
    // the count too, and that count (with five joins) cost about as much server CPU as the page itself (docs/loadtest.md).
    // The joins are all to-one, so they cannot change the number of maps counted. Each query gets its own filter
    // object because a raw() key is consumed by the query that renders it.
    return Promise.all([
      this.find(listFilter(teamId, query), {
        populate: ['createdBy', 'updatedBy', 'summary', 'summary.computedBy', 'thumbnail'],
        // All to-one: one joined query instead of a select-in query per relation (the list is the busiest read).
        strategy: 'joined',
        orderBy: orderBy as never,
        limit: query.limit,
        offset: query.offset,
      }),
      this.count(listFilter(teamId, query)),
    ]);
  }

  /** Maps in the bin of a team, most recently deleted first. */
  listDeleted(teamId: string): Promise<SavedMap[]> {
    return this.find({ team: teamId, deletedAt: { $ne: null } } as FilterQuery<SavedMap>, { populate: ['deletedBy'], orderBy: { deletedAt: 'desc' } });
  }
}

/** Live maps of a team, searched in title and tags (case-insensitive), and with a tag if given. */
function listFilter(teamId: string, query: MapListQuery): FilterQuery<SavedMap> {
  const where: Record<string, unknown> = { team: teamId, deletedAt: null };
  const and: Record<string, unknown>[] = [];
  if (query.search) {
    const pattern = `%${query.search.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    // Title contains the text, or some tag does.
    and.push({
      $or: [{ title: { $ilike: pattern } }, { [raw((alias) => `array_to_string(${alias}.tags, ' ')`)]: { $ilike: pattern } }],
    });
  }
  if (query.tag) and.push({ tags: { $contains: [query.tag] } });
  if (and.length) where.$and = and;
  return where as FilterQuery<SavedMap>;
}
