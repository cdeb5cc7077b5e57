import crypto from 'node:crypto';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { EntityManager } from '@mikro-orm/postgresql';
import { defaultSetup, type MapLiveEvent, type SharedLiveEvent } from '@fieldbound/shared';
import { startTestApp, TestClock, type TestApp } from '../../test/test-app';
import { addMember, api, type Person, registerPerson, roleCast, type RoleCast } from '../../test/team-fixtures';
import { data, openStream, type SseStream } from '../../test/sse';
import { VIEW_RATE_LIMIT } from '../viewing-links/viewing-link-throttler.guard';
import { LiveHubService } from './live-hub.service';
import { LISTENER_APPLICATION_NAME, LiveListenerService } from './live-listener.service';
import { LiveMaintenanceService } from './live-maintenance.service';

const HEARTBEAT_MS = 150;
let t: TestApp;
let clock: TestClock;
let cast: RoleCast;
let call: ReturnType<typeof api>;
const open: SseStream[] = [];

beforeAll(async () => {
  clock = new TestClock();
  // A short heartbeat so the access re-check and the comment lines show within a test.
  t = await startTestApp({ live: { heartbeatMs: HEARTBEAT_MS, maxStreams: 1000, maxStreamsPerUser: 3, retentionDays: 7 } }, { clock });
  call = api(t);
  cast = await roleCast(t);
});
afterEach(async () => {
  for (const s of open.splice(0)) s.close();
  await until(() => t.app.get(LiveHubService).streamCount === 0, 'every stream of the test is closed');
});
afterAll(async () => {
  await t?.close();
});

async function newMap(title = 'Live map'): Promise<string> {
  const res = await call('POST', `/teams/${cast.teamId}/maps`, { as: cast.owner, json: { title, setup: defaultSetup() } });
  expect(res.status).toBe(201);
  return res.body.id;
}

async function stream(path: string, options: { as?: Person; lastEventId?: string } = {}): Promise<SseStream & { body?: any }> {
  const s = await openStream(`${t.baseUrl}${path}`, { token: options.as?.token, lastEventId: options.lastEventId });
  open.push(s);
  return s;
}

const point = { kind: 'point', at: { alpha: 319.8, fieldTesla: 1.5e4 } };

async function newPin(mapId: string, title = 'Live pin') {
  const res = await call('POST', `/maps/${mapId}/pins`, { as: cast.editor, json: { geometry: point, title, body: 'see the knee' } });
  expect(res.status).toBe(201);
  return res.body as { id: string; version: number };
}

async function newLink(mapId: string, json: Record<string, unknown>): Promise<{ token: string; id: string }> {
  const res = await call('POST', `/maps/${mapId}/viewing-links`, { as: cast.editor, json });
  expect(res.status).toBe(201);
  return { token: res.body.token, id: res.body.link.id };
}

