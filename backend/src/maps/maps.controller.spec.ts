import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EntityManager } from '@mikro-orm/postgresql';
import { defaultSetup, setupFingerprint } from '@fieldbound/shared';
import { startTestApp, type TestApp } from '../../test/test-app';
import { addMember, api, type Caller, callerOf, createTeam, type Person, PNG_1x1, ROLES, roleCast, type RoleCast, thumbnailForm } from '../../test/team-fixtures';
import { MapsPurgeService } from './maps-purge.service';

let t: TestApp;
let cast: RoleCast;
let call: ReturnType<typeof api>;

beforeAll(async () => {
  t = await startTestApp();
  call = api(t);
  cast = await roleCast(t);
});
afterAll(async () => {
  await t?.close();
});

async function newMap(by: Person = cast.owner, overrides: Record<string, unknown> = {}) {
  const res = await call('POST', `/teams/${cast.teamId}/maps`, { as: by, json: { title: 'Caesium, weak fields', tags: ['cs', 'lecture'], setup: defaultSetup(), ...overrides } });
  expect(res.status).toBe(201);
  return res.body as { id: string; version: number; title: string; setup: ReturnType<typeof defaultSetup> };
}

const summaryBody = () => ({ engineVersion: '0.1.0', setupFingerprint: setupFingerprint(defaultSetup()), counts: { bound: 120, resonance: 30, unbound: 4000 }, computationMs: 812.5 });

interface RouteCase {
  name: string;
  expect: Record<Caller, number>;
  run(as: Person | null): Promise<{ status: number }>;
}

const READ = { owner: 200, editor: 200, viewer: 200, outsider: 404, anonymous: 401 };
const EDIT = { owner: 200, editor: 200, viewer: 403, outsider: 404, anonymous: 401 };

const routes: RouteCase[] = [
  { name: 'GET /teams/:teamId/maps', expect: READ, run: (as) => call('GET', `/teams/${cast.teamId}/maps`, { as }) },
  { name: 'POST /teams/:teamId/maps', expect: { ...EDIT, owner: 201, editor: 201 }, run: (as) => call('POST', `/teams/${cast.teamId}/maps`, { as, json: { title: 'x', setup: defaultSetup() } }) },
  { name: 'GET /teams/:teamId/maps/deleted', expect: { owner: 200, editor: 403, viewer: 403, outsider: 404, anonymous: 401 }, run: (as) => call('GET', `/teams/${cast.teamId}/maps/deleted`, { as }) },
  { name: 'GET /maps/:mapId', expect: READ, run: async (as) => call('GET', `/maps/${(await newMap()).id}`, { as }) },
  { name: 'PATCH /maps/:mapId', expect: EDIT, run: async (as) => call('PATCH', `/maps/${(await newMap()).id}`, { as, json: { expectedVersion: 1, title: 'renamed' } }) },
  { name: 'DELETE /maps/:mapId', expect: { ...EDIT, owner: 204, editor: 204 }, run: async (as) => call('DELETE', `/maps/${(await newMap()).id}`, { as }) },
  {
    name: 'POST /maps/:mapId/restore',
    expect: { owner: 200, editor: 403, viewer: 403, outsider: 404, anonymous: 401 },
    run: async (as) => {
      const map = await newMap();
      expect((await call('DELETE', `/maps/${map.id}`, { as: cast.owner })).status).toBe(204);
      return call('POST', `/maps/${map.id}/restore`, { as });
    },
  },
  { name: 'POST /maps/:mapId/duplicate', expect: { ...EDIT, owner: 201, editor: 201 }, run: async (as) => call('POST', `/maps/${(await newMap()).id}/duplicate`, { as, json: {} }) },
  { name: 'GET /maps/:mapId/versions', expect: READ, run: async (as) => call('GET', `/maps/${(await newMap()).id}/versions`, { as }) },
  { name: 'GET /maps/:mapId/versions/:number', expect: READ, run: async (as) => call('GET', `/maps/${(await newMap()).id}/versions/1`, { as }) },
  { name: 'GET /maps/:mapId/diff', expect: READ, run: async (as) => call('GET', `/maps/${(await newMap()).id}/diff?from=1&to=1`, { as }) },
  { name: 'POST /maps/:mapId/versions/:number/restore', expect: EDIT, run: async (as) => call('POST', `/maps/${(await newMap()).id}/versions/1/restore`, { as, json: { expectedVersion: 1 } }) },
  { name: 'PUT /maps/:mapId/summary', expect: EDIT, run: async (as) => call('PUT', `/maps/${(await newMap()).id}/summary`, { as, json: summaryBody() }) },
  { name: 'PUT /maps/:mapId/thumbnail', expect: EDIT, run: async (as) => call('PUT', `/maps/${(await newMap()).id}/thumbnail`, { as, form: thumbnailForm() }) },
  {
    name: 'GET /maps/:mapId/thumbnail',
    expect: READ,
    run: async (as) => {
      const map = await newMap();
      expect((await call('PUT', `/maps/${map.id}/thumbnail`, { as: cast.owner, form: thumbnailForm() })).status).toBe(200);
      return call('GET', `/maps/${map.id}/thumbnail`, { as });
    },
  },
];

