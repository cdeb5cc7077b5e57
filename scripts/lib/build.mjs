// Builds shared, backend and frontend when any of their sources is newer than the last build.
import fs from 'node:fs';
import path from 'node:path';
import { dataDir, repoRoot } from './paths.mjs';
import { step } from './log.mjs';
import { runOrThrow } from './run.mjs';

const inputs = [
  'package-lock.json', 'tsconfig.base.json',
  'shared/src', 'shared/package.json', 'shared/tsconfig.build.json', 'shared/bin',
  'backend/src', 'backend/package.json', 'backend/tsconfig.json', 'backend/tsconfig.build.json',
  'frontend/src', 'frontend/public', 'frontend/index.html', 'frontend/vite.config.ts', 'frontend/tsconfig.json', 'frontend/package.json',
];
const outputs = ['shared/dist/index.js', 'backend/dist/main.js', 'frontend/dist/index.html'];
const stampFile = path.join(dataDir, 'build-stamp.json');

function newestMtime(target) {
  let stat;
  try {
    stat = fs.statSync(target);
  } catch {
    return 0;
  }
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of fs.readdirSync(target)) newest = Math.max(newest, newestMtime(path.join(target, entry)));
  return newest;
}

export function sourcesFingerprint() {
  return Math.max(...inputs.map((p) => newestMtime(path.join(repoRoot, p))));
}

export function buildIfStale({ force = false } = {}) {
  const newest = sourcesFingerprint();
  let stamp = null;
  try {
    stamp = JSON.parse(fs.readFileSync(stampFile, 'utf8'));
  } catch {
    // no previous build
  }
  const outputsExist = outputs.every((p) => fs.existsSync(path.join(repoRoot, p)));
  if (!force && outputsExist && stamp && stamp.newestSource >= newest) {
    step('build is up to date');
    return false;
  }
  step('building shared, backend and frontend');
  const started = Date.now();
  runOrThrow('npm', ['run', 'build'], { cwd: repoRoot });
  fs.mkdirSync(dataDir, { recursive: true });
  fs.writeFileSync(stampFile, JSON.stringify({ newestSource: newest, builtAt: new Date().toISOString() }));
  step(`built in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  return true;
}
