import { Injectable, Logger, Module, type OnApplicationBootstrap, type OnModuleDestroy } from '@nestjs/common';
import { PostgresThrottlerStorage } from './postgres-throttler.storage';

const HOUR_MS = 3_600_000;

/** Removes finished rate-limit counters at start and hourly. */
@Injectable()
export class RateLimitPruneService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('rate-limit');
  private timer: NodeJS.Timeout | null = null;

  constructor(private readonly storage: PostgresThrottlerStorage) {}

  onApplicationBootstrap(): void {
    const run = () => void this.storage.prune().catch((error: unknown) => this.logger.warn({ event: 'rate_limit.prune_failed', error: (error as Error).message }));
    this.timer = setInterval(run, HOUR_MS);
    this.timer.unref();
    run();
  }

  onModuleDestroy(): void {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
  }
}

/** Rate-limit counters shared by all server instances (PostgreSQL); ThrottlerModule uses the storage it exports. */
@Module({ providers: [PostgresThrottlerStorage, RateLimitPruneService], exports: [PostgresThrottlerStorage] })
export class RateLimitModule {}
