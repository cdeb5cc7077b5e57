import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';

/** Typed configuration, read once from the environment with local defaults. */
export interface AppConfig {
  version: string;
  host: string;
  port: number;
  dataDir: string;
  staticDir: string | null;
  jwtSecret: string;
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
  return {
    version: readVersion(),
    host: process.env.FIELDBOUND_HOST ?? '127.0.0.1',
    port: intFromEnv('FIELDBOUND_PORT', 3000),
    dataDir,
    staticDir: fs.existsSync(staticDir) ? staticDir : null,
    jwtSecret: jwtSecret(dataDir),
    database: {
      host: process.env.FIELDBOUND_DB_HOST ?? '127.0.0.1',
      port: intFromEnv('FIELDBOUND_DB_PORT', 54329),
      user: process.env.FIELDBOUND_DB_USER ?? 'fieldbound',
      password: databasePassword(dataDir),
      name: process.env.FIELDBOUND_DB_NAME ?? 'fieldbound',
    },
  };
}
