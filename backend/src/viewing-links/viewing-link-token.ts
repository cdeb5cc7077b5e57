import crypto from 'node:crypto';

/** 32 random bytes → 43 base64url characters (256 bits; the floor we promise is 128). */
const TOKEN = /^[A-Za-z0-9_-]{43}$/;

export function newViewingToken(): { token: string; hash: string } {
  const token = crypto.randomBytes(32).toString('base64url');
  return { token, hash: hashViewingToken(token) };
}

export function hashViewingToken(token: string): string {
  return crypto.createHash('sha256').update(token, 'utf8').digest('hex');
}

/** True when the text can be one of our tokens (so anything else is refused without a query). */
export function looksLikeViewingToken(token: string): boolean {
  return TOKEN.test(token);
}
