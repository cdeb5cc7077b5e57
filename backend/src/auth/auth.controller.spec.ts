import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { EntityManager } from '@mikro-orm/postgresql';
import { createApp } from '../app.factory';
import { loadConfig } from '../config/configuration';
import { call, type Reply, PASSWORD, registerAccount, uniqueEmail, waitForMail, tokenFromMail } from '../../test/http';
import { startTestApp, TestClock, type TestApp } from '../../test/test-app';

const DAY = 24 * 3600 * 1000;

describe('POST /auth/register', () => {
  let server: TestApp;
  beforeAll(async () => {
    server = await startTestApp();
  });
  afterAll(async () => {
    await server.close();
  });

  it('creates the account, answers 201 with an access token, and sets an httpOnly SameSite=Strict refresh cookie scoped to /api/auth', async () => {
    const email = uniqueEmail('ada');
    const res = await fetch(`${server.baseUrl}/auth/register`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: `  ${email.toUpperCase()} `, password: PASSWORD, displayName: ' Ada ' }),
    });
    expect(res.status).toBe(201);
    const body = (await res.json()) as { accessToken: string; user: { email: string; displayName: string }; accessTokenExpiresAt: string };
    expect(body.user).toMatchObject({ email, displayName: 'Ada' });
    expect(body.accessToken.split('.')).toHaveLength(3);
    const lifetime = Date.parse(body.accessTokenExpiresAt) - Date.now();
    expect(lifetime).toBeGreaterThan(14 * 60 * 1000);
    expect(lifetime).toBeLessThanOrEqual(15 * 60 * 1000);
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith('fieldbound_refresh='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Strict/i);
    expect(cookie).toMatch(/Path=\/api\/auth/);
    expect(res.headers.get('cache-control')).toBe('no-store');
    expect(JSON.stringify(body)).not.toContain(PASSWORD);
  });

  it('stores the password only as an argon2id hash (the column never holds the clear password)', async () => {
    const account = await registerAccount(server, 'hash');
    const em = server.app.get(EntityManager).fork();
    const rows = await em.getConnection().execute<{ password_hash: string }[]>('select password_hash from users where id = ?', [account.id]);
    expect(rows[0].password_hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
    expect(rows[0].password_hash).not.toContain(PASSWORD);
    const everything = await em.getConnection().execute('select * from users where id = ?', [account.id]);
    expect(JSON.stringify(everything)).not.toContain(PASSWORD);
  });

  it('answers 409 with a message on the email field when the address already has an account (any letter case)', async () => {
    const account = await registerAccount(server, 'taken');
    const res = await call(server, 'POST', '/auth/register', { body: { email: account.email.toUpperCase(), password: PASSWORD, displayName: 'Other' } });
    expect(res.status).toBe(409);
    expect(res.body.code).toBe('email_taken');
    expect(res.body.errors.email[0]).toMatch(/already exists/);
  });

  it('answers 400 with one list of messages per invalid field, and refuses unknown fields', async () => {
    const res = await call(server, 'POST', '/auth/register', { body: { email: 'not-an-address', password: 'short', displayName: '', isAdmin: true } });
    expect(res.status).toBe(400);
    expect(res.body.statusCode).toBe(400);
    expect(res.body.message).toBe('Some fields need attention.');
    expect(res.body.errors.email).toEqual(['Enter a valid e-mail address, such as name@institute.edu.']);
    expect(res.body.errors.password).toEqual(['A password needs at least 10 characters.']);
    expect(res.body.errors.displayName).toEqual(['Enter your name.']);
    expect(res.body.errors.isAdmin).toEqual(['This field is not expected here.']);
  });

  it('answers 400 for a body that is not an object', async () => {
    const res = await fetch(`${server.baseUrl}/auth/register`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: '"text"' });
    expect(res.status).toBe(400);
  });
});

