// Live updates of one map over server-sent events (contract: shared/src/api/live.ts). A fetch-based client, so the
// member stream can carry the Authorization header; we reconnect ourselves (backoff, fresh token, Last-Event-ID) and
// apply each event to the TanStack Query caches with setQueryData. Only a gap we cannot close (no event id to resume
// from) refetches, and then only the pin list.
import { useEffect, useRef, useState } from 'react';
import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { fetchEventSource, type EventSourceMessage } from '@microsoft/fetch-event-source';
import { LIVE_EVENT_NAME, type MapDetail, type MapLiveEvent, type SharedLiveEvent, type SharedMapView } from '@fieldbound/shared';
import { meKey } from './auth';
import { refreshSession, session } from './client';
import type { MeView } from './types';
import { mapKeys } from './maps';
import { dropPin, pinKeys, storePin, storeReply } from './pins';
import { viewingLinkKeys } from './viewingLinks';

export type LiveStatus = 'connecting' | 'live' | 'reconnecting' | 'closed';

export interface LiveConnectionOptions {
  /** Path under /api, e.g. `/maps/<id>/events`. */
  path: string;
  /** Send the access token (members' stream); false for a viewing link's public stream. */
  auth: boolean;
  onEvent: (event: unknown) => void;
  /** The stream is open; `resumed` when it continues from the last event seen (the server caught us up). */
  onOpen?: (resumed: boolean) => void;
  onStatus?: (status: LiveStatus) => void;
  /** Tests pass a fake fetch and a quick backoff. */
  fetch?: typeof fetch;
  backoffMs?: (attempt: number) => number;
}

class Reconnect extends Error {}
class Refused extends Error {
  constructor(readonly status: number) {
    super(`The live stream was refused (${status})`);
  }
}

/** 1 s, 2 s, 4 s … up to 30 s, with some jitter so many viewers do not reconnect in the same instant. */
export function defaultBackoff(attempt: number): number {
  const base = Math.min(30_000, 1000 * 2 ** Math.max(0, attempt - 1));
  return base * (0.75 + Math.random() * 0.5);
}

/** Opens the stream and keeps it open until the returned function is called. */
export function connectLive(options: LiveConnectionOptions): () => void {
  const { path, auth, onEvent, onOpen, onStatus, backoffMs = defaultBackoff } = options;
  const controller = new AbortController();
  let lastEventId: string | null = null;
  let attempt = 0;
  let stopped = false;
  let wake: (() => void) | null = null;

  const sleep = (ms: number) =>
    new Promise<void>((resolve) => {
      const timer = setTimeout(resolve, ms);
      wake = () => {
        clearTimeout(timer);
        resolve();
      };
    });

  const run = async () => {
    while (!stopped) {
      onStatus?.(attempt === 0 ? 'connecting' : 'reconnecting');
      const headers: Record<string, string> = { Accept: 'text/event-stream' };
      if (auth) {
        if (!session.token) await refreshSession();
        if (session.token) headers.Authorization = `Bearer ${session.token}`;
      }
      const resuming = lastEventId;
      if (resuming) headers['Last-Event-ID'] = resuming;
      try {
        await fetchEventSource(`/api${path}`, {
          signal: controller.signal,
          headers,
          openWhenHidden: true,
          fetch: options.fetch,
          onopen: async (response) => {
            const type = response.headers.get('content-type') ?? '';
            if (response.ok && type.startsWith('text/event-stream')) {
              attempt = 0;
              onStatus?.('live');
              onOpen?.(resuming !== null);
              return;
            }
            if (response.status === 401 && auth) {
              await refreshSession();
              throw new Reconnect();
            }
            // The id we resume from is unknown to the server (too old, another database): start over without it.
            if (resuming && (response.status === 400 || response.status === 409 || response.status === 410 || response.status === 412)) {
              lastEventId = null;
              throw new Reconnect();
            }
            if (response.status === 403 || response.status === 404 || response.status === 410) throw new Refused(response.status);
            throw new Reconnect();
          },
          onmessage: (message: EventSourceMessage) => {
            if (message.id) lastEventId = message.id;
            if (message.event !== LIVE_EVENT_NAME || !message.data) return;
            try {
              onEvent(JSON.parse(message.data));
            } catch {
              // A malformed event is skipped; the next one still applies.
            }
          },
          onclose: () => {
            throw new Reconnect();
          },
          onerror: (error: unknown) => {
            throw error; // no retry inside the library: this loop reconnects with a fresh token and Last-Event-ID
          },
        });
      } catch (error) {
        if (stopped) return;
        if (error instanceof Refused) {
          onStatus?.('closed');
          return;
        }
      }
      if (stopped) return;
      attempt++;
      onStatus?.('reconnecting');
      await sleep(backoffMs(attempt));
    }
  };
  void run();
  return () => {
    stopped = true;
    controller.abort();
    wake?.();
  };
}

