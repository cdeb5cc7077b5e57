import net from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DATABASE_UNAVAILABLE_MESSAGE } from '../src/common/database-unavailable.filter';
import { loadConfig } from '../src/config/configuration';
import { migrateUp } from '../src/database/migrate';
import { startTestApp, type TestApp } from './test-app';
import { freePort, ThrowawayCluster } from './throwaway-cluster';

/** pg's connectionTimeoutMillis in src/database/mikro-orm.config.ts, plus room for a loaded machine. */
const CONNECT_TIMEOUT_MS = 3_000;
const ANSWER_WITHIN_MS = CONNECT_TIMEOUT_MS + 3_000;

interface Answer {
  status: number;
  body: any;
  ms: number;
  retryAfter: string | null;
  setCookies: string[];
}

async function request(server: TestApp, method: 'GET' | 'POST', path: string, body?: unknown, token?: string, cookie?: string): Promise<Answer> {
  const started = performance.now();
  const headers: Record<string, string> = body === undefined ? {} : { 'Content-Type': 'application/json' };
  if (token) headers.Authorization = `Bearer ${token}`;
  if (cookie) headers.Cookie = cookie;
  const res = await fetch(`${server.baseUrl}${path}`, {
    method,
    headers,
    body: body === undefined ? undefined : JSON.stringify(body),
    signal: AbortSignal.timeout(20_000),
  });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null, ms: performance.now() - started, retryAfter: res.headers.get('retry-after'), setCookies: res.headers.getSetCookie() };
}

/** A sign-in for an address nobody registered: a database read that answers 401 while the database is up. */
const signIn = (server: TestApp) => request(server, 'POST', '/auth/sign-in', { email: 'nobody-restart@example.test', password: 'not the password at all' });
/** A registration: a transactional write. */
const register = (server: TestApp, email: string) => request(server, 'POST', '/auth/register', { email, password: 'correct horse battery staple', displayName: 'Restart Tester' });
/** The refresh cookie (`name=value`) a response set. */
const refreshCookieOf = (answer: Answer) => answer.setCookies.find((c) => c.startsWith('fieldbound_refresh='))?.split(';')[0];

const UNAVAILABLE = { statusCode: 503, code: 'database_unavailable', message: DATABASE_UNAVAILABLE_MESSAGE };

describe('the database restarted while the server runs (own throwaway PostgreSQL cluster)', () => {
  let cluster: ThrowawayCluster | undefined;
  let server: TestApp | undefined;

  beforeAll(async () => {
    cluster = await ThrowawayCluster.create();
    await cluster.createDatabase('fieldbound_restart_test');
    const database = cluster.databaseConfig('fieldbound_restart_test');
    await migrateUp(database);
    server = await startTestApp({ database });
  });

  afterAll(async () => {
    await server?.close();
    await cluster?.destroy();
  });

  let token = '';
  let cookie = '';

  it('answers health 200 and database-backed routes (sign-in, register, own profile) normally while the database is up', async () => {
    expect((await request(server!, 'GET', '/health')).status).toBe(200);
    expect((await signIn(server!)).status).toBe(401);
    const registered = await register(server!, 'restart-before@example.test');
    expect(registered.status, JSON.stringify(registered.body)).toBe(201);
    token = registered.body.accessToken;
    cookie = refreshCookieOf(registered) ?? '';
    expect(cookie).toMatch(/^fieldbound_refresh=./);
    expect((await request(server!, 'GET', '/users/me', undefined, token)).status).toBe(200);
  });

  it('answers 503 with the JSON error, Retry-After and within the connection timeout once the database is stopped — never 500 or 401, never a hang, refresh cookie kept', async () => {
    await cluster!.stop();
    const health = await request(server!, 'GET', '/health');
    expect(health.status).toBe(503);
    expect(health.body.database.status).toBe('down');
    expect(health.ms).toBeLessThan(ANSWER_WITHIN_MS);

    const answer = await signIn(server!);
    expect(answer.status).toBe(503);
    expect(answer.body).toEqual(UNAVAILABLE);
    expect(answer.retryAfter).toBe('5');
    expect(answer.ms).toBeLessThan(ANSWER_WITHIN_MS);

    // A write, a signed-in read and a session refresh fail the same way; a signed-in user is not told
    // to sign in again (401) and the refresh cookie is not cleared, so the session outlives the outage.
    const refresh = await request(server!, 'POST', '/auth/refresh', undefined, undefined, cookie);
    for (const other of [await register(server!, 'restart-during@example.test'), await request(server!, 'GET', '/users/me', undefined, token), refresh]) {
      expect(other.status).toBe(503);
      expect(other.body).toEqual(UNAVAILABLE);
      expect(other.ms).toBeLessThan(ANSWER_WITHIN_MS);
    }
    expect(refresh.setCookies).toEqual([]);

    // Many at once: none waits on a pool slot forever, all fail the same clean way.
    const many = await Promise.all(Array.from({ length: 25 }, () => signIn(server!)));
    expect(many.map((a) => a.status)).toEqual(Array(25).fill(503));
    expect(Math.max(...many.map((a) => a.ms))).toBeLessThan(ANSWER_WITHIN_MS);
  });

  it('recovers on the first request after the database is started again, without restarting the server; the session from before the outage still refreshes', async () => {
    await cluster!.start();
    expect((await request(server!, 'GET', '/health')).status).toBe(200);
    expect((await signIn(server!)).status).toBe(401);
    expect((await request(server!, 'GET', '/users/me', undefined, token)).status).toBe(200);
    expect((await register(server!, 'restart-after@example.test')).status).toBe(201);
    const refreshed = await request(server!, 'POST', '/auth/refresh', undefined, undefined, cookie);
    expect(refreshed.status, JSON.stringify(refreshed.body)).toBe(200);
    expect(refreshCookieOf(refreshed)).toMatch(/^fieldbound_refresh=./);
  });

  it('survives a fast restart between two requests: pooled connections the server killed are replaced, not reused', async () => {
    // Open several pooled connections first, so the restart has something to kill.
    await Promise.all(Array.from({ length: 8 }, () => signIn(server!)));
    await cluster!.restart();
    const after = await Promise.all(Array.from({ length: 8 }, () => signIn(server!)));
    expect(after.map((a) => a.status)).toEqual(Array(8).fill(401));
    expect((await request(server!, 'GET', '/health')).status).toBe(200);
  });
});

describe('a database that accepts connections but never answers', () => {
  let blackhole: net.Server | undefined;
  let server: TestApp | undefined;
  const sockets = new Set<net.Socket>();

  beforeAll(async () => {
    const port = await freePort();
    blackhole = net.createServer((socket) => {
      sockets.add(socket);
      socket.on('close', () => sockets.delete(socket));
    });
    await new Promise<void>((resolve) => blackhole!.listen(port, '127.0.0.1', resolve));
    server = await startTestApp({ database: { ...loadConfig().database, port, name: 'fieldbound_blackhole_test' } });
  });

  afterAll(async () => {
    await server?.close();
    for (const socket of sockets) socket.destroy();
    await new Promise((resolve) => (blackhole ? blackhole.close(resolve) : resolve(undefined)));
  });

  it('answers 503 after the 3 s connection timeout instead of hanging', async () => {
    const answer = await signIn(server!);
    expect(answer.status).toBe(503);
    expect(answer.body).toEqual(UNAVAILABLE);
    expect(answer.ms).toBeGreaterThanOrEqual(CONNECT_TIMEOUT_MS - 500);
    expect(answer.ms).toBeLessThan(ANSWER_WITHIN_MS);
  });
});
