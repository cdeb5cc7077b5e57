import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultSetup } from '@fieldbound/shared';
import { MailService } from '../mail/mail.service';
import { startTestApp, type TestApp } from '../../test/test-app';
import { addMember, api, type Caller, callerOf, type Person, registerPerson, ROLES, roleCast, type RoleCast } from '../../test/team-fixtures';

let t: TestApp;
let cast: RoleCast;
let call: ReturnType<typeof api>;
let mapId: string;

beforeAll(async () => {
  t = await startTestApp();
  call = api(t);
  cast = await roleCast(t);
  const map = await call('POST', `/teams/${cast.teamId}/maps`, { as: cast.owner, json: { title: 'Rubidium map', setup: defaultSetup() } });
  mapId = map.body.id;
});
afterAll(async () => {
  await t?.close();
});

const point = { kind: 'point', at: { alpha: 319.8, fieldTesla: 1.5e4 } };

async function newPin(by: Person = cast.editor, extra: Record<string, unknown> = {}) {
  const res = await call('POST', `/maps/${mapId}/pins`, { as: by, json: { geometry: point, title: 'Knee in the bound region', body: 'Check the grid here.', ...extra } });
  expect(res.status).toBe(201);
  return res.body as { id: string; version: number };
}

async function newReply(pinId: string, by: Person) {
  const res = await call('POST', `/pins/${pinId}/replies`, { as: by, json: { body: 'Seen it.' } });
  expect(res.status).toBe(201);
  return res.body as { id: string };
}

const READ = { owner: 200, editor: 200, viewer: 200, outsider: 404, anonymous: 401 };
const EDIT = { owner: 200, editor: 200, viewer: 403, outsider: 404, anonymous: 401 };

const routes: { name: string; expect: Record<Caller, number>; run(as: Person | null): Promise<{ status: number }> }[] = [
  { name: 'GET /maps/:mapId/pins', expect: READ, run: (as) => call('GET', `/maps/${mapId}/pins`, { as }) },
  { name: 'POST /maps/:mapId/pins', expect: { ...EDIT, owner: 201, editor: 201 }, run: (as) => call('POST', `/maps/${mapId}/pins`, { as, json: { geometry: point, title: 'x' } }) },
  { name: 'GET /pins/:pinId', expect: READ, run: async (as) => call('GET', `/pins/${(await newPin()).id}`, { as }) },
  { name: 'PATCH /pins/:pinId', expect: EDIT, run: async (as) => call('PATCH', `/pins/${(await newPin()).id}`, { as, json: { expectedVersion: 1, status: 'resolved' } }) },
  { name: 'DELETE /pins/:pinId', expect: { ...EDIT, owner: 204, editor: 204 }, run: async (as) => call('DELETE', `/pins/${(await newPin()).id}`, { as }) },
  { name: 'POST /pins/:pinId/replies', expect: { owner: 201, editor: 201, viewer: 201, outsider: 404, anonymous: 401 }, run: async (as) => call('POST', `/pins/${(await newPin()).id}/replies`, { as, json: { body: 'Agreed.' } }) },
  {
    name: "DELETE /pins/:pinId/replies/:replyId (someone else's reply)",
    expect: { owner: 204, editor: 204, viewer: 403, outsider: 404, anonymous: 401 },
    run: async (as) => {
      const pin = await newPin();
      const reply = await newReply(pin.id, cast.editor);
      return call('DELETE', `/pins/${pin.id}/replies/${reply.id}`, { as });
    },
  },
];

describe('pins: status of every route for every role', () => {
  for (const route of routes) {
    it(`${route.name}: ${ROLES.map((r) => `${r} ${route.expect[r]}`).join(', ')}`, async () => {
      const seen: Record<string, number> = {};
      for (const caller of ROLES) seen[caller] = (await route.run(callerOf(cast, caller))).status;
      expect(seen).toEqual(route.expect);
    });
  }

  it('lets a viewer delete their own reply', async () => {
    const pin = await newPin();
    const reply = await newReply(pin.id, cast.viewer);
    expect((await call('DELETE', `/pins/${pin.id}/replies/${reply.id}`, { as: cast.viewer })).status).toBe(204);
  });

  it('hides the pins of a map in the bin', async () => {
    const map = await call('POST', `/teams/${cast.teamId}/maps`, { as: cast.owner, json: { title: 'to delete', setup: defaultSetup() } });
    const pin = await call('POST', `/maps/${map.body.id}/pins`, { as: cast.owner, json: { geometry: point, title: 'x' } });
    await call('DELETE', `/maps/${map.body.id}`, { as: cast.owner });
    expect((await call('GET', `/pins/${pin.body.id}`, { as: cast.owner })).status).toBe(404);
    expect((await call('GET', `/maps/${map.body.id}/pins`, { as: cast.owner })).status).toBe(404);
  });
});

