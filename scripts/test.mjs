// `npm test`: the same bootstrap as `npm start` but on separate test databases (never the demo data),
// then every Vitest suite, the backend integration tests on the real PostgreSQL, and Playwright in
// Debian's Chromium. Every stage runs; the exit code is non-zero if any failed.
import fs from 'node:fs';
import path from 'node:path';
import { repoRoot } from './lib/paths.mjs';
import { step, failAndExit } from './lib/log.mjs';
import { runAsync, runOrThrow } from './lib/run.mjs';
import { ensureNodeModules, ensureChromium } from './lib/deps.mjs';
import { LocalCluster } from './lib/postgres.mjs';
import { buildIfStale } from './lib/build.mjs';

const UNIT_DB = 'fieldbound_test';
const E2E_DB = 'fieldbound_e2e_test';
const reportsDir = path.join(repoRoot, '.data', 'test-reports');

function readJson(file) {
  try {
    return JSON.parse(fs.readFileSync(file, 'utf8'));
  } catch {
    return null;
  }
}

async function vitestStage(name, workspace, env) {
  const outputFile = path.join(reportsDir, `${workspace}.json`);
  fs.rmSync(outputFile, { force: true });
  step(`${name}: vitest`);
  const code = await runAsync('npx', ['vitest', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${outputFile}`], {
    cwd: path.join(repoRoot, workspace),
    env,
  });
  const report = readJson(outputFile);
  return {
    name,
    code,
    passed: report?.numPassedTests ?? 0,
    // A suite that fails outside any test (a file that cannot load) still counts as a failure.
    failed: Math.max(report?.numFailedTests ?? 0, code === 0 ? 0 : 1),
    skipped: (report?.numPendingTests ?? 0) + (report?.numTodoTests ?? 0),
  };
}

async function playwrightStage(env) {
  const outputFile = path.join(repoRoot, 'e2e', 'test-results', 'report.json');
  fs.rmSync(outputFile, { force: true });
  step('end-to-end: playwright in Chromium');
  const code = await runAsync('npx', ['playwright', 'test'], { cwd: path.join(repoRoot, 'e2e'), env });
  const stats = readJson(outputFile)?.stats;
  return {
    name: 'end-to-end (Chromium)',
    code,
    passed: (stats?.expected ?? 0) + (stats?.flaky ?? 0),
    failed: Math.max(stats?.unexpected ?? 0, code === 0 ? 0 : 1),
    skipped: stats?.skipped ?? 0,
  };
}

async function main() {
  const started = Date.now();
  ensureNodeModules();
  const chromium = ensureChromium();
  const cluster = new LocalCluster();
  const startedDatabase = await cluster.start();
  let interrupted = false;
  process.on('SIGINT', () => {
    interrupted = true;
  });
  const results = [];
  try {
    cluster.ensureDatabase(UNIT_DB, { fresh: true });
    cluster.ensureDatabase(E2E_DB, { fresh: true });
    fs.mkdirSync(reportsDir, { recursive: true });
    const base = { ...process.env, FORCE_COLOR: process.env.CI ? '0' : '1' };

    results.push(await vitestStage('shared (engine)', 'shared', base));
    if (!interrupted) results.push(await vitestStage('backend (integration on PostgreSQL)', 'backend', { ...base, ...cluster.envFor(UNIT_DB) }));
    if (!interrupted) results.push(await vitestStage('frontend (components)', 'frontend', base));

    if (!interrupted) {
      buildIfStale();
      const e2eEnv = { ...base, ...cluster.envFor(E2E_DB), CHROMIUM_PATH: chromium };
      runOrThrow(process.execPath, [path.join(repoRoot, 'backend', 'dist', 'database', 'db-cli.js'), 'migrate'], { env: e2eEnv });
      results.push(await playwrightStage(e2eEnv));
    }
  } finally {
    if (startedDatabase) cluster.stop();
  }

  const width = Math.max(...results.map((r) => r.name.length));
  console.log('\nFieldbound test summary');
  for (const r of results) {
    const verdict = r.code === 0 && r.failed === 0 ? 'ok  ' : 'FAIL';
    console.log(`  ${verdict} ${r.name.padEnd(width)}  ${r.passed} passed, ${r.failed} failed, ${r.skipped} skipped`);
  }
  const passed = results.reduce((n, r) => n + r.passed, 0);
  const failed = results.reduce((n, r) => n + r.failed, 0);
  const skipped = results.reduce((n, r) => n + r.skipped, 0);
  const anyFailed = interrupted || results.some((r) => r.code !== 0 || r.failed > 0);
  console.log(`  time ${((Date.now() - started) / 1000).toFixed(0)} s`);
  console.log(`total: ${passed} passed, ${failed} failed, ${skipped} skipped`);
  process.exit(anyFailed ? 1 : 0);
}

main().catch(failAndExit);
