// A project-local PostgreSQL cluster on 127.0.0.1, from Debian's packages.
// initdb and postgres refuse to run as root, so as root every server command runs as the
// `postgres` system user, and the cluster lives where that user can reach it.
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import crypto from 'node:crypto';
import { dataDir, repoRoot } from './paths.mjs';
import { step, BootstrapError } from './log.mjs';
import { capture, runOrThrow, isRoot } from './run.mjs';
import { aptInstall } from './deps.mjs';

export const DEFAULT_DB_PORT = 54329;
const DB_USER = 'fieldbound';

function findServerBinaries() {
  const base = '/usr/lib/postgresql';
  if (!fs.existsSync(base)) return null;
  const versions = fs
    .readdirSync(base)
    .filter((v) => fs.existsSync(path.join(base, v, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], 'bin') : null;
}

export function ensurePostgresInstalled() {
  let bin = findServerBinaries();
  if (bin) return bin;
  if (isRoot) {
    // Keep Debian from creating and starting its own default cluster on port 5432.
    const confDir = '/etc/postgresql-common/createcluster.d';
    fs.mkdirSync(confDir, { recursive: true });
    fs.writeFileSync(path.join(confDir, 'fieldbound.conf'), 'create_main_cluster = false\n');
  }
  aptInstall('postgresql', 'The PostgreSQL server');
  bin = findServerBinaries();
  if (!bin) throw new BootstrapError('the Debian package `postgresql` was installed but no server binaries were found under /usr/lib/postgresql');
  return bin;
}

function postgresUserCanEnter(dir) {
  return capture('runuser', ['-u', 'postgres', '--', 'test', '-x', dir]).status === 0;
}

/** Where the cluster lives: `.data/postgres`, or under /var/tmp when the `postgres` user cannot reach `.data`. */
function clusterBase() {
  fs.mkdirSync(dataDir, { recursive: true, mode: 0o755 });
  if (!isRoot) return path.join(dataDir, 'postgres');
  fs.chmodSync(dataDir, 0o755);
  if (postgresUserCanEnter(dataDir)) return path.join(dataDir, 'postgres');
  const hash = crypto.createHash('sha256').update(repoRoot).digest('hex').slice(0, 12);
  const base = path.join('/var/tmp', `fieldbound-${hash}`, 'postgres');
  fs.writeFileSync(path.join(dataDir, 'postgres-location.txt'), `${base}\n`);
  return base;
}

function readOrCreatePassword() {
  const file = path.join(dataDir, 'db-password');
  if (fs.existsSync(file)) return fs.readFileSync(file, 'utf8').trim();
  const password = crypto.randomBytes(24).toString('hex');
  fs.writeFileSync(file, `${password}\n`, { mode: 0o600 });
  return password;
}

function isPortFree(port) {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once('error', () => resolve(false));
    server.listen(port, '127.0.0.1', () => server.close(() => resolve(true)));
  });
}

export async function assertPortFree(port, variable, what) {
  if (!(await isPortFree(port))) {
    throw new BootstrapError(`port ${port} on 127.0.0.1 (${what}) is already in use by another program; set ${variable} to choose another port.`);
  }
}

function processIsPostmasterOf(pid, pgdata) {
  try {
    const cmdline = fs.readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0');
    return cmdline.some((part) => part.includes('postgres')) && cmdline.includes(pgdata);
  } catch {
    return false;
  }
}

export class LocalCluster {
  constructor() {
    this.bin = ensurePostgresInstalled();
    this.base = clusterBase();
    this.pgdata = path.join(this.base, 'data');
    this.socketDir = path.join(this.base, 'run');
    this.logFile = path.join(this.base, 'server.log');
    this.password = readOrCreatePassword();
    this.requestedPort = Number(process.env.FIELDBOUND_DB_PORT ?? DEFAULT_DB_PORT);
    if (!Number.isInteger(this.requestedPort) || this.requestedPort < 1 || this.requestedPort > 65535) {
      throw new BootstrapError(`FIELDBOUND_DB_PORT must be a port number, got "${process.env.FIELDBOUND_DB_PORT}"`);
    }
    this.port = this.requestedPort;
  }

  /** Runs a server binary, as the postgres user when we are root. */
  serverCommand(binary, args) {
    const full = path.join(this.bin, binary);
    const opts = { cwd: this.base, stdio: 'inherit' };
    if (isRoot) runOrThrow('runuser', ['-u', 'postgres', '--', full, ...args], opts);
    else runOrThrow(full, args, opts);
  }

  prepareBase() {
    fs.mkdirSync(this.base, { recursive: true, mode: 0o700 });
    fs.mkdirSync(this.socketDir, { recursive: true, mode: 0o700 });
    if (isRoot) runOrThrow('chown', ['-R', 'postgres:postgres', this.base]);
    if (isRoot && !postgresUserCanEnter(this.base)) {
      throw new BootstrapError(`the postgres system user cannot enter ${this.base}; make its parent directories world-executable`);
    }
  }