describe('POST /auth/sign-in', () => {
  let server: TestApp;
  beforeAll(async () => {
    server = await startTestApp();
  });
  afterAll(async () => {
    await server.close();
  });

  it('signs in with the right password (e-mail in any case) and answers 200 with a token that opens /users/me', async () => {
    const account = await registerAccount(server, 'signin');
    const res = await call(server, 'POST', '/auth/sign-in', { body: { email: account.email.toUpperCase(), password: PASSWORD } });
    expect(res.status).toBe(200);
    expect(res.refreshCookie).toBeTruthy();
    const me = await call(server, 'GET', '/users/me', { token: res.body.accessToken });
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(account.email);
  });

  it('gives exactly the same 401 answer for a wrong password and for an unknown e-mail', async () => {
    const account = await registerAccount(server, 'same');
    const wrong = await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: 'not the password' } });
    const unknown = await call(server, 'POST', '/auth/sign-in', { body: { email: uniqueEmail('nobody'), password: 'not the password' } });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body).toEqual({ statusCode: 401, code: 'invalid_credentials', message: 'The e-mail address or the password is not correct.' });
    expect(wrong.refreshCookie).toBeUndefined();
  });

  it('spends comparable time on unknown e-mails and wrong passwords (argon2 runs in both cases)', async () => {
    const account = await registerAccount(server, 'timing');
    const time = async (email: string) => {
      const started = performance.now();
      await call(server, 'POST', '/auth/sign-in', { body: { email, password: 'not the password' } });
      return performance.now() - started;
    };
    const known: number[] = [];
    const unknown: number[] = [];
    for (let i = 0; i < 5; i++) {
      known.push(await time(account.email));
      unknown.push(await time(uniqueEmail('ghost')));
    }
    const median = (xs: number[]) => xs.sort((a, b) => a - b)[2];
    // Without the decoy verification the unknown case answers in a few ms against ~150 ms; the
    // generous bound keeps the test steady on a busy machine.
    expect(median(unknown)).toBeGreaterThan(median(known) * 0.3);
  });
});

describe('rate limits on sign-in, register and forgot-password', () => {
  let server: TestApp;
  beforeAll(async () => {
    server = await startTestApp({ auth: { rateLimit: { limit: 3, windowSeconds: 60 } } });
  });
  afterAll(async () => {
    await server.close();
  });

  it('answers 429 with Retry-After on the 4th sign-in attempt from one address within the window', async () => {
    const statuses: number[] = [];
    let last: Reply | undefined;
    for (let i = 0; i < 4; i++) {
      last = await call(server, 'POST', '/auth/sign-in', { body: { email: uniqueEmail('flood'), password: 'whatever-password' } });
      statuses.push(last.status);
    }
    expect(statuses).toEqual([401, 401, 401, 429]);
    expect(last!.body.message).toMatch(/Too many attempts/);
    expect(Number(last!.headers.get('retry-after'))).toBeGreaterThan(0);
  });

  it('counts register and forgot-password separately, and limits each to 3 per window', async () => {
    const register: number[] = [];
    const forgot: number[] = [];
    for (let i = 0; i < 4; i++) {
      register.push((await call(server, 'POST', '/auth/register', { body: { email: 'bad', password: 'x', displayName: 'x' } })).status);
      forgot.push((await call(server, 'POST', '/auth/forgot-password', { body: { email: uniqueEmail('f') } })).status);
    }
    expect(register).toEqual([400, 400, 400, 429]);
    expect(forgot).toEqual([202, 202, 202, 429]);
  });
});

