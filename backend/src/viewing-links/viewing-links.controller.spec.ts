import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EntityManager } from '@mikro-orm/postgresql';
import { defaultSetup } from '@fieldbound/shared';
import { redactPath } from '../common/request-logging.middleware';
import { startTestApp, TestClock, type TestApp } from '../../test/test-app';
import { api, type Caller, callerOf, type Person, ROLES, roleCast, type RoleCast } from '../../test/team-fixtures';
import { VIEW_RATE_LIMIT } from './viewing-link-throttler.guard';

let t: TestApp;
let clock: TestClock;
let cast: RoleCast;
let call: ReturnType<typeof api>;

beforeAll(async () => {
  clock = new TestClock();
  t = await startTestApp({}, { clock });
  call = api(t);
  cast = await roleCast(t);
});
afterAll(async () => {
  await t?.close();
});

async function newMap(title = 'Potassium for the lecture') {
  const res = await call('POST', `/teams/${cast.teamId}/maps`, { as: cast.owner, json: { title, description: 'Week 3', tags: ['k'], setup: defaultSetup() } });
  expect(res.status).toBe(201);
  return res.body as { id: string };
}

function speciesCsv(listName: string, rows: string[]): FormData {
  const form = new FormData();
  form.append('name', listName);
  form.append('file', new Blob([['name,polarizability,uncertainty,unit,mass_number,electron_affinity_ev,source', ...rows].join('\n')], { type: 'text/csv' }), 'species.csv');
  return form;
}

async function newLink(mapId: string, json: Record<string, unknown> = {}, as: Person = cast.editor) {
  const res = await call('POST', `/maps/${mapId}/viewing-links`, { as, json });
  expect(res.status).toBe(201);
  return res.body as { token: string; path: string; link: { id: string; viewCount: number } };
}

const EDIT = { owner: 200, editor: 200, viewer: 403, outsider: 404, anonymous: 401 };

describe('viewing links: status of every route for every role', () => {
  const routes: { name: string; expect: Record<Caller, number>; run(as: Person | null): Promise<{ status: number }> }[] = [
    { name: 'GET /maps/:mapId/viewing-links', expect: EDIT, run: async (as) => call('GET', `/maps/${(await newMap()).id}/viewing-links`, { as }) },
    { name: 'POST /maps/:mapId/viewing-links', expect: { ...EDIT, owner: 201, editor: 201 }, run: async (as) => call('POST', `/maps/${(await newMap()).id}/viewing-links`, { as, json: {} }) },
    {
      name: 'DELETE /maps/:mapId/viewing-links/:linkId',
      expect: { ...EDIT, owner: 204, editor: 204 },
      run: async (as) => {
        const map = await newMap();
        const link = await newLink(map.id);
        return call('DELETE', `/maps/${map.id}/viewing-links/${link.link.id}`, { as });
      },
    },
    {
      name: 'GET /view/:token (no sign-in needed; any caller)',
      expect: { owner: 200, editor: 200, viewer: 200, outsider: 200, anonymous: 200 },
      run: async (as) => call('GET', (await newLink((await newMap()).id)).path.replace(/^/, ''), { as }),
    },
  ];
  for (const route of routes) {
    it(`${route.name}: ${ROLES.map((r) => `${r} ${route.expect[r]}`).join(', ')}`, async () => {
      const seen: Record<string, number> = {};
      for (const caller of ROLES) seen[caller] = (await route.run(callerOf(cast, caller))).status;
      expect(seen).toEqual(route.expect);
    });
  }
});

