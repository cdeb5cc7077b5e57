import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { EntityManager } from '@mikro-orm/postgresql';
import type { HealthResponse } from '@fieldbound/shared';
import type { AppConfig } from '../config/configuration';

@Injectable()
export class HealthService {
  constructor(
    private readonly em: EntityManager,
    private readonly config: ConfigService<AppConfig, true>,
  ) {}

  async check(): Promise<HealthResponse> {
    const started = performance.now();
    let database: HealthResponse['database'];
    try {
      // A real round trip: the answer depends on the server we talk to.
      const rows = await this.em.getConnection().execute<{ version: string }[]>('select current_setting(\'server_version\') as version');
      database = { status: 'up', latencyMs: Math.round((performance.now() - started) * 100) / 100, serverVersion: rows[0]?.version ?? null };
    } catch {
      database = { status: 'down', latencyMs: null, serverVersion: null };
    }
    return {
      status: database.status === 'up' ? 'ok' : 'degraded',
      version: this.config.get('version', { infer: true }),
      database,
      time: new Date().toISOString(),
    };
  }
}
