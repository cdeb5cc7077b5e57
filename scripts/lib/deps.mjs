// Installs npm dependencies when node_modules is missing or older than the lock file,
// and Debian packages (PostgreSQL, Chromium) when their binaries are absent.
import fs from 'node:fs';
import path from 'node:path';
import { repoRoot } from './paths.mjs';
import { step, BootstrapError } from './log.mjs';
import { runOrThrow, capture, isRoot } from './run.mjs';

function mtime(file) {
  try {
    return fs.statSync(file).mtimeMs;
  } catch {
    return null;
  }
}

export function ensureNodeModules() {
  const lock = path.join(repoRoot, 'package-lock.json');
  // npm rewrites node_modules/.package-lock.json after every successful install.
  const installed = mtime(path.join(repoRoot, 'node_modules', '.package-lock.json'));
  const locked = mtime(lock);
  if (installed !== null && locked !== null && installed >= locked) return;
  step(installed === null ? 'node_modules missing: running npm ci' : 'package-lock.json changed: running npm ci');
  runOrThrow('npm', ['ci', '--no-audit', '--no-fund'], { cwd: repoRoot });
}

let aptUpdated = false;

/** apt-get install as root; otherwise a message that names the Debian package. */
export function aptInstall(debianPackage, why) {
  const hasApt = capture('sh', ['-c', 'command -v apt-get']).status === 0;
  if (!isRoot || !hasApt) {
    throw new BootstrapError(
      `${why} is not installed and cannot be installed automatically here ` +
        `(${!hasApt ? 'apt-get is unavailable' : 'not running as root'}). ` +
        `Install the Debian package \`${debianPackage}\` (sudo apt-get install -y ${debianPackage}) and run again.`,
    );
  }
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (!aptUpdated) {
    step('apt-get update');
    runOrThrow('apt-get', ['update', '-qq'], { env });
    aptUpdated = true;
  }
  step(`apt-get install ${debianPackage} (${why})`);
  runOrThrow('apt-get', ['install', '-y', '-qq', '--no-install-recommends', debianPackage], { env });
}

export const chromiumPath = '/usr/bin/chromium';

export function ensureChromium() {
  if (fs.existsSync(chromiumPath)) return chromiumPath;
  aptInstall('chromium', 'Chromium (for the end-to-end tests)');
  if (!fs.existsSync(chromiumPath)) throw new BootstrapError(`chromium was installed but ${chromiumPath} is missing`);
  return chromiumPath;
}
