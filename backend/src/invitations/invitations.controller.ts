import { Body, Controller, Delete, Get, HttpCode, Param, ParseUUIDPipe, Post, Req, Res, UseGuards } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { ThrottlerGuard } from '@nestjs/throttler';
import type { Request, Response } from 'express';
import type { AppConfig } from '../config/configuration';
import { Public } from '../common/public.decorator';
import { CurrentUser, type AuthUser } from '../common/current-user.decorator';
import { clientMeta, sendSession } from '../auth/refresh-cookie';
import type { SessionView } from '../auth/session.service';
import type { Membership } from '../teams/membership.entity';
import { CurrentMembership, TeamRole } from '../teams/team-role.guard';
import type { TeamRole as Role } from '../teams/team-role';
import { AcceptWithNewAccountDto, CreateInvitationDto } from './dto/invitation.dto';
import type { InvitationPreview, InvitationView } from './invitation.view';
import { InvitationsService, type SentInvitation } from './invitations.service';

const uuid = new ParseUUIDPipe({ version: '4', errorHttpStatusCode: 404 });

/** A team's invitations: owners only (non-members 404, other roles 403). */
@Controller('teams/:teamId/invitations')
@TeamRole('owner')
export class TeamInvitationsController {
  constructor(private readonly invitations: InvitationsService) {}

  @Get()
  list(@CurrentMembership() membership: Membership): Promise<InvitationView[]> {
    return this.invitations.listOpen(membership.team.id);
  }

  @Post()
  create(@CurrentMembership() membership: Membership, @CurrentUser() user: AuthUser, @Body() dto: CreateInvitationDto): Promise<SentInvitation> {
    return this.invitations.create(membership.team, user, dto.email, dto.role);
  }

  @Post(':invitationId/resend')
  @HttpCode(200)
  resend(@CurrentMembership() membership: Membership, @CurrentUser() user: AuthUser, @Param('invitationId', uuid) id: string): Promise<SentInvitation> {
    return this.invitations.resend(membership.team.id, user, id);
  }

  @Delete(':invitationId')
  @HttpCode(204)
  revoke(@CurrentMembership() membership: Membership, @CurrentUser() user: AuthUser, @Param('invitationId', uuid) id: string): Promise<void> {
    return this.invitations.revoke(membership.team.id, user, id);
  }
}

/**
 * An invitation link's own routes. Reading it and accepting with a new account are public (the link
 * is the credential); accepting into an existing account needs that account signed in.
 */
@Controller('invitations/:token')
export class InvitationLinkController {
  constructor(
    private readonly invitations: InvitationsService,
    private readonly config: ConfigService<AppConfig, true>,
  ) {}

  @Public()
  @Get()
  preview(@Param('token') token: string): Promise<InvitationPreview> {
    return this.invitations.preview(token);
  }

  @Post('accept')
  @HttpCode(200)
  accept(@Param('token') token: string, @CurrentUser() user: AuthUser): Promise<{ teamId: string; role: Role }> {
    return this.invitations.accept(token, user);
  }

  @Public()
  @UseGuards(ThrottlerGuard)
  @Post('register')
  async register(
    @Param('token') token: string,
    @Body() dto: AcceptWithNewAccountDto,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<SessionView & { teamId: string }> {
    const session = await this.invitations.acceptWithNewAccount(token, dto.displayName, dto.password, clientMeta(req));
    const body = sendSession(res, session, this.config.get('auth', { infer: true }).secureCookies);
    return { ...body, teamId: session.teamId };
  }
}