describe('maps: status of every route for every role', () => {
  for (const route of routes) {
    it(`${route.name}: ${ROLES.map((r) => `${r} ${route.expect[r]}`).join(', ')}`, async () => {
      const seen: Record<string, number> = {};
      for (const caller of ROLES) seen[caller] = (await route.run(callerOf(cast, caller))).status;
      expect(seen).toEqual(route.expect);
    });
  }

  it('answers 404 (not 400 or 500) for a malformed map id and an unknown one', async () => {
    expect((await call('GET', '/maps/not-a-uuid', { as: cast.owner })).status).toBe(404);
    expect((await call('GET', '/maps/00000000-0000-4000-8000-000000000000', { as: cast.owner })).status).toBe(404);
  });
});

describe('maps: setup validation', () => {
  it('rejects an invalid setup with 400 naming each offending field under setup.', async () => {
    const setup = defaultSetup() as unknown as Record<string, any>;
    setup.alphaAxis.min = -5;
    setup.fieldAxis = { ...setup.fieldAxis, min: 100, max: 10 };
    setup.grid.nAlpha = 5000;
    setup.colour = 'teal';
    const res = await call('POST', `/teams/${cast.teamId}/maps`, { as: cast.editor, json: { title: 'bad', setup } });
    expect(res.status).toBe(400);
    expect(res.body.statusCode).toBe(400);
    expect(Object.keys(res.body.errors).sort()).toEqual(['setup.alphaAxis.min', 'setup.colour', 'setup.fieldAxis.max', 'setup.grid.nAlpha']);
    expect(res.body.errors['setup.alphaAxis.min'].join(' ')).toMatch(/greater than zero/);
    expect(res.body.errors['setup.colour']).toEqual(['unknown field "colour"']);
  });

  it('rejects unknown top-level fields and an empty title with field errors', async () => {
    const res = await call('POST', `/teams/${cast.teamId}/maps`, { as: cast.editor, json: { title: '  ', setup: defaultSetup(), owner: 'me' } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.errors).sort()).toEqual(['owner', 'title']);
  });

  it('rejects an invalid setup in an edit and keeps the map unchanged', async () => {
    const map = await newMap();
    const res = await call('PATCH', `/maps/${map.id}`, { as: cast.editor, json: { expectedVersion: 1, setup: { ...defaultSetup(), grid: { nAlpha: 1, nField: 10 } } } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.errors)).toEqual(['setup.grid.nAlpha']);
    expect((await call('GET', `/maps/${map.id}`, { as: cast.viewer })).body.version).toBe(1);
  });
});

