import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, createTeam, joinWithRole, registerAccount, uniqueEmail, type Account } from './http';
import { startTestApp, type TestApp } from './test-app';

/**
 * Every team route × every kind of caller, asserting the status code.
 * Callers: the team's owner, an editor, a viewer, a signed-in member of another team, and nobody.
 * Non-members must get 404 (never learn the team exists), lower roles 403, anonymous callers 401.
 *
 * Routes added for team-owned data (maps, pins, threads, viewing links) belong in ROUTES too.
 */
type Caller = 'owner' | 'editor' | 'viewer' | 'otherTeam' | 'anonymous';
const CALLERS: Caller[] = ['anonymous', 'otherTeam', 'viewer', 'editor', 'owner'];

interface Fixture {
  teamId: string;
  accounts: Record<Exclude<Caller, 'anonymous'>, Account>;
}

interface RouteCase {
  name: string;
  method: string;
  /** Builds the path (and body) right before each call; may create what the call consumes. */
  prepare: (f: Fixture) => Promise<{ path: string; body?: unknown }>;
  expected: Record<Caller, number>;
}

const readable = { owner: 200, editor: 200, viewer: 200, otherTeam: 404, anonymous: 401 };
const ownerOnly = (ok: number) => ({ owner: ok, editor: 403, viewer: 403, otherTeam: 404, anonymous: 401 });

let server: TestApp;
let fixture: Fixture;

async function pendingInvitation(f: Fixture): Promise<string> {
  const res = await call(server, 'POST', `/teams/${f.teamId}/invitations`, { token: f.accounts.owner.token, body: { email: uniqueEmail('matrix'), role: 'viewer' } });
  return res.body.invitation.id;
}

const ROUTES: RouteCase[] = [
  { name: 'GET /teams/:teamId', method: 'GET', prepare: async (f) => ({ path: `/teams/${f.teamId}` }), expected: readable },
  { name: 'PATCH /teams/:teamId', method: 'PATCH', prepare: async (f) => ({ path: `/teams/${f.teamId}`, body: { name: 'Matrix team' } }), expected: ownerOnly(200) },
  { name: 'GET /teams/:teamId/members', method: 'GET', prepare: async (f) => ({ path: `/teams/${f.teamId}/members` }), expected: readable },
  {
    name: 'PATCH /teams/:teamId/members/:userId',
    method: 'PATCH',
    prepare: async (f) => ({ path: `/teams/${f.teamId}/members/${f.accounts.viewer.id}`, body: { role: 'viewer' } }),
    expected: ownerOnly(200),
  },
  {
    name: 'DELETE /teams/:teamId/members/:userId (someone else)',
    method: 'DELETE',
    prepare: async (f) => {
      const spare = await joinWithRole(server, f.accounts.owner, f.teamId, 'spare', 'viewer');
      return { path: `/teams/${f.teamId}/members/${spare.id}` };
    },
    expected: ownerOnly(204),
  },
  { name: 'GET /teams/:teamId/invitations', method: 'GET', prepare: async (f) => ({ path: `/teams/${f.teamId}/invitations` }), expected: ownerOnly(200) },
  {
    name: 'POST /teams/:teamId/invitations',
    method: 'POST',
    prepare: async (f) => ({ path: `/teams/${f.teamId}/invitations`, body: { email: uniqueEmail('matrix-new'), role: 'editor' } }),
    expected: ownerOnly(201),
  },
  {
    name: 'POST /teams/:teamId/invitations/:id/resend',
    method: 'POST',
    prepare: async (f) => ({ path: `/teams/${f.teamId}/invitations/${await pendingInvitation(f)}/resend` }),
    expected: ownerOnly(200),
  },
  {
    name: 'DELETE /teams/:teamId/invitations/:id',
    method: 'DELETE',
    prepare: async (f) => ({ path: `/teams/${f.teamId}/invitations/${await pendingInvitation(f)}` }),
    expected: ownerOnly(204),
  },
  { name: 'GET /teams/:teamId/audit', method: 'GET', prepare: async (f) => ({ path: `/teams/${f.teamId}/audit` }), expected: ownerOnly(200) },
  // Last: it deletes the team.
  { name: 'DELETE /teams/:teamId', method: 'DELETE', prepare: async (f) => ({ path: `/teams/${f.teamId}` }), expected: ownerOnly(204) },
];

describe('authorization matrix: owner / editor / viewer / other team / anonymous × every team route', () => {
  beforeAll(async () => {
    server = await startTestApp();
    const owner = await registerAccount(server, 'm-owner');
    const teamId = await createTeam(server, owner, 'Matrix team');
    const editor = await joinWithRole(server, owner, teamId, 'm-editor', 'editor');
    const viewer = await joinWithRole(server, owner, teamId, 'm-viewer', 'viewer');
    const otherTeam = await registerAccount(server, 'm-other');
    await createTeam(server, otherTeam, 'Another group');
    fixture = { teamId, accounts: { owner, editor, viewer, otherTeam } };
  });
  afterAll(async () => {
    await server.close();
  });

  for (const route of ROUTES) {
    it(`${route.name}: ${CALLERS.map((c) => `${c} ${route.expected[c]}`).join(', ')}`, async () => {
      const actual: Partial<Record<Caller, number>> = {};
      for (const caller of CALLERS) {
        const { path, body } = await route.prepare(fixture);
        const token = caller === 'anonymous' ? undefined : fixture.accounts[caller].token;
        const res = await call(server, route.method, path, { token, body });
        actual[caller] = res.status;
        if (res.status === 404) expect(res.body.code).toBe('team_not_found');
        if (res.status === 403) expect(res.body.code).toBe('insufficient_role');
        // Refusals to outsiders never carry the team's content.
        if (res.status === 401 || res.status === 404) expect(JSON.stringify(res.body)).not.toContain('Matrix team');
      }
      expect(actual).toEqual(route.expected);
    });
  }

  it('a made-up or malformed team id answers 404 to a signed-in caller, like a team they are not in', async () => {
    const token = fixture.accounts.owner.token;
    expect((await call(server, 'GET', `/teams/${crypto.randomUUID()}`, { token })).status).toBe(404);
    expect((await call(server, 'GET', '/teams/not-a-uuid/members', { token })).status).toBe(404);
  });
});

describe('routes for any signed-in person', () => {
  beforeAll(async () => {
    server = await startTestApp();
  });
  afterAll(async () => {
    await server.close();
  });

  const SIGNED_IN_ROUTES: [string, string, unknown?][] = [
    ['GET', '/teams'],
    ['POST', '/teams', { name: 'Anyone may create' }],
    ['GET', '/users/me'],
    ['PATCH', '/users/me', { displayName: 'New name' }],
    ['GET', '/users/me/activity'],
    ['POST', '/auth/change-password', { currentPassword: 'x', newPassword: 'yyyyyyyyyyyy' }],
  ];

  for (const [method, path, body] of SIGNED_IN_ROUTES) {
    it(`${method} ${path} answers 401 to anonymous callers and succeeds for a signed-in one`, async () => {
      const anonymous = await call(server, method, path, { body });
      expect(anonymous.status).toBe(401);
      expect(anonymous.body.code).toBe('not_signed_in');
      if (path === '/auth/change-password') return; // its signed-in cases are in auth.controller.spec.ts
      const account = await registerAccount(server, 'any');
      const res = await call(server, method, path, { token: account.token, body });
      expect(res.status).toBeLessThan(300);
    });
  }
});