describe('pins: geometry, threads and status', () => {
  it('stores rectangles and polygons in physical units and returns them unchanged', async () => {
    const rect = { kind: 'rect', min: { alpha: 100, fieldTesla: 10 }, max: { alpha: 400, fieldTesla: 1e5 } };
    const polygon = { kind: 'polygon', vertices: [{ alpha: 10, fieldTesla: 1 }, { alpha: 20, fieldTesla: 1 }, { alpha: 15, fieldTesla: 3.5 }] };
    const a = await call('POST', `/maps/${mapId}/pins`, { as: cast.editor, json: { geometry: rect, title: 'band', category: 'numerics' } });
    const b = await call('POST', `/maps/${mapId}/pins`, { as: cast.editor, json: { geometry: polygon, title: 'island' } });
    expect(a.body).toMatchObject({ geometry: rect, category: 'numerics', status: 'open', version: 1, author: { id: cast.editor.id } });
    expect(b.body.geometry).toEqual(polygon);
  });

  it('rejects bad geometry with the path of each offending coordinate', async () => {
    const bad = async (geometry: unknown) => (await call('POST', `/maps/${mapId}/pins`, { as: cast.editor, json: { geometry, title: 'x' } })).body;
    expect(Object.keys((await bad({ kind: 'point', at: { alpha: -1, fieldTesla: 'NaN' } })).errors)).toEqual(['geometry.at.alpha', 'geometry.at.fieldTesla']);
    expect(Object.keys((await bad({ kind: 'rect', min: { alpha: 5, fieldTesla: 5 }, max: { alpha: 4, fieldTesla: 6 } })).errors)).toEqual(['geometry.max.alpha']);
    expect((await bad({ kind: 'polygon', vertices: [{ alpha: 1, fieldTesla: 1 }, { alpha: 2, fieldTesla: 2 }] })).errors['geometry.vertices'][0]).toMatch(/3 to 200 vertices/);
    const many = Array.from({ length: 201 }, (_, i) => ({ alpha: 1 + i, fieldTesla: 1 }));
    expect((await bad({ kind: 'polygon', vertices: many })).errors['geometry.vertices'][0]).toMatch(/this one has 201/);
    expect(Object.keys((await bad({ kind: 'circle' })).errors)).toEqual(['geometry.kind']);
    expect(Object.keys((await bad({ kind: 'point', at: { alpha: 1, fieldTesla: 1, colour: 'red' } })).errors)).toEqual(['geometry.at.colour']);
  });

  it('keeps the body as plain text up to 10 000 characters', async () => {
    const body = '<b>not markup</b> & "quotes"\n'.repeat(300).slice(0, 10_000);
    const pin = await call('POST', `/maps/${mapId}/pins`, { as: cast.editor, json: { geometry: point, title: 'long', body } });
    expect(pin.status).toBe(201);
    expect((await call('GET', `/pins/${pin.body.id}`, { as: cast.viewer })).body.body).toBe(body);
    const tooLong = await call('POST', `/maps/${mapId}/pins`, { as: cast.editor, json: { geometry: point, title: 'long', body: 'x'.repeat(10_001) } });
    expect(tooLong.status).toBe(400);
    expect(Object.keys(tooLong.body.errors)).toEqual(['body']);
  });

  it('resolves and reopens, moves a pin, and shows the thread in order with its count', async () => {
    const pin = await newPin();
    await newReply(pin.id, cast.viewer);
    await call('POST', `/pins/${pin.id}/replies`, { as: cast.owner, json: { body: 'Second.' } });
    const resolved = await call('PATCH', `/pins/${pin.id}`, { as: cast.editor, json: { expectedVersion: 1, status: 'resolved' } });
    expect(resolved.body).toMatchObject({ status: 'resolved', version: 2, resolvedBy: { id: cast.editor.id }, replyCount: 2 });
    expect(resolved.body.resolvedAt).not.toBeNull();
    const moved = await call('PATCH', `/pins/${pin.id}`, { as: cast.owner, json: { expectedVersion: 2, geometry: { kind: 'point', at: { alpha: 300, fieldTesla: 2e4 } }, status: 'open' } });
    expect(moved.body).toMatchObject({ status: 'open', version: 3, resolvedAt: null, geometry: { at: { alpha: 300 } } });
    const detail = await call('GET', `/pins/${pin.id}`, { as: cast.viewer });
    expect(detail.body.replies.map((r: { body: string }) => r.body)).toEqual(['Seen it.', 'Second.']);
    expect(detail.body.replies[0].author.id).toBe(cast.viewer.id);
    const open = await call('GET', `/maps/${mapId}/pins?status=resolved`, { as: cast.viewer });
    expect(open.body.some((p: { id: string }) => p.id === pin.id)).toBe(false);
  });
});

