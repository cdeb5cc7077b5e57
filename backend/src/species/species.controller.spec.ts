import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EntityManager } from '@mikro-orm/postgresql';
import { startTestApp, type TestApp } from '../../test/test-app';
import { api, type Caller, callerOf, type Person, ROLES, roleCast, type RoleCast } from '../../test/team-fixtures';

let t: TestApp;
let cast: RoleCast;
let call: ReturnType<typeof api>;

const HEADER = 'name,polarizability,uncertainty,unit,mass_number,electron_affinity_ev,source';
const GOOD = [HEADER, 'Cs (our fit),401.2,0.5,a0^3,133,0.4716,Group calculation 2026', 'K (CRC),43.4,,A^3,39,0.501459,CRC Handbook', 'Ar*,11.08,,1e-24cm^3,40,,made-up test species'].join('\n');

beforeAll(async () => {
  t = await startTestApp();
  call = api(t);
  cast = await roleCast(t);
});
afterAll(async () => {
  await t?.close();
});

function csvForm(text: string | Buffer, name = `List ${Math.random().toString(36).slice(2, 8)}`): FormData {
  const form = new FormData();
  form.append('name', name);
  form.append('file', new Blob([typeof text === 'string' ? text : new Uint8Array(text)], { type: 'text/csv' }), 'species.csv');
  return form;
}

async function upload(text: string | Buffer, as: Person = cast.editor, name?: string) {
  return call('POST', `/teams/${cast.teamId}/species-lists`, { as, form: csvForm(text, name) });
}

async function teamSpeciesCount(): Promise<number> {
  const em = t.app.get(EntityManager).fork();
  const [row] = await em.getConnection().execute('select count(*)::int as n from team_species s join species_lists l on l.id = s.list_id where l.team_id = ?', [cast.teamId]);
  return row.n as number;
}

describe('species catalogue', () => {
  it('serves the 45 seeded atoms with values and sources (Cs: 400.9 ± 0.7 a0^3, He: no stable anion)', async () => {
    const res = await call('GET', '/species/catalogue', { as: cast.viewer });
    expect(res.status).toBe(200);
    expect(res.body.items).toHaveLength(45);
    const cs = res.body.items.find((s: { symbol: string }) => s.symbol === 'Cs');
    expect(cs).toMatchObject({ id: 'catalogue:Cs', origin: 'catalogue', atomicNumber: 55, massNumber: 133, polarizability: { value: 400.9, uncertainty: 0.7 }, electronAffinity: { valueEv: 0.4715983 } });
    expect(cs.polarizability.source).toMatch(/Schwerdtfeger.*Nagle/);
    expect(cs.massSource).toMatch(/AME2020/);
    const he = res.body.items.find((s: { symbol: string }) => s.symbol === 'He');
    expect(he.electronAffinity).toMatchObject({ valueEv: null, stableAnion: false, status: 'confirmed' });
    expect(he.electronAffinity.note).toMatch(/metastable/);
    // The one value the compilation could not confirm in a public document is flagged as such.
    const tl = res.body.items.find((s: { symbol: string }) => s.symbol === 'Tl');
    expect(tl.electronAffinity).toMatchObject({ valueEv: 0.320053, stableAnion: true, status: 'from memory' });
    expect(res.body.items.filter((s: { electronAffinity: { status: string } }) => s.electronAffinity.status !== 'confirmed').map((s: { symbol: string }) => s.symbol)).toEqual(['Tl']);
    expect(he.electronAffinity.source).toMatch(/Andersen/);
    expect(res.body.items.map((s: { atomicNumber: number }) => s.atomicNumber)).toEqual([...res.body.items.map((s: { atomicNumber: number }) => s.atomicNumber)].sort((a, b) => a - b));
  });

  it('searches by name or exact symbol', async () => {
    const names = async (q: string) => (await call('GET', `/species/catalogue?search=${q}`, { as: cast.viewer })).body.items.map((s: { symbol: string }) => s.symbol);
    expect(await names('cs')).toEqual(['Cs']);
    expect(await names('ium')).toContain('Rb');
  });
});

