import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultSetup, type MapLiveEvent } from '@fieldbound/shared';
import { startTestApp, type TestApp } from '../../test/test-app';
import { api, type Person, roleCast, type RoleCast } from '../../test/team-fixtures';
import { data, openStream, type SseStream } from '../../test/sse';

let t: TestApp;
let cast: RoleCast;
let call: ReturnType<typeof api>;
let mapId: string;
const open: SseStream[] = [];

beforeAll(async () => {
  t = await startTestApp();
  call = api(t);
  cast = await roleCast(t);
  mapId = (await call('POST', `/teams/${cast.teamId}/maps`, { as: cast.owner, json: { title: 'Live map', setup: defaultSetup() } })).body.id;
});
afterAll(async () => {
  for (const s of open) s.close();
  await t?.close();
});

async function stream(path: string, options: { as?: Person; lastEventId?: string } = {}): Promise<SseStream & { body?: any }> {
  const s = await openStream(`${t.baseUrl}${path}`, { token: options.as?.token, lastEventId: options.lastEventId });
  open.push(s);
  return s;
}

const point = { kind: 'point', at: { alpha: 319.8, fieldTesla: 1.5e4 } };

describe('live map events: members', () => {
  it('delivers a pin created by an editor to a viewer with the map open, as event "map" with the pin and its author', async () => {
    const s = await stream(`/maps/${mapId}/events`, { as: cast.viewer });
    expect(s.status).toBe(200);
    expect(s.headers.get('content-type')).toMatch(/^text\/event-stream/);
    const created = await call('POST', `/maps/${mapId}/pins`, { as: cast.editor, json: { geometry: point, title: 'Live pin' } });
    expect(created.status).toBe(201);
    const event = await s.next();
    expect(event.event).toBe('map');
    const body = data<MapLiveEvent>(event);
    expect(event.id).toBe(body.id);
    expect(body).toMatchObject({ kind: 'pin.created', mapId, actor: { id: cast.editor.id, displayName: cast.editor.displayName } });
    expect(body.kind === 'pin.created' && body.pin).toEqual(created.body);
  });
});
