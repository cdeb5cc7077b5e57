import crypto from 'node:crypto';

/**
 * Opaque one-time tokens (refresh tokens, reset links, invitation links) have the form `<id>.<secret>`:
 * the id finds the row, the secret is 32 random bytes of which only the SHA-256 is stored.
 * A database leak therefore yields no usable token.
 */
export interface SecretToken {
  id: string;
  secret: string;
  hash: string;
  token: string;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const SECRET = /^[A-Za-z0-9_-]{43}$/;

export function hashSecret(secret: string): string {
  return crypto.createHash('sha256').update(secret).digest('hex');
}

export function newSecretToken(id: string = crypto.randomUUID()): SecretToken {
  const secret = crypto.randomBytes(32).toString('base64url');
  return { id, secret, hash: hashSecret(secret), token: `${id}.${secret}` };
}

/** Splits a presented token; null when it cannot be one of ours (so callers answer "not valid" without a query). */
export function parseSecretToken(token: string | undefined | null): { id: string; secret: string } | null {
  if (!token || token.length > 200) return null;
  const dot = token.indexOf('.');
  if (dot < 0) return null;
  const id = token.slice(0, dot);
  const secret = token.slice(dot + 1);
  return UUID.test(id) && SECRET.test(secret) ? { id: id.toLowerCase(), secret } : null;
}

/** Constant-time comparison of a presented secret with a stored hash. */
export function secretMatches(secret: string, storedHash: string): boolean {
  const a = Buffer.from(hashSecret(secret), 'hex');
  const b = Buffer.from(storedHash, 'hex');
  return a.length === b.length && crypto.timingSafeEqual(a, b);
}
