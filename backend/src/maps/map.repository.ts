import { EntityRepository, type FilterQuery } from '@mikro-orm/postgresql';
import type { SavedMap } from './map.entity';

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

  /** Maps in the bin of a team, most recently deleted first. */
  listDeleted(teamId: string): Promise<SavedMap[]> {
    return this.find({ team: teamId, deletedAt: { $ne: null } } as FilterQuery<SavedMap>, { populate: ['deletedBy'], orderBy: { deletedAt: 'desc' } });
  }
}
