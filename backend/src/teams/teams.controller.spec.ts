import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ForbiddenException, NotFoundException } from '@nestjs/common';
import { EntityManager, MikroORM } from '@mikro-orm/postgresql';
import { call, createTeam, joinWithRole, registerAccount, tokenFromMail, waitForMail, type Account } from '../../test/http';
import { startTestApp, type TestApp } from '../../test/test-app';
import { TeamAccessService } from './team-access.service';

describe('teams and memberships', () => {
  let server: TestApp;
  let owner: Account;
  beforeAll(async () => {
    server = await startTestApp();
    owner = await registerAccount(server, 'owner');
  });
  afterAll(async () => {
    await server.close();
  });

  it('POST /teams creates a team with the caller as its only owner; GET /teams lists it with the role and member count', async () => {
    const created = await call(server, 'POST', '/teams', { token: owner.token, body: { name: '  Rydberg anions  ' } });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Rydberg anions', role: 'owner', memberCount: 1 });
    const list = await call(server, 'GET', '/teams', { token: owner.token });
    expect(list.status).toBe(200);
    expect(list.body).toContainEqual(expect.objectContaining({ id: created.body.id, role: 'owner', memberCount: 1 }));
    const me = await call(server, 'GET', '/users/me', { token: owner.token });
    expect(me.body.teams).toContainEqual({ id: created.body.id, name: 'Rydberg anions', role: 'owner' });
  });

  it('POST /teams answers 400 on name when it is blank or too long', async () => {
    const blank = await call(server, 'POST', '/teams', { token: owner.token, body: { name: '   ' } });
    expect(blank.status).toBe(400);
    expect(blank.body.errors.name).toEqual(['Enter a name for the team.']);
    const long = await call(server, 'POST', '/teams', { token: owner.token, body: { name: 'x'.repeat(101) } });
    expect(long.body.errors.name).toEqual(['A team name has at most 100 characters.']);
  });

  it('a user can belong to several teams with different roles', async () => {
    const other = await registerAccount(server, 'multi');
    const teamA = await createTeam(server, owner, 'Team A');
    const teamB = await createTeam(server, other, 'Team B');
    const joined = await joinWithRole(server, owner, teamA, 'member', 'viewer');
    const invite = await call(server, 'POST', `/teams/${teamB}/invitations`, { token: other.token, body: { email: joined.email, role: 'editor' } });
    expect(invite.status).toBe(201);
    const token = tokenFromMail(await waitForMail(server, joined.email, 'Team B'), '/invitations/');
    expect((await call(server, 'POST', `/invitations/${encodeURIComponent(token)}/accept`, { token: joined.token })).status).toBe(200);
    const teams = await call(server, 'GET', '/teams', { token: joined.token });
    expect(teams.body.map((t: { name: string; role: string }) => [t.name, t.role])).toEqual([
      ['Team A', 'viewer'],
      ['Team B', 'editor'],
    ]);
  });

  it('GET /teams/:id/members lists members with roles; PATCH changes a role; the last owner cannot be demoted (409 last_owner)', async () => {
    const teamId = await createTeam(server, owner);
    const editor = await joinWithRole(server, owner, teamId, 'editor', 'editor');
    const members = await call(server, 'GET', `/teams/${teamId}/members`, { token: editor.token });
    expect(members.status).toBe(200);
    expect(members.body.map((m: { email: string; role: string }) => [m.email, m.role]).sort()).toEqual(
      [
        [owner.email, 'owner'],
        [editor.email, 'editor'],
      ].sort(),
    );
    expect(JSON.stringify(members.body)).not.toMatch(/password|tokenVersion/i);

    const demoteSelf = await call(server, 'PATCH', `/teams/${teamId}/members/${owner.id}`, { token: owner.token, body: { role: 'editor' } });
    expect(demoteSelf.status).toBe(409);
    expect(demoteSelf.body.code).toBe('last_owner');

    const promote = await call(server, 'PATCH', `/teams/${teamId}/members/${editor.id}`, { token: owner.token, body: { role: 'owner' } });
    expect(promote.status).toBe(200);
    expect(promote.body).toMatchObject({ userId: editor.id, role: 'owner' });
    // With two owners, one may step down.
    const stepDown = await call(server, 'PATCH', `/teams/${teamId}/members/${owner.id}`, { token: owner.token, body: { role: 'viewer' } });
    expect(stepDown.status).toBe(200);
    // ... and is now a viewer, so further owner actions are refused.
    expect((await call(server, 'PATCH', `/teams/${teamId}`, { token: owner.token, body: { name: 'New' } })).status).toBe(403);
  });

  it('PATCH /teams/:id/members/:userId answers 400 for an unknown role and 404 for a non-member', async () => {
    const teamId = await createTeam(server, owner);
    const stranger = await registerAccount(server, 'stranger');
    const bad = await call(server, 'PATCH', `/teams/${teamId}/members/${owner.id}`, { token: owner.token, body: { role: 'admin' } });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.role).toEqual(['Choose one of the roles: viewer, editor, owner.']);
    const missing = await call(server, 'PATCH', `/teams/${teamId}/members/${stranger.id}`, { token: owner.token, body: { role: 'viewer' } });
    expect(missing.status).toBe(404);
    expect(missing.body.code).toBe('member_not_found');
  });

  it('concurrent demotions of the two owners leave at least one owner', async () => {
    const teamId = await createTeam(server, owner);
    const second = await joinWithRole(server, owner, teamId, 'second', 'owner');
    const results = await Promise.all([
      call(server, 'PATCH', `/teams/${teamId}/members/${owner.id}`, { token: second.token, body: { role: 'editor' } }),
      call(server, 'PATCH', `/teams/${teamId}/members/${second.id}`, { token: owner.token, body: { role: 'editor' } }),
    ]);
    // Owner rows are locked (SELECT … FOR UPDATE): the later request either finds its caller already
    // demoted (403) or sees a single owner left (409); never do both demotions pass.
    const [winner, loser] = results.map((r) => r.status).sort();
    expect(winner).toBe(200);
    expect([403, 409]).toContain(loser);
    const members = await server.app.get(MikroORM).em.fork().getConnection().execute<{ role: string }[]>(
      "select role from memberships where team_id = ? and role = 'owner'",
      [teamId],
    );
    expect(members).toHaveLength(1);
  });

  it('DELETE /teams/:id/members/:userId: a member may leave; the last owner may not (409); owners remove others', async () => {
    const teamId = await createTeam(server, owner);
    const viewer = await joinWithRole(server, owner, teamId, 'leaver', 'viewer');
    const editor = await joinWithRole(server, owner, teamId, 'removed', 'editor');
    expect((await call(server, 'DELETE', `/teams/${teamId}/members/${viewer.id}`, { token: viewer.token })).status).toBe(204);
    expect((await call(server, 'GET', `/teams/${teamId}`, { token: viewer.token })).status).toBe(404);
    const lastOwner = await call(server, 'DELETE', `/teams/${teamId}/members/${owner.id}`, { token: owner.token });
    expect(lastOwner.status).toBe(409);
    expect(lastOwner.body.message).toMatch(/last owner/);
    expect((await call(server, 'DELETE', `/teams/${teamId}/members/${editor.id}`, { token: owner.token })).status).toBe(204);
    expect((await call(server, 'GET', `/teams/${teamId}/members`, { token: editor.token })).status).toBe(404);
  });

  it('PATCH /teams/:id renames; DELETE /teams/:id removes the team with its memberships and invitations', async () => {
    const teamId = await createTeam(server, owner);
    const viewer = await joinWithRole(server, owner, teamId, 'gone', 'viewer');
    await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email: 'pending@example.test', role: 'viewer' } });
    const renamed = await call(server, 'PATCH', `/teams/${teamId}`, { token: owner.token, body: { name: 'Renamed group' } });
    expect(renamed.status).toBe(200);
    expect(renamed.body.name).toBe('Renamed group');
    expect((await call(server, 'DELETE', `/teams/${teamId}`, { token: owner.token })).status).toBe(204);
    expect((await call(server, 'GET', `/teams/${teamId}`, { token: owner.token })).status).toBe(404);
    expect((await call(server, 'GET', '/teams', { token: viewer.token })).body).toEqual([]);
    const conn = server.app.get(MikroORM).em.fork().getConnection();
    expect(await conn.execute('select 1 from memberships where team_id = ?', [teamId])).toHaveLength(0);
    expect(await conn.execute('select 1 from invitations where team_id = ?', [teamId])).toHaveLength(0);
  });
});

