import { once } from 'node:events';
import { HttpException, HttpStatus, Injectable, Logger, type OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import type { Request, Response } from 'express';
import { LIVE_EVENT_NAME, type MapLiveEvent, type SharedLiveEvent } from '@fieldbound/shared';
import type { AppConfig } from '../config/configuration';
import { MapEventsService, toSharedLiveEvent } from './map-events.service';

/** A stream whose unsent output passes this is dropped; the client reconnects and catches up by Last-Event-ID. */
const MAX_BUFFERED_BYTES = 256 * 1024;
/** Events read per query while catching up. */
const PAGE = 500;
/** Wait before reading a map's new events again after a failed read, in ms. */
const READ_RETRY_MS = 1000;
/** Reconnection delay the browser is told to use (the SSE `retry:` field), in ms. */
const RETRY_MS = 2000;

/** Who is listening and what they may see. */
export interface StreamSpec {
  mapId: string;
  /** The signed-in member, or null for a viewing-link holder. */
  userId: string | null;
  /** Set for a viewing-link holder: the stream carries SharedLiveEvent, pin events only with pins. */
  shared: { includePins: boolean } | null;
  /** Events after this id are sent first (from Last-Event-ID); null starts with what happens next. */
  lastEventId: bigint | null;
  /** Checked at every heartbeat; false ends the stream (membership lost, link revoked or expired, map deleted). */
  stillAllowed: () => Promise<boolean>;
  /** When set, the stream ends at this time (the access token's expiry); the client reconnects with a fresh token. */
  endsAt: Date | null;
}

interface Subscriber {
  spec: StreamSpec;
  res: Response;
  /** Id of the newest event sent (or skipped as not for this stream). */
  lastSentId: bigint;
  /** False while catching up: live events wait in `pending`. */
  live: boolean;
  pending: MapLiveEvent[];
  closed: boolean;
  timers: NodeJS.Timeout[];
}

interface Channel {
  mapId: string;
  subscribers: Set<Subscriber>;
  /** Newest event id read for this map on this instance. */
  lastId: bigint;
  pulling: boolean;
  pullAgain: boolean;
}

/**
 * The live streams this server instance holds, grouped by map. New events are read from `map_events`
 * (announced by the LISTEN connection, LiveListenerService) and written to every stream of their map.
 * There is no event bus in memory between instances: each instance reads the rows itself.
 */
@Injectable()
export class LiveHubService implements OnModuleDestroy {
  private readonly logger = new Logger('live');
  private readonly channels = new Map<string, Channel>();
  private readonly perUser = new Map<string, number>();
  private streams = 0;

  constructor(
    private readonly events: MapEventsService,
    private readonly config: ConfigService<AppConfig, true>,
  ) {}

  get streamCount(): number {
    return this.streams;
  }

  /** Refuses a new stream before any header is sent: 503 when this instance is full, 429 when the account has too many. */
  checkCapacity(userId: string | null): void {
    const live = this.config.get('live', { infer: true });
    if (this.streams >= live.maxStreams) {
      throw new HttpException({ statusCode: 503, code: 'too_many_streams', message: 'This server holds as many live streams as it can; try again shortly.' }, HttpStatus.SERVICE_UNAVAILABLE);
    }
    if (userId && (this.perUser.get(userId) ?? 0) >= live.maxStreamsPerUser) {
      throw new HttpException(
        { statusCode: 429, code: 'too_many_streams', message: `You have ${live.maxStreamsPerUser} live streams open already; close some tabs and try again.` },
        HttpStatus.TOO_MANY_REQUESTS,
      );
    }
  }

  /** Opens the stream: headers, catch-up of events after `spec.lastEventId`, then live events until either side closes. */
  async open(req: Request, res: Response, spec: StreamSpec): Promise<void> {
    this.checkCapacity(spec.userId);
    // Known before registering: a new channel starts here, so no committed event is read twice or lost.
    const latest = await this.events.latestId(spec.mapId);

    res.status(200);
    res.setHeader('Content-Type', 'text/event-stream; charset=utf-8');
    // no-transform: proxies and compression must not buffer or rewrite the stream.
    res.setHeader('Cache-Control', 'no-cache, no-store, no-transform');
    res.setHeader('Connection', 'keep-alive');
    // nginx and similar proxies buffer responses unless told not to.
    res.setHeader('X-Accel-Buffering', 'no');
    res.flushHeaders();
    req.socket.setNoDelay(true);
    req.socket.setKeepAlive(true);
    res.write(`retry: ${RETRY_MS}\n: live updates of map ${spec.mapId}\n\n`);

    // An id beyond the map's newest event was not issued by this database (restored or recreated since): start from now.
    const from = spec.lastEventId !== null && spec.lastEventId <= latest ? spec.lastEventId : latest;
    const sub: Subscriber = { spec, res, lastSentId: from, live: false, pending: [], closed: false, timers: [] };
    this.register(sub, latest);
    res.on('close', () => this.unregister(sub));
    // The client may have gone while the first query ran: then 'close' has already fired.
    if (res.destroyed || req.socket.destroyed) {
      this.unregister(sub);
      return;
    }
    this.startTimers(sub);

    try {
      // Catch-up: every event after Last-Event-ID, in id order, waiting for the socket when it is full.
      for (;;) {
        const page = await this.events.after(spec.mapId, sub.lastSentId, PAGE);
        for (const event of page) {
          if (sub.closed) return;
          if (!this.write(sub, event)) await Promise.race([once(res, 'drain'), once(res, 'close')]);
        }
        if (page.length < PAGE) break;
      }
      // Then whatever arrived live meanwhile, then live.
      for (const event of sub.pending.sort((a, b) => (BigInt(a.id) < BigInt(b.id) ? -1 : 1))) this.write(sub, event);
      sub.pending = [];
      sub.live = true;
    } catch (error) {
      this.logger.warn({ event: 'live.catch_up_failed', map: spec.mapId, error: (error as Error).message });
      this.end(sub);
    }
  }

  /** Reads new events of a map (announced by NOTIFY) and sends them to its streams on this instance. */
  notify(mapId: string): void {
    const channel = this.channels.get(mapId);
    if (channel) void this.pull(channel);
  }

  /** After the LISTEN connection came back: reads every event missed meanwhile, per map. */
  pullAll(): void {
    for (const channel of this.channels.values()) void this.pull(channel);
  }

  onModuleDestroy(): void {
    // Open streams would keep the HTTP server from closing.
    for (const channel of [...this.channels.values()]) for (const sub of [...channel.subscribers]) this.end(sub);
  }

  private async pull(channel: Channel): Promise<void> {
    if (channel.pulling) {
      channel.pullAgain = true;
      return;
    }
    channel.pulling = true;
    try {
      do {
        channel.pullAgain = false;
        for (;;) {
          const page = await this.events.after(channel.mapId, channel.lastId, PAGE);
          for (const event of page) {
            channel.lastId = BigInt(event.id);
            for (const sub of channel.subscribers) {
              if (sub.live) this.write(sub, event);
              else sub.pending.push(event);
            }
          }
          if (page.length < PAGE) break;
        }
      } while (channel.pullAgain);
    } catch (error) {
      // The database is away: try again shortly (the listener also pulls every map when it reconnects).
      this.logger.warn({ event: 'live.read_failed', map: channel.mapId, error: (error as Error).message });
      setTimeout(() => {
        if (this.channels.get(channel.mapId) === channel) void this.pull(channel);
      }, READ_RETRY_MS).unref();
    } finally {
      channel.pulling = false;
    }
  }

  /** Writes one event if it is new for this stream; false when the socket asks to wait (drain). */
  private write(sub: Subscriber, event: MapLiveEvent): boolean {
    const id = BigInt(event.id);
    if (sub.closed || id <= sub.lastSentId) return true;
    sub.lastSentId = id;
    const data: MapLiveEvent | SharedLiveEvent | null = sub.spec.shared ? toSharedLiveEvent(event, sub.spec.shared.includePins) : event;
    if (!data) return true;
    const ok = sub.res.write(`id: ${event.id}\nevent: ${LIVE_EVENT_NAME}\ndata: ${JSON.stringify(data)}\n\n`);
    if (sub.live && sub.res.writableLength > MAX_BUFFERED_BYTES) {
      // A client that does not read: drop it rather than hold memory; it catches up when it reconnects.
      this.logger.warn({ event: 'live.slow_client_dropped', map: sub.spec.mapId });
      this.end(sub);
    }
    return ok;
  }

  private register(sub: Subscriber, latest: bigint): void {
    let channel = this.channels.get(sub.spec.mapId);
    if (!channel) {
      channel = { mapId: sub.spec.mapId, subscribers: new Set(), lastId: latest, pulling: false, pullAgain: false };
      this.channels.set(sub.spec.mapId, channel);
    }
    channel.subscribers.add(sub);
    this.streams += 1;
    if (sub.spec.userId) this.perUser.set(sub.spec.userId, (this.perUser.get(sub.spec.userId) ?? 0) + 1);
  }

  private unregister(sub: Subscriber): void {
    if (sub.closed) return;
    sub.closed = true;
    for (const timer of sub.timers) clearTimeout(timer);
    const channel = this.channels.get(sub.spec.mapId);
    if (channel?.subscribers.delete(sub)) {
      this.streams -= 1;
      if (sub.spec.userId) {
        const left = (this.perUser.get(sub.spec.userId) ?? 1) - 1;
        if (left > 0) this.perUser.set(sub.spec.userId, left);
        else this.perUser.delete(sub.spec.userId);
      }
      if (channel.subscribers.size === 0) this.channels.delete(sub.spec.mapId);
    }
  }

  private end(sub: Subscriber): void {
    this.unregister(sub);
    if (!sub.res.writableEnded) sub.res.end();
  }

  private startTimers(sub: Subscriber): void {
    const heartbeatMs = this.config.get('live', { infer: true }).heartbeatMs;
    const beat = setInterval(() => {
      if (sub.closed) return;
      sub.res.write(': heartbeat\n\n');
      sub.spec.stillAllowed().then(
        (allowed) => {
          if (!allowed) this.end(sub);
        },
        // The database is away: keep the stream; the next beat checks again.
        () => undefined,
      );
    }, heartbeatMs);
    sub.timers.push(beat);
    if (sub.spec.endsAt) {
      // setTimeout holds at most 2³¹−1 ms.
      const ms = Math.min(Math.max(0, sub.spec.endsAt.getTime() - Date.now()), 2 ** 31 - 1);
      sub.timers.push(setTimeout(() => this.end(sub), ms));
    }
  }
}