  ensureInitialised() {
    this.prepareBase();
    if (fs.existsSync(path.join(this.pgdata, 'PG_VERSION'))) return false;
    // A crashed initdb leaves a partial directory behind; build in a scratch directory and rename.
    for (const entry of fs.readdirSync(this.base)) {
      if (entry.startsWith('data.partial')) fs.rmSync(path.join(this.base, entry), { recursive: true, force: true });
    }
    if (fs.existsSync(this.pgdata)) fs.rmSync(this.pgdata, { recursive: true, force: true });
    const scratch = path.join(this.base, `data.partial-${process.pid}`);
    const pwfile = path.join(this.base, `pwfile-${process.pid}`);
    fs.writeFileSync(pwfile, `${this.password}\n`, { mode: 0o600 });
    if (isRoot) runOrThrow('chown', ['postgres:postgres', pwfile]);
    step(`initialising a PostgreSQL cluster in ${this.pgdata}`);
    try {
      this.serverCommand('initdb', [
        '-D', scratch, '-U', DB_USER, `--pwfile=${pwfile}`,
        '--auth-host=scram-sha-256', '--auth-local=peer', '--encoding=UTF8', '--locale=C.UTF-8', '--no-instructions',
      ]);
    } finally {
      fs.rmSync(pwfile, { force: true });
    }
    fs.renameSync(scratch, this.pgdata);
    return true;
  }

  /** The pid of this cluster's running postmaster, or null; clears files a crashed server left behind. */
  runningPid() {
    const pidFile = path.join(this.pgdata, 'postmaster.pid');
    if (!fs.existsSync(pidFile)) return null;
    const lines = fs.readFileSync(pidFile, 'utf8').split('\n');
    const pid = Number(lines[0]);
    if (pid > 0 && processIsPostmasterOf(pid, this.pgdata)) {
      this.port = Number(lines[3]) || this.port;
      return pid;
    }
    step('removing a stale postmaster.pid left by a server that is no longer running');
    fs.rmSync(pidFile, { force: true });
    for (const entry of fs.existsSync(this.socketDir) ? fs.readdirSync(this.socketDir) : []) {
      if (entry.startsWith('.s.PGSQL.')) fs.rmSync(path.join(this.socketDir, entry), { force: true });
    }
    return null;
  }

  /** Starts the cluster unless it already runs. Returns true when this call started it. */
  async start() {
    this.ensureInitialised();
    if (this.runningPid()) {
      if (this.port !== this.requestedPort) step(`PostgreSQL already running on port ${this.port} (not ${this.requestedPort}); using it`);
      return false;
    }
    await assertPortFree(this.port, 'FIELDBOUND_DB_PORT', 'the database port');
    step(`starting PostgreSQL on 127.0.0.1:${this.port}`);
    const options = `-c listen_addresses=127.0.0.1 -p ${this.port} -k ${this.socketDir} -c unix_socket_permissions=0700`;
    this.serverCommand('pg_ctl', ['-w', '-t', '60', '-D', this.pgdata, '-l', this.logFile, '-o', options, 'start']);
    return true;
  }

  stop() {
    if (!this.runningPid()) return;
    step('stopping PostgreSQL');
    this.serverCommand('pg_ctl', ['-w', '-t', '60', '-D', this.pgdata, '-m', 'fast', 'stop']);
  }

  sql(statement, database = 'postgres') {
    const result = capture(path.join(this.bin, 'psql'), [
      '-h', '127.0.0.1', '-p', String(this.port), '-U', DB_USER, '-d', database,
      '-v', 'ON_ERROR_STOP=1', '-tAc', statement,
    ], { env: { ...process.env, PGPASSWORD: this.password } });
    if (result.status !== 0) throw new BootstrapError(`psql failed on "${statement}": ${result.stderr.trim()}`);
    return result.stdout.trim();
  }

  /** Creates the database if missing; with fresh=true drops it first (tests start from nothing). */
  ensureDatabase(name, { fresh = false } = {}) {
    if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new BootstrapError(`invalid database name "${name}"`);
    if (fresh) this.sql(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    const exists = this.sql(`SELECT 1 FROM pg_database WHERE datname = '${name}'`) === '1';
    if (!exists) this.sql(`CREATE DATABASE ${name}`);
  }

  /** Environment variables that point the backend at a database of this cluster. */
  envFor(database) {
    return {
      FIELDBOUND_DB_HOST: '127.0.0.1',
      FIELDBOUND_DB_PORT: String(this.port),
      FIELDBOUND_DB_USER: DB_USER,
      FIELDBOUND_DB_PASSWORD: this.password,
      FIELDBOUND_DB_NAME: database,
    };
  }
}
