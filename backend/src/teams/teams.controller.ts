import { Body, Controller, Delete, Get, HttpCode, Param, ParseUUIDPipe, Patch, Post } from '@nestjs/common';
import { CurrentUser, type AuthUser } from '../common/current-user.decorator';
import { ChangeRoleDto, TeamNameDto } from './dto/team.dto';
import type { Membership } from './membership.entity';
import { CurrentMembership, TeamRole } from './team-role.guard';
import type { MemberView, TeamView } from './team.view';
import { TeamsService } from './teams.service';

const uuid = new ParseUUIDPipe({ version: '4', errorHttpStatusCode: 404 });

/**
 * Who may call what (non-members get 404 on every `:teamId` route, lower roles 403):
 * - signed in: list my teams, create a team;
 * - viewer+: read the team and its members, leave (remove myself);
 * - owner: rename, delete, change roles, remove others.
 */
@Controller('teams')
export class TeamsController {
  constructor(private readonly teams: TeamsService) {}

  @Get()
  list(@CurrentUser() user: AuthUser): Promise<TeamView[]> {
    return this.teams.listMine(user.id);
  }

  @Post()
  create(@CurrentUser() user: AuthUser, @Body() dto: TeamNameDto): Promise<TeamView> {
    return this.teams.create(user, dto.name);
  }

  @Get(':teamId')
  @TeamRole('viewer')
  get(@CurrentMembership() membership: Membership): Promise<TeamView> {
    return this.teams.view(membership);
  }

  @Patch(':teamId')
  @TeamRole('owner')
  rename(@CurrentMembership() membership: Membership, @CurrentUser() user: AuthUser, @Body() dto: TeamNameDto): Promise<TeamView> {
    return this.teams.rename(membership, user, dto.name);
  }

  @Delete(':teamId')
  @TeamRole('owner')
  @HttpCode(204)
  remove(@CurrentMembership() membership: Membership, @CurrentUser() user: AuthUser): Promise<void> {
    return this.teams.delete(membership, user);
  }

  @Get(':teamId/members')
  @TeamRole('viewer')
  members(@CurrentMembership() membership: Membership): Promise<MemberView[]> {
    return this.teams.members(membership.team.id);
  }

  @Patch(':teamId/members/:userId')
  @TeamRole('owner')
  changeRole(
    @CurrentMembership() membership: Membership,
    @CurrentUser() user: AuthUser,
    @Param('userId', uuid) userId: string,
    @Body() dto: ChangeRoleDto,
  ): Promise<MemberView> {
    return this.teams.changeRole(membership.team.id, user, userId, dto.role);
  }

  /** Owners remove anyone; any member may remove themselves (leave the team). */
  @Delete(':teamId/members/:userId')
  @TeamRole('viewer')
  @HttpCode(204)
  removeMember(@CurrentMembership() membership: Membership, @CurrentUser() user: AuthUser, @Param('userId', uuid) userId: string): Promise<void> {
    return this.teams.removeMember(membership, user, userId);
  }
}