describe('species: status of every route for every role', () => {
  const READ = { owner: 200, editor: 200, viewer: 200, outsider: 404, anonymous: 401 };
  const routes: { name: string; expect: Record<Caller, number>; run(as: Person | null): Promise<{ status: number }> }[] = [
    { name: 'GET /species/catalogue', expect: { ...READ, outsider: 200 }, run: (as) => call('GET', '/species/catalogue', { as }) },
    { name: 'GET /teams/:teamId/species', expect: READ, run: (as) => call('GET', `/teams/${cast.teamId}/species`, { as }) },
    { name: 'GET /teams/:teamId/species-lists', expect: READ, run: (as) => call('GET', `/teams/${cast.teamId}/species-lists`, { as }) },
    {
      name: 'POST /teams/:teamId/species-lists',
      expect: { owner: 201, editor: 201, viewer: 403, outsider: 404, anonymous: 401 },
      run: (as) => call('POST', `/teams/${cast.teamId}/species-lists`, { as, form: csvForm(GOOD) }),
    },
    {
      name: 'GET /teams/:teamId/species-lists/:listId',
      expect: READ,
      run: async (as) => call('GET', `/teams/${cast.teamId}/species-lists/${(await upload(GOOD)).body.id}`, { as }),
    },
    {
      name: 'DELETE /teams/:teamId/species-lists/:listId',
      expect: { owner: 204, editor: 204, viewer: 403, outsider: 404, anonymous: 401 },
      run: async (as) => call('DELETE', `/teams/${cast.teamId}/species-lists/${(await upload(GOOD)).body.id}`, { as }),
    },
  ];
  for (const route of routes) {
    it(`${route.name}: ${ROLES.map((r) => `${r} ${route.expect[r]}`).join(', ')}`, async () => {
      const seen: Record<string, number> = {};
      for (const caller of ROLES) seen[caller] = (await route.run(callerOf(cast, caller))).status;
      expect(seen).toEqual(route.expect);
    });
  }

  it("does not show one team's list to another team (404)", async () => {
    const list = await upload(GOOD);
    expect((await call('GET', `/teams/${cast.otherTeamId}/species-lists/${list.body.id}`, { as: cast.outsider })).status).toBe(404);
  });
});