async function until(check: () => boolean | Promise<boolean>, what: string, timeoutMs = 5000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`still not true after ${timeoutMs} ms: ${what}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

describe('live map events: members', () => {
  it('delivers a pin created by an editor to a viewer with the map open, as event "map" with the pin and its author', async () => {
    const mapId = await newMap();
    const s = await stream(`/maps/${mapId}/events`, { as: cast.viewer });
    expect(s.status).toBe(200);
    expect(s.headers.get('content-type')).toMatch(/^text\/event-stream/);
    expect(s.headers.get('cache-control')).toContain('no-transform');
    const created = await call('POST', `/maps/${mapId}/pins`, { as: cast.editor, json: { geometry: point, title: 'Live pin' } });
    expect(created.status).toBe(201);
    const event = await s.next();
    expect(event.event).toBe('map');
    const body = data<MapLiveEvent>(event);
    expect(event.id).toBe(body.id);
    expect(body).toMatchObject({ kind: 'pin.created', mapId, actor: { id: cast.editor.id, displayName: cast.editor.displayName } });
    expect(body.kind === 'pin.created' && body.pin).toEqual(created.body);
  });

  it('carries moves, resolving, replies, deletion and map saves in the order they were made, with the state after each', async () => {
    const mapId = await newMap();
    const s = await stream(`/maps/${mapId}/events`, { as: cast.owner });
    const pin = await newPin(mapId);
    const moved = await call('PATCH', `/pins/${pin.id}`, { as: cast.editor, json: { expectedVersion: 1, geometry: { kind: 'point', at: { alpha: 300, fieldTesla: 2e4 } } } });
    const resolved = await call('PATCH', `/pins/${pin.id}`, { as: cast.editor, json: { expectedVersion: 2, status: 'resolved' } });
    const reply = await call('POST', `/pins/${pin.id}/replies`, { as: cast.viewer, json: { body: 'Agreed, resolved.' } });
    const saved = await call('PATCH', `/maps/${mapId}`, { as: cast.editor, json: { expectedVersion: 1, title: 'Live map, renamed' } });
    const deleted = await call('DELETE', `/pins/${pin.id}`, { as: cast.editor });
    expect([moved.status, resolved.status, reply.status, saved.status, deleted.status]).toEqual([200, 200, 201, 200, 204]);

    const events: MapLiveEvent[] = [];
    for (let i = 0; i < 6; i++) events.push(data<MapLiveEvent>(await s.next()));
    expect(events.map((e) => e.kind)).toEqual(['pin.created', 'pin.updated', 'pin.updated', 'pin.replied', 'map.saved', 'pin.deleted']);
    const ids = events.map((e) => BigInt(e.id));
    expect(ids.every((id, i) => i === 0 || id > ids[i - 1])).toBe(true);
    expect(events[1]).toMatchObject({ pin: moved.body });
    expect(events[2]).toMatchObject({ pin: { status: 'resolved', version: 3, resolvedBy: { id: cast.editor.id } } });
    expect(events[3]).toMatchObject({ pinId: pin.id, reply: reply.body, replyCount: 1, actor: { id: cast.viewer.id } });
    expect(events[4]).toMatchObject({ version: 2, title: 'Live map, renamed', updatedAt: saved.body.updatedAt });
    expect(events[5]).toMatchObject({ pinId: pin.id, actor: { id: cast.editor.id } });
  });

  it('lets every member role open the stream (owner, editor, viewer: 200)', async () => {
    const mapId = await newMap();
    for (const as of [cast.owner, cast.editor, cast.viewer]) expect((await stream(`/maps/${mapId}/events`, { as })).status).toBe(200);
  });

  it('refuses anonymous callers (401), outsiders and unknown maps (404, as for the map itself) and a malformed Last-Event-ID (400)', async () => {
    const mapId = await newMap();
    expect((await stream(`/maps/${mapId}/events`)).status).toBe(401);
    const outsider = await stream(`/maps/${mapId}/events`, { as: cast.outsider });
    expect(outsider.status).toBe(404);
    expect(outsider.body.code).toBe('map_not_found');
    expect((await stream(`/maps/00000000-0000-4000-8000-000000000000/events`, { as: cast.owner })).status).toBe(404);
    const bad = await stream(`/maps/${mapId}/events`, { as: cast.owner, lastEventId: '12abc' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.lastEventId).toBeDefined();
  });

  it('after Last-Event-ID sends every later event of the map in id order first, then live ones (header or ?lastEventId=)', async () => {
    const mapId = await newMap();
    const otherMapId = await newMap('Another map');
    const first = await stream(`/maps/${mapId}/events`, { as: cast.viewer });
    await newPin(mapId, 'one');
    const seen = await first.next();
    first.close();
    // Made while nobody listened; the other map's event must not appear.
    await newPin(mapId, 'two');
    await newPin(otherMapId, 'elsewhere');
    await newPin(mapId, 'three');

    for (const resume of [{ lastEventId: seen.id }, { query: seen.id }]) {
      const path = `/maps/${mapId}/events${resume.query ? `?lastEventId=${resume.query}` : ''}`;
      const s = await stream(path, { as: cast.viewer, lastEventId: resume.lastEventId });
      const caught = [data<MapLiveEvent>(await s.next()), data<MapLiveEvent>(await s.next())];
      expect(caught.map((e) => e.kind === 'pin.created' && e.pin.title)).toEqual(['two', 'three']);
      s.close();
    }
    const resumed = await stream(`/maps/${mapId}/events`, { as: cast.viewer, lastEventId: seen.id });
    await resumed.next();
    await resumed.next();
    await newPin(mapId, 'four');
    const live = data<MapLiveEvent>(await resumed.next());
    expect(live.kind === 'pin.created' && live.pin.title).toBe('four');
    expect(resumed.events.map((e) => e.id)).toEqual([...new Set(resumed.events.map((e) => e.id))]);
  });

  it('without Last-Event-ID, or with one this database never issued for the map, starts with the next change', async () => {
    const mapId = await newMap();
    await newPin(mapId, 'before');
    const fresh = await stream(`/maps/${mapId}/events`, { as: cast.viewer });
    const unknown = await stream(`/maps/${mapId}/events`, { as: cast.viewer, lastEventId: '9000000000000000000' });
    await newPin(mapId, 'after');
    for (const s of [fresh, unknown]) {
      const event = data<MapLiveEvent>(await s.next());
      expect(event.kind === 'pin.created' && event.pin.title).toBe('after');
    }
  });

  it('sends a heartbeat comment and ends the stream at the next heartbeat once the member is removed from the team', async () => {
    const mapId = await newMap();
    const leaving = await registerPerson(t, 'leaving');
    await addMember(t, cast.teamId, leaving, 'viewer');
    const s = await stream(`/maps/${mapId}/events`, { as: leaving });
    expect(s.status).toBe(200);
    await until(() => s.comments.includes('heartbeat'), 'a heartbeat comment');
    const removed = await call('DELETE', `/teams/${cast.teamId}/members/${leaving.id}`, { as: cast.owner });
    expect(removed.status).toBe(204);
    await s.ended;
    await newPin(mapId, 'after removal');
    expect(s.events).toEqual([]);
  });

  it('removes a stream when the client disconnects, and caps the streams one account holds (429 beyond it)', async () => {
    const mapId = await newMap();
    const hub = t.app.get(LiveHubService);
    const person = await registerPerson(t, 'tabs');
    await addMember(t, cast.teamId, person, 'viewer');
    const before = hub.streamCount;
    const tabs = [await stream(`/maps/${mapId}/events`, { as: person }), await stream(`/maps/${mapId}/events`, { as: person }), await stream(`/maps/${mapId}/events`, { as: person })];
    expect(tabs.map((s) => s.status)).toEqual([200, 200, 200]);
    expect(hub.streamCount).toBe(before + 3);
    const fourth = await stream(`/maps/${mapId}/events`, { as: person });
    expect(fourth.status).toBe(429);
    expect(fourth.body.code).toBe('too_many_streams');
    tabs[0].close();
    await until(() => hub.streamCount === before + 2, 'the closed stream is removed');
    expect((await stream(`/maps/${mapId}/events`, { as: person })).status).toBe(200);
  });
});

describe('live map events: viewing links', () => {
  it('with pins: pins without authors, map saves, deletions, and no replies or actors', async () => {
    const mapId = await newMap();
    const link = await newLink(mapId, { includePins: true });
    const s = await stream(`/view/${link.token}/events`);
    expect(s.status).toBe(200);
    expect(s.headers.get('referrer-policy')).toBe('no-referrer');
    const pin = await newPin(mapId);
    await call('POST', `/pins/${pin.id}/replies`, { as: cast.viewer, json: { body: 'internal remark' } });
    await call('PATCH', `/maps/${mapId}`, { as: cast.editor, json: { expectedVersion: 1, title: 'Shown in the lecture' } });
    await call('DELETE', `/pins/${pin.id}`, { as: cast.editor });
    const events: SharedLiveEvent[] = [];
    for (let i = 0; i < 3; i++) events.push(data<SharedLiveEvent>(await s.next()));
    expect(events.map((e) => e.kind)).toEqual(['pin.created', 'map.saved', 'pin.deleted']);
    expect(events[0]).toEqual({ id: events[0].id, mapId, at: events[0].at, kind: 'pin.created', pin: { id: pin.id, geometry: point, title: 'Live pin', body: 'see the knee', status: 'open', category: null } });
    const text = s.events.map((e) => e.data).join('\n');
    expect(text).not.toContain('internal remark');
    expect(text).not.toContain(cast.editor.id);
    expect(text).not.toContain(cast.viewer.id);
    expect(text).not.toContain('actor');
    expect(text).not.toContain('author');
  });

  it('without pins: only map saves', async () => {
    const mapId = await newMap();
    const link = await newLink(mapId, { includePins: false });
    const s = await stream(`/view/${link.token}/events`);
    await newPin(mapId);
    await call('PATCH', `/maps/${mapId}`, { as: cast.editor, json: { expectedVersion: 1, title: 'Saved again' } });
    const event = data<SharedLiveEvent>(await s.next());
    expect(event).toMatchObject({ kind: 'map.saved', version: 2, title: 'Saved again' });
    expect(s.events).toHaveLength(1);
  });

  it('refuses unknown and revoked links (404) and expired ones (410); a stream ends once its link is revoked', async () => {
    const mapId = await newMap();
    expect((await stream(`/view/${'x'.repeat(43)}/events`)).status).toBe(404);
    const link = await newLink(mapId, { includePins: true });
    const s = await stream(`/view/${link.token}/events`);
    expect(s.status).toBe(200);
    expect((await call('DELETE', `/maps/${mapId}/viewing-links/${link.id}`, { as: cast.editor })).status).toBe(204);
    await s.ended;
    const revoked = await stream(`/view/${link.token}/events`);
    expect(revoked.status).toBe(404);
    expect(revoked.body.code).toBe('viewing_link_not_found');

    const expiring = await newLink(mapId, { expiresAt: new Date(clock.now().getTime() + 3_600_000).toISOString() });
    expect((await stream(`/view/${expiring.token}/events`)).status).toBe(200);
    clock.advance(2 * 3_600_000);
    const expired = await stream(`/view/${expiring.token}/events`);
    expect(expired.status).toBe(410);
    expect(expired.body.code).toBe('viewing_link_expired');
  });
});

describe('live map events: guessing link tokens', () => {
  it(`answers 429 after ${VIEW_RATE_LIMIT.limit} stream requests a minute from one address, unknown tokens included`, async () => {
    // Its own application: the counters of the other tests' link streams stay out of it.
    const own = await startTestApp();
    try {
      const statuses: number[] = [];
      for (let i = 0; i <= VIEW_RATE_LIMIT.limit; i++) statuses.push((await fetch(`${own.baseUrl}/view/${crypto.randomBytes(32).toString('base64url')}/events`)).status);
      expect(statuses.slice(0, VIEW_RATE_LIMIT.limit).every((s) => s === 404)).toBe(true);
      expect(statuses[VIEW_RATE_LIMIT.limit]).toBe(429);
    } finally {
      await own.close();
    }
  });
});

describe('live map events: storage and the LISTEN connection', () => {
  it('stores each event in map_events with its actor, and prunes events older than the retention', async () => {
    const mapId = await newMap();
    await newPin(mapId, 'kept');
    const em = t.app.get(EntityManager).fork();
    const rows = await em.getConnection().execute<{ kind: string; actor_id: string }[]>('select kind, actor_id from map_events where map_id = ?', [mapId]);
    expect(rows).toEqual([{ kind: 'pin.created', actor_id: cast.editor.id }]);
    await em.getConnection().execute(
      `insert into map_events (map_id, kind, payload, actor_id, created_at) values (?, 'pin.deleted', '{"pinId":"x"}', null, ?)`,
      [mapId, new Date(clock.now().getTime() - 8 * 86_400_000)],
    );
    expect(await t.app.get(LiveMaintenanceService).prune()).toBeGreaterThanOrEqual(1);
    const left = await em.getConnection().execute<{ kind: string }[]>('select kind from map_events where map_id = ?', [mapId]);
    expect(left.map((r) => r.kind)).toEqual(['pin.created']);
  });

  it('reconnects the LISTEN connection after the database drops it, and delivers the events committed meanwhile', async () => {
    const mapId = await newMap();
    const s = await stream(`/maps/${mapId}/events`, { as: cast.viewer });
    const listener = t.app.get(LiveListenerService);
    await until(() => listener.listening, 'the listener is connected');
    const em = t.app.get(EntityManager).fork();
    const backends = () =>
      em.getConnection().execute<{ pid: number }[]>('select pid from pg_stat_activity where application_name = ? and datname = current_database()', [LISTENER_APPLICATION_NAME]);
    const [before] = await backends();
    expect(before).toBeDefined();
    await em.getConnection().execute('select pg_terminate_backend(?)', [before.pid]);
    await until(() => !listener.listening, 'the listener noticed the lost connection');
    await newPin(mapId, 'while reconnecting');
    const event = data<MapLiveEvent>(await s.next(undefined, 15_000));
    expect(event.kind === 'pin.created' && event.pin.title).toBe('while reconnecting');
    await until(() => listener.listening, 'the listener is connected again', 15_000);
    const after = await backends();
    expect(after.map((b) => b.pid)).not.toContain(before.pid);
    await newPin(mapId, 'after reconnecting');
    const next = data<MapLiveEvent>(await s.next());
    expect(next.kind === 'pin.created' && next.pin.title).toBe('after reconnecting');
  });
});

describe('live map events: OpenAPI', () => {
  it('lists both streams at /api/docs-json as text/event-stream, with Last-Event-ID', async () => {
    const docs = await call('GET', '/docs-json');
    expect(docs.status).toBe(200);
    for (const path of ['/api/maps/{mapId}/events', '/api/view/{token}/events']) {
      const operation = docs.body.paths[path]?.get;
      expect(operation, path).toBeDefined();
      expect(Object.keys(operation.responses['200'].content)).toEqual(['text/event-stream']);
      expect(operation.parameters.map((p: { name: string }) => p.name)).toEqual(expect.arrayContaining(['Last-Event-ID', 'lastEventId']));
    }
  });
});

describe('live map events: shutdown', () => {
  it('closing the application ends its open streams instead of waiting for them', async () => {
    const own = await startTestApp();
    const ownCast = await roleCast(own);
    const ownMap = (await api(own)('POST', `/teams/${ownCast.teamId}/maps`, { as: ownCast.owner, json: { title: 'Closing', setup: defaultSetup() } })).body.id;
    const s = await openStream(`${own.baseUrl}/maps/${ownMap}/events`, { token: ownCast.viewer.token });
    expect(s.status).toBe(200);
    await own.close();
    await s.ended;
    expect(own.app.get(LiveHubService).streamCount).toBe(0);
  });
});
