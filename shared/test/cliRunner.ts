/** The command line for tests: as a separate process through tsx (the TypeScript source, no build needed), or in-process. */
import { type ChildProcessWithoutNullStreams, spawn, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { main } from '../src/cli/main.js';

const shared = fileURLToPath(new URL('..', import.meta.url));
const entry = fileURLToPath(new URL('../src/cli/run.ts', import.meta.url));

/** Runs `fieldbound <args>` as its own process; exit status and both streams. */
export function runCli(args: string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', entry, ...args], { cwd: shared, encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** Starts `fieldbound <args>` as its own process and returns it running (signals, streamed output). */
export function spawnCli(args: string[]): ChildProcessWithoutNullStreams {
  return spawn(process.execPath, ['--import', 'tsx', entry, ...args], { cwd: shared });
}

/** Runs the command line's main() in this process, collecting what it prints. */
export async function captureCli(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { out: (t) => (out += t + '\n'), err: (t) => (err += t + '\n') });
  return { code, out, err };
}