describe('refresh tokens: rotation, reuse detection, expiry, sign-out', () => {
  let server: TestApp;
  const clock = new TestClock();
  beforeAll(async () => {
    server = await startTestApp({ auth: { refreshReuseGraceSeconds: 5 } as never }, { clock });
  });
  afterAll(async () => {
    await server.close();
  });

  it('POST /auth/refresh trades the cookie for a new access token and a different refresh cookie', async () => {
    const account = await registerAccount(server, 'rotate');
    const res = await call(server, 'POST', '/auth/refresh', { cookie: account.cookie });
    expect(res.status).toBe(200);
    expect(res.body.user.id).toBe(account.id);
    expect(res.refreshCookie).toBeTruthy();
    expect(res.refreshCookie).not.toBe(account.cookie);
    const me = await call(server, 'GET', '/users/me', { token: res.body.accessToken });
    expect(me.status).toBe(200);
  });

  it('stores refresh tokens only as SHA-256 hashes', async () => {
    const account = await registerAccount(server, 'tokhash');
    const em = server.app.get(EntityManager).fork();
    const [id, secret] = account.cookie.split('.');
    const rows = await em.getConnection().execute<{ token_hash: string }[]>('select token_hash from refresh_tokens where id = ?', [id]);
    expect(rows[0].token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(rows[0].token_hash).not.toContain(secret);
  });

  it('a used refresh token presented again after the grace window is refused (401 refresh_token_reused) and the whole family is revoked', async () => {
    const account = await registerAccount(server, 'reuse');
    const first = await call(server, 'POST', '/auth/refresh', { cookie: account.cookie });
    expect(first.status).toBe(200);
    clock.advance(6_000);
    const replay = await call(server, 'POST', '/auth/refresh', { cookie: account.cookie });
    expect(replay.status).toBe(401);
    expect(replay.body.code).toBe('refresh_token_reused');
    expect(replay.refreshCookie).toBe('');
    // The legitimate successor dies with its family.
    const successor = await call(server, 'POST', '/auth/refresh', { cookie: first.refreshCookie });
    expect(successor.status).toBe(401);
    expect(successor.body.code).toBe('refresh_token_revoked');
  });

  it('a used refresh token presented again within the grace window (two tabs at once) gets its own successor', async () => {
    const account = await registerAccount(server, 'tabs');
    const [a, b] = await Promise.all([
      call(server, 'POST', '/auth/refresh', { cookie: account.cookie }),
      call(server, 'POST', '/auth/refresh', { cookie: account.cookie }),
    ]);
    expect([a.status, b.status]).toEqual([200, 200]);
    expect(a.refreshCookie).not.toBe(b.refreshCookie);
    expect((await call(server, 'POST', '/auth/refresh', { cookie: a.refreshCookie })).status).toBe(200);
    expect((await call(server, 'POST', '/auth/refresh', { cookie: b.refreshCookie })).status).toBe(200);
  });

  it('refuses an expired refresh token with 401 refresh_token_expired', async () => {
    const account = await registerAccount(server, 'expire');
    clock.advance(31 * DAY);
    const res = await call(server, 'POST', '/auth/refresh', { cookie: account.cookie });
    expect(res.status).toBe(401);
    expect(res.body.code).toBe('refresh_token_expired');
  });

  it('refuses a missing cookie (401 refresh_token_missing) and a forged one (401 refresh_token_invalid)', async () => {
    const account = await registerAccount(server, 'forge');
    const missing = await call(server, 'POST', '/auth/refresh');
    expect(missing.status).toBe(401);
    expect(missing.body.code).toBe('refresh_token_missing');
    const [id] = account.cookie.split('.');
    for (const forged of [`${id}.${'A'.repeat(43)}`, 'garbage', `${crypto.randomUUID()}.${'b'.repeat(43)}`]) {
      const res = await call(server, 'POST', '/auth/refresh', { cookie: forged });
      expect(res.status).toBe(401);
      expect(res.body.code).toBe('refresh_token_invalid');
    }
    // The genuine token still works: forgery attempts do not revoke it.
    expect((await call(server, 'POST', '/auth/refresh', { cookie: account.cookie })).status).toBe(200);
  });

  it('POST /auth/sign-out revokes the session (204, cookie cleared) so its refresh token is refused afterwards', async () => {
    const account = await registerAccount(server, 'signout');
    const out = await call(server, 'POST', '/auth/sign-out', { cookie: account.cookie });
    expect(out.status).toBe(204);
    expect(out.refreshCookie).toBe('');
    const res = await call(server, 'POST', '/auth/refresh', { cookie: account.cookie });
    expect(res.status).toBe(401);
    expect(res.body.code).toBe('refresh_token_revoked');
  });

  it('POST /auth/sign-out without a cookie still answers 204', async () => {
    expect((await call(server, 'POST', '/auth/sign-out')).status).toBe(204);
  });
});

describe('access tokens', () => {
  let server: TestApp;
  beforeAll(async () => {
    // 5 s: long enough for the first call to land inside the lifetime on a loaded machine.
    server = await startTestApp({ auth: { accessTokenTtlSeconds: 5 } as never });
  });
  afterAll(async () => {
    await server.close();
  });

  it('refuses a request without a token: 401 not_signed_in', async () => {
    const res = await call(server, 'GET', '/users/me');
    expect(res.status).toBe(401);
    expect(res.body).toEqual({ statusCode: 401, code: 'not_signed_in', message: 'Sign in to continue.' });
  });

  it('refuses a forged token (wrong signature) and a malformed one: 401 access_token_invalid', async () => {
    const account = await registerAccount(server, 'jwt');
    const [header, payload] = account.token.split('.');
    const forgedPayload = Buffer.from(JSON.stringify({ ...JSON.parse(Buffer.from(payload, 'base64url').toString()), sub: crypto.randomUUID() })).toString('base64url');
    for (const token of [`${header}.${forgedPayload}.${account.token.split('.')[2]}`, 'abc.def.ghi', `${header}.${payload}.`]) {
      const res = await call(server, 'GET', '/users/me', { token });
      expect(res.status).toBe(401);
      expect(res.body.code).toBe('access_token_invalid');
    }
  });

  it('refuses a token signed with "none" or another secret', async () => {
    const none = `${Buffer.from('{"alg":"none","typ":"JWT"}').toString('base64url')}.${Buffer.from(JSON.stringify({ sub: crypto.randomUUID(), ver: 0, exp: 9999999999 })).toString('base64url')}.`;
    expect((await call(server, 'GET', '/users/me', { token: none })).status).toBe(401);
  });

  it('refuses an expired token with 401 access_token_expired (lifetime shortened to 5 s for this test)', async () => {
    const account = await registerAccount(server, 'short');
    expect((await call(server, 'GET', '/users/me', { token: account.token })).status).toBe(200);
    await new Promise((r) => setTimeout(r, 6100));
    const res = await call(server, 'GET', '/users/me', { token: account.token });
    expect(res.status).toBe(401);
    expect(res.body.code).toBe('access_token_expired');
    expect(res.body.message).toMatch(/expired/);
  });
});

describe('POST /auth/change-password', () => {
  let server: TestApp;
  beforeAll(async () => {
    server = await startTestApp();
  });
  afterAll(async () => {
    await server.close();
  });

  it('needs a signed-in caller (401)', async () => {
    const res = await call(server, 'POST', '/auth/change-password', { body: { currentPassword: PASSWORD, newPassword: 'another long password' } });
    expect(res.status).toBe(401);
  });

  it('answers 400 on currentPassword when it is wrong, and changes nothing', async () => {
    const account = await registerAccount(server, 'chwrong');
    const res = await call(server, 'POST', '/auth/change-password', { token: account.token, body: { currentPassword: 'wrong password!', newPassword: 'another long password' } });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual({ currentPassword: ['The current password is not correct.'] });
    expect((await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: PASSWORD } })).status).toBe(200);
  });

  it('changes the password, revokes other sessions and old access tokens, keeps this device signed in, and mails a notice', async () => {
    const account = await registerAccount(server, 'change');
    const other = await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: PASSWORD } });
    const res = await call(server, 'POST', '/auth/change-password', { token: account.token, body: { currentPassword: PASSWORD, newPassword: 'a brand new password' } });
    expect(res.status).toBe(200);
    expect(res.refreshCookie).toBeTruthy();
    expect((await call(server, 'GET', '/users/me', { token: res.body.accessToken })).status).toBe(200);
    const oldAccess = await call(server, 'GET', '/users/me', { token: account.token });
    expect(oldAccess.status).toBe(401);
    expect(oldAccess.body.code).toBe('access_token_revoked');
    expect((await call(server, 'POST', '/auth/refresh', { cookie: other.refreshCookie })).body.code).toBe('refresh_token_revoked');
    expect((await call(server, 'POST', '/auth/refresh', { cookie: account.cookie })).body.code).toBe('refresh_token_revoked');
    expect((await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: PASSWORD } })).status).toBe(401);
    expect((await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: 'a brand new password' } })).status).toBe(200);
    const notice = await waitForMail(server, account.email, 'password was changed');
    expect(notice.text).not.toContain('a brand new password');
  });
});

