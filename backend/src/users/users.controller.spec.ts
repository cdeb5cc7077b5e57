import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, registerAccount } from '../../test/http';
import { startTestApp, type TestApp } from '../../test/test-app';

describe('/users/me', () => {
  let server: TestApp;
  beforeAll(async () => {
    server = await startTestApp();
  });
  afterAll(async () => {
    await server.close();
  });

  it('GET returns the signed-in person without secrets, and an empty team list for a new account', async () => {
    const account = await registerAccount(server, 'me');
    const res = await call(server, 'GET', '/users/me', { token: account.token });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ user: { id: account.id, email: account.email, displayName: account.displayName, createdAt: expect.any(String) }, teams: [] });
  });

  it('PATCH changes the display name (trimmed) and refuses an empty one with a field message', async () => {
    const account = await registerAccount(server, 'rename');
    const ok = await call(server, 'PATCH', '/users/me', { token: account.token, body: { displayName: '  Lise Meitner ' } });
    expect(ok.status).toBe(200);
    expect(ok.body.displayName).toBe('Lise Meitner');
    const bad = await call(server, 'PATCH', '/users/me', { token: account.token, body: { displayName: '', email: 'x@y.z' } });
    expect(bad.status).toBe(400);
    expect(bad.body.errors).toEqual({ displayName: ['Enter your name.'], email: ['This field is not expected here.'] });
  });
});
