import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../test/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

describe('OpenAPI documentation', () => {
  it('serves the page at /api/docs without sign-in', async () => {
    const res = await fetch(`${t.baseUrl}/docs`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/text\/html/);
    expect(await res.text()).toContain('Fieldbound API');
  });

  it('describes the maps, pins, viewing-link and species routes with their DTO fields', async () => {
    const doc = (await (await fetch(`${t.baseUrl}/docs-json`)).json()) as {
      paths: Record<string, Record<string, unknown>>;
      components: { schemas: Record<string, { properties?: Record<string, unknown>; required?: string[] }> };
    };
    for (const path of ['/api/teams/{teamId}/maps', '/api/maps/{mapId}', '/api/maps/{mapId}/diff', '/api/maps/{mapId}/pins', '/api/pins/{pinId}/replies', '/api/maps/{mapId}/viewing-links', '/api/view/{token}', '/api/teams/{teamId}/species-lists', '/api/species/catalogue']) {
      expect(doc.paths[path], path).toBeDefined();
    }
    expect(Object.keys(doc.paths['/api/maps/{mapId}']).sort()).toEqual(['delete', 'get', 'patch']);
    expect(doc.components.schemas.UpdateMapDto.required).toEqual(['expectedVersion']);
    expect(Object.keys(doc.components.schemas.CreatePinDto.properties ?? {}).sort()).toEqual(['body', 'category', 'geometry', 'title']);
  });
});
