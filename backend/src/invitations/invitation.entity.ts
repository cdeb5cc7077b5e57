import { Entity, Enum, Index, ManyToOne, type Opt, PrimaryKey, Property } from '@mikro-orm/core';
import { Team } from '../teams/team.entity';
import { TEAM_ROLES, type TeamRole } from '../teams/team-role';
import { User } from '../users/user.entity';

export type InvitationStatus = 'pending' | 'accepted' | 'revoked' | 'expired';
/** `pending`: the e-mail could not be delivered yet and is re-sent automatically (InvitationMailRetryService). */
export type InvitationMailStatus = 'sent' | 'pending';

/**
 * An e-mailed invitation to join a team with a role. The link carries `<id>.<secret>`; only the
 * secret's SHA-256 is stored. Re-sending replaces the secret (the old link stops working) and
 * restarts the expiry; accepting or revoking ends it for good.
 */
@Entity({ tableName: 'invitations' })
@Index({ name: 'invitations_team_index', properties: ['team'] })
@Index({
  name: 'invitations_mail_due_index',
  expression: `create index "invitations_mail_due_index" on "invitations" ("mail_next_attempt_at") where "mail_status" = 'pending'`,
})
export class Invitation {
  @PrimaryKey({ type: 'uuid' })
  id: string;

  @ManyToOne(() => Team, { deleteRule: 'cascade' })
  team: Team;

  /** Lower-cased address the invitation was sent to. */
  @Property({ type: 'string', length: 254 })
  email: string;

  @Enum({ items: () => [...TEAM_ROLES], type: 'string' })
  role: TeamRole;

  @ManyToOne(() => User, { deleteRule: 'set null', nullable: true })
  invitedBy: User | null;

  @Property({ type: 'string', length: 64, hidden: true })
  tokenHash: string;

  @Property({ type: 'datetime' })
  createdAt: Date;

  @Property({ type: 'datetime' })
  lastSentAt: Date;

  @Property({ type: 'integer' })
  sendCount: number & Opt = 1;

  @Property({ type: 'datetime' })
  expiresAt: Date;

  @Property({ type: 'datetime', nullable: true })
  acceptedAt: Date | null = null;

  @ManyToOne(() => User, { deleteRule: 'set null', nullable: true })
  acceptedBy: User | null = null;

  @Property({ type: 'datetime', nullable: true })
  revokedAt: Date | null = null;

  @Enum({ items: () => ['sent', 'pending'], type: 'string', default: 'sent' })
  mailStatus: InvitationMailStatus & Opt = 'sent';

  /** Failed deliveries since the last successful one. */
  @Property({ type: 'integer', default: 0 })
  mailAttempts: number & Opt = 0;

  @Property({ type: 'datetime', nullable: true })
  mailNextAttemptAt: Date | null = null;

  @Property({ type: 'string', length: 500, nullable: true })
  mailLastError: string | null = null;

  constructor(init: { id: string; team: Team; email: string; role: TeamRole; invitedBy: User; tokenHash: string; now: Date; expiresAt: Date }) {
    this.id = init.id;
    this.team = init.team;
    this.email = init.email.trim().toLowerCase();
    this.role = init.role;
    this.invitedBy = init.invitedBy;
    this.tokenHash = init.tokenHash;
    this.createdAt = init.now;
    this.lastSentAt = init.now;
    this.expiresAt = init.expiresAt;
  }

  statusAt(now: Date): InvitationStatus {
    if (this.acceptedAt) return 'accepted';
    if (this.revokedAt) return 'revoked';
    if (this.expiresAt.getTime() <= now.getTime()) return 'expired';
    return 'pending';
  }
}