describe('maps: versions, diff and restore', () => {
  it('numbers every save, lists versions newest first, diffs two versions and restores as a new version', async () => {
    const map = await newMap(cast.editor);
    const v2 = await call('PATCH', `/maps/${map.id}`, { as: cast.editor, json: { expectedVersion: 1, title: 'Caesium, revised' } });
    expect(v2.status).toBe(200);
    expect(v2.body.version).toBe(2);
    const changed = { ...map.setup, alphaAxis: { ...map.setup.alphaAxis, max: map.setup.alphaAxis.max * 2 }, orbitals: { mMax: 3 } };
    const v3 = await call('PATCH', `/maps/${map.id}`, { as: cast.owner, json: { expectedVersion: 2, setup: changed } });
    expect(v3.body.version).toBe(3);
    expect(v3.body.updatedBy.id).toBe(cast.owner.id);

    const list = await call('GET', `/maps/${map.id}/versions`, { as: cast.viewer });
    expect(list.body.map((v: { number: number }) => v.number)).toEqual([3, 2, 1]);
    expect(list.body[2].createdBy.id).toBe(cast.editor.id);

    const diff = await call('GET', `/maps/${map.id}/diff?from=1&to=3`, { as: cast.viewer });
    expect(diff.status).toBe(200);
    expect(diff.body.changes).toEqual([
      { path: 'title', before: 'Caesium, weak fields', after: 'Caesium, revised' },
      { path: 'setup.alphaAxis.max', before: map.setup.alphaAxis.max, after: map.setup.alphaAxis.max * 2 },
      { path: 'setup.orbitals.mMax', before: map.setup.orbitals.mMax, after: 3 },
    ]);

    const restored = await call('POST', `/maps/${map.id}/versions/1/restore`, { as: cast.editor, json: { expectedVersion: 3 } });
    expect(restored.status).toBe(200);
    expect(restored.body).toMatchObject({ version: 4, title: 'Caesium, weak fields', setup: map.setup });
    const v4 = await call('GET', `/maps/${map.id}/versions/4`, { as: cast.viewer });
    expect(v4.body).toMatchObject({ number: 4, restoredFrom: 1, setup: map.setup });
    expect((await call('GET', `/maps/${map.id}/diff?from=1&to=4`, { as: cast.viewer })).body.changes).toEqual([]);
    expect((await call('GET', `/maps/${map.id}/versions/9`, { as: cast.viewer })).status).toBe(404);
  });

  it('makes no new version when an edit changes nothing', async () => {
    const map = await newMap();
    const res = await call('PATCH', `/maps/${map.id}`, { as: cast.editor, json: { expectedVersion: 1, title: map.title } });
    expect(res.body.version).toBe(1);
  });
});

describe('maps: optimistic locking', () => {
  it('answers 409 with the current map to a stale expectedVersion and overwrites nothing', async () => {
    const map = await newMap();
    expect((await call('PATCH', `/maps/${map.id}`, { as: cast.editor, json: { expectedVersion: 1, title: 'first writer' } })).status).toBe(200);
    const stale = await call('PATCH', `/maps/${map.id}`, { as: cast.owner, json: { expectedVersion: 1, title: 'second writer' } });
    expect(stale.status).toBe(409);
    expect(stale.body).toMatchObject({ statusCode: 409, code: 'version_conflict', current: { id: map.id, version: 2, title: 'first writer' } });
    expect(stale.body.current.setup).toEqual(map.setup);
    expect((await call('GET', `/maps/${map.id}`, { as: cast.viewer })).body.title).toBe('first writer');
  });

  it('lets exactly one of two simultaneous edits of the same version win', async () => {
    const map = await newMap();
    const results = await Promise.all(
      ['left', 'right', 'middle'].map((title) => call('PATCH', `/maps/${map.id}`, { as: cast.editor, json: { expectedVersion: 1, title } })),
    );
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409]);
    const winner = results.find((r) => r.status === 200)!.body.title;
    const now = await call('GET', `/maps/${map.id}`, { as: cast.viewer });
    expect(now.body).toMatchObject({ version: 2, title: winner });
    expect((await call('GET', `/maps/${map.id}/versions`, { as: cast.viewer })).body).toHaveLength(2);
  });

  it('answers 409 to a restore based on a stale version', async () => {
    const map = await newMap();
    await call('PATCH', `/maps/${map.id}`, { as: cast.editor, json: { expectedVersion: 1, title: 'moved on' } });
    const res = await call('POST', `/maps/${map.id}/versions/1/restore`, { as: cast.editor, json: { expectedVersion: 1 } });
    expect(res.status).toBe(409);
    expect(res.body.current.version).toBe(2);
  });
});

