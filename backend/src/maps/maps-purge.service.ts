import { Injectable, Logger, type OnApplicationBootstrap, type OnModuleDestroy } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import { MAP_LIMITS } from '@fieldbound/shared';
import { Clock } from '../common/clock';
import { startRepeatingJob } from '../common/repeating-job';
import { SavedMap } from './map.entity';

const HOUR_MS = 3_600_000;

/**
 * Empties the bin: maps deleted more than MAP_LIMITS.restoreWindowDays ago are removed for good, with
 * their versions, pins, threads and viewing links (foreign keys cascade). Runs at start and hourly.
 */
@Injectable()
export class MapsPurgeService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('maps');
  private stop: (() => void) | null = null;

  constructor(
    private readonly em: EntityManager,
    private readonly clock: Clock,
  ) {}

  onApplicationBootstrap(): void {
    this.stop = startRepeatingJob(() => this.purgeExpired(), HOUR_MS, this.logger, 'maps.purge_failed');
  }

  onModuleDestroy(): void {
    this.stop?.();
    this.stop = null;
  }

  /** Deletes maps whose restore window has passed; returns how many. Uses its own EntityManager (no request context). */
  async purgeExpired(now: Date = this.clock.now()): Promise<number> {
    const cutoff = new Date(now.getTime() - MAP_LIMITS.restoreWindowDays * 86_400_000);
    const count = await this.em.fork().nativeDelete(SavedMap, { deletedAt: { $lte: cutoff } });
    if (count > 0) this.logger.log({ event: 'maps.purged', count });
    return count;
  }
}
