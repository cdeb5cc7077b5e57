// `npm run docs:screenshots`: retakes the user guide's screenshots (docs/guide/img/*.png, 1280 × 800) by running the
// user journeys in Chromium with FIELDBOUND_SCREENSHOTS=1, on a fresh database of their own (never the demo data of
// `npm start`) and a port of their own. Same bootstrap as `npm test`.
import path from 'node:path';
import { repoRoot } from './lib/paths.mjs';
import { step, failAndExit } from './lib/log.mjs';
import { runAsync, runOrThrow } from './lib/run.mjs';
import { ensureNodeModules, ensureChromium } from './lib/deps.mjs';
import { LocalCluster } from './lib/postgres.mjs';
import { buildIfStale } from './lib/build.mjs';

const DB = 'fieldbound_docs_test';
const SPECS = ['tests/theorist.spec.ts', 'tests/lecturer.spec.ts', 'tests/collaborator.spec.ts', 'tests/guide.spec.ts'];

async function main() {
  ensureNodeModules();
  const chromium = ensureChromium();
  const cluster = new LocalCluster();
  const startedDatabase = await cluster.start();
  let code = 1;
  try {
    cluster.ensureDatabase(DB, { fresh: true });
    buildIfStale();
    const env = {
      ...process.env,
      ...cluster.envFor(DB),
      CHROMIUM_PATH: chromium,
      FIELDBOUND_SCREENSHOTS: '1',
      FIELDBOUND_E2E_PORT: process.env.FIELDBOUND_E2E_PORT ?? '3190',
    };
    runOrThrow(process.execPath, [path.join(repoRoot, 'backend', 'dist', 'database', 'db-cli.js'), 'migrate'], { env });
    step('guide screenshots: playwright in Chromium (FIELDBOUND_SCREENSHOTS=1)');
    code = await runAsync('npx', ['playwright', 'test', ...SPECS], { cwd: path.join(repoRoot, 'e2e'), env });
  } finally {
    if (startedDatabase) cluster.stop();
  }
  if (code === 0) step(`screenshots written to ${path.join('docs', 'guide', 'img')}`);
  process.exit(code);
}

main().catch(failAndExit);