describe('maps: soft delete, restore and purge', () => {
  it('hides a deleted map, lists it for owners, and restores it', async () => {
    const map = await newMap();
    expect((await call('DELETE', `/maps/${map.id}`, { as: cast.editor })).status).toBe(204);
    expect((await call('GET', `/maps/${map.id}`, { as: cast.owner })).status).toBe(404);
    expect((await call('PATCH', `/maps/${map.id}`, { as: cast.owner, json: { expectedVersion: 1, title: 'x' } })).status).toBe(404);
    const listed = await call('GET', `/teams/${cast.teamId}/maps?limit=200`, { as: cast.owner });
    expect(listed.body.items.some((m: { id: string }) => m.id === map.id)).toBe(false);
    const bin = await call('GET', `/teams/${cast.teamId}/maps/deleted`, { as: cast.owner });
    const entry = bin.body.find((m: { id: string }) => m.id === map.id);
    expect(entry.deletedBy.id).toBe(cast.editor.id);
    expect(new Date(entry.restorableUntil).getTime() - new Date(entry.deletedAt).getTime()).toBe(30 * 86_400_000);

    const restored = await call('POST', `/maps/${map.id}/restore`, { as: cast.owner });
    expect(restored.status).toBe(200);
    expect((await call('GET', `/maps/${map.id}`, { as: cast.viewer })).status).toBe(200);
  });

  it('refuses to restore after 30 days (410) and purges such maps', async () => {
    const map = await newMap();
    await call('DELETE', `/maps/${map.id}`, { as: cast.owner });
    const em = t.app.get(EntityManager).fork();
    await em.getConnection().execute(`update maps set deleted_at = now() - interval '31 days' where id = ?`, [map.id]);
    expect((await call('POST', `/maps/${map.id}/restore`, { as: cast.owner })).status).toBe(410);
    const bin = await call('GET', `/teams/${cast.teamId}/maps/deleted`, { as: cast.owner });
    expect(bin.body.some((m: { id: string }) => m.id === map.id)).toBe(false);

    expect(await t.app.get(MapsPurgeService).purgeExpired()).toBeGreaterThanOrEqual(1);
    expect(await em.getConnection().execute('select count(*)::int as n from map_versions where map_id = ?', [map.id])).toEqual([{ n: 0 }]);
    expect((await call('POST', `/maps/${map.id}/restore`, { as: cast.owner })).status).toBe(404);
  });
});

describe('maps: duplicate', () => {
  it('copies into another team where the caller is an editor, and not where they are a viewer or a stranger', async () => {
    const map = await newMap(cast.editor, { description: 'for the seminar' });
    const editable = await createTeam(t, cast.outsider);
    await addMember(t, editable, cast.editor, 'editor');
    const readOnly = await createTeam(t, cast.outsider);
    await addMember(t, readOnly, cast.editor, 'viewer');

    const copy = await call('POST', `/maps/${map.id}/duplicate`, { as: cast.editor, json: { teamId: editable, title: 'Seminar copy' } });
    expect(copy.status).toBe(201);
    expect(copy.body).toMatchObject({ teamId: editable, title: 'Seminar copy', description: 'for the seminar', version: 1, setup: map.setup });
    const first = await call('GET', `/maps/${copy.body.id}/versions/1`, { as: cast.outsider });
    expect(first.body.duplicatedFrom).toEqual({ mapId: map.id, version: 1 });

    expect((await call('POST', `/maps/${map.id}/duplicate`, { as: cast.editor, json: { teamId: readOnly } })).status).toBe(403);
    expect((await call('POST', `/maps/${map.id}/duplicate`, { as: cast.editor, json: { teamId: cast.otherTeamId } })).status).toBe(404);
    const same = await call('POST', `/maps/${map.id}/duplicate`, { as: cast.editor, json: {} });
    expect(same.body).toMatchObject({ teamId: cast.teamId, title: 'Caesium, weak fields (copy)' });
  });
});

