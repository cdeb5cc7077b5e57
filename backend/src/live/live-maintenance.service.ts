import { Injectable, Logger, type OnApplicationBootstrap, type OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { startRepeatingJob } from '../common/repeating-job';
import type { AppConfig } from '../config/configuration';
import { MapEventsService } from './map-events.service';

const HOUR_MS = 3_600_000;

/** Deletes map events older than the retention (FIELDBOUND_EVENT_RETENTION_DAYS, 7 by default), at start and hourly. */
@Injectable()
export class LiveMaintenanceService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('live');
  private stop: (() => void) | null = null;

  constructor(
    private readonly events: MapEventsService,
    private readonly config: ConfigService<AppConfig, true>,
  ) {}

  onApplicationBootstrap(): void {
    this.stop = startRepeatingJob(() => this.prune(), HOUR_MS, this.logger, 'live.prune_failed');
  }

  onModuleDestroy(): void {
    this.stop?.();
    this.stop = null;
  }

  async prune(): Promise<number> {
    const count = await this.events.prune(this.config.get('live', { infer: true }).retentionDays);
    if (count > 0) this.logger.log({ event: 'live.events_pruned', count });
    return count;
  }
}
