import { afterEach, describe, expect, it, vi } from 'vitest';
import { QueryClient } from '@tanstack/react-query';
import type { MapLiveEvent, PinDetail, PinView, SharedLiveEvent, SharedMapView } from '@fieldbound/shared';
import { defaultSetup } from '@fieldbound/shared';
import { applyMapEvent, applySharedEvent, connectLive, type LiveStatus } from './live';
import { pinKeys } from './pins';
import { session } from './client';
import { viewingLinkKeys } from './viewingLinks';
import { testPin } from '../features/pins/testPin';

afterEach(() => {
  vi.restoreAllMocks();
  session.set(null);
});

const pin = testPin;
const base = { mapId: 'm1', at: '2026-12-02T03:00:00Z', actor: { id: 'u2', displayName: 'Kofi' } };

function clientWithPins(pins: PinView[], detail?: PinDetail) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity } } });
  const listFn = vi.fn(async () => pins);
  client.setQueryDefaults(pinKeys.list('m1'), { queryFn: listFn });
  client.setQueryData(pinKeys.list('m1'), pins);
  if (detail) client.setQueryData(pinKeys.detail(detail.id), detail);
  return { client, listFn };
}

describe('live events update the caches in place', () => {
  it('adds a created pin, takes a newer version of an updated one, and ignores an older copy arriving late', () => {
    const { client, listFn } = clientWithPins([pin()]);
    applyMapEvent(client, 'm1', { ...base, id: '10', kind: 'pin.created', pin: pin({ id: 'p2', title: 'Band' }) });
    applyMapEvent(client, 'm1', { ...base, id: '11', kind: 'pin.updated', pin: pin({ version: 3, status: 'resolved' }) });
    applyMapEvent(client, 'm1', { ...base, id: '12', kind: 'pin.updated', pin: pin({ version: 2, status: 'open' }) });
    const list = client.getQueryData<PinView[]>(pinKeys.list('m1'))!;
    expect(list.map((p) => [p.id, p.status, p.version])).toEqual([['p1', 'resolved', 3], ['p2', 'open', 1]]);
    expect(listFn).not.toHaveBeenCalled();
  });

  it('appends a reply to an open thread once and sets the count in the list; removes a deleted pin and its thread', () => {
    const detail: PinDetail = { ...pin(), replies: [] };
    const { client } = clientWithPins([pin()], detail);
    const reply = { id: 'r1', author: { id: 'u2', displayName: 'Kofi' }, body: 'Checked at 45 T', createdAt: '2026-12-02T03:01:00Z' };
    const event: MapLiveEvent = { ...base, id: '20', kind: 'pin.replied', pinId: 'p1', reply, replyCount: 1 };
    applyMapEvent(client, 'm1', event);
    applyMapEvent(client, 'm1', event); // delivered twice (catch-up after a reconnect): still one reply
    expect(client.getQueryData<PinDetail>(pinKeys.detail('p1'))!.replies).toEqual([reply]);
    expect(client.getQueryData<PinView[]>(pinKeys.list('m1'))![0].replyCount).toBe(1);
    applyMapEvent(client, 'm1', { ...base, id: '21', kind: 'pin.deleted', pinId: 'p1' });
    expect(client.getQueryData<PinView[]>(pinKeys.list('m1'))).toEqual([]);
    expect(client.getQueryData(pinKeys.detail('p1'))).toBeUndefined();
  });

  it('keeps a thread’s replies when the pin itself changes', () => {
    const reply = { id: 'r1', author: null, body: 'x', createdAt: '2026-12-02T03:01:00Z' };
    const { client } = clientWithPins([pin()], { ...pin(), replyCount: 1, replies: [reply] });
    applyMapEvent(client, 'm1', { ...base, id: '30', kind: 'pin.updated', pin: pin({ version: 2, status: 'resolved', replyCount: 1 }) });
    const detail = client.getQueryData<PinDetail>(pinKeys.detail('p1'))!;
    expect(detail.status).toBe('resolved');
    expect(detail.replies).toEqual([reply]);
  });

  it('ignores events of another map', () => {
    const { client } = clientWithPins([pin()]);
    applyMapEvent(client, 'm1', { ...base, mapId: 'm2', id: '40', kind: 'pin.deleted', pinId: 'p1' });
    expect(client.getQueryData<PinView[]>(pinKeys.list('m1'))).toHaveLength(1);
  });

  it('moves, adds and removes pins of a viewing link’s view', () => {
    const client = new QueryClient();
    const shared = (id: string, title: string) => ({ id, title, body: '', status: 'open' as const, category: null, geometry: { kind: 'point' as const, at: { alpha: 1, fieldTesla: 1 } } });
    client.setQueryData<SharedMapView>(viewingLinkKeys.shared('tok'), { title: 'Map', description: '', setup: defaultSetup(), species: [], pins: [shared('a', 'A')] });
    const e = (x: Partial<SharedLiveEvent> & Pick<SharedLiveEvent, 'kind'>) => ({ id: '1', mapId: 'm1', at: base.at, ...x }) as SharedLiveEvent;
    applySharedEvent(client, 'tok', e({ kind: 'pin.created', pin: shared('b', 'B') }));
    applySharedEvent(client, 'tok', e({ kind: 'pin.updated', pin: { ...shared('a', 'A2'), status: 'resolved' } }));
    applySharedEvent(client, 'tok', e({ kind: 'pin.deleted', pinId: 'b' }));
    expect(client.getQueryData<SharedMapView>(viewingLinkKeys.shared('tok'))!.pins!.map((p) => [p.id, p.title, p.status])).toEqual([['a', 'A2', 'resolved']]);
  });
});

