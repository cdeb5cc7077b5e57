import type { Request, Response } from 'express';
import type { ClientMeta, IssuedSession, SessionView } from './session.service';

/** The refresh cookie: httpOnly (no script reads it), SameSite=Strict, and sent only to /api/auth. */
export const REFRESH_COOKIE = 'fieldbound_refresh';
export const REFRESH_COOKIE_PATH = '/api/auth';

/** Sets the refresh cookie of a new session and returns the JSON body (never cached). */
export function sendSession(res: Response, session: IssuedSession, secure: boolean): SessionView {
  res.cookie(REFRESH_COOKIE, session.refreshToken, { httpOnly: true, sameSite: 'strict', secure, path: REFRESH_COOKIE_PATH, expires: session.refreshExpiresAt });
  res.setHeader('Cache-Control', 'no-store');
  return session.body;
}

export function clearRefreshCookie(res: Response, secure: boolean): void {
  res.clearCookie(REFRESH_COOKIE, { httpOnly: true, sameSite: 'strict', secure, path: REFRESH_COOKIE_PATH });
}

export function clientMeta(req: Request): ClientMeta {
  return { ip: req.ip ?? null, userAgent: req.get('user-agent') ?? null };
}