describe('forgotten password: one-time e-mailed reset links', () => {
  let server: TestApp;
  const clock = new TestClock();
  beforeAll(async () => {
    server = await startTestApp({}, { clock });
  });
  afterAll(async () => {
    await server.close();
  });

  it('answers 202 with the same words for known and unknown addresses, and mails a link only to the known one', async () => {
    const account = await registerAccount(server, 'forgot');
    const nobody = uniqueEmail('nobody');
    const known = await call(server, 'POST', '/auth/forgot-password', { body: { email: account.email } });
    const unknown = await call(server, 'POST', '/auth/forgot-password', { body: { email: nobody } });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    const mail = await waitForMail(server, account.email, 'Reset');
    expect(mail.links.some((l) => l.includes('/reset-password/'))).toBe(true);
    await new Promise((r) => setTimeout(r, 200));
    const fake = (await call(server, 'GET', '/dev/mailbox')).body.messages as { to: string[] }[];
    expect(fake.some((m) => m.to.includes(nobody))).toBe(false);
  });

  it('follows the mailed link: GET shows whose it is, POST sets the password once, signs out everywhere, and a second use answers 410', async () => {
    const account = await registerAccount(server, 'reset');
    await call(server, 'POST', '/auth/forgot-password', { body: { email: account.email } });
    const token = tokenFromMail(await waitForMail(server, account.email, 'Reset'), '/reset-password/');
    const check = await call(server, 'GET', `/auth/reset-password/${encodeURIComponent(token)}`);
    expect(check.status).toBe(200);
    expect(check.body.email).toBe(account.email);
    const res = await call(server, 'POST', '/auth/reset-password', { body: { token, password: 'reset to this one' } });
    expect(res.status).toBe(200);
    expect((await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: 'reset to this one' } })).status).toBe(200);
    expect((await call(server, 'POST', '/auth/refresh', { cookie: account.cookie })).body.code).toBe('refresh_token_revoked');
    expect((await call(server, 'GET', '/users/me', { token: account.token })).body.code).toBe('access_token_revoked');
    const again = await call(server, 'POST', '/auth/reset-password', { body: { token, password: 'and once more please' } });
    expect(again.status).toBe(410);
    expect(again.body.code).toBe('reset_token_used');
    expect((await call(server, 'GET', `/auth/reset-password/${encodeURIComponent(token)}`)).status).toBe(410);
  });

  it('refuses a forged link with 401 reset_token_invalid and an expired one (after 1 hour) with 410 reset_token_expired', async () => {
    const account = await registerAccount(server, 'resetexp');
    await call(server, 'POST', '/auth/forgot-password', { body: { email: account.email } });
    const token = tokenFromMail(await waitForMail(server, account.email, 'Reset'), '/reset-password/');
    const forged = `${token.split('.')[0]}.${'x'.repeat(43)}`;
    const bad = await call(server, 'POST', '/auth/reset-password', { body: { token: forged, password: 'reset to this one' } });
    expect(bad.status).toBe(401);
    expect(bad.body.code).toBe('reset_token_invalid');
    clock.advance(3600 * 1000 + 1000);
    const late = await call(server, 'POST', '/auth/reset-password', { body: { token, password: 'reset to this one' } });
    expect(late.status).toBe(410);
    expect(late.body.code).toBe('reset_token_expired');
    expect((await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: PASSWORD } })).status).toBe(200);
  });

  it('validates the new password like registration (400 on password)', async () => {
    const res = await call(server, 'POST', '/auth/reset-password', { body: { token: 'x', password: 'short' } });
    expect(res.status).toBe(400);
    expect(res.body.errors.password).toEqual(['A password needs at least 10 characters.']);
  });
});

