import type { AuditEventView as SharedAuditEventView } from '@fieldbound/shared';
import { Injectable } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import { Clock } from '../common/clock';
import { AuditEvent, type AuditAction } from './audit-event.entity';

export interface AuditEntry {
  action: AuditAction;
  teamId?: string | null;
  actor?: { id: string; email: string } | null;
  targetUserId?: string | null;
  targetEmail?: string | null;
  details?: Record<string, unknown> | null;
  ip?: string | null;
}

export type AuditEventView = SharedAuditEventView<AuditAction>;

/**
 * Writes audit events. `record` only persists: the event is flushed together with the change it
 * describes (one flush per use case), so a rolled-back change leaves no event behind.
 */
@Injectable()
export class AuditService {
  constructor(
    private readonly em: EntityManager,
    private readonly clock: Clock,
  ) {}

  /** Persists the event in `em` (pass the transaction's EntityManager inside `em.transactional`). */
  /** Strictly increasing stamps within this process, so events of one use case keep their order. */
  private lastStamp = 0;

  record(entry: AuditEntry, em: EntityManager = this.em): AuditEvent {
    const event = new AuditEvent(entry.action);
    event.teamId = entry.teamId ?? null;
    event.actorId = entry.actor?.id ?? null;
    event.actorEmail = entry.actor?.email ?? null;
    event.targetUserId = entry.targetUserId ?? null;
    event.targetEmail = entry.targetEmail ?? null;
    event.details = entry.details ?? null;
    event.ip = entry.ip ?? null;
    const stamp = Math.max(this.clock.now().getTime(), this.lastStamp + 1);
    this.lastStamp = stamp;
    event.createdAt = new Date(stamp);
    em.persist(event);
    return event;
  }

  /** A team's events, newest first, `limit` at a time; `before` (an ISO time) pages back. */
  async forTeam(teamId: string, options: { limit: number; before?: Date }): Promise<AuditEventView[]> {
    const events = await this.em.find(
      AuditEvent,
      { teamId, ...(options.before ? { createdAt: { $lt: options.before } } : {}) },
      { orderBy: { createdAt: 'desc', id: 'desc' }, limit: options.limit },
    );
    return events.map(toView);
  }

  /** The signed-in person's own account events (sign-ins, password changes), newest first. */
  async forActor(userId: string, limit: number): Promise<AuditEventView[]> {
    const events = await this.em.find(
      AuditEvent,
      { $or: [{ actorId: userId }, { targetUserId: userId }], teamId: null, action: { $like: 'auth.%' } },
      { orderBy: { createdAt: 'desc', id: 'desc' }, limit },
    );
    return events.map(toView);
  }
}

function toView(event: AuditEvent): AuditEventView {
  return {
    id: event.id,
    action: event.action,
    actorId: event.actorId,
    actorEmail: event.actorEmail,
    targetUserId: event.targetUserId,
    targetEmail: event.targetEmail,
    details: event.details,
    createdAt: event.createdAt.toISOString(),
  };
}
