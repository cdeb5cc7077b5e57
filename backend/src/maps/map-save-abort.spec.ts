import net from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultSetup, type MapSetup } from '@fieldbound/shared';
import { startTestApp, type TestApp } from '../../test/test-app';
import { api, createTeam, registerPerson, type Person } from '../../test/team-fixtures';

/**
 * A browser closed in the middle of a save: the connection drops while the request is still being sent, or
 * right after it was sent and before the answer. The server must apply a save completely or not at all, and
 * the version history must stay consistent (map.version = newest version number = number of versions; the
 * map's content = the newest version's content).
 */
let t: TestApp;
let call: ReturnType<typeof api>;
let owner: Person;
let teamId: string;

beforeAll(async () => {
  t = await startTestApp();
  call = api(t);
  owner = await registerPerson(t, 'saver');
  teamId = await createTeam(t, owner);
});
afterAll(async () => {
  await t?.close();
});

async function newMap(): Promise<{ id: string; version: number }> {
  const res = await call('POST', `/teams/${teamId}/maps`, { as: owner, json: { title: 'Interrupted saves', setup: defaultSetup() } });
  expect(res.status).toBe(201);
  return res.body;
}

function saveBody(expectedVersion: number, n: number): string {
  const setup: MapSetup = { ...defaultSetup(), energyFloorKelvin: 1e-3 * (n + 1), grid: { nAlpha: 64 + n, nField: 64 } };
  // A description long enough that the body spans several TCP segments.
  return JSON.stringify({ expectedVersion, title: `Save ${n}`, description: `Attempt ${n}: ${'field-bound anion '.repeat(400)}`, setup });
}

/**
 * Writes a PATCH of `body` on a raw socket. `cutAt` bytes of the whole request (head + body) go out, then the
 * socket is destroyed; with `cutAt` = the full length the request is complete and the connection is dropped
 * before the answer could be read.
 */
async function interruptedSave(mapId: string, body: string, cutAt: (total: number) => number): Promise<void> {
  const url = new URL(t.baseUrl);
  const head =
    `PATCH ${url.pathname}/maps/${mapId} HTTP/1.1\r\nHost: ${url.host}\r\nAuthorization: Bearer ${owner.token}\r\n` +
    `Content-Type: application/json\r\nContent-Length: ${Buffer.byteLength(body)}\r\n\r\n`;
  const request = Buffer.from(head + body);
  const n = Math.max(1, Math.min(request.length, cutAt(request.length)));
  await new Promise<void>((resolve, reject) => {
    const socket = net.connect(Number(url.port), url.hostname, () => {
      // Sent in pieces, as a slow upload would be; the last piece is followed at once by the drop.
      const pieces = [request.subarray(0, Math.floor(n / 2)), request.subarray(Math.floor(n / 2), n)];
      socket.write(pieces[0], () => {
        setTimeout(() => {
          socket.write(pieces[1], () => {
            socket.destroy();
            resolve();
          });
        }, 20);
      });
    });
    socket.on('error', reject);
  });
}

interface History {
  version: number;
  title: string;
  setup: MapSetup;
  versions: { number: number; title: string }[];
}

async function history(mapId: string): Promise<History> {
  const map = await call('GET', `/maps/${mapId}`, { as: owner });
  const versions = await call('GET', `/maps/${mapId}/versions`, { as: owner });
  expect(map.status).toBe(200);
  return { version: map.body.version, title: map.body.title, setup: map.body.setup, versions: versions.body };
}

/** The invariants of a consistent history; answers the newest version's full content. */
async function expectConsistent(mapId: string): Promise<History> {
  const h = await history(mapId);
  const numbers = h.versions.map((v) => v.number).sort((a, b) => a - b);
  expect(numbers).toEqual(Array.from({ length: h.version }, (_, i) => i + 1));
  const newest = await call('GET', `/maps/${mapId}/versions/${h.version}`, { as: owner });
  expect(newest.status).toBe(200);
  expect(newest.body.title).toBe(h.title);
  expect(newest.body.setup).toEqual(h.setup);
  return h;
}