describe('maps: list, summary and thumbnail', () => {
  it('searches titles and tags, filters by tag and sorts by title', async () => {
    const team = await createTeam(t, cast.owner);
    const make = (title: string, tags: string[]) => call('POST', `/teams/${team}/maps`, { as: cast.owner, json: { title, tags, setup: defaultSetup() } });
    await make('Rubidium sweep', ['rb']);
    await make('Alkali overview', ['cs', 'rb', 'k']);
    await make('Noble gases', ['ar', 'kr']);
    const titles = async (q: string) => (await call('GET', `/teams/${team}/maps?${q}`, { as: cast.owner })).body.items.map((m: { title: string }) => m.title);
    expect(await titles('search=rb&sort=title')).toEqual(['Alkali overview', 'Rubidium sweep']);
    expect(await titles('search=NOBLE')).toEqual(['Noble gases']);
    expect(await titles('tag=kr')).toEqual(['Noble gases']);
    expect(await titles('sort=title&order=desc')).toEqual(['Rubidium sweep', 'Noble gases', 'Alkali overview']);
    expect(await titles('search=50%25')).toEqual([]);
    // total counts every match, not just the page (the count runs as its own query with the same filter).
    const page = async (q: string) => (await call('GET', `/teams/${team}/maps?${q}`, { as: cast.owner })).body;
    expect(await page('search=rb&limit=1&sort=title')).toMatchObject({ total: 2, items: [{ title: 'Alkali overview' }] });
    expect(await page('tag=rb&limit=1&offset=1&sort=title')).toMatchObject({ total: 2, items: [{ title: 'Rubidium sweep' }] });
    expect(await page('limit=2')).toMatchObject({ total: 3 });
    expect(await page('search=xenon')).toEqual({ items: [], total: 0 });
    expect((await call('GET', `/teams/${team}/maps?sort=colour`, { as: cast.owner })).status).toBe(400);
  });

  it('shows the summary and thumbnail in the list, and marks a summary stale after the setup changes', async () => {
    const map = await newMap();
    const put = await call('PUT', `/maps/${map.id}/summary`, { as: cast.editor, json: summaryBody() });
    expect(put.body).toMatchObject({ engineVersion: '0.1.0', counts: { bound: 120, resonance: 30, unbound: 4000 }, computationMs: 812.5, matchesCurrentSetup: true });
    const thumb = await call('PUT', `/maps/${map.id}/thumbnail`, { as: cast.editor, form: thumbnailForm() });
    expect(thumb.body.thumbnailUrl).toMatch(new RegExp(`^/api/maps/${map.id}/thumbnail\\?v=\\d+$`));

    const listed = (await call('GET', `/teams/${cast.teamId}/maps?limit=200`, { as: cast.viewer })).body.items.find((m: { id: string }) => m.id === map.id);
    expect(listed.summary.matchesCurrentSetup).toBe(true);
    expect(listed.thumbnailUrl).toBe(thumb.body.thumbnailUrl);
    expect(listed.setup).toBeUndefined();

    const got = await call('GET', `/maps/${map.id}/thumbnail`, { as: cast.viewer });
    expect(got.headers.get('content-type')).toBe('image/png');
    expect(Buffer.compare(got.body, PNG_1x1)).toBe(0);

    await call('PATCH', `/maps/${map.id}`, { as: cast.editor, json: { expectedVersion: 1, setup: { ...map.setup, orbitals: { mMax: 5 } } } });
    expect((await call('GET', `/maps/${map.id}`, { as: cast.viewer })).body.summary.matchesCurrentSetup).toBe(false);
  });

  it('refuses a thumbnail that is not a PNG (400) or is over 256 KB (413)', async () => {
    const map = await newMap();
    const jpeg = Buffer.from('ffd8ffe000104a46494600010100000100010000', 'hex');
    const notPng = await call('PUT', `/maps/${map.id}/thumbnail`, { as: cast.editor, form: thumbnailForm(jpeg) });
    expect(notPng.status).toBe(400);
    expect(notPng.body.errors.file).toEqual(['The thumbnail must be a PNG image.']);
    const big = Buffer.concat([PNG_1x1, Buffer.alloc(256 * 1024)]);
    expect((await call('PUT', `/maps/${map.id}/thumbnail`, { as: cast.editor, form: thumbnailForm(big) })).status).toBe(413);
    expect((await call('GET', `/maps/${map.id}/thumbnail`, { as: cast.editor })).status).toBe(404);
  });

  it('rejects a summary with a malformed fingerprint or negative counts', async () => {
    const map = await newMap();
    const res = await call('PUT', `/maps/${map.id}/summary`, { as: cast.editor, json: { ...summaryBody(), setupFingerprint: 'xyz', counts: { bound: -1, resonance: 0, unbound: 0 } } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.errors).sort()).toEqual(['counts.bound', 'setupFingerprint']);
  });
});
