import type { PersonRef } from './common.js';
import type { PinReplyView, PinView } from './pins.js';
import type { SharedPin } from './links.js';

/**
 * Live updates of one map, carried as server-sent events.
 *
 * - Members: `GET /api/maps/:mapId/events` (Authorization header, so the browser uses a fetch-based
 *   event-source client rather than `EventSource`).
 * - Link holders: `GET /api/view/:token/events` (no sign-in; pin events only when the link shows pins).
 *
 * Every event is stored before it is announced (PostgreSQL `NOTIFY`), so any server instance can deliver
 * it. The SSE `id:` field is the event's `id`; a client that reconnects sends it back as `Last-Event-ID`
 * and first receives every later event of the map (catch-up), then live ones. Events are sent with
 * `event: map` and JSON `data:`; the server also sends a comment line every 15 s as a heartbeat.
 */
interface LiveEventBase {
  /** Monotonic per database (a bigint as a decimal string); compare with BigInt, not as text. */
  id: string;
  mapId: string;
  /** ISO 8601 time the change was committed. */
  at: string;
  /** Who made the change; null for link holders' streams and for deleted accounts. */
  actor: PersonRef | null;
}

export type MapLiveEvent = LiveEventBase &
  (
    | { kind: 'pin.created'; pin: PinView }
    /** Moved, reshaped, edited, resolved or reopened: the pin as it is now. */
    | { kind: 'pin.updated'; pin: PinView }
    | { kind: 'pin.deleted'; pinId: string }
    | { kind: 'pin.replied'; pinId: string; reply: PinReplyView; replyCount: number }
    /** A new version of the map's setup was saved. */
    | { kind: 'map.saved'; version: number; title: string; updatedAt: string }
  );

/** What a link holder's stream carries: pins without authors or threads, and map saves. */
export type SharedLiveEvent = Omit<LiveEventBase, 'actor'> &
  (
    | { kind: 'pin.created' | 'pin.updated'; pin: SharedPin }
    | { kind: 'pin.deleted'; pinId: string }
    | { kind: 'map.saved'; version: number; title: string; updatedAt: string }
  );

export const LIVE_EVENT_NAME = 'map';
export const LIVE_HEARTBEAT_MS = 15_000;
