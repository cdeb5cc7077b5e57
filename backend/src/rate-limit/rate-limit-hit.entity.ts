import { Entity, Index, PrimaryKey, Property } from '@mikro-orm/core';

/**
 * A rate-limit counter shared by every server instance: hits of one key (throttler, route, address)
 * in the fixed window ending at `expiresAt`, and the end of a block once the limit was passed.
 * Written only with one atomic upsert (PostgresThrottlerStorage); expired rows are pruned.
 */
@Entity({ tableName: 'rate_limit_hits' })
@Index({ name: 'rate_limit_hits_expires_at_index', properties: ['expiresAt'] })
export class RateLimitHit {
  @PrimaryKey({ type: 'string', length: 200 })
  key!: string;

  @Property({ type: 'integer' })
  hits!: number;

  @Property({ type: 'datetime' })
  expiresAt!: Date;

  @Property({ type: 'datetime', nullable: true })
  blockedUntil: Date | null = null;
}
