import { applyDecorators, type CanActivate, createParamDecorator, type ExecutionContext, Injectable, SetMetadata, UseGuards } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import type { AuthenticatedRequest } from '../common/current-user.decorator';
import { ApiError } from '../common/api-error';
import type { Membership } from './membership.entity';
import { TeamAccessService } from './team-access.service';
import type { TeamRole as Role } from './team-role';

const TEAM_ROLE_KEY = 'fieldbound:teamRole';
const ROLE_ONLY_KEY = 'fieldbound:teamRoleOnly';

type TeamRequest = AuthenticatedRequest & { membership?: Membership };

/** Checks the `:teamId` route parameter against the caller's membership (see TeamAccessService). */
@Injectable()
export class TeamRoleGuard implements CanActivate {
  constructor(
    private readonly reflector: Reflector,
    private readonly access: TeamAccessService,
  ) {}

  async canActivate(context: ExecutionContext): Promise<boolean> {
    const minimum = this.reflector.getAllAndOverride<Role | undefined>(TEAM_ROLE_KEY, [context.getHandler(), context.getClass()]);
    if (!minimum) return true;
    const request = context.switchToHttp().getRequest<TeamRequest>();
    if (!request.user) throw new ApiError(401, 'not_signed_in', 'Sign in to continue.');
    const teamId = request.params.teamId;
    if (typeof teamId !== 'string') throw new Error('@TeamRole() is only for routes with a :teamId parameter');
    const roleOnly = this.reflector.getAllAndOverride<boolean | undefined>(ROLE_ONLY_KEY, [context.getHandler(), context.getClass()]);
    if (roleOnly) await this.access.requireRoleOnly(teamId, request.user.id, minimum);
    else request.membership = await this.access.requireRole(teamId, request.user.id, minimum);
    return true;
  }
}

/**
 * Requires the signed-in caller to hold at least `minimumRole` in the team named by the route's
 * `:teamId` parameter: 404 for non-members, 403 for a lower role. Put it on a handler or a
 * controller (the handler's wins). `roleOnly: true` checks with one plain statement and loads no
 * membership entity (busy read routes that do not use `@CurrentMembership()`).
 */
export const TeamRole = (minimumRole: Role, options: { roleOnly?: boolean } = {}) =>
  applyDecorators(SetMetadata(TEAM_ROLE_KEY, minimumRole), SetMetadata(ROLE_ONLY_KEY, options.roleOnly ?? false), UseGuards(TeamRoleGuard));

/** The caller's membership in the `:teamId` team, as checked by `@TeamRole()`; its team is loaded. */
export const CurrentMembership = createParamDecorator((_data: unknown, context: ExecutionContext): Membership => {
  const request = context.switchToHttp().getRequest<TeamRequest>();
  if (!request.membership) throw new Error('@CurrentMembership() needs @TeamRole() on the route');
  return request.membership;
});
