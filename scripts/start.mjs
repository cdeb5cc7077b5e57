// `npm start`: install what is missing, start the local PostgreSQL, migrate, seed the demo data once,
// build when sources changed, and serve API and frontend at http://127.0.0.1:3000. Ctrl-C stops it all.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { repoRoot } from './lib/paths.mjs';
import { step, failAndExit } from './lib/log.mjs';
import { runOrThrow } from './lib/run.mjs';
import { ensureNodeModules } from './lib/deps.mjs';
import { LocalCluster, assertPortFree } from './lib/postgres.mjs';
import { buildIfStale } from './lib/build.mjs';

const DATABASE = 'fieldbound';

async function main() {
  const started = Date.now();
  ensureNodeModules();
  const cluster = new LocalCluster();
  const startedDatabase = await cluster.start();
  cluster.ensureDatabase(DATABASE);
  buildIfStale();

  const env = { ...process.env, ...cluster.envFor(DATABASE) };
  const dbCli = path.join(repoRoot, 'backend', 'dist', 'database', 'db-cli.js');
  runOrThrow(process.execPath, [dbCli, 'migrate'], { env });
  runOrThrow(process.execPath, [dbCli, 'seed'], { env });

  const port = Number(process.env.FIELDBOUND_PORT ?? 3000);
  await assertPortFree(port, 'FIELDBOUND_PORT', 'the web server port');
  step(`ready in ${((Date.now() - started) / 1000).toFixed(1)} s; starting the server (Ctrl-C stops the server and the database)`);
  const server = spawn(process.execPath, [path.join(repoRoot, 'backend', 'dist', 'main.js')], {
    env: { ...env, FIELDBOUND_PORT: String(port) },
    stdio: 'inherit',
  });

  let stopping = false;
  const shutdown = (signal) => {
    if (stopping) return;
    stopping = true;
    step(`${signal}: stopping`);
    if (server.exitCode === null) server.kill('SIGTERM');
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));

  const code = await new Promise((resolve) => server.on('exit', (c) => resolve(c ?? 0)));
  if (startedDatabase) cluster.stop();
  process.exit(stopping ? 0 : code);
}

main().catch(failAndExit);
