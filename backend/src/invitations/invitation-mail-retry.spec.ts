import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, PASSWORD, registerAccount, startAppWithTeam, tokenFromMail, uniqueEmail, waitForMail, type Account } from '../../test/http';
import { TestClock, type TestApp } from '../../test/test-app';
import { MailService } from '../mail/mail.service';
import { InvitationMailRetryService } from './invitation-mail-retry.service';
import { mailRetryDelaySeconds } from './invitations.service';

/** The fake SMTP server of this app: stopped, the mailer's connections are refused, as with a mail server that is down. */
function mailServer(server: TestApp) {
  const fake = server.app.get(MailService).fake!;
  const port = fake.port;
  return {
    stop: () => fake.stop(),
    start: async () => {
      await fake.start(port);
    },
  };
}

describe('invitation e-mail while the mail server is down', () => {
  let server: TestApp;
  let owner: Account;
  let teamId: string;
  const clock = new TestClock();
  beforeAll(async () => {
    ({ server, owner, teamId } = await startAppWithTeam(clock, 'mailowner', 'Outage group'));
  });
  afterAll(async () => {
    await server.close();
  });

  it('backs off 30 s, 1 min, 2 min … and never waits more than an hour between attempts', () => {
    expect([1, 2, 3, 4].map(mailRetryDelaySeconds)).toEqual([30, 60, 120, 240]);
    expect(mailRetryDelaySeconds(20)).toBe(3600);
  });

  it('keeps the invitation as mail pending, retries with backoff while the server is down, and sends a working link once it is back', async () => {
    const smtp = mailServer(server);
    const retry = server.app.get(InvitationMailRetryService);
    const email = uniqueEmail('waiting');
    await smtp.stop();
    try {
      const invited = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email, role: 'viewer' } });
      expect(invited.status).toBe(201);
      expect(invited.body.emailSent).toBe(false);
      expect(invited.body.invitation).toMatchObject({ email, status: 'pending', mailStatus: 'pending', mailAttempts: 1 });
      const firstRetryAt = Date.parse(invited.body.invitation.nextMailAttemptAt);
      expect(firstRetryAt - clock.now().getTime()).toBeGreaterThan(25_000);
      expect(firstRetryAt - clock.now().getTime()).toBeLessThanOrEqual(30_000);

      // The owners' list shows it the same way, so the page can say the mail is pending.
      const listed = await call(server, 'GET', `/teams/${teamId}/invitations`, { token: owner.token });
      expect(listed.body.find((i: { email: string }) => i.email === email)).toMatchObject({ mailStatus: 'pending', mailAttempts: 1 });

      // Not due yet: nothing is attempted.
      expect(await retry.deliverDue()).toBe(0);
      expect((await call(server, 'GET', `/teams/${teamId}/invitations`, { token: owner.token })).body.find((i: { email: string }) => i.email === email).mailAttempts).toBe(1);

      // Due while the server is still down: a second failed attempt, the next one a minute later.
      clock.advance(31_000);
      expect(await retry.deliverDue()).toBe(0);
      const second = (await call(server, 'GET', `/teams/${teamId}/invitations`, { token: owner.token })).body.find((i: { email: string }) => i.email === email);
      expect(second).toMatchObject({ mailStatus: 'pending', mailAttempts: 2 });
      const wait = Date.parse(second.nextMailAttemptAt) - clock.now().getTime();
      expect(wait).toBeGreaterThan(55_000);
      expect(wait).toBeLessThanOrEqual(60_000);
    } finally {
      await smtp.start();
    }

    // The mail server is back; once the attempt is due the e-mail goes out by itself.
    clock.advance(61_000);
    expect(await retry.deliverDue()).toBe(1);
    const message = await waitForMail(server, email, 'Join');
    const after = (await call(server, 'GET', `/teams/${teamId}/invitations`, { token: owner.token })).body.find((i: { email: string }) => i.email === email);
    expect(after).toMatchObject({ mailStatus: 'sent', mailAttempts: 0, nextMailAttemptAt: null, status: 'pending' });
    // Sent once: a further round finds nothing due.
    clock.advance(3_600_000);
    expect(await retry.deliverDue()).toBe(0);

    // The link in the re-sent mail works.
    const token = tokenFromMail(message, '/invitations/');
    const joined = await call(server, 'POST', `/invitations/${encodeURIComponent(token)}/register`, { body: { displayName: 'Patient Reader', password: PASSWORD } });
    expect(joined.status).toBe(201);
    expect(joined.body.teamId).toBe(teamId);
  });

  it('stops retrying an invitation that was revoked while its mail was pending', async () => {
    const smtp = mailServer(server);
    const retry = server.app.get(InvitationMailRetryService);
    const email = uniqueEmail('withdrawn');
    await smtp.stop();
    let invitationId: string;
    try {
      const invited = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email, role: 'viewer' } });
      expect(invited.body.emailSent).toBe(false);
      invitationId = invited.body.invitation.id;
    } finally {
      await smtp.start();
    }
    expect((await call(server, 'DELETE', `/teams/${teamId}/invitations/${invitationId}`, { token: owner.token })).status).toBe(204);
    clock.advance(31_000);
    expect(await retry.deliverDue()).toBe(0);
    await expect(waitForMail(server, email, 'Join', 300)).rejects.toThrow(/no mail/);
  });

  it('an invitation whose mail went out at once is marked sent and never retried', async () => {
    const email = uniqueEmail('prompt');
    const invited = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email, role: 'editor' } });
    expect(invited.body.emailSent).toBe(true);
    expect(invited.body.invitation).toMatchObject({ mailStatus: 'sent', mailAttempts: 0, nextMailAttemptAt: null });
    await waitForMail(server, email, 'Join');
    clock.advance(3_600_000);
    expect(await server.app.get(InvitationMailRetryService).deliverDue()).toBe(0);
  });
});
