// What the browser benchmarks share: the benchmark's map setup, the built server on its own database, and a user
// with a team that owns the map. Used by explorer.bench.ts, first-visit-profile.ts and first-visit-compare.ts.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { APIRequestContext } from '@playwright/test';

const here = path.dirname(fileURLToPath(import.meta.url));
export const repoRoot = path.resolve(here, '..', '..');

/** The benchmark's setup: 256 × 256, Landau orbitals m = 0…7, thermal ions at 4 K (²⁴Mg⁻), survivors shown. */
export async function benchSetup() {
  const { defaultSetup } = await import('../../shared/dist/index.js');
  const base = defaultSetup();
  return {
    ...base,
    grid: { nAlpha: 256, nField: 256 },
    orbitals: { mMax: 7 },
    motion: { kind: 'temperature' as const, kelvin: 4 },
    ion: { massNumber: 24 },
    display: { ...base.display, shown: { kind: 'survivors' as const } },
  };
}

async function waitFor(url: string, timeoutMs: number) {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (await fetch(url).then((r) => r.ok, () => false)) return;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

/**
 * The local cluster (started if it was not running), database `db` created afresh and migrated, and one built server
 * per entry of `servers` (its port, and optionally the client build it serves). `stop` ends the servers and the
 * cluster if this call started it.
 */
export async function startBenchServers(db: string, servers: { port: number; staticDir?: string }[]): Promise<{ stop: () => void }> {
  const { LocalCluster } = await import('../../scripts/lib/postgres.mjs');
  const { runOrThrow } = await import('../../scripts/lib/run.mjs');
  const cluster = new LocalCluster();
  const started = await cluster.start();
  cluster.ensureDatabase(db, { fresh: true });
  const dbEnv = cluster.envFor(db);
  runOrThrow(process.execPath, [path.join(repoRoot, 'backend', 'dist', 'database', 'db-cli.js'), 'migrate'], { env: { ...process.env, ...dbEnv }, stdio: 'ignore' });
  const children: ChildProcess[] = servers.map(({ port, staticDir }) =>
    spawn(process.execPath, [path.join(repoRoot, 'backend', 'dist', 'main.js')], {
      env: { ...process.env, ...dbEnv, FIELDBOUND_PORT: String(port), ...(staticDir ? { FIELDBOUND_STATIC_DIR: staticDir } : {}) },
      stdio: ['ignore', 'ignore', 'inherit'],
    }),
  );
  const stop = () => {
    for (const child of children) child.kill('SIGTERM');
    if (started) cluster.stop();
  };
  try {
    for (const { port } of servers) await waitFor(`http://127.0.0.1:${port}/api/health`, 60_000);
  } catch (error) {
    stop();
    throw error;
  }
  return { stop };
}

/**
 * Registers a user (the request context keeps the refresh cookie), creates a team and stores `setup` as a map in it;
 * returns the map's id.
 */
export async function createBenchMap(request: APIRequestContext, base: string, setup: unknown, title: string): Promise<string> {
  const id = Math.random().toString(36).slice(2, 10);
  const reg = await request.post(`${base}/api/auth/register`, { data: { email: `bench-${id}@example.test`, password: 'bench of the explorer', displayName: 'Bench' } });
  if (reg.status() !== 201) throw new Error(`register: ${reg.status()} ${await reg.text()}`);
  const { accessToken } = (await reg.json()) as { accessToken: string };
  const headers = { Authorization: `Bearer ${accessToken}` };
  const team = await request.post(`${base}/api/teams`, { data: { name: `Bench ${id}` }, headers });
  const { id: teamId } = (await team.json()) as { id: string };
  const map = await request.post(`${base}/api/teams/${teamId}/maps`, { data: { title, setup }, headers });
  if (map.status() !== 201) throw new Error(`create map: ${map.status()} ${await map.text()}`);
  return ((await map.json()) as { id: string }).id;
}
