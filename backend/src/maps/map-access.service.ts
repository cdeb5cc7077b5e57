import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@mikro-orm/nestjs';
import { TeamAccessService } from '../teams/team-access.service';
import { roleAtLeast, type TeamRole } from '../teams/team-role';
import type { Membership } from '../teams/membership.entity';
import { SavedMap } from './map.entity';
import { MapRepository } from './map.repository';
import { type MapAccessContext, MapReads } from './map.reads';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function mapNotFound(): NotFoundException {
  return new NotFoundException({ statusCode: 404, code: 'map_not_found', message: 'No such map, or you are not a member of its team.' });
}

/**
 * Loads a map for a signed-in caller and checks their role in the map's team. A missing map, a map in
 * the bin and a map of a team the caller is not in all answer the same 404, so outsiders learn nothing;
 * a member with too low a role gets the teams module's 403.
 */
@Injectable()
export class MapAccessService {
  constructor(
    @InjectRepository(SavedMap) private readonly maps: MapRepository,
    private readonly access: TeamAccessService,
    private readonly reads: MapReads,
  ) {}

  /**
   * The same check as `load` for routes that only read (one plain statement, no entities): the map's team id,
   * or the same 404 / 403 answers.
   */
  async requireRoleForMap(mapId: string, userId: string, minimumRole: TeamRole): Promise<MapAccessContext & { role: TeamRole }> {
    if (!UUID.test(mapId) || !UUID.test(userId)) throw mapNotFound();
    const found = await this.reads.accessContext(mapId.toLowerCase(), userId);
    if (!found?.role) throw mapNotFound();
    if (!roleAtLeast(found.role, minimumRole)) await this.access.requireRole(found.teamId, userId, minimumRole);
    return { ...found, role: found.role };
  }

  async load(mapId: string, userId: string, minimumRole: TeamRole, options: { includeDeleted?: boolean } = {}): Promise<{ map: SavedMap; membership: Membership }> {
    if (!UUID.test(mapId)) throw mapNotFound();
    const map = options.includeDeleted ? await this.maps.findAny(mapId.toLowerCase()) : await this.maps.findLive(mapId.toLowerCase());
    if (!map) throw mapNotFound();
    const membership = await this.access.findMembership(map.team.id, userId);
    if (!membership) throw mapNotFound();
    if (!roleAtLeast(membership.role, minimumRole)) await this.access.requireRole(map.team.id, userId, minimumRole);
    return { map, membership };
  }
}
