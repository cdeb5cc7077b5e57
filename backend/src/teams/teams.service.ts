import { ConflictException, ForbiddenException, Injectable, NotFoundException } from '@nestjs/common';
import { EntityManager, LockMode } from '@mikro-orm/postgresql';
import type { AuthUser } from '../common/current-user.decorator';
import { AuditService } from '../audit/audit.service';
import { User } from '../users/user.entity';
import { Membership } from './membership.entity';
import { Team } from './team.entity';
import type { TeamRole } from './team-role';
import type { MemberView, TeamView } from './team.view';

/** Teams and their members. Access is checked before these methods run (TeamRoleGuard / TeamAccessService). */
@Injectable()
export class TeamsService {
  constructor(
    private readonly em: EntityManager,
    private readonly audit: AuditService,
  ) {}

  async listMine(userId: string): Promise<TeamView[]> {
    const memberships = await this.em.find(Membership, { user: userId }, { populate: ['team'], orderBy: { team: { name: 'asc' } } });
    const counts = await this.memberCounts(memberships.map((m) => m.team.id));
    return memberships.map((m) => toTeamView(m, counts.get(m.team.id) ?? 1));
  }

  /** Creates a team with the caller as its first owner. */
  async create(actor: AuthUser, name: string): Promise<TeamView> {
    const user = this.em.getReference(User, actor.id);
    const team = new Team(name);
    const membership = new Membership(team, user, 'owner');
    this.em.persist([team, membership]);
    this.audit.record({ action: 'team.created', teamId: team.id, actor, details: { name: team.name } });
    await this.em.flush();
    return toTeamView(membership, 1);
  }

  async view(membership: Membership): Promise<TeamView> {
    const counts = await this.memberCounts([membership.team.id]);
    return toTeamView(membership, counts.get(membership.team.id) ?? 1);
  }

  async rename(membership: Membership, actor: AuthUser, name: string): Promise<TeamView> {
    const team = membership.team;
    const previous = team.name;
    team.name = name;
    this.audit.record({ action: 'team.renamed', teamId: team.id, actor, details: { from: previous, to: name } });
    await this.em.flush();
    return this.view(membership);
  }

  /** Deletes the team with its memberships and invitations (and, through foreign keys, everything it owns). */
  async delete(membership: Membership, actor: AuthUser): Promise<void> {
    const team = membership.team;
    this.audit.record({ action: 'team.deleted', teamId: team.id, actor, details: { name: team.name } });
    await this.em.flush();
    await this.em.nativeDelete(Team, { id: team.id });
  }

  async members(teamId: string): Promise<MemberView[]> {
    const memberships = await this.em.find(Membership, { team: teamId }, { populate: ['user'], orderBy: { user: { displayName: 'asc', email: 'asc' } } });
    return memberships.map(toMemberView);
  }

  /** Owners change anyone's role; the last owner cannot be demoted (409). */
  async changeRole(teamId: string, actor: AuthUser, targetUserId: string, role: TeamRole): Promise<MemberView> {
    return this.em.transactional(async (em) => {
      const owners = await this.lockOwners(em, teamId);
      const target = await em.findOne(Membership, { team: teamId, user: targetUserId }, { populate: ['user'] });
      if (!target) throw memberNotFound();
      if (target.role === role) return toMemberView(target);
      if (target.role === 'owner' && owners.length === 1) {
        throw new ConflictException({
          statusCode: 409,
          code: 'last_owner',
          message: 'A team needs at least one owner: make someone else an owner before changing this role.',
        });
      }
      const from = target.role;
      target.role = role;
      this.audit.record({ action: 'member.role_changed', teamId, actor, targetUserId, targetEmail: target.user.email, details: { from, to: role } }, em);
      return toMemberView(target);
    });
  }

  /**
   * Removes a member. Owners may remove anyone; every member may remove themselves (leave).
   * The last owner can neither leave nor be removed (409).
   */
  async removeMember(caller: Membership, actor: AuthUser, targetUserId: string): Promise<void> {
    const teamId = caller.team.id;
    const leaving = targetUserId === actor.id;
    if (!leaving && caller.role !== 'owner') {
      throw new ForbiddenException({ statusCode: 403, code: 'insufficient_role', message: 'Only owners can remove other members.', requiredRole: 'owner', role: caller.role });
    }
    await this.em.transactional(async (em) => {
      const owners = await this.lockOwners(em, teamId);
      const target = await em.findOne(Membership, { team: teamId, user: targetUserId }, { populate: ['user'] });
      if (!target) throw memberNotFound();
      if (target.role === 'owner' && owners.length === 1) {
        throw new ConflictException({
          statusCode: 409,
          code: 'last_owner',
          message: leaving
            ? 'You are the last owner: make someone else an owner before leaving, or delete the team.'
            : 'A team needs at least one owner.',
        });
      }
      em.remove(target);
      this.audit.record({ action: leaving ? 'member.left' : 'member.removed', teamId, actor, targetUserId, targetEmail: target.user.email, details: { role: target.role } }, em);
    });
  }

  /** Locks the team's owner memberships for the rest of the transaction, so two demotions cannot both pass the last-owner check. */
  private lockOwners(em: EntityManager, teamId: string): Promise<Membership[]> {
    return em.find(Membership, { team: teamId, role: 'owner' }, { lockMode: LockMode.PESSIMISTIC_WRITE });
  }

  private async memberCounts(teamIds: string[]): Promise<Map<string, number>> {
    if (!teamIds.length) return new Map();
    const rows = await this.em
      .getConnection()
      .execute<{ team_id: string; count: number }[]>(
        `select team_id, count(*)::int as count from memberships where team_id in (${teamIds.map(() => '?').join(', ')}) group by team_id`,
        teamIds,
      );
    return new Map(rows.map((r) => [r.team_id, Number(r.count)]));
  }
}

function memberNotFound(): NotFoundException {
  return new NotFoundException({ statusCode: 404, code: 'member_not_found', message: 'This person is not a member of the team.' });
}

function toTeamView(membership: Membership, memberCount: number): TeamView {
  return { id: membership.team.id, name: membership.team.name, role: membership.role, memberCount, createdAt: membership.team.createdAt.toISOString() };
}

function toMemberView(m: Membership): MemberView {
  return {
    userId: m.user.id,
    email: m.user.email,
    displayName: m.user.displayName,
    role: m.role,
    joinedAt: m.createdAt.toISOString(),
    lastSignInAt: m.user.lastSignInAt?.toISOString() ?? null,
  };
}
