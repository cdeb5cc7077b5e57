import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EntityManager } from '@mikro-orm/postgresql';
import { defaultSetup, setupFingerprint } from '@fieldbound/shared';
import { startTestApp, type TestApp } from '../../test/test-app';
import { api, roleCast, type RoleCast, thumbnailForm } from '../../test/team-fixtures';
import { SavedMap } from '../maps/map.entity';
import { MapReads } from '../maps/map.reads';
import { MapVersion } from '../maps/map-version.entity';
import { toMapDetail, toMapListItem, toVersionSummary } from '../maps/map.views';
import { PinReply } from '../pins/pin-reply.entity';
import { Pin } from '../pins/pin.entity';
import { PinReads } from '../pins/pin.reads';
import { toPinView, toReplyView } from '../pins/pin.views';
import { SpeciesReads } from '../species/species.reads';
import { SpeciesService } from '../species/species.service';
import { Clock } from './clock';

// The plain-SQL reads (common/sql-reads.ts) must answer exactly what the ORM-built views answer for the same rows:
// every field, the same order, the same JSON text. The data covers every joined branch: summaries (current and
// stale), thumbnails, edits by another person, a restored version, resolved pins, replies, a person removed.

let t: TestApp;
let cast: RoleCast;
let call: ReturnType<typeof api>;
const mapIds: string[] = [];

beforeAll(async () => {
  t = await startTestApp();
  call = api(t);
  cast = await roleCast(t);
  const summary = { engineVersion: '0.2.0', setupFingerprint: setupFingerprint(defaultSetup()), counts: { bound: 12, resonance: 3, unbound: 400 }, computationMs: 81.25 };
  for (const [i, title] of ['Barium at 20 T', 'caesium_%_weak', 'Strontium sweep'].entries()) {
    const created = await call('POST', `/teams/${cast.teamId}/maps`, { as: cast.owner, json: { title, tags: i ? ['lab', `t${i}`] : [], setup: defaultSetup() } });
    expect(created.status).toBe(201);
    mapIds.push(created.body.id);
  }
  const [a, b] = mapIds;
  expect((await call('PUT', `/maps/${a}/summary`, { as: cast.editor, json: summary })).status).toBe(200);
  expect((await call('PUT', `/maps/${a}/thumbnail`, { as: cast.editor, form: thumbnailForm() })).status).toBe(200);
  expect((await call('PUT', `/maps/${b}/summary`, { as: cast.owner, json: summary })).status).toBe(200);
  // b's setup changes after its summary: the summary is stale (matchesCurrentSetup false).
  const saved = await call('PATCH', `/maps/${b}`, { as: cast.editor, json: { expectedVersion: 1, description: 'Edited.', setup: { ...defaultSetup(), energyFloorKelvin: 2e-3 } } });
  expect(saved.status).toBe(200);
  expect((await call('POST', `/maps/${b}/versions/1/restore`, { as: cast.editor, json: { expectedVersion: 2 } })).status).toBe(200);
  for (const mapId of [a, b]) {
    for (const title of ['First look', 'Second look']) {
      const pin = await call('POST', `/maps/${mapId}/pins`, { as: cast.editor, json: { geometry: { kind: 'point', at: { alpha: 80, fieldTesla: 12 } }, title, body: 'Is <this> bound?' } });
      expect(pin.status).toBe(201);
      expect((await call('POST', `/pins/${pin.body.id}/replies`, { as: cast.viewer, json: { body: 'Reply one.' } })).status).toBe(201);
      expect((await call('POST', `/pins/${pin.body.id}/replies`, { as: cast.owner, json: { body: 'Reply two.' } })).status).toBe(201);
      if (title === 'Second look') expect((await call('PATCH', `/pins/${pin.body.id}`, { as: cast.owner, json: { expectedVersion: 1, status: 'resolved' } })).status).toBe(200);
    }
  }
  const rect = { kind: 'rect', min: { alpha: 10, fieldTesla: 1 }, max: { alpha: 20, fieldTesla: 2 } };
  expect((await call('POST', `/maps/${a}/pins`, { as: cast.editor, json: { geometry: rect, title: 'No replies' } })).status).toBe(201);
});
afterAll(async () => {
  await t?.close();
});

