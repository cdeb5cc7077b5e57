import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../config/configuration';
import { seedDemoData } from '../database/seed';
import { startTestApp, type TestApp } from '../../test/test-app';
import { DEMO_LECTURE_TOKEN, DEMO_PEOPLE, DEMO_TEAM_NAME } from './demo-people';
import { DEMO_MAPS, LAB_SHORTLIST } from './demo-maps';
import { DEMO_PINS } from './demo-threads';

async function json<T>(res: Response): Promise<T> {
  const text = await res.text();
  try {
    return JSON.parse(text) as T;
  } catch {
    throw new Error(`expected JSON, got ${res.status}: ${text.slice(0, 200)}`);
  }
}

describe('demo seed', () => {
  const db = loadConfig().database;
  let server: TestApp;

  beforeAll(async () => {
    await seedDemoData(db, { reset: true });
    server = await startTestApp();
  });
  afterAll(async () => {
    await server.close();
  });

  it('runs once: a second seed finds the demo and writes nothing', async () => {
    await expect(seedDemoData(db)).resolves.toMatch(/already present/);
  });

  it('lets the demo owner sign in and see the group with its four members and every demo map', async () => {
    const signIn = await fetch(`${server.baseUrl}/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: DEMO_PEOPLE.owner.email, password: DEMO_PEOPLE.owner.password }),
    });
    expect(signIn.status).toBe(200);
    const { accessToken } = await json<{ accessToken: string }>(signIn);
    const auth = { authorization: `Bearer ${accessToken}` };
    const teams = await json<{ id: string; name: string; role: string }[]>(await fetch(`${server.baseUrl}/teams`, { headers: auth }));
    const team = teams.find((t) => t.name === DEMO_TEAM_NAME);
    expect(team?.role).toBe('owner');
    const members = await json<{ email: string; role: string }[]>(await fetch(`${server.baseUrl}/teams/${team!.id}/members`, { headers: auth }));
    expect(members.map((m) => `${m.email}:${m.role}`).sort()).toEqual(Object.values(DEMO_PEOPLE).map((p) => `${p.email}:${p.role}`).sort());
    const maps = await json<{ items: { title: string }[] }>(await fetch(`${server.baseUrl}/teams/${team!.id}/maps?limit=50`, { headers: auth }));
    expect(maps.items.map((m) => m.title).sort()).toEqual(DEMO_MAPS.map((m) => m.title).sort());
  });

  it('serves the lecture link without an account, with the laboratory map, its shortlist species and its pins', async () => {
    const res = await fetch(`${server.baseUrl}/view/${DEMO_LECTURE_TOKEN}`);
    expect(res.status).toBe(200);
    const view = await json<{ title: string; species: { symbol: string | null; origin: string }[]; pins?: { title: string }[] }>(res);
    expect(view.title).toBe(DEMO_MAPS.find((m) => m.key === 'lab')!.title);
    expect(view.species.map((s) => `${s.origin}:${s.symbol}`).sort()).toEqual(LAB_SHORTLIST.map((symbol) => `catalogue:${symbol}`).sort());
    expect(view.pins?.map((p) => p.title).sort()).toEqual(DEMO_PINS.filter((p) => p.map === 'lab').map((p) => p.title).sort());
  });

  it('re-seeds from scratch with reset, leaving exactly one demo group', async () => {
    await expect(seedDemoData(db, { reset: true })).resolves.toMatch(/^re-seeded the demo/);
    await expect(seedDemoData(db)).resolves.toMatch(/already present/);
  });
});
