import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, createTeam, PASSWORD, registerAccount, startAppWithTeam, tokenFromMail, uniqueEmail, waitForMail, type Account } from '../../test/http';
import { TestClock, type TestApp } from '../../test/test-app';

const DAY = 24 * 3600 * 1000;

describe('invitations through the local SMTP fake', () => {
  let server: TestApp;
  let owner: Account;
  let teamId: string;
  const clock = new TestClock();
  beforeAll(async () => {
    ({ server, owner, teamId } = await startAppWithTeam(clock, 'inviter', 'Polarizability group'));
  });
  afterAll(async () => {
    await server.close();
  });

  it('round trip: the owner invites, the mail arrives over SMTP with a link, the link shows the invitation, and accepting with a new account joins the team with the role', async () => {
    const email = uniqueEmail('newcomer');
    const invited = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email: email.toUpperCase(), role: 'editor' } });
    expect(invited.status).toBe(201);
    expect(invited.body.emailSent).toBe(true);
    expect(invited.body.invitation).toMatchObject({ email, role: 'editor', status: 'pending', sendCount: 1, invitedBy: { id: owner.id } });
    expect(Date.parse(invited.body.invitation.expiresAt) - clock.now().getTime()).toBeGreaterThan(7 * DAY - 60_000);

    // The message as the fake SMTP server received it, read through the public dev mailbox.
    const mailbox = await call(server, 'GET', '/dev/mailbox');
    const message = (mailbox.body.messages as { to: string[]; subject: string; text: string; links: string[]; html: string }[]).find((m) => m.to.includes(email))!;
    expect(message.subject).toBe('Join Polarizability group on Fieldbound');
    expect(message.text).toContain('Inviter Tester invited you to join the research team "Polarizability group" on Fieldbound as an editor.');
    expect(message.html).toContain('Accept the invitation');
    const link = message.links.find((l) => l.includes('/invitations/'))!;
    expect(link.startsWith(`${server.config.publicUrl}/invitations/`)).toBe(true);
    const token = tokenFromMail(await waitForMail(server, email, 'Join'), '/invitations/');

    const preview = await call(server, 'GET', `/invitations/${encodeURIComponent(token)}`);
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ teamId, teamName: 'Polarizability group', email, role: 'editor', invitedByName: 'Inviter Tester', accountExists: false });

    const joined = await call(server, 'POST', `/invitations/${encodeURIComponent(token)}/register`, { body: { displayName: 'Newcomer', password: PASSWORD } });
    expect(joined.status).toBe(201);
    expect(joined.body.teamId).toBe(teamId);
    expect(joined.body.user.email).toBe(email);
    expect(joined.refreshCookie).toBeTruthy();
    const teams = await call(server, 'GET', '/teams', { token: joined.body.accessToken });
    expect(teams.body).toEqual([expect.objectContaining({ id: teamId, role: 'editor', memberCount: 2 })]);

    // One-time: the same link cannot be used again.
    const again = await call(server, 'POST', `/invitations/${encodeURIComponent(token)}/register`, { body: { displayName: 'Again', password: PASSWORD } });
    expect(again.status).toBe(410);
    expect(again.body.code).toBe('invitation_used');
    expect((await call(server, 'GET', `/invitations/${encodeURIComponent(token)}`)).status).toBe(410);
    // And it no longer appears among the open invitations.
    const open = await call(server, 'GET', `/teams/${teamId}/invitations`, { token: owner.token });
    expect(open.body.map((i: { email: string }) => i.email)).not.toContain(email);
  });

  it('an existing account signs in and accepts (200); the preview says the account exists', async () => {
    const colleague = await registerAccount(server, 'existing');
    await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email: colleague.email, role: 'viewer' } });
    const token = tokenFromMail(await waitForMail(server, colleague.email, 'Join'), '/invitations/');
    expect((await call(server, 'GET', `/invitations/${encodeURIComponent(token)}`)).body.accountExists).toBe(true);
    expect((await call(server, 'POST', `/invitations/${encodeURIComponent(token)}/accept`)).status).toBe(401);
    const register = await call(server, 'POST', `/invitations/${encodeURIComponent(token)}/register`, { body: { displayName: 'Dup', password: PASSWORD } });
    expect(register.status).toBe(409);
    expect(register.body.code).toBe('email_taken');
    const accepted = await call(server, 'POST', `/invitations/${encodeURIComponent(token)}/accept`, { token: colleague.token });
    expect(accepted.status).toBe(200);
    expect(accepted.body).toEqual({ teamId, role: 'viewer' });
    expect((await call(server, 'GET', `/teams/${teamId}`, { token: colleague.token })).body.role).toBe('viewer');
  });

  it('accepting while signed in with another address is refused with 403 invitation_other_address', async () => {
    const someoneElse = await registerAccount(server, 'wrongaddr');
    const email = uniqueEmail('intended');
    await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email, role: 'viewer' } });
    const token = tokenFromMail(await waitForMail(server, email, 'Join'), '/invitations/');
    const res = await call(server, 'POST', `/invitations/${encodeURIComponent(token)}/accept`, { token: someoneElse.token });
    expect(res.status).toBe(403);
    expect(res.body.code).toBe('invitation_other_address');
    expect((await call(server, 'GET', `/teams/${teamId}`, { token: someoneElse.token })).status).toBe(404);
  });

  it('re-sending replaces the link (the old one answers 401) and restarts the expiry; revoking makes the link answer 410', async () => {
    const email = uniqueEmail('resend');
    const created = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email, role: 'viewer' } });
    const first = tokenFromMail(await waitForMail(server, email, 'Join'), '/invitations/');
    clock.advance(DAY);
    const resent = await call(server, 'POST', `/teams/${teamId}/invitations/${created.body.invitation.id}/resend`, { token: owner.token });
    expect(resent.status).toBe(200);
    expect(resent.body.invitation.sendCount).toBe(2);
    expect(Date.parse(resent.body.invitation.expiresAt)).toBeGreaterThan(Date.parse(created.body.invitation.expiresAt));
    const messages = (await call(server, 'GET', '/dev/mailbox')).body.messages.filter((m: { to: string[] }) => m.to.includes(email));
    expect(messages).toHaveLength(2);
    const second = tokenFromMail(messages[0], '/invitations/');
    expect(second).not.toBe(first);
    const old = await call(server, 'GET', `/invitations/${encodeURIComponent(first)}`);
    expect(old.status).toBe(401);
    expect(old.body.code).toBe('invitation_invalid');
    expect((await call(server, 'GET', `/invitations/${encodeURIComponent(second)}`)).status).toBe(200);

    expect((await call(server, 'DELETE', `/teams/${teamId}/invitations/${created.body.invitation.id}`, { token: owner.token })).status).toBe(204);
    const revoked = await call(server, 'GET', `/invitations/${encodeURIComponent(second)}`);
    expect(revoked.status).toBe(410);
    expect(revoked.body.code).toBe('invitation_revoked');
    const resendRevoked = await call(server, 'POST', `/teams/${teamId}/invitations/${created.body.invitation.id}/resend`, { token: owner.token });
    expect(resendRevoked.status).toBe(409);
  });

  it('an invitation expires after 7 days (410 invitation_expired), is listed as expired, and re-sending revives it', async () => {
    const email = uniqueEmail('late');
    const created = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email, role: 'viewer' } });
    const token = tokenFromMail(await waitForMail(server, email, 'Join'), '/invitations/');
    clock.advance(7 * DAY + 1000);
    const late = await call(server, 'POST', `/invitations/${encodeURIComponent(token)}/register`, { body: { displayName: 'Late', password: PASSWORD } });
    expect(late.status).toBe(410);
    expect(late.body.code).toBe('invitation_expired');
    const list = await call(server, 'GET', `/teams/${teamId}/invitations`, { token: owner.token });
    expect(list.body.find((i: { id: string }) => i.id === created.body.invitation.id).status).toBe('expired');
    // An expired invitation does not block a new one to the same address.
    expect((await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email, role: 'editor' } })).status).toBe(201);
  });

  it('refuses forged links with 401 invitation_invalid', async () => {
    for (const forged of ['nonsense', `${crypto.randomUUID()}.${'a'.repeat(43)}`]) {
      const res = await call(server, 'GET', `/invitations/${encodeURIComponent(forged)}`);
      expect(res.status).toBe(401);
      expect(res.body.code).toBe('invitation_invalid');
    }
  });

  it('refuses to invite a current member or an address with a pending invitation (409 with a message on email), and validates the body', async () => {
    const member = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email: owner.email, role: 'viewer' } });
    expect(member.status).toBe(409);
    expect(member.body.errors.email).toEqual(['This person is already a member of the team.']);
    const email = uniqueEmail('twice');
    expect((await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email, role: 'viewer' } })).status).toBe(201);
    const twice = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email, role: 'viewer' } });
    expect(twice.status).toBe(409);
    expect(twice.body.code).toBe('already_invited');
    const invalid = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email: 'nope', role: 'boss' } });
    expect(invalid.status).toBe(400);
    expect(Object.keys(invalid.body.errors).sort()).toEqual(['email', 'role']);
  });

  it('re-sending or revoking an invitation of another team answers 404', async () => {
    const otherOwner = await registerAccount(server, 'otherowner');
    const otherTeam = await createTeam(server, otherOwner);
    const created = await call(server, 'POST', `/teams/${otherTeam}/invitations`, { token: otherOwner.token, body: { email: uniqueEmail('x'), role: 'viewer' } });
    const id = created.body.invitation.id;
    expect((await call(server, 'POST', `/teams/${teamId}/invitations/${id}/resend`, { token: owner.token })).status).toBe(404);
    expect((await call(server, 'DELETE', `/teams/${teamId}/invitations/${id}`, { token: owner.token })).status).toBe(404);
  });
});
