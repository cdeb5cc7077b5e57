import type { SentInvitation } from '@fieldbound/shared';
import { ConflictException, ForbiddenException, Injectable, Logger, NotFoundException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { EntityManager } from '@mikro-orm/postgresql';
import type { AppConfig } from '../config/configuration';
import type { AuthUser } from '../common/current-user.decorator';
import { Clock } from '../common/clock';
import { ApiError } from '../common/api-error';
import { newSecretToken, parseSecretToken, secretMatches } from '../common/secret-token';
import { AuditService } from '../audit/audit.service';
import { AuthService } from '../auth/auth.service';
import { type ClientMeta, type IssuedSession, SessionService } from '../auth/session.service';
import { MailService } from '../mail/mail.service';
import { invitationMail } from '../mail/templates';
import { Membership } from '../teams/membership.entity';
import type { Team } from '../teams/team.entity';
import type { TeamRole } from '../teams/team-role';
import { User } from '../users/user.entity';
import { Invitation } from './invitation.entity';
import type { InvitationPreview, InvitationView } from './invitation.view';

// emailSent is false when the SMTP server refused or could not be reached; the invitation exists and can be re-sent.
export type { SentInvitation };

/**
 * Invitations: owners invite an address with a role; the e-mailed one-time link lets its holder join,
 * creating an account on the way if the address has none.
 */
@Injectable()
export class InvitationsService {
  private readonly logger = new Logger('invitations');

  constructor(
    private readonly em: EntityManager,
    private readonly clock: Clock,
    private readonly audit: AuditService,
    private readonly mail: MailService,
    private readonly auth: AuthService,
    private readonly sessions: SessionService,
    private readonly config: ConfigService<AppConfig, true>,
  ) {}

  /** Invitations that are not accepted or revoked (pending and expired), newest first. */
  async listOpen(teamId: string): Promise<InvitationView[]> {
    const invitations = await this.em.find(
      Invitation,
      { team: teamId, acceptedAt: null, revokedAt: null },
      { populate: ['invitedBy'], orderBy: { createdAt: 'desc' } },
    );
    const now = this.clock.now();
    return invitations.map((i) => toView(i, now));
  }

  async create(team: Team, actor: AuthUser, email: string, role: TeamRole): Promise<SentInvitation> {
    const now = this.clock.now();
    const alreadyMember = await this.em.count(Membership, { team: team.id, user: { email } });
    if (alreadyMember) {
      throw conflict('already_member', 'email', 'This person is already a member of the team.');
    }
    const open = await this.em.findOne(Invitation, { team: team.id, email, acceptedAt: null, revokedAt: null, expiresAt: { $gt: now } });
    if (open) {
      throw conflict('already_invited', 'email', 'This address already has a pending invitation; re-send it from the list instead.');
    }
    const inviter = await this.em.findOneOrFail(User, { id: actor.id });
    const secret = newSecretToken();
    const invitation = new Invitation({
      id: secret.id,
      team,
      email,
      role,
      invitedBy: inviter,
      tokenHash: secret.hash,
      now,
      expiresAt: this.expiryFrom(now),
    });
    markInFlight(invitation, now);
    this.em.persist(invitation);
    this.audit.record({ action: 'invitation.created', teamId: team.id, actor, targetEmail: email, details: { role, invitationId: invitation.id } });
    await this.em.flush();
    const emailSent = await this.deliver(this.em, invitation, secret.token);
    return { invitation: toView(invitation, this.clock.now()), emailSent };
  }

  /** A new link (the previous one stops working) and a new expiry, sent again. */
  async resend(teamId: string, actor: AuthUser, invitationId: string): Promise<SentInvitation> {
    const invitation = await this.findInTeam(teamId, invitationId);
    const now = this.clock.now();
    const status = invitation.statusAt(now);
    if (status === 'accepted' || status === 'revoked') {
      throw new ConflictException({ statusCode: 409, code: `invitation_${status}`, message: `This invitation was ${status}; invite the address again instead.` });
    }
    const secret = newSecretToken(invitation.id);
    invitation.tokenHash = secret.hash;
    invitation.lastSentAt = now;
    invitation.sendCount += 1;
    invitation.expiresAt = this.expiryFrom(now);
    markInFlight(invitation, now);
    this.audit.record({ action: 'invitation.resent', teamId, actor, targetEmail: invitation.email, details: { invitationId: invitation.id, sendCount: invitation.sendCount } });
    await this.em.flush();
    const emailSent = await this.deliver(this.em, invitation, secret.token);
    return { invitation: toView(invitation, this.clock.now()), emailSent };
  }

  async revoke(teamId: string, actor: AuthUser, invitationId: string): Promise<void> {
    const invitation = await this.findInTeam(teamId, invitationId);
    const now = this.clock.now();
    if (invitation.acceptedAt) {
      throw new ConflictException({ statusCode: 409, code: 'invitation_accepted', message: 'This invitation was already accepted; remove the member instead.' });
    }
    if (invitation.revokedAt) return;
    invitation.revokedAt = now;
    this.audit.record({ action: 'invitation.revoked', teamId, actor, targetEmail: invitation.email, details: { invitationId: invitation.id } });
    await this.em.flush();
  }

  async preview(token: string): Promise<InvitationPreview> {
    const invitation = await this.usable(token);
    const accountExists = (await this.em.count(User, { email: invitation.email })) > 0;
    return {
      teamId: invitation.team.id,
      teamName: invitation.team.name,
      email: invitation.email,
      role: invitation.role,
      invitedByName: invitation.invitedBy?.displayName ?? null,
      expiresAt: invitation.expiresAt.toISOString(),
      accountExists,
    };
  }

  /** The signed-in person joins; the invitation must be addressed to their e-mail. */
  async accept(token: string, actor: AuthUser): Promise<{ teamId: string; role: TeamRole }> {
    const invitation = await this.usable(token);
    if (invitation.email !== actor.email.toLowerCase()) {
      throw new ForbiddenException({
        statusCode: 403,
        code: 'invitation_other_address',
        message: `This invitation was sent to ${invitation.email}; sign in with that address to accept it.`,
      });
    }
    const user = await this.em.findOneOrFail(User, { id: actor.id });
    if (await this.em.count(Membership, { team: invitation.team.id, user: user.id })) {
      throw new ConflictException({ statusCode: 409, code: 'already_member', message: `You are already a member of ${invitation.team.name}.` });
    }
    this.join(invitation, user);
    await this.em.flush();
    return { teamId: invitation.team.id, role: invitation.role };
  }

  /** Creates the invited address's account, joins the team and signs in, in one step. */
  async acceptWithNewAccount(token: string, displayName: string, password: string, meta: ClientMeta): Promise<IssuedSession & { teamId: string }> {
    const invitation = await this.usable(token);
    const user = await this.auth.createUser(invitation.email, displayName, password);
    user.lastSignInAt = this.clock.now();
    this.join(invitation, user);
    const session = this.sessions.issue(user, meta);
    this.audit.record({ action: 'auth.registered', actor: user, ip: meta.ip, details: { via: 'invitation' } });
    await this.auth.flushNewUser();
    return { ...session, teamId: invitation.team.id };
  }

  private join(invitation: Invitation, user: User): void {
    const now = this.clock.now();
    invitation.acceptedAt = now;
    invitation.acceptedBy = user;
    this.em.persist(new Membership(invitation.team, user, invitation.role));
    const actor = { id: user.id, email: user.email };
    this.audit.record({ action: 'invitation.accepted', teamId: invitation.team.id, actor, targetEmail: invitation.email, details: { invitationId: invitation.id, role: invitation.role } });
    this.audit.record({ action: 'member.joined', teamId: invitation.team.id, actor, targetUserId: user.id, targetEmail: user.email, details: { role: invitation.role } });
  }

  /** The invitation behind a link, if it can still be used: 401 forged, 410 used, revoked or expired. */
  private async usable(token: string): Promise<Invitation> {
    const parsed = parseSecretToken(token);
    const invitation = parsed ? await this.em.findOne(Invitation, { id: parsed.id }, { populate: ['team', 'invitedBy'] }) : null;
    if (!parsed || !invitation || !secretMatches(parsed.secret, invitation.tokenHash)) {
      throw new ApiError(401, 'invitation_invalid', 'This invitation link is not valid. It may have been replaced by a newer one; ask for the latest e-mail.');
    }
    switch (invitation.statusAt(this.clock.now())) {
      case 'accepted':
        throw new ApiError(410, 'invitation_used', 'This invitation was already accepted. Sign in to open the team.');
      case 'revoked':
        throw new ApiError(410, 'invitation_revoked', 'This invitation was withdrawn by the team. Ask its owners for a new one.');
      case 'expired':
        throw new ApiError(410, 'invitation_expired', 'This invitation has expired. Ask the team to send it again.');
      default:
        return invitation;
    }
  }

  private async findInTeam(teamId: string, invitationId: string): Promise<Invitation> {
    const invitation = await this.em.findOne(Invitation, { id: invitationId, team: teamId }, { populate: ['team', 'invitedBy'] });
    if (!invitation) throw new NotFoundException({ statusCode: 404, code: 'invitation_not_found', message: 'No such invitation in this team.' });
    return invitation;
  }

  private expiryFrom(now: Date): Date {
    return new Date(now.getTime() + this.config.get('auth', { infer: true }).invitationTtlSeconds * 1000);
  }

  /**
   * Sends the invitation's e-mail and stores the outcome: `sent`, or `pending` with the next attempt after a
   * backoff (InvitationMailRetryService re-sends it). Never throws for a mail failure; answers whether it went out.
   */
  async deliver(em: EntityManager, invitation: Invitation, token: string): Promise<boolean> {
    const inviter = invitation.invitedBy;
    const message = invitationMail({
      to: invitation.email,
      teamName: invitation.team.name,
      inviterName: inviter?.displayName || 'A colleague',
      role: invitation.role,
      link: `${this.config.get('publicUrl', { infer: true })}/invitations/${token}`,
      expiresAt: invitation.expiresAt,
    });
    let sent = true;
    try {
      await this.mail.send(message);
    } catch (error) {
      sent = false;
      const text = (error as Error).message || String(error);
      this.logger.warn({ event: 'invitation.mail_pending', invitationId: invitation.id, attempt: invitation.mailAttempts + 1, error: text });
      const now = this.clock.now();
      invitation.mailStatus = 'pending';
      invitation.mailAttempts += 1;
      invitation.mailNextAttemptAt = new Date(now.getTime() + mailRetryDelaySeconds(invitation.mailAttempts) * 1000);
      invitation.mailLastError = text.slice(0, 500);
    }
    if (sent) {
      invitation.mailStatus = 'sent';
      invitation.mailAttempts = 0;
      invitation.mailNextAttemptAt = null;
      invitation.mailLastError = null;
      invitation.lastSentAt = this.clock.now();
    }
    await em.flush();
    return sent;
  }
}

/** How long the server waits before trying again after `attempts` failed deliveries: 30 s, 1 min, 2 min, … at most 1 h. */
export function mailRetryDelaySeconds(attempts: number): number {
  return Math.min(30 * 2 ** Math.max(0, attempts - 1), 3600);
}

/** While a send is under way the invitation is pending with a far next attempt, so a server that dies mid-send leaves it to be retried. */
export const IN_FLIGHT_SECONDS = 600;

export function markInFlight(invitation: Invitation, now: Date): void {
  invitation.mailStatus = 'pending';
  invitation.mailNextAttemptAt = new Date(now.getTime() + IN_FLIGHT_SECONDS * 1000);
}

function conflict(code: string, field: string, message: string): ConflictException {
  return new ConflictException({ statusCode: 409, code, message, errors: { [field]: [message] } });
}

function toView(invitation: Invitation, now: Date): InvitationView {
  const by = invitation.invitedBy;
  return {
    id: invitation.id,
    email: invitation.email,
    role: invitation.role,
    status: invitation.statusAt(now),
    invitedBy: by ? { id: by.id, displayName: by.displayName } : null,
    createdAt: invitation.createdAt.toISOString(),
    lastSentAt: invitation.lastSentAt.toISOString(),
    sendCount: invitation.sendCount,
    expiresAt: invitation.expiresAt.toISOString(),
    mailStatus: invitation.mailStatus,
    mailAttempts: invitation.mailAttempts,
    nextMailAttemptAt: invitation.mailStatus === 'pending' && invitation.mailNextAttemptAt ? invitation.mailNextAttemptAt.toISOString() : null,
  };
}