/** A fresh manager with no identity map carried over, as a request has. */
const fresh = () => t.app.get(EntityManager).fork();

describe('plain-SQL reads equal the ORM views', () => {
  it('open map: every map of the team, with the caller’s role', async () => {
    for (const id of mapIds) {
      const em = fresh();
      const viaOrm = toMapDetail(await em.findOneOrFail(SavedMap, { id }, { populate: ['createdBy', 'updatedBy', 'summary', 'summary.computedBy', 'thumbnail'] }));
      const viaSql = await new MapReads(fresh()).detailWithRole(id, cast.viewer.id);
      expect(JSON.stringify(viaSql?.detail)).toBe(JSON.stringify(viaOrm));
      expect(viaSql?.role).toBe('viewer');
      expect((await new MapReads(fresh()).detailWithRole(id, cast.outsider.id))?.role).toBeNull();
    }
  });

  it('map list: every sort, order, search, tag and page gives the ORM’s items in the ORM’s order', async () => {
    const orm = async (orderBy: Record<string, 'asc' | 'desc'>, where: Record<string, unknown> = {}) =>
      (await fresh().find(SavedMap, { team: cast.teamId, deletedAt: null, ...where }, { populate: ['createdBy', 'updatedBy', 'summary', 'summary.computedBy', 'thumbnail'], orderBy: { ...orderBy, id: 'asc' } })).map(toMapListItem);
    const reads = new MapReads(fresh());
    for (const [sort, column] of [['updatedAt', 'updatedAt'], ['createdAt', 'createdAt'], ['title', 'title']] as const) {
      for (const order of ['asc', 'desc'] as const) {
        const expected = await orm({ [column]: order });
        const got = await reads.listForTeam(cast.teamId, { sort, order, limit: 50, offset: 0 });
        expect(JSON.stringify(got.items)).toBe(JSON.stringify(expected));
        expect(got.total).toBe(expected.length);
        const page = await reads.listForTeam(cast.teamId, { sort, order, limit: 2, offset: 1 });
        expect(JSON.stringify(page.items)).toBe(JSON.stringify(expected.slice(1, 3)));
        expect(page.total).toBe(expected.length);
      }
    }
    // Search matches titles and tags; LIKE wildcards in the text are literal.
    expect((await reads.listForTeam(cast.teamId, { search: '_%_', sort: 'title', order: 'asc', limit: 50, offset: 0 })).items.map((m) => m.title)).toEqual(['caesium_%_weak']);
    expect((await reads.listForTeam(cast.teamId, { search: 'LAB', sort: 'title', order: 'asc', limit: 50, offset: 0 })).total).toBe(2);
    expect((await reads.listForTeam(cast.teamId, { tag: 't2', sort: 'title', order: 'asc', limit: 50, offset: 0 })).items.map((m) => m.title)).toEqual(['Strontium sweep']);
    // Past the last page: no items, and still the true total.
    expect(await reads.listForTeam(cast.teamId, { sort: 'title', order: 'asc', limit: 2, offset: 10 })).toEqual({ items: [], total: 3 });
  });

  it('versions: newest first, with restored-from', async () => {
    for (const id of mapIds) {
      const expected = (await fresh().find(MapVersion, { map: id }, { populate: ['createdBy'], orderBy: { number: 'desc' } })).map(toVersionSummary);
      expect(JSON.stringify(await new MapReads(fresh()).versionSummaries(id))).toBe(JSON.stringify(expected));
    }
    expect((await new MapReads(fresh()).versionSummaries(mapIds[1])).map((v) => v.restoredFrom)).toEqual([1, null, null]);
  });

  it('pins: list (all, open, resolved), one pin with its thread, and the shared view of them', async () => {
    for (const id of mapIds) {
      for (const status of [undefined, 'open', 'resolved'] as const) {
        const pins = await fresh().find(Pin, { map: id, ...(status ? { status } : {}) }, { populate: ['author', 'resolvedBy'], orderBy: { createdAt: 'asc', id: 'asc' } });
        expect(JSON.stringify(await new PinReads(fresh()).listForMap(id, status))).toBe(JSON.stringify(pins.map(toPinView)));
      }
      const pins = await fresh().find(Pin, { map: id }, { orderBy: { createdAt: 'asc', id: 'asc' } });
      const shared = pins.map(({ id: pinId, geometry, title, body, status, category }) => ({ id: pinId, geometry, title, body, status, category }));
      expect(JSON.stringify(await new PinReads(fresh()).sharedForMap(id))).toBe(JSON.stringify(shared));
      for (const pin of pins) {
        const em = fresh();
        const entity = await em.findOneOrFail(Pin, { id: pin.id }, { populate: ['author', 'resolvedBy'] });
        const replies = await em.find(PinReply, { pin: pin.id }, { populate: ['author'], orderBy: { createdAt: 'asc', id: 'asc' } });
        const reads = new PinReads(fresh());
        const detail = await reads.detail((await reads.pin(pin.id))!);
        expect(JSON.stringify(detail)).toBe(JSON.stringify({ ...toPinView(entity), replyCount: replies.length, replies: replies.map(toReplyView) }));
      }
    }
    expect((await new PinReads(fresh()).listForMap(mapIds[0], 'resolved')).length).toBe(1);
  });

  it('species: the catalogue atoms and team species that names pick out, as the ORM-built team species filtered by the overlay rule', async () => {
    const csv = (rows: string[]) => new Blob([['name,polarizability,uncertainty,unit,mass_number,electron_affinity_ev,source', ...rows].join('\n')], { type: 'text/csv' });
    const upload = async (teamId: string, as: RoleCast['owner'], name: string, rows: string[]) => {
      const form = new FormData();
      form.append('name', name);
      form.append('file', csv(rows), 'species.csv');
      expect((await call('POST', `/teams/${teamId}/species-lists`, { as, form })).status).toBe(201);
    };
    // Two lists (uploaded out of name order) share a name; another team has the same name and one of its own.
    await upload(cast.teamId, cast.editor, 'Zeta list', ['Shared name,12.5,0.5,A^3,40,0.3,Zeta source', 'Zeta only,7,,a0^3,20,,Zeta']);
    await upload(cast.teamId, cast.editor, 'Alpha list', ['Shared name,30,,1e-24cm^3,41,,Alpha source', 'Cs,1,,a0^3,1,,a team row named like a symbol']);
    await upload(cast.otherTeamId, cast.outsider, 'Other', ['Shared name,99,,a0^3,1,,other team', 'Only theirs,5,,a0^3,1,,other team']);
    const names = ['Cs', 'Helium', 'Shared name', 'Only theirs', 'nobody', 'cs'];
    const orm = await new SpeciesService(fresh(), t.app.get(Clock)).forTeam(cast.teamId);
    const expected = orm.items.filter((e) => names.includes(e.name) || (e.symbol !== null && names.includes(e.symbol)));
    const got = await new SpeciesReads(fresh()).namedForTeam(cast.teamId, names);
    expect(JSON.stringify(got)).toBe(JSON.stringify(expected));
    expect(got.map((e) => `${e.list?.name ?? 'catalogue'}:${e.name}`)).toEqual(['catalogue:Helium', 'catalogue:Caesium', 'Alpha list:Shared name', 'Alpha list:Cs', 'Zeta list:Shared name']);
    expect(await new SpeciesReads(fresh()).namedForTeam(cast.teamId, [])).toEqual([]);
  });

  it('keeps a map, pin and reply readable after their author leaves (people shown as null)', async () => {
    const em = fresh();
    await em.getConnection().execute('delete from users where id = ?', [cast.viewer.id]);
    const pins = await new PinReads(fresh()).listForMap(mapIds[0]);
    const reads = new PinReads(fresh());
    const detail = await reads.detail((await reads.pin(pins[0].id))!);
    expect(detail.replies.map((r) => r.author)).toEqual([null, { id: cast.owner.id, displayName: expect.any(String) }]);
    const entity = await fresh().findOneOrFail(PinReply, { pin: pins[0].id, author: null }, { populate: ['author'] });
    expect(toReplyView(entity).author).toBeNull();
  });
});
