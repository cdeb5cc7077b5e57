import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import { LIVE_HEARTBEAT_MS } from '@fieldbound/shared';

/** Typed configuration, read once from the environment with local defaults. */
export interface AppConfig {
  version: string;
  host: string;
  port: number;
  dataDir: string;
  staticDir: string | null;
  jwtSecret: string;
  /** Where people open the app; links in e-mails start with it. */
  publicUrl: string;
  auth: {
    /** Lifetime of a JWT access token. */
    accessTokenTtlSeconds: number;
    /** Lifetime of a refresh token (each rotation starts a new one). */
    refreshTokenTtlSeconds: number;
    /** A rotated refresh token presented again within this window is treated as a concurrent refresh, not theft. */
    refreshReuseGraceSeconds: number;
    passwordResetTtlSeconds: number;
    invitationTtlSeconds: number;
    /** Send the refresh cookie only over HTTPS (on when publicUrl is https). */
    secureCookies: boolean;
    /** Requests per IP per window on sign-in, register and forgot-password (each counted separately). */
    rateLimit: { limit: number; windowSeconds: number };
  };
  mail: {
    /** smtp(s)://user:pass@host:port for real delivery; null starts the local fake SMTP server. */
    smtpUrl: string | null;
    from: string;
    /** Port of the local fake SMTP server on 127.0.0.1 (0 picks a free one). */
    fakePort: number;
    /** How often undelivered invitation e-mails are looked for and re-sent (0: never; tests call the service). */
    retryIntervalSeconds: number;
  };
  /** Live map updates (server-sent events); see docs/operations.md. */
  live: {
    /** Interval of the comment line every stream gets (and of the access re-check). */
    heartbeatMs: number;
    /** Streams one server instance holds at most; one more answers 503. */
    maxStreams: number;
    /** Streams one account holds at most on one instance; one more answers 429. */
    maxStreamsPerUser: number;
    /** Days map events are kept for catch-up by Last-Event-ID; older ones are pruned hourly. */
    retentionDays: number;
  };
  /**
   * Prefix of rate-limit keys in the shared `rate_limit_hits` table. Instances serving one site share it
   * (empty by default); tests give each application its own so one test's counters never reach another.
   */
  rateLimitScope?: string;
  database: {
    host: string;
    port: number;
    user: string;
    password: string;
    name: string;
  };
}

const repoRoot = path.resolve(__dirname, '..', '..', '..');

function readVersion(): string {
  const pkg = JSON.parse(fs.readFileSync(path.join(repoRoot, 'package.json'), 'utf8')) as { version: string };
  return pkg.version;
}

function intFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 0 || value > 65535) {
    throw new Error(`${name} must be a port number between 0 and 65535, got "${raw}"`);
  }
  return value;
}

/** The secret from the environment, else one generated on first start and kept in .data/. */
function positiveIntFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 0) throw new Error(`${name} must be a whole number of seconds or a count, got "${raw}"`);
  return value;
}

function jwtSecret(dataDir: string): string {
  const fromEnv = process.env.FIELDBOUND_JWT_SECRET;
  if (fromEnv) return fromEnv;
  const file = path.join(dataDir, 'jwt-secret');
  if (fs.existsSync(file)) return fs.readFileSync(file, 'utf8').trim();
  fs.mkdirSync(dataDir, { recursive: true });
  const secret = crypto.randomBytes(48).toString('base64url');
  fs.writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}

function databasePassword(dataDir: string): string {
  const fromEnv = process.env.FIELDBOUND_DB_PASSWORD;
  if (fromEnv !== undefined) return fromEnv;
  const file = path.join(dataDir, 'db-password');
  return fs.existsSync(file) ? fs.readFileSync(file, 'utf8').trim() : '';
}

export function loadConfig(): AppConfig {
  const dataDir = path.resolve(process.env.FIELDBOUND_DATA_DIR ?? path.join(repoRoot, '.data'));
  const defaultStatic = path.join(repoRoot, 'frontend', 'dist');
  const staticDir = process.env.FIELDBOUND_STATIC_DIR ?? defaultStatic;
  const host = process.env.FIELDBOUND_HOST ?? '127.0.0.1';
  const port = intFromEnv('FIELDBOUND_PORT', 3000);
  const publicUrl = (process.env.FIELDBOUND_PUBLIC_URL ?? `http://${host === '0.0.0.0' ? '127.0.0.1' : host}:${port}`).replace(/\/+$/, '');
  return {
    version: readVersion(),
    host,
    port,
    dataDir,
    staticDir: fs.existsSync(staticDir) ? staticDir : null,
    jwtSecret: jwtSecret(dataDir),
    publicUrl,
    auth: {
      accessTokenTtlSeconds: positiveIntFromEnv('FIELDBOUND_ACCESS_TOKEN_TTL', 15 * 60),
      refreshTokenTtlSeconds: positiveIntFromEnv('FIELDBOUND_REFRESH_TOKEN_TTL', 30 * 24 * 3600),
      refreshReuseGraceSeconds: positiveIntFromEnv('FIELDBOUND_REFRESH_REUSE_GRACE', 10),
      passwordResetTtlSeconds: positiveIntFromEnv('FIELDBOUND_PASSWORD_RESET_TTL', 3600),
      invitationTtlSeconds: positiveIntFromEnv('FIELDBOUND_INVITATION_TTL', 7 * 24 * 3600),
      secureCookies: publicUrl.startsWith('https://'),
      rateLimit: {
        limit: positiveIntFromEnv('FIELDBOUND_AUTH_RATE_LIMIT', 10),
        windowSeconds: positiveIntFromEnv('FIELDBOUND_AUTH_RATE_WINDOW', 60),
      },
    },
    mail: {
      smtpUrl: process.env.FIELDBOUND_SMTP_URL || null,
      from: process.env.FIELDBOUND_MAIL_FROM ?? 'Fieldbound <no-reply@fieldbound.local>',
      fakePort: intFromEnv('FIELDBOUND_FAKE_SMTP_PORT', 0),
      retryIntervalSeconds: positiveIntFromEnv('FIELDBOUND_MAIL_RETRY_INTERVAL', 15),
    },
    live: {
      heartbeatMs: LIVE_HEARTBEAT_MS,
      maxStreams: positiveIntFromEnv('FIELDBOUND_LIVE_MAX_STREAMS', 2000),
      maxStreamsPerUser: positiveIntFromEnv('FIELDBOUND_LIVE_MAX_STREAMS_PER_USER', 20),
      retentionDays: positiveIntFromEnv('FIELDBOUND_EVENT_RETENTION_DAYS', 7),
    },
    database: {
      host: process.env.FIELDBOUND_DB_HOST ?? '127.0.0.1',
      port: intFromEnv('FIELDBOUND_DB_PORT', 54329),
      user: process.env.FIELDBOUND_DB_USER ?? 'fieldbound',
      password: databasePassword(dataDir),
      name: process.env.FIELDBOUND_DB_NAME ?? 'fieldbound',
    },
  };
}