describe('species lists: CSV upload', () => {
  it('imports a good file, converts units to a0^3 and lists catalogue and team species in one shape', async () => {
    const res = await upload(GOOD, cast.editor, 'Alkali fits');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Alkali fits', fileName: 'species.csv', speciesCount: 3, createdBy: { id: cast.editor.id } });
    const k = res.body.species.find((s: { name: string }) => s.name === 'K (CRC)');
    expect(k.polarizability.value).toBeCloseTo(43.4 / 0.14818471147216282, 9);
    expect(k.polarizability.entered).toEqual({ value: 43.4, uncertainty: null, unit: 'A^3' });
    expect(k).toMatchObject({ origin: 'team', list: { id: res.body.id, name: 'Alkali fits' }, massNumber: 39, electronAffinity: { valueEv: 0.501459 } });
    const ar = res.body.species.find((s: { name: string }) => s.name === 'Ar*');
    expect(ar.electronAffinity.valueEv).toBeNull();

    const all = await call('GET', `/teams/${cast.teamId}/species?search=cs`, { as: cast.viewer });
    expect(all.body.items.map((s: { origin: string; name: string }) => `${s.origin}:${s.name}`)).toEqual(expect.arrayContaining(['catalogue:Caesium', 'team:Cs (our fit)']));
    const lists = await call('GET', `/teams/${cast.teamId}/species-lists`, { as: cast.viewer });
    expect(lists.body.find((l: { id: string }) => l.id === res.body.id).speciesCount).toBe(3);
  });

  it('rejects a file with bad rows in several places, lists every error by line and column, and imports nothing', async () => {
    const before = await teamSpeciesCount();
    const text = [
      HEADER,
      'Good one,10,1,a0^3,7,,ok',
      'Bad alpha,-4,,a0^3,7,,src',
      'Good two,12,,a0^3,9,,ok',
      'Bad unit,12,,furlong^3,9,,src',
      'Bad mass,12,,a0^3,7.5,,src',
      'Good one,11,,a0^3,7,,dup',
      'Bad EA,12,,a0^3,9,-0.2,',
    ].join('\n');
    const res = await upload(text);
    expect(res.status).toBe(400);
    expect(res.body).toMatchObject({ statusCode: 400, code: 'csv_rejected' });
    expect(res.body.issues.map((i: { line: number; column: string }) => `${i.line}:${i.column}`)).toEqual([
      '3:polarizability',
      '5:unit',
      '6:mass_number',
      '7:name',
      '8:electron_affinity_ev',
      '8:source',
    ]);
    expect(res.body.issues[3].message).toBe('"Good one" is listed twice (first on line 2).');
    expect(await teamSpeciesCount()).toBe(before);
  });

  it('rejects a file that is not UTF-8 with a clear message', async () => {
    const latin1 = Buffer.from(`${HEADER}\nÅngström test,10,,A^3,7,,Physik-Handbuch für Studenten\n`, 'latin1');
    const res = await upload(latin1);
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([{ line: 2, column: null, message: expect.stringMatching(/^Line 2 is not valid UTF-8 text/) }]);
    const binary = await upload(Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x08]));
    expect(binary.body.issues[0].message).toMatch(/binary data/);
  });

  it('refuses a file over 1 MB (413) and one with more than 2000 species (400)', async () => {
    const row = 'Filler species with a long name,10,,a0^3,7,,a source that takes up room in every line of the file\n';
    const big = HEADER + '\n' + row.repeat(Math.ceil((1024 * 1024) / row.length) + 1);
    expect((await upload(big)).status).toBe(413);
    const many = [HEADER, ...Array.from({ length: 2001 }, (_, i) => `S${i},10,,a0^3,7,,s`)].join('\n');
    const res = await upload(many);
    expect(res.status).toBe(400);
    expect(res.body.issues[0].message).toBe('The file has 2001 species; at most 2000 per list.');
  });

  it('imports 2000 rows in one go', async () => {
    const rows = [HEADER, ...Array.from({ length: 2000 }, (_, i) => `Species ${i},${10 + i / 10},0.1,a0^3,${1 + (i % 250)},${i % 2 ? '' : '0.5'},generated`)].join('\n');
    const res = await upload(rows);
    expect(res.status).toBe(201);
    expect(res.body.speciesCount).toBe(2000);
  });

  it('refuses a second list with the same name (409) and a missing file or name (400)', async () => {
    expect((await upload(GOOD, cast.editor, 'Twice')).status).toBe(201);
    const again = await upload(GOOD, cast.editor, 'Twice');
    expect(again.status).toBe(409);
    const noFile = new FormData();
    noFile.append('name', 'No file');
    expect((await call('POST', `/teams/${cast.teamId}/species-lists`, { as: cast.editor, form: noFile })).body.issues[0].message).toMatch(/Attach the CSV/);
    const noName = new FormData();
    noName.append('file', new Blob([GOOD]), 'x.csv');
    const res = await call('POST', `/teams/${cast.teamId}/species-lists`, { as: cast.editor, form: noName });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.errors)).toEqual(['name']);
  });

  it('deletes a list with its species', async () => {
    const list = await upload(GOOD);
    const before = await teamSpeciesCount();
    expect((await call('DELETE', `/teams/${cast.teamId}/species-lists/${list.body.id}`, { as: cast.owner })).status).toBe(204);
    expect(await teamSpeciesCount()).toBe(before - 3);
    expect((await call('GET', `/teams/${cast.teamId}/species-lists/${list.body.id}`, { as: cast.owner })).status).toBe(404);
  });
});
