import { ForbiddenException, Injectable, NotFoundException } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import { selectRows } from '../common/sql-reads';
import { Membership } from './membership.entity';
import { roleAtLeast, type TeamRole } from './team-role';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * The one place that decides whether a person may act on a team's resources.
 *
 * Use it from any service that touches team-owned data (maps, pins, threads, viewing links):
 *
 * ```ts
 * const membership = await this.access.requireRole(map.team.id, user.id, 'editor');
 * ```
 *
 * - not a member (or no such team, or a malformed id) → 404 `team_not_found`: outsiders cannot
 *   even learn that the team or its resource exists, so look up the resource, then call this with
 *   its team and let the 404 stand for both;
 * - a member whose role is below `minimumRole` → 403 `insufficient_role`, naming the role needed;
 * - otherwise the membership (with its team loaded) is returned.
 *
 * For routes shaped `/teams/:teamId/...` the `@TeamRole('editor')` decorator does the same check
 * in a guard and hands the membership to the handler through `@CurrentMembership()`.
 */
@Injectable()
export class TeamAccessService {
  constructor(private readonly em: EntityManager) {}

  async requireRole(teamId: string, userId: string, minimumRole: TeamRole): Promise<Membership> {
    const membership = await this.findMembership(teamId, userId);
    if (!membership) throw teamNotFound();
    if (!roleAtLeast(membership.role, minimumRole)) {
      throw new ForbiddenException({
        statusCode: 403,
        code: 'insufficient_role',
        message: `This needs the ${minimumRole} role in ${membership.team.name}; you are ${article(membership.role)} ${membership.role}.`,
        requiredRole: minimumRole,
        role: membership.role,
      });
    }
    return membership;
  }

  /** The same answers as `requireRole`, from one plain statement (common/sql-reads.ts); loads no entities. */
  async requireRoleOnly(teamId: string, userId: string, minimumRole: TeamRole): Promise<TeamRole> {
    const rows = UUID.test(teamId) && UUID.test(userId)
      ? await selectRows<{ role: TeamRole }>(this.em, 'select role from memberships where team_id = ? and user_id = ?', [teamId.toLowerCase(), userId])
      : [];
    if (!rows[0]) throw teamNotFound();
    // A role too low is rare: let the entity path build its 403 with the team's name.
    if (!roleAtLeast(rows[0].role, minimumRole)) await this.requireRole(teamId, userId, minimumRole);
    return rows[0].role;
  }

  /** The membership, or null for non-members and malformed ids. Never throws for access reasons. */
  async findMembership(teamId: string, userId: string): Promise<Membership | null> {
    if (!UUID.test(teamId) || !UUID.test(userId)) return null;
    return this.em.findOne(Membership, { team: teamId.toLowerCase(), user: userId }, { populate: ['team'] });
  }
}

export function teamNotFound(): NotFoundException {
  return new NotFoundException({ statusCode: 404, code: 'team_not_found', message: 'No such team, or you are not a member of it.' });
}

function article(role: TeamRole): string {
  return role === 'owner' || role === 'editor' ? 'an' : 'a';
}
