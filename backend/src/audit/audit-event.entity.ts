import crypto from 'node:crypto';
import { Entity, Index, type Opt, PrimaryKey, Property } from '@mikro-orm/core';

/**
 * What happened, who did it, to whom, and when. Rows are only ever inserted.
 * Team events (membership, roles, invitations) carry the team; sign-ins carry none.
 */
export const AUDIT_ACTIONS = [
  'auth.registered',
  'auth.signed_in',
  'auth.sign_in_failed',
  'auth.signed_out',
  'auth.password_changed',
  'auth.password_reset_requested',
  'auth.password_reset',
  'auth.refresh_token_reused',
  'team.created',
  'team.renamed',
  'team.deleted',
  'member.joined',
  'member.role_changed',
  'member.removed',
  'member.left',
  'invitation.created',
  'invitation.resent',
  'invitation.revoked',
  'invitation.accepted',
] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];

@Entity({ tableName: 'audit_events' })
@Index({ name: 'audit_events_team_created_index', properties: ['teamId', 'createdAt'] })
@Index({ name: 'audit_events_actor_created_index', properties: ['actorId', 'createdAt'] })
export class AuditEvent {
  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @Property({ type: 'string', length: 60 })
  action: AuditAction;

  /** Kept as plain ids, not foreign keys, so the log outlives deleted teams and accounts. */
  @Property({ type: 'uuid', nullable: true })
  teamId: string | null = null;

  @Property({ type: 'uuid', nullable: true })
  actorId: string | null = null;

  @Property({ type: 'string', length: 254, nullable: true })
  actorEmail: string | null = null;

  @Property({ type: 'uuid', nullable: true })
  targetUserId: string | null = null;

  @Property({ type: 'string', length: 254, nullable: true })
  targetEmail: string | null = null;

  @Property({ type: 'json', nullable: true })
  details: Record<string, unknown> | null = null;

  @Property({ type: 'string', length: 64, nullable: true })
  ip: string | null = null;

  @Property({ type: 'datetime' })
  createdAt: Date & Opt = new Date();

  constructor(action: AuditAction) {
    this.action = action;
  }
}
