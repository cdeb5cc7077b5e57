import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module';
import { TeamsModule } from '../teams/teams.module';
import { InvitationLinkController, TeamInvitationsController } from './invitations.controller';
import { InvitationsService } from './invitations.service';
import { InvitationMailRetryService } from './invitation-mail-retry.service';

@Module({
  imports: [AuthModule, TeamsModule],
  controllers: [TeamInvitationsController, InvitationLinkController],
  providers: [InvitationsService, InvitationMailRetryService],
})
export class InvitationsModule {}
