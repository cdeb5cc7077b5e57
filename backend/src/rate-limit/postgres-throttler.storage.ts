import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { EntityManager } from '@mikro-orm/postgresql';
import type { ThrottlerStorage } from '@nestjs/throttler';
import type { AppConfig } from '../config/configuration';

type ThrottlerStorageRecord = Awaited<ReturnType<ThrottlerStorage['increment']>>;

interface HitRow {
  hits: number;
  expires_in_ms: string | number;
  blocked_for_ms: string | number | null;
}

/**
 * One statement per hit, atomic under concurrency (INSERT … ON CONFLICT DO UPDATE locks the row), timed by
 * the database's clock so every instance agrees. A fixed window per key: the first hit opens a window of
 * `ttl`; a hit past `limit` blocks the key for `blockDuration`; the first hit after the block (or after
 * the window) starts a new window. While blocked, hits are not counted (as in the in-memory storage).
 */
const INCREMENT = `
with now as (select clock_timestamp() as t)
insert into rate_limit_hits as r (key, hits, expires_at, blocked_until)
select ?, 1, now.t + make_interval(secs => ?::double precision / 1000),
       case when 1 > ? then now.t + make_interval(secs => ?::double precision / 1000) end
from now
on conflict (key) do update set
  hits = case
    when r.blocked_until > (select t from now) then r.hits
    when r.blocked_until is not null or r.expires_at <= (select t from now) then 1
    else r.hits + 1 end,
  expires_at = case
    when r.blocked_until > (select t from now) then r.expires_at
    when r.blocked_until is not null or r.expires_at <= (select t from now) then excluded.expires_at
    else r.expires_at end,
  blocked_until = case
    when r.blocked_until > (select t from now) then r.blocked_until
    when r.blocked_until is null and r.expires_at > (select t from now) and r.hits + 1 > ?
      then (select t from now) + make_interval(secs => ?::double precision / 1000)
    when (r.blocked_until is not null or r.expires_at <= (select t from now)) and 1 > ?
      then (select t from now) + make_interval(secs => ?::double precision / 1000)
    else null end
returning hits,
  extract(epoch from (expires_at - (select t from now))) * 1000 as expires_in_ms,
  extract(epoch from (blocked_until - (select t from now))) * 1000 as blocked_for_ms`;

/**
 * Rate-limit counters in PostgreSQL (`rate_limit_hits`), so a limit holds for a client whichever server
 * instance it reaches. Used by every ThrottlerGuard of the application (ThrottlerModule's `storage`).
 */
@Injectable()
export class PostgresThrottlerStorage implements ThrottlerStorage {
  private readonly scope: string;

  constructor(
    private readonly em: EntityManager,
    config: ConfigService<AppConfig, true>,
  ) {
    const scope = config.get('rateLimitScope', { infer: true });
    this.scope = scope ? `${scope}:` : '';
  }

  async increment(key: string, ttl: number, limit: number, blockDuration: number, throttlerName: string): Promise<ThrottlerStorageRecord> {
    const fullKey = `${this.scope}${throttlerName}:${key}`.slice(0, 200);
    const block = blockDuration > 0 ? blockDuration : ttl;
    const [row] = await this.em.execute<HitRow[]>(INCREMENT, [fullKey, ttl, limit, block, limit, block, limit, block]);
    const blockedForMs = row.blocked_for_ms === null ? 0 : Number(row.blocked_for_ms);
    return {
      totalHits: row.hits,
      timeToExpire: Math.max(0, Math.ceil(Number(row.expires_in_ms) / 1000)),
      isBlocked: blockedForMs > 0,
      timeToBlockExpire: Math.max(0, Math.ceil(blockedForMs / 1000)),
    };
  }

  /** Deletes counters whose window and block have both ended; returns how many. */
  async prune(): Promise<number> {
    const result = await this.em.execute<{ affectedRows: number }>('delete from rate_limit_hits where expires_at < clock_timestamp() and (blocked_until is null or blocked_until < clock_timestamp())', [], 'run');
    return result.affectedRows ?? 0;
  }
}