describe('logs', () => {
  it('never contain the clear password, the refresh token or a reset link through register, sign-in, refresh and reset', async () => {
    const lines: string[] = [];
    const spy = vi.spyOn(process.stdout, 'write').mockImplementation((chunk: string | Uint8Array) => {
      lines.push(String(chunk));
      return true;
    });
    const spyErr = vi.spyOn(process.stderr, 'write').mockImplementation((chunk: string | Uint8Array) => {
      lines.push(String(chunk));
      return true;
    });
    const config = { ...loadConfig(), staticDir: null, port: 0 };
    config.mail = { ...config.mail, smtpUrl: null };
    const app = await createApp({ logs: 'json', config });
    await app.listen(0, '127.0.0.1');
    const server = { app, config, baseUrl: `http://127.0.0.1:${(app.getHttpServer().address() as { port: number }).port}/api`, close: () => app.close() };
    try {
      const account = await registerAccount(server, 'logs', 'secret words never logged');
      await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: 'secret words never logged' } });
      await call(server, 'POST', '/auth/sign-in', { body: { email: account.email, password: 'wrong secret words here' } });
      const refreshed = await call(server, 'POST', '/auth/refresh', { cookie: account.cookie });
      await call(server, 'POST', '/auth/forgot-password', { body: { email: account.email } });
      const token = tokenFromMail(await waitForMail(server, account.email, 'Reset'), '/reset-password/');
      await call(server, 'GET', `/auth/reset-password/${encodeURIComponent(token)}`);
      const all = lines.join('');
      expect(all).toContain('"path":"/api/auth/sign-in"');
      for (const secret of ['secret words never logged', 'wrong secret words here', account.cookie.split('.')[1], refreshed.refreshCookie!.split('.')[1], token.split('.')[1]]) {
        expect(all).not.toContain(secret);
      }
    } finally {
      await app.close();
      spy.mockRestore();
      spyErr.mockRestore();
    }
  });
});
