// Backup and restore of one database of the local cluster with pg_dump / pg_restore (custom format).
//
// Restore never writes into the live database: it restores into a new scratch database in one
// transaction, and only when that has fully succeeded swaps the names (the old database is kept,
// renamed, until someone drops it). A failed or interrupted restore leaves the target untouched.
import fs from 'node:fs';
import path from 'node:path';
import { dataDir } from './paths.mjs';
import { step, BootstrapError } from './log.mjs';
import { capture } from './run.mjs';

const NAME = /^[a-z_][a-z0-9_]*$/;
const MAX_IDENTIFIER = 63;

/** 20261202t014500z: sortable, safe in file and database names. */
function stamp(date = new Date()) {
  return date.toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z').toLowerCase();
}

function assertName(name) {
  if (!NAME.test(name) || name.length > MAX_IDENTIFIER) throw new BootstrapError(`invalid database name "${name}"`);
}

/** `<base>_<suffix>`, shortening base so the whole stays a valid PostgreSQL identifier. */
function derivedName(base, suffix) {
  return `${base.slice(0, MAX_IDENTIFIER - suffix.length - 1)}_${suffix}`;
}

function clientEnv(cluster) {
  return { ...process.env, PGPASSWORD: cluster.password, PGCONNECT_TIMEOUT: '10' };
}

function connectionArgs(cluster) {
  return ['-h', '127.0.0.1', '-p', String(cluster.port), '-U', 'fieldbound', '--no-password'];
}

function databaseExists(cluster, name) {
  return cluster.sql(`SELECT 1 FROM pg_database WHERE datname = '${name}'`) === '1';
}

/** The archive's table of contents; throws when the file is not a readable pg_dump custom archive. */
function archiveContents(cluster, file) {
  const list = capture(path.join(cluster.bin, 'pg_restore'), ['--list', file]);
  if (list.status !== 0) throw new BootstrapError(`${file} is not a readable pg_dump archive: ${list.stderr.trim().split('\n')[0]}`);
  const tables = list.stdout.split('\n').filter((line) => / TABLE DATA /.test(line)).length;
  return { tables };
}

function humanSize(bytes) {
  return bytes < 1024 * 1024 ? `${(bytes / 1024).toFixed(1)} kB` : `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/**
 * pg_dump of `database` in custom format (compressed, restorable table by table) to `file`,
 * default `.data/backups/<database>-<timestamp>.dump`. Written to a partial file and renamed when
 * complete and readable, mode 0600 (the dump holds password hashes). Never overwrites a file.
 */
export function backup(cluster, database, file) {
  assertName(database);
  if (!databaseExists(cluster, database)) throw new BootstrapError(`database "${database}" does not exist; nothing to back up`);
  let target = file ? path.resolve(file) : null;
  if (!target) {
    const dir = path.join(dataDir, 'backups');
    fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
    const base = `${database}-${stamp()}`;
    target = path.join(dir, `${base}.dump`);
    for (let n = 1; fs.existsSync(target); n++) target = path.join(dir, `${base}-${n}.dump`);
  } else {
    if (fs.existsSync(target)) throw new BootstrapError(`${target} already exists; choose another file name (backups are never overwritten)`);
    fs.mkdirSync(path.dirname(target), { recursive: true });
  }
  const partial = `${target}.partial-${process.pid}`;
  const started = Date.now();
  step(`backing up database ${database} to ${target}`);
  try {
    const dump = capture(path.join(cluster.bin, 'pg_dump'), [...connectionArgs(cluster), '--dbname', database, '--format=custom', '--compress=6', '--file', partial], { env: clientEnv(cluster) });
    if (dump.status !== 0) throw new BootstrapError(`pg_dump failed: ${dump.stderr.trim()}`);
    fs.chmodSync(partial, 0o600);
    const { tables } = archiveContents(cluster, partial);
    fs.renameSync(partial, target);
    step(`backup complete: ${tables} tables, ${humanSize(fs.statSync(target).size)}, ${((Date.now() - started) / 1000).toFixed(1)} s`);
    return target;
  } finally {
    fs.rmSync(partial, { force: true });
  }
}

/**
 * Restores `file` into `database`. Refuses when the database exists unless `force`. Steps:
 * 1. check the archive is readable (nothing is touched otherwise);
 * 2. create `<database>_restoring_<ts>` from template0 and pg_restore into it with
 *    --single-transaction --exit-on-error --no-owner --no-privileges; on any error drop it and stop;
 * 3. swap: refuse new connections to the old database, end its sessions, rename it to
 *    `<database>_before_restore_<ts>`, rename the restored one to `<database>` (one transaction),
 *    and allow connections to the kept copy again.
 * A running server loses its connections for a moment (its requests answer 503) and reconnects
 * to the restored database by name.
 */
export function restore(cluster, database, file, { force = false } = {}) {
  assertName(database);
  if (!file) throw new BootstrapError('usage: npm run db:restore -- FILE [--force]');
  const source = path.resolve(file);
  if (!fs.existsSync(source)) throw new BootstrapError(`${source} does not exist`);
  const { tables } = archiveContents(cluster, source);
  const exists = databaseExists(cluster, database);
  if (exists && !force) {
    throw new BootstrapError(
      `database "${database}" exists and would be replaced. Run again with --force (npm run db:restore -- FILE --force); ` +
        `the current database is then kept as ${derivedName(database, `before_restore_${stamp()}`)}.`,
    );
  }
  const ts = stamp();
  const scratch = derivedName(database, `restoring_${ts}`);
  const previous = derivedName(database, `before_restore_${ts}`);
  const started = Date.now();
  step(`restoring ${source} (${tables} tables) into a new database ${scratch}`);
  cluster.sql(`CREATE DATABASE ${scratch} TEMPLATE template0 ENCODING 'UTF8'`);
  try {
    const result = capture(
      path.join(cluster.bin, 'pg_restore'),
      [...connectionArgs(cluster), '--dbname', scratch, '--single-transaction', '--exit-on-error', '--no-owner', '--no-privileges', source],
      { env: clientEnv(cluster) },
    );
    if (result.status !== 0) throw new BootstrapError(`pg_restore failed; ${database} was not changed: ${result.stderr.trim()}`);
  } catch (error) {
    cluster.sql(`DROP DATABASE IF EXISTS ${scratch} WITH (FORCE)`);
    throw error;
  }
  if (exists) {
    step(`swapping: ${database} → ${previous}, ${scratch} → ${database}`);
    cluster.sql(`ALTER DATABASE ${database} WITH ALLOW_CONNECTIONS false`);
    try {
      cluster.sql(`SELECT count(pg_terminate_backend(pid)) FROM pg_stat_activity WHERE datname = '${database}' AND pid <> pg_backend_pid()`);
      cluster.sql(`BEGIN; ALTER DATABASE ${database} RENAME TO ${previous}; ALTER DATABASE ${scratch} RENAME TO ${database}; COMMIT;`);
    } catch (error) {
      cluster.sql(`DROP DATABASE IF EXISTS ${scratch} WITH (FORCE)`);
      throw error;
    } finally {
      cluster.sql(`ALTER DATABASE ${databaseExists(cluster, previous) ? previous : database} WITH ALLOW_CONNECTIONS true`);
    }
  } else {
    cluster.sql(`ALTER DATABASE ${scratch} RENAME TO ${database}`);
  }
  step(`restore complete in ${((Date.now() - started) / 1000).toFixed(1)} s: ${database} now holds the backup`);
  if (exists) step(`the replaced database is kept as ${previous}; drop it once you have checked the restore: DROP DATABASE ${previous};`);
  return { database, previous: exists ? previous : null };
}
