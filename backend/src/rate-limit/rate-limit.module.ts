import { Injectable, Logger, Module, type OnApplicationBootstrap, type OnModuleDestroy } from '@nestjs/common';
import { startRepeatingJob } from '../common/repeating-job';
import { PostgresThrottlerStorage } from './postgres-throttler.storage';

const HOUR_MS = 3_600_000;

/** Removes finished rate-limit counters at start and hourly. */
@Injectable()
export class RateLimitPruneService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('rate-limit');
  private stop: (() => void) | null = null;

  constructor(private readonly storage: PostgresThrottlerStorage) {}

  onApplicationBootstrap(): void {
    this.stop = startRepeatingJob(() => this.storage.prune(), HOUR_MS, this.logger, 'rate_limit.prune_failed');
  }

  onModuleDestroy(): void {
    this.stop?.();
    this.stop = null;
  }
}

/** Rate-limit counters shared by all server instances (PostgreSQL); ThrottlerModule uses the storage it exports. */
@Module({ providers: [PostgresThrottlerStorage, RateLimitPruneService], exports: [PostgresThrottlerStorage] })
export class RateLimitModule {}
