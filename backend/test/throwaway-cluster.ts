import { execFile } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { promisify } from 'node:util';
import type { AppConfig } from '../src/config/configuration';

const run = promisify(execFile);
const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

/** The newest PostgreSQL server binaries from Debian's packages (as scripts/lib/postgres.mjs finds them). */
function serverBinaries(): string {
  const base = '/usr/lib/postgresql';
  const versions = fs.existsSync(base) ? fs.readdirSync(base).filter((v) => fs.existsSync(path.join(base, v, 'bin', 'pg_ctl'))).sort((a, b) => Number(b) - Number(a)) : [];
  if (!versions.length) throw new Error('PostgreSQL server binaries not found under /usr/lib/postgresql (npm start installs them)');
  return path.join(base, versions[0], 'bin');
}

/** A free TCP port on 127.0.0.1. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

/**
 * A PostgreSQL cluster of its own for tests that stop and start the database: a fresh `initdb` in a
 * temporary directory under /var/tmp (which the `postgres` system user can enter), on a free
 * loopback port, with fsync off. As root the server commands run as `postgres`, like the project's
 * cluster. `destroy()` stops it and removes the directory; call it in `afterAll` so it runs on failure too.
 */
export class ThrowawayCluster {
  readonly bin = serverBinaries();
  readonly base: string;
  readonly pgdata: string;
  readonly password = crypto.randomBytes(18).toString('hex');
  readonly user = 'fieldbound';
  port = 0;

  private constructor(base: string) {
    this.base = base;
    this.pgdata = path.join(base, 'data');
  }

  static async create(): Promise<ThrowawayCluster> {
    const cluster = new ThrowawayCluster(fs.mkdtempSync('/var/tmp/fieldbound-throwaway-'));
    try {
      await cluster.init();
      cluster.port = await freePort();
      await cluster.start();
    } catch (error) {
      await cluster.destroy();
      throw error;
    }
    return cluster;
  }

  private async server(binary: string, args: string[]): Promise<void> {
    const full = path.join(this.bin, binary);
    const [command, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', full, ...args]] : [full, args];
    await run(command, argv, { cwd: this.base, timeout: 60_000 });
  }

  private async init(): Promise<void> {
    fs.mkdirSync(path.join(this.base, 'run'), { mode: 0o700 });
    const pwfile = path.join(this.base, 'pwfile');
    fs.writeFileSync(pwfile, `${this.password}\n`, { mode: 0o600 });
    if (isRoot) await run('chown', ['-R', 'postgres:postgres', this.base]);
    try {
      await this.server('initdb', ['-D', this.pgdata, '-U', this.user, `--pwfile=${pwfile}`, '--auth-host=scram-sha-256', '--auth-local=peer', '--encoding=UTF8', '--locale=C.UTF-8', '--no-sync', '--no-instructions']);
    } finally {
      fs.rmSync(pwfile, { force: true });
    }
  }

  private serverOptions(): string[] {
    // The log file matters: without it the postmaster would keep pg_ctl's output pipe open and the call would never return.
    const options = `-c listen_addresses=127.0.0.1 -p ${this.port} -k ${path.join(this.base, 'run')} -c unix_socket_permissions=0700 -c fsync=off -c full_page_writes=off`;
    return ['-l', path.join(this.base, 'server.log'), '-o', options];
  }

  async start(): Promise<void> {
    await this.server('pg_ctl', ['-w', '-t', '30', '-D', this.pgdata, ...this.serverOptions(), 'start']);
  }

  /** Fast shutdown: open connections are terminated with 57P01 (admin_shutdown), as in a real restart. */
  async stop(): Promise<void> {
    await this.server('pg_ctl', ['-w', '-t', '30', '-D', this.pgdata, '-m', 'fast', 'stop']);
  }

  async restart(): Promise<void> {
    await this.server('pg_ctl', ['-w', '-t', '30', '-D', this.pgdata, '-m', 'fast', ...this.serverOptions(), 'restart']);
  }

  async createDatabase(name: string): Promise<void> {
    if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`invalid database name ${name}`);
    await run(path.join(this.bin, 'psql'), ['-h', '127.0.0.1', '-p', String(this.port), '-U', this.user, '-d', 'postgres', '-v', 'ON_ERROR_STOP=1', '-qc', `CREATE DATABASE ${name}`], {
      env: { ...process.env, PGPASSWORD: this.password },
      timeout: 30_000,
    });
  }

  databaseConfig(name: string): AppConfig['database'] {
    return { host: '127.0.0.1', port: this.port, user: this.user, password: this.password, name };
  }

  /** Stops the server if it runs and removes the directory. Safe to call more than once. */
  async destroy(): Promise<void> {
    if (!fs.existsSync(this.base)) return;
    try {
      if (fs.existsSync(path.join(this.pgdata, 'postmaster.pid'))) await this.server('pg_ctl', ['-w', '-t', '30', '-D', this.pgdata, '-m', 'immediate', 'stop']);
    } catch {
      // Not running after all; the directory still goes.
    }
    fs.rmSync(this.base, { recursive: true, force: true });
  }
}
