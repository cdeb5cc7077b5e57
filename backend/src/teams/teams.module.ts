import { Module } from '@nestjs/common';
import { TeamAccessService } from './team-access.service';
import { TeamRoleGuard } from './team-role.guard';
import { TeamsController } from './teams.controller';
import { TeamsService } from './teams.service';

/**
 * Teams, memberships and roles. Exports TeamAccessService and TeamRoleGuard: import TeamsModule in
 * any feature whose data belongs to a team, then use `@TeamRole(...)` or `requireRole(...)`.
 */
@Module({
  controllers: [TeamsController],
  providers: [TeamsService, TeamAccessService, TeamRoleGuard],
  exports: [TeamsService, TeamAccessService, TeamRoleGuard],
})
export class TeamsModule {}