describe('viewing links: tokens', () => {
  it('shows a 256-bit base64url token once, stores only its SHA-256, and lists links without it', async () => {
    const map = await newMap();
    const created = await newLink(map.id, { includePins: true });
    expect(created.token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(created.path).toBe(`/view/${created.token}`);

    const em = t.app.get(EntityManager).fork();
    const rows = await em.getConnection().execute('select * from viewing_links where id = ?', [created.link.id]);
    expect(rows[0].token_hash).toBe(crypto.createHash('sha256').update(created.token).digest('hex'));
    expect(JSON.stringify(rows[0])).not.toContain(created.token);

    const listed = await call('GET', `/maps/${map.id}/viewing-links`, { as: cast.owner });
    expect(listed.body).toHaveLength(1);
    expect(Object.keys(listed.body[0]).sort()).toEqual(['createdAt', 'createdBy', 'expiresAt', 'id', 'includePins', 'lastViewedAt', 'mapId', 'revokedAt', 'viewCount']);
    expect(JSON.stringify(listed.body)).not.toContain(created.token);
    expect(listed.body[0]).toMatchObject({ includePins: true, createdBy: { id: cast.editor.id }, revokedAt: null, expiresAt: null });
  });

  it('gives two links to the same map different tokens', async () => {
    const map = await newMap();
    const [a, b] = [await newLink(map.id), await newLink(map.id)];
    expect(a.token).not.toBe(b.token);
  });
});

describe('viewing links: what a holder sees', () => {
  it('returns title, description and setup only, and counts each view', async () => {
    const map = await newMap('Shared map');
    await call('POST', `/maps/${map.id}/pins`, { as: cast.editor, json: { geometry: { kind: 'point', at: { alpha: 290, fieldTesla: 100 } }, title: 'secret pin' } });
    const link = await newLink(map.id);
    for (let i = 0; i < 3; i++) {
      const view = await call('GET', `/view/${link.token}`);
      expect(view.status).toBe(200);
      expect(view.body).toEqual({ title: 'Shared map', description: 'Week 3', setup: defaultSetup(), species: [], pins: null });
      expect(view.headers.get('cache-control')).toBe('no-store');
    }
    const listed = await call('GET', `/maps/${map.id}/viewing-links`, { as: cast.editor });
    expect(listed.body[0].viewCount).toBe(3);
    expect(listed.body[0].lastViewedAt).not.toBeNull();
  });

  it('includes pins (without authors or threads) only when the link allows it', async () => {
    const map = await newMap();
    const pin = await call('POST', `/maps/${map.id}/pins`, { as: cast.editor, json: { geometry: { kind: 'point', at: { alpha: 290, fieldTesla: 100 } }, title: 'Look here', body: 'the m = 0 edge' } });
    await call('POST', `/pins/${pin.body.id}/replies`, { as: cast.viewer, json: { body: 'internal remark' } });
    const link = await newLink(map.id, { includePins: true });
    const view = await call('GET', `/view/${link.token}`);
    expect(view.body.pins).toEqual([{ id: pin.body.id, geometry: { kind: 'point', at: { alpha: 290, fieldTesla: 100 } }, title: 'Look here', body: 'the m = 0 edge', status: 'open', category: null }]);
    expect(JSON.stringify(view.body)).not.toContain('internal remark');
    expect(JSON.stringify(view.body)).not.toContain(cast.editor.id);
  });

  it("carries the species the overlay names, from the catalogue and the map's team lists only, as the map page matches them", async () => {
    const ours = await call('POST', `/teams/${cast.teamId}/species-lists`, {
      as: cast.editor,
      form: speciesCsv(`Ours ${crypto.randomUUID()}`, ["Cs (our fit),401.2,0.5,a0^3,133,0.4716,Group calculation 2026", "O'Neil? \\x,43.4,,A^3,39,,Quote test source", 'Not named,10,,a0^3,20,,unused']),
    });
    expect(ours.status).toBe(201);
    // Another team's list with a species of the same name and one of its own: neither may reach this map's link.
    const theirs = await call('POST', `/teams/${cast.otherTeamId}/species-lists`, {
      as: cast.outsider,
      form: speciesCsv(`Theirs ${crypto.randomUUID()}`, ['Cs (our fit),999,,a0^3,133,,Other team secret source', 'Their own,50,,a0^3,40,,Other team private value']),
    });
    expect(theirs.status).toBe(201);

    const names = ['Mg', 'Barium', 'Cs (our fit)', "O'Neil? \\x", 'Their own', 'Unobtainium', 'mg'];
    const created = await call('POST', `/teams/${cast.teamId}/maps`, { as: cast.owner, json: { title: 'With species', setup: { ...defaultSetup(), species: names } } });
    expect(created.status).toBe(201);
    const link = await newLink(created.body.id);
    const view = await call('GET', `/view/${link.token}`);
    expect(view.status).toBe(200);

    const species = view.body.species as { name: string; symbol: string | null; origin: string; list: { name: string } | null; polarizability: { value: number; source: string } }[];
    // Catalogue by atomic number (Mg by symbol, Ba by name), then the team's rows; exact text only ("mg" matches nothing).
    expect(species.map((s) => [s.origin, s.symbol ?? s.name])).toEqual([
      ['catalogue', 'Mg'],
      ['catalogue', 'Ba'],
      ['team', 'Cs (our fit)'],
      ['team', "O'Neil? \\x"],
    ]);
    expect(species[0].polarizability.source.length).toBeGreaterThan(0);
    expect(species[2]).toMatchObject({ list: { name: ours.body.name }, polarizability: { value: 401.2, source: 'Group calculation 2026' }, electronAffinity: { valueEv: 0.4716, source: 'Group calculation 2026' } });
    // 43.4 Å³ entered, kept with the a₀³ value as on the map page.
    expect(species[3]).toMatchObject({ polarizability: { entered: { value: 43.4, unit: 'A^3' } }, electronAffinity: { stableAnion: false } });
    for (const s of species) expect(Object.keys(s)).not.toContain('id');

    // The same entries the signed-in map page gets from the team's species (minus ids), picked by the overlay's rule.
    const teamSpecies = await call('GET', `/teams/${cast.teamId}/species`, { as: cast.viewer });
    const picked = (teamSpecies.body.items as { id: string; name: string; symbol: string | null; list: { id: string; name: string } | null }[])
      .filter((s) => names.includes(s.name) || (s.symbol !== null && names.includes(s.symbol)))
      .map(({ id: _id, list, ...rest }) => ({ ...rest, list: list ? { name: list.name } : null }));
    expect(species).toEqual(picked);

    const text = JSON.stringify(view.body);
    for (const secret of ['Other team', theirs.body.id, theirs.body.name, ours.body.id, 'unused']) expect(text).not.toContain(secret);
  });

  it('answers 410 after the expiry, 404 after revocation, and 404 for unknown or malformed tokens', async () => {
    const map = await newMap();
    const expiring = await newLink(map.id, { expiresAt: new Date(clock.now().getTime() + 3_600_000).toISOString() });
    expect((await call('GET', `/view/${expiring.token}`)).status).toBe(200);
    clock.advance(2 * 3_600_000);
    try {
      const expired = await call('GET', `/view/${expiring.token}`);
      expect(expired.status).toBe(410);
      expect(expired.body.code).toBe('viewing_link_expired');
    } finally {
      clock.advance(-2 * 3_600_000);
    }

    const revoked = await newLink(map.id);
    expect((await call('DELETE', `/maps/${map.id}/viewing-links/${revoked.link.id}`, { as: cast.owner })).status).toBe(204);
    expect((await call('GET', `/view/${revoked.token}`)).status).toBe(404);
    const listed = await call('GET', `/maps/${map.id}/viewing-links`, { as: cast.owner });
    expect(listed.body.find((l: { id: string }) => l.id === revoked.link.id).revokedAt).not.toBeNull();

    expect((await call('GET', `/view/${crypto.randomBytes(32).toString('base64url')}`)).status).toBe(404);
    expect((await call('GET', '/view/not-a-token')).status).toBe(404);
  });

  it('refuses an expiry in the past', async () => {
    const map = await newMap();
    const res = await call('POST', `/maps/${map.id}/viewing-links`, { as: cast.editor, json: { expiresAt: '2020-01-01T00:00:00Z' } });
    expect(res.status).toBe(400);
    expect(res.body.errors.expiresAt).toEqual(['The expiry must be in the future.']);
  });

  it('stops working while the map is in the bin and works again after a restore', async () => {
    const map = await newMap();
    const link = await newLink(map.id);
    await call('DELETE', `/maps/${map.id}`, { as: cast.editor });
    expect((await call('GET', `/view/${link.token}`)).status).toBe(404);
    await call('POST', `/maps/${map.id}/restore`, { as: cast.owner });
    expect((await call('GET', `/view/${link.token}`)).status).toBe(200);
  });
});

describe('viewing links: a token opens nothing but GET /api/view/:token', () => {
  it('is refused (401) as a bearer token on every map, pin, link and species route, and changes nothing', async () => {
    const map = await newMap('Protected');
    const pin = await call('POST', `/maps/${map.id}/pins`, { as: cast.editor, json: { geometry: { kind: 'point', at: { alpha: 290, fieldTesla: 100 } }, title: 'p' } });
    const { token, link } = await newLink(map.id, { includePins: true });
    const m = `/maps/${map.id}`;
    const p = `/pins/${pin.body.id}`;
    const requests: [string, string, unknown?][] = [
      ['GET', `/teams/${cast.teamId}/maps`],
      ['POST', `/teams/${cast.teamId}/maps`, { title: 'x', setup: defaultSetup() }],
      ['GET', `/teams/${cast.teamId}/maps/deleted`],
      ['GET', m],
      ['PATCH', m, { expectedVersion: 1, title: 'hijacked' }],
      ['DELETE', m],
      ['POST', `${m}/restore`],
      ['POST', `${m}/duplicate`, {}],
      ['GET', `${m}/versions`],
      ['GET', `${m}/versions/1`],
      ['GET', `${m}/diff?from=1&to=1`],
      ['POST', `${m}/versions/1/restore`, { expectedVersion: 1 }],
      ['PUT', `${m}/summary`, { engineVersion: 'x', setupFingerprint: '0123456789abcdef', counts: { bound: 0, resonance: 0, unbound: 0 }, computationMs: 1 }],
      ['GET', `${m}/thumbnail`],
      ['GET', `${m}/pins`],
      ['POST', `${m}/pins`, { geometry: { kind: 'point', at: { alpha: 1, fieldTesla: 1 } }, title: 'x' }],
      ['GET', p],
      ['PATCH', p, { expectedVersion: 1, title: 'hijacked' }],
      ['DELETE', p],
      ['POST', `${p}/replies`, { body: 'hi' }],
      ['GET', `${m}/viewing-links`],
      ['POST', `${m}/viewing-links`, {}],
      ['DELETE', `${m}/viewing-links/${link.id}`],
      ['GET', '/species/catalogue'],
      ['GET', `/teams/${cast.teamId}/species`],
      ['GET', `/teams/${cast.teamId}/species-lists`],
    ];
    const statuses: Record<string, number> = {};
    for (const [method, path, json] of requests) {
      statuses[`${method} ${path}`] = (await call(method, path, { token, json })).status;
      // The token in the query string or a header other than Authorization is ignored just the same.
      const sep = path.includes('?') ? '&' : '?';
      const viaQuery = await call(method, `${path}${sep}token=${token}`, { json, headers: { 'x-viewing-token': token } });
      expect(viaQuery.status, `${method} ${path} with ?token=`).toBe(401);
    }
    expect(Object.entries(statuses).filter(([, s]) => s !== 401)).toEqual([]);
    // Nothing changed.
    const now = await call('GET', m, { as: cast.viewer });
    expect(now.body).toMatchObject({ title: 'Protected', version: 1 });
    expect((await call('GET', p, { as: cast.viewer })).body).toMatchObject({ title: 'p', replyCount: 0 });
    expect((await call('GET', `/view/${token}`)).status).toBe(200);
  });

  it('has no write method on the public route', async () => {
    const map = await newMap();
    const { token } = await newLink(map.id);
    for (const method of ['POST', 'PUT', 'PATCH', 'DELETE']) {
      expect((await call(method, `/view/${token}`, { json: { title: 'x' } })).status, method).toBe(404);
    }
  });

  it('masks the token in the logged path of /api/view/<token>, whatever its length', () => {
    expect(redactPath('/api/view/AbC_-12')).toBe('/api/view/:token');
    expect(redactPath(`/api/view/${'x'.repeat(43)}`)).toBe('/api/view/:token');
    expect(redactPath('/api/maps/7f1f2b9e-3c61-4a7e-9d0b-2d4b1f0c5a11/viewing-links')).toBe('/api/maps/7f1f2b9e-3c61-4a7e-9d0b-2d4b1f0c5a11/viewing-links');
  });
});

describe('viewing links: rate limit', () => {
  it(`answers 429 after ${VIEW_RATE_LIMIT.limit} views a minute from one address`, async () => {
    const own = await startTestApp();
    try {
      const ownCall = api(own);
      const statuses: number[] = [];
      // Unknown tokens count too: that is what stops guessing.
      for (let i = 0; i <= VIEW_RATE_LIMIT.limit; i++) statuses.push((await ownCall('GET', `/view/${crypto.randomBytes(32).toString('base64url')}`)).status);
      expect(statuses.slice(0, VIEW_RATE_LIMIT.limit).every((s) => s === 404)).toBe(true);
      expect(statuses[VIEW_RATE_LIMIT.limit]).toBe(429);
      // Signed-in routes are not affected by it.
      expect((await ownCall('GET', '/species/catalogue')).status).toBe(401);
    } finally {
      await own.close();
    }
  });
});