async function settle(mapId: string, until: (h: History) => boolean): Promise<History> {
  const deadline = Date.now() + 5000;
  for (;;) {
    const h = await history(mapId);
    if (until(h) || Date.now() > deadline) return h;
    await new Promise((r) => setTimeout(r, 50));
  }
}

describe('a save interrupted by a closed browser', () => {
  it('cut in the middle of the body: nothing is written, and the next save works', async () => {
    const map = await newMap();
    await interruptedSave(map.id, saveBody(1, 1), (total) => Math.floor(total * 0.6));
    // Give the server time to notice the drop (it must not half-apply anything meanwhile).
    await new Promise((r) => setTimeout(r, 300));
    const h = await expectConsistent(map.id);
    expect(h.version).toBe(1);
    expect(h.title).toBe('Interrupted saves');

    const next = await call('PATCH', `/maps/${map.id}`, { as: owner, json: JSON.parse(saveBody(1, 2)) });
    expect(next.status).toBe(200);
    expect(next.body.version).toBe(2);
    await expectConsistent(map.id);
  });

  it('cut inside the request head: nothing is written', async () => {
    const map = await newMap();
    await interruptedSave(map.id, saveBody(1, 3), () => 40);
    await new Promise((r) => setTimeout(r, 300));
    expect((await expectConsistent(map.id)).version).toBe(1);
  });

  it('complete request, connection dropped before the answer: the save is applied in full as one new version', async () => {
    const map = await newMap();
    const body = saveBody(1, 4);
    await interruptedSave(map.id, body, (total) => total);
    const h = await settle(map.id, (x) => x.version === 2);
    expect(h.version).toBe(2);
    expect(h.title).toBe('Save 4');
    expect(h.setup).toEqual(JSON.parse(body).setup);
    await expectConsistent(map.id);
  });

  it('forty saves cut at random points, several at once: every one is all or nothing and the history stays consistent', async () => {
    const map = await newMap();
    const sent = new Map<string, MapSetup>();
    // Deterministic "random" cut points (a fixed linear congruential sequence), half of them complete requests.
    let seed = 20261202;
    const next = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    let expected = 1;
    for (let round = 0; round < 8; round++) {
      const fractions = Array.from({ length: 5 }, () => next());
      await Promise.all(
        fractions.map((fraction, i) => {
          const n = 10 + round * 5 + i;
          const body = saveBody(expected, n);
          sent.set(`Save ${n}`, JSON.parse(body).setup);
          return interruptedSave(map.id, body, (total) => (fraction < 0.5 ? total : Math.floor(total * fraction * 2)));
        }),
      );
      // Of the complete requests based on the same version exactly one lands (the others conflict); cut ones never do.
      if (fractions.some((f) => f < 0.5)) expected++;
      const h = await settle(map.id, (x) => x.version === expected);
      expect(h.version).toBe(expected);
    }
    await new Promise((r) => setTimeout(r, 300));
    const h = await expectConsistent(map.id);
    expect(h.version).toBe(expected);
    expect(expected).toBeGreaterThan(4);
    // Every stored version is exactly one of the complete bodies that were sent (or the original).
    for (let number = 2; number <= h.version; number++) {
      const v = await call('GET', `/maps/${map.id}/versions/${number}`, { as: owner });
      expect(sent.get(v.body.title)).toEqual(v.body.setup);
      expect(v.body.description).toMatch(/^Attempt \d+: (field-bound anion ){400}$/);
    }
    // And the server still serves and saves normally.
    const after = await call('PATCH', `/maps/${map.id}`, { as: owner, json: { expectedVersion: h.version, title: 'After the storm' } });
    expect(after.status).toBe(200);
    expect(after.body.version).toBe(h.version + 1);
    await expectConsistent(map.id);
  });
});
