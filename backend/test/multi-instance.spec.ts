import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EntityManager } from '@mikro-orm/postgresql';
import { defaultSetup, type MapLiveEvent } from '@fieldbound/shared';
import { PostgresThrottlerStorage } from '../src/rate-limit/postgres-throttler.storage';
import { startTestApp, type TestApp } from './test-app';
import { api, roleCast, type RoleCast } from './team-fixtures';
import { data, openStream, type SseStream } from './sse';

/**
 * Two server instances (two Nest applications on their own ports) against one database, as behind a
 * load balancer: live updates travel through PostgreSQL LISTEN/NOTIFY and rate limits through the
 * shared `rate_limit_hits` table, never through memory of one process.
 */
describe('two server instances against one database', () => {
  let a: TestApp;
  let b: TestApp;
  let cast: RoleCast;
  let mapId: string;
  const streams: SseStream[] = [];

  beforeAll(async () => {
    [a, b] = [await startTestApp(), await startTestApp()];
    cast = await roleCast(a);
    mapId = (await api(a)('POST', `/teams/${cast.teamId}/maps`, { as: cast.owner, json: { title: 'Shared across instances', setup: defaultSetup() } })).body.id;
  });
  afterAll(async () => {
    for (const s of streams) s.close();
    await Promise.all([a?.close(), b?.close()]);
  });

  it('run on different ports', () => {
    expect(new URL(a.baseUrl).port).not.toBe(new URL(b.baseUrl).port);
  });

  it('a pin created through instance A arrives on a stream opened on instance B, and a reply through B on a stream on A', async () => {
    const onB = await openStream(`${b.baseUrl}/maps/${mapId}/events`, { token: cast.viewer.token });
    const onA = await openStream(`${a.baseUrl}/maps/${mapId}/events`, { token: cast.owner.token });
    streams.push(onA, onB);
    expect([onA.status, onB.status]).toEqual([200, 200]);

    const pin = await api(a)('POST', `/maps/${mapId}/pins`, { as: cast.editor, json: { geometry: { kind: 'point', at: { alpha: 300, fieldTesla: 1e4 } }, title: 'Made on A' } });
    expect(pin.status).toBe(201);
    const arrived = data<MapLiveEvent>(await onB.next((e) => data<MapLiveEvent>(e).kind === 'pin.created'));
    expect(arrived.kind === 'pin.created' && arrived.pin).toEqual(pin.body);

    const reply = await api(b)('POST', `/pins/${pin.body.id}/replies`, { as: cast.viewer, json: { body: 'Seen on B' } });
    expect(reply.status).toBe(201);
    const replied = data<MapLiveEvent>(await onA.next((e) => data<MapLiveEvent>(e).kind === 'pin.replied'));
    expect(replied).toMatchObject({ kind: 'pin.replied', pinId: pin.body.id, reply: reply.body, replyCount: 1 });
    // Both instances delivered the same stored event (same id) to both streams.
    const onBReply = await onB.next((e) => data<MapLiveEvent>(e).kind === 'pin.replied');
    expect(onBReply.id).toBe(replied.id);
  });

  it('share one sign-in rate limit: attempts alternating between two instances are refused on the 4th (429 with Retry-After)', async () => {
    const shared = { rateLimitScope: crypto.randomUUID(), auth: { rateLimit: { limit: 3, windowSeconds: 60 } } };
    const limitedA = await startTestApp(shared);
    const limitedB = await startTestApp(shared);
    const statuses: number[] = [];
    let retryAfter: string | null = null;
    for (const server of [limitedA, limitedB, limitedA, limitedB]) {
      const res = await api(server)('POST', '/auth/sign-in', { json: { email: `nobody-${crypto.randomUUID().slice(0, 6)}@example.org`, password: 'not the password' } });
      statuses.push(res.status);
      retryAfter = res.headers.get('retry-after');
    }
    expect(statuses).toEqual([401, 401, 401, 429]);
    expect(Number(retryAfter)).toBeGreaterThan(0);
    // An instance serving another site (another scope) counts on its own.
    const other = await startTestApp({ auth: { rateLimit: { limit: 3, windowSeconds: 60 } } });
    try {
      expect((await api(other)('POST', '/auth/sign-in', { json: { email: 'nobody@example.org', password: 'not the password' } })).status).toBe(401);
    } finally {
      await Promise.all([other.close(), limitedA.close(), limitedB.close()]);
    }
  });
});

describe('PostgresThrottlerStorage', () => {
  let t: TestApp;
  let storage: PostgresThrottlerStorage;
  let em: EntityManager;
  beforeAll(async () => {
    t = await startTestApp();
    storage = t.app.get(PostgresThrottlerStorage);
    em = t.app.get(EntityManager).fork();
  });
  afterAll(async () => {
    await t?.close();
  });

  it('counts concurrent hits exactly (one atomic upsert each) and blocks past the limit', async () => {
    const key = crypto.randomUUID();
    const records = await Promise.all(Array.from({ length: 20 }, () => storage.increment(key, 60_000, 15, 60_000, 'test')));
    const counted = records.filter((r) => !r.isBlocked).map((r) => r.totalHits).sort((x, y) => x - y);
    expect(counted).toEqual(Array.from({ length: 15 }, (_, i) => i + 1));
    expect(records.filter((r) => r.isBlocked)).toHaveLength(5);
    expect(records.every((r) => r.timeToExpire > 0 && r.timeToExpire <= 60)).toBe(true);
  });

  it('starts a new window once the window has passed, and lifts a block once it has passed', async () => {
    const key = crypto.randomUUID();
    await storage.increment(key, 60_000, 1, 30_000, 'test');
    const blocked = await storage.increment(key, 60_000, 1, 30_000, 'test');
    expect(blocked).toMatchObject({ isBlocked: true, totalHits: 2 });
    expect(blocked.timeToBlockExpire).toBeGreaterThan(0);
    expect(blocked.timeToBlockExpire).toBeLessThanOrEqual(30);
    // Move the stored times into the past instead of waiting.
    await em.getConnection().execute(`update rate_limit_hits set blocked_until = now() - interval '1 second', expires_at = now() - interval '1 second' where key like ?`, [`%${key}`]);
    expect(await storage.increment(key, 60_000, 1, 30_000, 'test')).toMatchObject({ isBlocked: false, totalHits: 1, timeToBlockExpire: 0 });
    await em.getConnection().execute(`update rate_limit_hits set expires_at = now() - interval '1 second' where key like ?`, [`%${key}`]);
    expect(await storage.increment(key, 60_000, 5, 30_000, 'test')).toMatchObject({ isBlocked: false, totalHits: 1 });
  });

  it('prunes counters whose window and block have ended', async () => {
    const key = crypto.randomUUID();
    await storage.increment(key, 60_000, 5, 60_000, 'test');
    await em.getConnection().execute(`update rate_limit_hits set expires_at = now() - interval '1 second' where key like ?`, [`%${key}`]);
    expect(await storage.prune()).toBeGreaterThanOrEqual(1);
    expect(await em.getConnection().execute('select 1 from rate_limit_hits where key like ?', [`%${key}`])).toEqual([]);
  });
});