/** Applies one member-stream event to the caches. */
export function applyMapEvent(queryClient: QueryClient, mapId: string, event: MapLiveEvent): void {
  if (event.mapId !== mapId) return;
  switch (event.kind) {
    case 'pin.created':
    case 'pin.updated':
      storePin(queryClient, event.pin);
      return;
    case 'pin.deleted':
      dropPin(queryClient, mapId, event.pinId);
      return;
    case 'pin.replied':
      storeReply(queryClient, mapId, event.pinId, event.reply, event.replyCount);
      return;
    case 'map.saved':
      // Only the title and time are safe to take over: the setup and version stay until the person reloads (an editor's
      // next save must meet the 409, not silently overwrite the newer version).
      queryClient.setQueryData<MapDetail>(mapKeys.detail(mapId), (map) => (map && map.version < event.version ? { ...map, title: event.title } : map));
      return;
  }
}

/** Applies one link-holder event to the shared view's cache. */
export function applySharedEvent(queryClient: QueryClient, token: string, event: SharedLiveEvent): void {
  queryClient.setQueryData<SharedMapView>(viewingLinkKeys.shared(token), (view) => {
    if (!view) return view;
    switch (event.kind) {
      case 'pin.created':
      case 'pin.updated': {
        if (!view.pins) return view;
        const pins = view.pins.some((p) => p.id === event.pin.id) ? view.pins.map((p) => (p.id === event.pin.id ? event.pin : p)) : [...view.pins, event.pin];
        return { ...view, pins };
      }
      case 'pin.deleted':
        return view.pins ? { ...view, pins: view.pins.filter((p) => p.id !== event.pinId) } : view;
      case 'map.saved':
        return { ...view, title: event.title };
    }
  });
}

export interface LiveState {
  status: LiveStatus;
  /** A collaborator saved a newer version of the setup (the page offers to reload it). */
  savedVersion: { version: number; by: string | null } | null;
}

/** Keeps a member's caches of one map live while the page is open. */
export function useLiveMap(mapId: string | undefined, currentVersion: number | undefined): LiveState {
  const queryClient = useQueryClient();
  const [status, setStatus] = useState<LiveStatus>('connecting');
  const [savedVersion, setSavedVersion] = useState<LiveState['savedVersion']>(null);
  const versionRef = useRef(currentVersion);
  versionRef.current = currentVersion;
  useEffect(() => {
    if (!mapId) return;
    return connectLive({
      path: `/maps/${mapId}/events`,
      auth: true,
      onStatus: setStatus,
      // Not resumed: events between the list's load and this open (or during an outage we cannot replay) may be
      // missing, so the pin list — and only it — is read again.
      onOpen: (resumed) => {
        if (!resumed) void queryClient.invalidateQueries({ queryKey: pinKeys.list(mapId), exact: true });
      },
      onEvent: (raw) => {
        const event = raw as MapLiveEvent;
        applyMapEvent(queryClient, mapId, event);
        const mine = event.actor !== null && event.actor.id === queryClient.getQueryData<MeView | null>(meKey)?.user.id;
        if (event.kind === 'map.saved' && !mine && versionRef.current !== undefined && event.version > versionRef.current) {
          setSavedVersion({ version: event.version, by: event.actor?.displayName ?? null });
        }
      },
    });
  }, [mapId, queryClient]);
  return { status, savedVersion: savedVersion && currentVersion !== undefined && savedVersion.version > currentVersion ? savedVersion : null };
}

/** Keeps a viewing link's cache live (pins and title) while the shared view is open. */
export function useLiveSharedMap(token: string | undefined, enabled: boolean): LiveStatus {
  const queryClient = useQueryClient();
  const [status, setStatus] = useState<LiveStatus>('connecting');
  useEffect(() => {
    if (!token || !enabled) return;
    let opened = false;
    return connectLive({
      path: `/view/${encodeURIComponent(token)}/events`,
      auth: false,
      // The first open follows the page's own load closely; a later open that cannot resume (no event seen) may have
      // missed changes, so the view is read again. Not on the first open: each read counts as a view of the link.
      onOpen: (resumed) => {
        if (!resumed && opened) void queryClient.invalidateQueries({ queryKey: viewingLinkKeys.shared(token), exact: true });
        opened = true;
      },
      onEvent: (raw) => applySharedEvent(queryClient, token, raw as SharedLiveEvent),
      onStatus: (s) => {
        setStatus(s);
        // Refused (revoked or expired while open): read the link again so the page says why it stopped working.
        if (s === 'closed') void queryClient.invalidateQueries({ queryKey: viewingLinkKeys.shared(token), exact: true });
      },
    });
  }, [token, enabled, queryClient]);
  return status;
}
