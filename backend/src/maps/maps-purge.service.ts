import { Injectable, Logger, type OnApplicationBootstrap, type OnModuleDestroy } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import { MAP_LIMITS } from '@fieldbound/shared';
import { Clock } from '../common/clock';
import { SavedMap } from './map.entity';

const HOUR_MS = 3_600_000;

/**
 * Empties the bin: maps deleted more than MAP_LIMITS.restoreWindowDays ago are removed for good, with
 * their versions, pins, threads and viewing links (foreign keys cascade). Runs at start and hourly.
 */
@Injectable()
export class MapsPurgeService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('maps');
  private timer: NodeJS.Timeout | null = null;

  constructor(
    private readonly em: EntityManager,
    private readonly clock: Clock,
  ) {}

  onApplicationBootstrap(): void {
    const run = () => void this.purgeExpired().catch((error: unknown) => this.logger.warn({ event: 'maps.purge_failed', error: (error as Error).message }));
    this.timer = setInterval(run, HOUR_MS);
    this.timer.unref();
    run();
  }

  onModuleDestroy(): void {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
  }

  /** Deletes maps whose restore window has passed; returns how many. Uses its own EntityManager (no request context). */
  async purgeExpired(now: Date = this.clock.now()): Promise<number> {
    const cutoff = new Date(now.getTime() - MAP_LIMITS.restoreWindowDays * 86_400_000);
    const count = await this.em.fork().nativeDelete(SavedMap, { deletedAt: { $lte: cutoff } });
    if (count > 0) this.logger.log({ event: 'maps.purged', count });
    return count;
  }
}
