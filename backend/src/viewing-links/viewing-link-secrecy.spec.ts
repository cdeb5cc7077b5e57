import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EntityManager } from '@mikro-orm/postgresql';
import { defaultSetup } from '@fieldbound/shared';
import { startTestApp, type TestApp } from '../../test/test-app';
import { api, createTeam, registerPerson, type Person } from '../../test/team-fixtures';
import { VIEW_RATE_LIMIT } from './viewing-link-throttler.guard';

/**
 * Viewing-link tokens against enumeration and leaks: the server's real log output (JSON lines on stdout and
 * stderr) and every table are searched for the clear token after it was created, used, guessed at, throttled
 * and revoked; guessing from one address is cut off by the rate limit, which then also refuses the real token.
 */
let t: TestApp;
let call: ReturnType<typeof api>;
let editor: Person;
let teamId: string;
const output: string[] = [];
const writes = { out: process.stdout.write.bind(process.stdout), err: process.stderr.write.bind(process.stderr) };

beforeAll(async () => {
  // Capture everything the application prints (its logger writes JSON lines to stdout/stderr); kept out of the test output.
  const capture = ((chunk: string | Uint8Array) => {
    output.push(String(chunk));
    return true;
  }) as typeof process.stdout.write;
  process.stdout.write = capture;
  process.stderr.write = capture;
  t = await startTestApp({}, { logs: 'json' });
  call = api(t);
  editor = await registerPerson(t, 'lecturer');
  teamId = await createTeam(t, editor);
});
afterAll(async () => {
  await t?.close();
  process.stdout.write = writes.out;
  process.stderr.write = writes.err;
});

/** Every text-like value of every row of every table in the public schema, as one string per table. */
async function allTableText(): Promise<Map<string, string>> {
  const em = t.app.get(EntityManager).fork();
  const tables = (await em.getConnection().execute<{ table_name: string }[]>(`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE'`)).map((r) => r.table_name);
  const text = new Map<string, string>();
  for (const table of tables) {
    const rows = await em.getConnection().execute<{ j: string }[]>(`select row_to_json(x)::text as j from "${table}" x`);
    text.set(table, rows.map((r) => r.j).join('\n'));
  }
  return text;
}

describe('viewing-link tokens', () => {
  it('never appear in clear in the log or in the database, through create, view, guesses, throttling and revoke', async () => {
    const map = await call('POST', `/teams/${teamId}/maps`, { as: editor, json: { title: 'Secret lecture map', setup: defaultSetup() } });
    expect(map.status).toBe(201);
    const created = await call('POST', `/maps/${map.body.id}/viewing-links`, { as: editor, json: { includePins: true } });
    expect(created.status).toBe(201);
    const token: string = created.body.token;
    expect(token.length).toBeGreaterThanOrEqual(40);

    expect((await call('GET', `/view/${token}`)).status).toBe(200);
    // The token in a query string or a header (where someone might paste it) is not logged either.
    expect((await call('GET', `/view/${token}?ref=${token}`, { headers: { 'x-forwarded-for': '198.18.7.7' } })).status).toBe(200);
    // A guess differing in one character, and a long run of random guesses from one address until it is refused.
    const near = token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A');
    expect((await call('GET', `/view/${near}`)).status).toBe(404);
    const guesser = { 'x-forwarded-for': '198.18.9.9' };
    const statuses: number[] = [];
    for (let i = 0; i < VIEW_RATE_LIMIT.limit + 5; i++) statuses.push((await call('GET', `/view/${crypto.randomBytes(32).toString('base64url')}`, { headers: guesser })).status);
    expect(statuses.slice(0, VIEW_RATE_LIMIT.limit).every((s) => s === 404)).toBe(true);
    expect(statuses.slice(VIEW_RATE_LIMIT.limit)).toEqual(Array(5).fill(429));
    // Once cut off, even the right token gets nothing from that address — so a lucky guess cannot be confirmed.
    const blocked = await call('GET', `/view/${token}`, { headers: guesser });
    expect(blocked.status).toBe(429);
    expect(blocked.body.code).toBe('too_many_views');
    // Another address is not affected.
    expect((await call('GET', `/view/${token}`, { headers: { 'x-forwarded-for': '198.18.10.10' } })).status).toBe(200);

    // The list of links never carries the token.
    const links = await call('GET', `/maps/${map.body.id}/viewing-links`, { as: editor });
    expect(JSON.stringify(links.body)).not.toContain(token);
    expect((await call('DELETE', `/maps/${map.body.id}/viewing-links/${created.body.link.id}`, { as: editor })).status).toBe(204);
    expect((await call('GET', `/view/${token}`)).status).toBe(404);

    // The log did record these requests (so the check below is not vacuous) ...
    const log = output.join('');
    expect(log).toContain('"path":"/api/view/:token"');
    expect(log.match(/"status":429/g)?.length ?? 0).toBeGreaterThanOrEqual(6);
    // ... and holds neither the token nor the near guess.
    expect(log).not.toContain(token);
    expect(log).not.toContain(near);
    expect(log).not.toContain(encodeURIComponent(token));
    // No table holds the token in clear (viewing_links keeps its SHA-256; rate-limit keys are per address).
    for (const [table, text] of await allTableText()) expect(text.includes(token), `table ${table}`).toBe(false);
  });
});