describe('TeamAccessService.requireRole', () => {
  let server: TestApp;
  beforeAll(async () => {
    server = await startTestApp();
  });
  afterAll(async () => {
    await server.close();
  });

  it('returns the membership with its team for a sufficient role, 403 for a lower role, 404 for outsiders and malformed ids', async () => {
    const owner = await registerAccount(server, 'acc-owner');
    const outsider = await registerAccount(server, 'acc-out');
    const teamId = await createTeam(server, owner, 'Access team');
    const viewer = await joinWithRole(server, owner, teamId, 'acc-viewer', 'viewer');
    const orm = server.app.get(MikroORM);
    const access = new TeamAccessService(orm.em.fork() as EntityManager);

    const membership = await access.requireRole(teamId, owner.id, 'editor');
    expect(membership.role).toBe('owner');
    expect(membership.team.name).toBe('Access team');
    expect((await access.requireRole(teamId, viewer.id, 'viewer')).role).toBe('viewer');

    const forbidden = await access.requireRole(teamId, viewer.id, 'editor').catch((e: unknown) => e);
    expect(forbidden).toBeInstanceOf(ForbiddenException);
    expect((forbidden as ForbiddenException).getResponse()).toMatchObject({ code: 'insufficient_role', requiredRole: 'editor', role: 'viewer' });

    for (const [team, user] of [
      [teamId, outsider.id],
      [crypto.randomUUID(), owner.id],
      ['not-a-uuid', owner.id],
    ]) {
      const error = await access.requireRole(team, user, 'viewer').catch((e: unknown) => e);
      expect(error).toBeInstanceOf(NotFoundException);
      expect((error as NotFoundException).getResponse()).toMatchObject({ code: 'team_not_found' });
    }
  });
});
