import { Injectable, Logger, type OnApplicationBootstrap, type OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { Client, type Notification } from 'pg';
import type { AppConfig } from '../config/configuration';
import { LiveHubService } from './live-hub.service';

/** The NOTIFY channel the `map_events` trigger announces on (migration Migration20261202030000_live_events). */
export const MAP_EVENTS_CHANNEL = 'map_events';
/** `application_name` of the LISTEN connection, so operators (and tests) can find it in pg_stat_activity. */
export const LISTENER_APPLICATION_NAME = 'fieldbound-live';
const MIN_BACKOFF_MS = 250;
const MAX_BACKOFF_MS = 10_000;
/** A query on the LISTEN connection this often, so a connection that died silently is noticed. */
const PING_MS = 30_000;

/**
 * One dedicated PostgreSQL connection per server instance that LISTENs for map events. On each
 * notification the hub reads the new rows of that map (only when this instance has streams for it).
 * When the connection drops (database restart, network), it reconnects with exponential backoff and
 * then reads, for every map with streams here, the events committed while it was away.
 */
@Injectable()
export class LiveListenerService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('live');
  private client: Client | null = null;
  private stopped = false;
  private attempt = 0;
  private retryTimer: NodeJS.Timeout | null = null;
  private pingTimer: NodeJS.Timeout | null = null;
  private connectedOnce = false;
  /** True while the LISTEN connection is up. */
  listening = false;

  constructor(
    private readonly hub: LiveHubService,
    private readonly config: ConfigService<AppConfig, true>,
  ) {}

  onApplicationBootstrap(): void {
    // In the background: the server starts (and answers 503) even when the database is away.
    void this.connect();
  }

  async onModuleDestroy(): Promise<void> {
    this.stopped = true;
    if (this.retryTimer) clearTimeout(this.retryTimer);
    if (this.pingTimer) clearInterval(this.pingTimer);
    const client = this.client;
    this.client = null;
    this.listening = false;
    if (client) await client.end().catch(() => undefined);
  }

  private async connect(): Promise<void> {
    if (this.stopped) return;
    const db = this.config.get('database', { infer: true });
    const client = new Client({
      host: db.host,
      port: db.port,
      user: db.user,
      password: db.password,
      database: db.name,
      application_name: LISTENER_APPLICATION_NAME,
      connectionTimeoutMillis: 3000,
      keepAlive: true,
    });
    this.client = client;
    let failed = false;
    const fail = (error: Error | null) => {
      if (failed) return;
      failed = true;
      this.listening = false;
      if (this.pingTimer) clearInterval(this.pingTimer);
      this.pingTimer = null;
      if (this.client === client) this.client = null;
      client.removeAllListeners('notification');
      void client.end().catch(() => undefined);
      if (this.stopped) return;
      this.logger.warn({ event: 'live.listener_lost', error: error?.message ?? 'connection ended' });
      this.scheduleReconnect();
    };
    client.on('error', (error) => fail(error));
    client.on('end', () => fail(null));
    client.on('notification', (message: Notification) => this.onNotification(message));
    try {
      await client.connect();
      await client.query(`listen ${MAP_EVENTS_CHANNEL}`);
    } catch (error) {
      fail(error as Error);
      return;
    }
    if (this.stopped) {
      await client.end().catch(() => undefined);
      return;
    }
    this.attempt = 0;
    this.listening = true;
    this.pingTimer = setInterval(() => void client.query('select 1').catch((error: Error) => fail(error)), PING_MS);
    this.pingTimer.unref();
    if (this.connectedOnce) this.logger.log({ event: 'live.listener_reconnected' });
    this.connectedOnce = true;
    // Whatever was committed while no connection listened.
    this.hub.pullAll();
  }

  private scheduleReconnect(): void {
    if (this.retryTimer || this.stopped) return;
    const base = Math.min(MAX_BACKOFF_MS, MIN_BACKOFF_MS * 2 ** this.attempt);
    this.attempt += 1;
    const delay = base / 2 + Math.random() * (base / 2);
    this.retryTimer = setTimeout(() => {
      this.retryTimer = null;
      void this.connect();
    }, delay);
    this.retryTimer.unref();
  }

  private onNotification(message: Notification): void {
    if (message.channel !== MAP_EVENTS_CHANNEL || !message.payload) return;
    try {
      const { mapId } = JSON.parse(message.payload) as { id: string; mapId: string };
      if (typeof mapId === 'string') this.hub.notify(mapId);
    } catch {
      this.logger.warn({ event: 'live.bad_notification' });
    }
  }
}