/** A text/event-stream answer that sends `chunks` and then ends (as a server or proxy closing the connection). */
function streamResponse(chunks: string[]): Response {
  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      for (const c of chunks) controller.enqueue(new TextEncoder().encode(c));
      controller.close();
    },
  });
  return new Response(body, { status: 200, headers: { 'Content-Type': 'text/event-stream' } });
}

describe('connectLive', () => {
  const waitFor = async (check: () => boolean) => {
    for (let i = 0; i < 200 && !check(); i++) await new Promise((r) => setTimeout(r, 5));
    expect(check()).toBe(true);
  };

  it('delivers events, and after the stream ends reconnects with the token and Last-Event-ID of the last event', async () => {
    session.set('tok-1');
    const seen: unknown[] = [];
    const opens: boolean[] = [];
    const requests: Headers[] = [];
    const answers = [
      streamResponse(['retry: 1000\n: hello\n\n', 'id: 41\nevent: map\ndata: {"kind":"pin.deleted","pinId":"a"}\n\n', 'id: 42\nevent: map\ndata: {"kind":"pin.deleted","pinId":"b"}\n\n']),
      streamResponse(['id: 43\nevent: map\ndata: {"kind":"pin.deleted","pinId":"c"}\n\n']),
    ];
    const fakeFetch = vi.fn(async (_url: RequestInfo | URL, init?: RequestInit) => {
      requests.push(new Headers(init?.headers));
      return answers.shift() ?? new Promise<Response>(() => {});
    });
    const stop = connectLive({ path: '/maps/m1/events', auth: true, onEvent: (e) => seen.push(e), onOpen: (r) => opens.push(r), fetch: fakeFetch as typeof fetch, backoffMs: () => 1 });
    await waitFor(() => seen.length === 3);
    stop();
    expect(seen).toEqual([{ kind: 'pin.deleted', pinId: 'a' }, { kind: 'pin.deleted', pinId: 'b' }, { kind: 'pin.deleted', pinId: 'c' }]);
    expect(String(fakeFetch.mock.calls[0][0])).toBe('/api/maps/m1/events');
    expect(requests[0].get('authorization')).toBe('Bearer tok-1');
    expect(requests[0].get('last-event-id')).toBeNull();
    expect(requests[1].get('last-event-id')).toBe('42');
    expect(opens).toEqual([false, true]);
  });

  it('stops for good when the stream is refused (a revoked link: 404) and says it is closed', async () => {
    const statuses: LiveStatus[] = [];
    const fakeFetch = vi.fn(async () => new Response(JSON.stringify({ statusCode: 404 }), { status: 404, headers: { 'Content-Type': 'application/json' } }));
    connectLive({ path: '/view/t/events', auth: false, onEvent: () => {}, onStatus: (s) => statuses.push(s), fetch: fakeFetch as typeof fetch, backoffMs: () => 1 });
    await waitFor(() => statuses.includes('closed'));
    await new Promise((r) => setTimeout(r, 30));
    expect(fakeFetch).toHaveBeenCalledTimes(1);
    expect(new Headers((fakeFetch.mock.calls[0] as unknown as [string, RequestInit])[1].headers).get('authorization')).toBeNull();
  });

  it('retries after a server error with backoff instead of giving up', async () => {
    const answers = [new Response('busy', { status: 503 }), streamResponse(['id: 7\nevent: map\ndata: {"kind":"x"}\n\n'])];
    const seen: unknown[] = [];
    const delays: number[] = [];
    const fakeFetch = vi.fn(async () => answers.shift() ?? new Promise<Response>(() => {}));
    const stop = connectLive({ path: '/view/t/events', auth: false, onEvent: (e) => seen.push(e), fetch: fakeFetch as typeof fetch, backoffMs: (n) => (delays.push(n), 1) });
    await waitFor(() => seen.length === 1);
    stop();
    expect(delays[0]).toBe(1);
  });
});
