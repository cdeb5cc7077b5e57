import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ApiError, apiFetch, session } from './client';

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

beforeEach(() => {
  session.set(null);
});
afterEach(() => {
  vi.unstubAllGlobals();
});

describe('apiFetch and the session', () => {
  it('without an access token, refreshes first and sends the new token as a Bearer header', async () => {
    const fetchMock = vi.fn(async (url: string, init?: RequestInit) => {
      if (url === '/api/auth/refresh') return json(200, { accessToken: 'token-1' });
      expect(new Headers(init?.headers).get('Authorization')).toBe('Bearer token-1');
      return json(200, { ok: true });
    });
    vi.stubGlobal('fetch', fetchMock);
    await expect(apiFetch('/users/me')).resolves.toEqual({ ok: true });
    expect(fetchMock.mock.calls.map((c) => c[0])).toEqual(['/api/auth/refresh', '/api/users/me']);
  });

  it('on 401 access_token_expired refreshes once and repeats the request with the new token', async () => {
    session.set('old');
    const fetchMock = vi.fn(async (url: string, init?: RequestInit) => {
      if (url === '/api/auth/refresh') return json(200, { accessToken: 'new' });
      const auth = new Headers(init?.headers).get('Authorization');
      return auth === 'Bearer new' ? json(200, { ok: true }) : json(401, { statusCode: 401, code: 'access_token_expired', message: 'expired' });
    });
    vi.stubGlobal('fetch', fetchMock);
    await expect(apiFetch('/teams')).resolves.toEqual({ ok: true });
    expect(fetchMock).toHaveBeenCalledTimes(3);
    expect(session.token).toBe('new');
  });

  it('when the refresh fails too, ends the session and throws the 401', async () => {
    session.set('old');
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string) =>
        url === '/api/auth/refresh'
          ? json(401, { code: 'refresh_token_expired', message: 'Your session has expired; sign in again.' })
          : json(401, { code: 'access_token_expired', message: 'expired' }),
      ),
    );
    const error = await apiFetch('/teams').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).status).toBe(401);
    expect(session.token).toBeNull();
  });

  it('concurrent requests share one refresh', async () => {
    let refreshes = 0;
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string) => {
        if (url === '/api/auth/refresh') {
          refreshes += 1;
          await new Promise((r) => setTimeout(r, 10));
          return json(200, { accessToken: 't' });
        }
        return json(200, {});
      }),
    );
    await Promise.all([apiFetch('/a'), apiFetch('/b'), apiFetch('/c')]);
    expect(refreshes).toBe(1);
  });

  it('exposes the code and the per-field messages of an error answer', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => json(409, { statusCode: 409, code: 'email_taken', message: 'taken', errors: { email: ['taken'] } })));
    const error = (await apiFetch('/auth/register', { method: 'POST', auth: false }).catch((e: unknown) => e)) as ApiError;
    expect(error.code).toBe('email_taken');
    expect(error.fieldErrors).toEqual({ email: ['taken'] });
  });
});
