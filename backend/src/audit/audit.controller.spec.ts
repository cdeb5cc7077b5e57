import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, createTeam, joinWithRole, registerAccount, uniqueEmail } from '../../test/http';
import { startTestApp, type TestApp } from '../../test/test-app';

describe('audit log', () => {
  let server: TestApp;
  beforeAll(async () => {
    server = await startTestApp();
  });
  afterAll(async () => {
    await server.close();
  });

  it('GET /teams/:id/audit shows owners who did what to whom and when: creation, invitations, joins, role changes, removals', async () => {
    const owner = await registerAccount(server, 'auditor');
    const teamId = await createTeam(server, owner, 'Audited group');
    const member = await joinWithRole(server, owner, teamId, 'audited', 'viewer');
    await call(server, 'PATCH', `/teams/${teamId}/members/${member.id}`, { token: owner.token, body: { role: 'editor' } });
    const pending = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email: uniqueEmail('pending'), role: 'viewer' } });
    await call(server, 'POST', `/teams/${teamId}/invitations/${pending.body.invitation.id}/resend`, { token: owner.token });
    await call(server, 'DELETE', `/teams/${teamId}/invitations/${pending.body.invitation.id}`, { token: owner.token });
    await call(server, 'DELETE', `/teams/${teamId}/members/${member.id}`, { token: owner.token });

    const res = await call(server, 'GET', `/teams/${teamId}/audit`, { token: owner.token });
    expect(res.status).toBe(200);
    const events = res.body.events as { action: string; actorEmail: string; targetEmail: string | null; details: Record<string, unknown>; createdAt: string }[];
    expect(events.map((e) => e.action).reverse()).toEqual([
      'team.created',
      'invitation.created',
      'invitation.accepted',
      'member.joined',
      'member.role_changed',
      'invitation.created',
      'invitation.resent',
      'invitation.revoked',
      'member.removed',
    ]);
    const roleChange = events.find((e) => e.action === 'member.role_changed')!;
    expect(roleChange).toMatchObject({ actorEmail: owner.email, targetEmail: member.email, details: { from: 'viewer', to: 'editor' } });
    expect(Date.parse(roleChange.createdAt)).toBeGreaterThan(Date.now() - 60_000);
    // Pages back with ?before and ?limit.
    const page = await call(server, 'GET', `/teams/${teamId}/audit?limit=2&before=${encodeURIComponent(events[1].createdAt)}`, { token: owner.token });
    expect(page.body.events).toHaveLength(2);
    expect(page.body.events[0].action).toBe(events[2].action);
    expect((await call(server, 'GET', `/teams/${teamId}/audit?limit=0`, { token: owner.token })).status).toBe(400);
  });

  it('records sign-ins (also failed ones) and password changes, and shows them on GET /users/me/activity', async () => {
    const account = await registerAccount(server, 'activity');
    await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: 'not the right one' } });
    await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: account.password } });
    const res = await call(server, 'GET', '/users/me/activity', { token: account.token });
    expect(res.status).toBe(200);
    expect(res.body.events.map((e: { action: string }) => e.action)).toEqual(['auth.signed_in', 'auth.sign_in_failed', 'auth.registered']);
  });
});
