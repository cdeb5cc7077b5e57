// Child-process helpers for the bootstrap scripts (no dependencies: they run before npm ci).
import { spawn, spawnSync } from 'node:child_process';
import { BootstrapError } from './log.mjs';

/** Runs a command to completion with inherited output; throws a BootstrapError naming it on failure. */
export function runOrThrow(command, args, options = {}) {
  const result = spawnSync(command, args, { stdio: 'inherit', ...options });
  if (result.error) throw new BootstrapError(`could not run ${command}: ${result.error.message}`);
  if (result.status !== 0) {
    throw new BootstrapError(`${command} ${args.join(' ')} exited with ${result.status ?? result.signal}`);
  }
}

/** Runs a command and returns { status, stdout, stderr } without throwing. */
export function capture(command, args, options = {}) {
  const result = spawnSync(command, args, { encoding: 'utf8', ...options });
  return {
    status: result.error ? -1 : result.status,
    stdout: result.stdout ?? '',
    stderr: (result.stderr ?? '') + (result.error ? String(result.error.message) : ''),
  };
}

/** Runs a command asynchronously with inherited output and resolves to its exit code. */
export function runAsync(command, args, options = {}) {
  return new Promise((resolve) => {
    const child = spawn(command, args, { stdio: 'inherit', ...options });
    child.on('error', () => resolve(127));
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 128 : 1)));
  });
}

export const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
