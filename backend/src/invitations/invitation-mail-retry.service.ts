import { Injectable, Logger, type OnApplicationBootstrap, type OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { LockMode } from '@mikro-orm/core';
import { EntityManager } from '@mikro-orm/postgresql';
import type { AppConfig } from '../config/configuration';
import { Clock } from '../common/clock';
import { newSecretToken } from '../common/secret-token';
import { Invitation } from './invitation.entity';
import { InvitationsService, markInFlight } from './invitations.service';

/** At most this many invitations per round, so one round stays short. */
const BATCH = 20;

/**
 * Re-sends invitation e-mails that could not be delivered (mail server down or refusing). The state lives in
 * the `invitations` row (`mail_status`, `mail_attempts`, `mail_next_attempt_at`), so nothing is lost when the
 * server restarts, and several instances share the work: each round claims due rows with
 * `FOR UPDATE SKIP LOCKED` and pushes their next attempt out before sending, so no two instances send one
 * invitation at once. Each retry carries a new link (only the secret's hash is stored; the undelivered old
 * link is replaced). Invitations that were accepted, revoked or have expired are not retried.
 */
@Injectable()
export class InvitationMailRetryService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('invitations');
  private timer: NodeJS.Timeout | null = null;
  private running: Promise<number> | null = null;

  constructor(
    private readonly em: EntityManager,
    private readonly clock: Clock,
    private readonly invitations: InvitationsService,
    private readonly config: ConfigService<AppConfig, true>,
  ) {}

  onApplicationBootstrap(): void {
    const seconds = this.config.get('mail', { infer: true }).retryIntervalSeconds;
    if (!seconds) return;
    this.timer = setInterval(() => {
      this.deliverDue().catch((error: unknown) => this.logger.warn({ event: 'invitation.mail_retry_failed', error: (error as Error).message }));
    }, seconds * 1000);
    this.timer.unref();
  }

  async onModuleDestroy(): Promise<void> {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
    await this.running?.catch(() => undefined);
  }

  /** One round: sends every due pending invitation e-mail; answers how many went out. Rounds never overlap in one process. */
  deliverDue(): Promise<number> {
    if (!this.running) {
      this.running = this.round().finally(() => {
        this.running = null;
      });
    }
    return this.running;
  }

  private async round(): Promise<number> {
    const em = this.em.fork();
    const now = this.clock.now();
    const claimed = await em.transactional(async (tx) => {
      const due = await tx.find(
        Invitation,
        { mailStatus: 'pending', mailNextAttemptAt: { $lte: now }, acceptedAt: null, revokedAt: null, expiresAt: { $gt: now } },
        { orderBy: { mailNextAttemptAt: 'asc' }, limit: BATCH, lockMode: LockMode.PESSIMISTIC_PARTIAL_WRITE },
      );
      return new Map(
        due.map((invitation) => {
          const secret = newSecretToken(invitation.id);
          invitation.tokenHash = secret.hash;
          markInFlight(invitation, now);
          return [invitation.id, secret.token] as const;
        }),
      );
    });
    if (!claimed.size) return 0;
    const invitations = await em.find(Invitation, { id: { $in: [...claimed.keys()] } }, { populate: ['team', 'invitedBy'], refresh: true });
    let sent = 0;
    for (const invitation of invitations) {
      const token = claimed.get(invitation.id)!;
      if (await this.invitations.deliver(em, invitation, token)) {
        sent++;
        this.logger.log({ event: 'invitation.mail_resent', invitationId: invitation.id });
      }
    }
    return sent;
  }
}