describe('pins: optimistic locking', () => {
  it('answers 409 with the current pin to a stale expectedVersion and overwrites nothing', async () => {
    const pin = await newPin();
    expect((await call('PATCH', `/pins/${pin.id}`, { as: cast.editor, json: { expectedVersion: 1, title: 'first' } })).status).toBe(200);
    const stale = await call('PATCH', `/pins/${pin.id}`, { as: cast.owner, json: { expectedVersion: 1, title: 'second' } });
    expect(stale.status).toBe(409);
    expect(stale.body).toMatchObject({ code: 'version_conflict', current: { id: pin.id, version: 2, title: 'first' } });
    expect((await call('GET', `/pins/${pin.id}`, { as: cast.viewer })).body.title).toBe('first');
  });

  it('lets exactly one of simultaneous edits of the same pin version win', async () => {
    const pin = await newPin();
    const results = await Promise.all(['a', 'b', 'c'].map((title) => call('PATCH', `/pins/${pin.id}`, { as: cast.editor, json: { expectedVersion: 1, title } })));
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409]);
    const now = await call('GET', `/pins/${pin.id}`, { as: cast.viewer });
    expect(now.body.version).toBe(2);
  });
});

describe('pins: mentions', () => {
  it('e-mails a mentioned team member (pin body and reply), but not outsiders, the author, or a repeat mention', async () => {
    const fake = t.app.get(MailService).fake!;
    const stranger: Person = await registerPerson(t, 'stranger');
    const colleague = await registerPerson(t, 'colleague');
    await addMember(t, cast.teamId, colleague, 'viewer');
    fake.clear();

    const pin = await call('POST', `/maps/${mapId}/pins`, {
      as: cast.editor,
      json: { geometry: point, title: 'Threshold', body: `@${colleague.email} and @${stranger.email}: is this the m = 1 threshold? cc @${cast.editor.email}` },
    });
    expect(pin.status).toBe(201);
    let mails = fake.list();
    expect(mails.map((m) => m.to)).toEqual([[colleague.email]]);
    expect(mails[0].subject).toBe(`${cast.editor.displayName} mentioned you on "Rubidium map"`);
    expect(mails[0].text).toContain('is this the m = 1 threshold?');
    expect(mails[0].links.some((l) => l.includes(`/maps/${mapId}?pin=${pin.body.id}`))).toBe(true);

    // Editing without a new mention sends nothing; a reply mentioning the viewer sends one.
    fake.clear();
    await call('PATCH', `/pins/${pin.body.id}`, { as: cast.editor, json: { expectedVersion: 1, body: `@${colleague.email} is this the m = 1 threshold? (edited)` } });
    expect(fake.list()).toEqual([]);
    await call('POST', `/pins/${pin.body.id}/replies`, { as: colleague, json: { body: `@${cast.viewer.email.toUpperCase()} what do you think?` } });
    mails = fake.list();
    expect(mails.map((m) => m.to)).toEqual([[cast.viewer.email]]);
    expect(mails[0].text).toContain('in the thread of the pin "Threshold"');
  });
});
