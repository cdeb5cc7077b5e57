/// <reference types="node" />
import { ENGINE_VERSION } from '../version.js';
import { levelsCommand } from './levelsCommand.js';
import { CliUsageError, parseLevelsArgs } from './parseLevelsArgs.js';

export const USAGE = `fieldbound ${ENGINE_VERSION} — field-induced negative ions of polarizable atoms

Usage:
  fieldbound levels --alpha <a0^3> --field <value> --field-unit <tesla|au> --cutoff <a0> --m-max <n> [--json]
  fieldbound --help

levels   every bound state (m = 0…m-max, all levels ν) of an electron at a fixed atom of
         polarizability alpha (a0^3) in the field B, with the polarization potential
         -alpha/(2(r^2 + r_c^2)^2) cut off at r_c = --cutoff (bohr).
         --json prints one JSON object {"engine", "input", "states": [{m, nu, bindingHartree,
         bindingOverB, relError, flags}]} sorted by m then nu; otherwise a table with
         binding energies in hartree, ueV and kelvin.

Exit codes: 0 success, 2 bad arguments, 1 internal error.`;

/** Where the CLI writes (injectable for tests). */
export interface CliIo {
  out: (text: string) => void;
  err: (text: string) => void;
}

const nodeIo: CliIo = {
  out: (t) => process.stdout.write(t + '\n'),
  err: (t) => process.stderr.write(t + '\n'),
};

/**
 * Runs the command line with `argv` (arguments after the program name) and returns the exit code:
 * 0 on success, 2 for bad arguments (one line on stderr naming the argument), 1 for anything else.
 *
 * @example
 * main(['levels', '--alpha', '10', '--field', '0.1', '--field-unit', 'au', '--cutoff', '2', '--m-max', '1', '--json']) // 0
 */
export function main(argv: string[], io: CliIo = nodeIo): number {
  try {
    const [command, ...rest] = argv;
    if (command === undefined || command === '--help' || command === '-h' || command === 'help') {
      io.out(USAGE);
      return 0;
    }
    if (command === '--version') {
      io.out(ENGINE_VERSION);
      return 0;
    }
    if (command !== 'levels') throw new CliUsageError('command', `unknown command '${command}' (expected 'levels'; see --help)`);
    const args = parseLevelsArgs(rest);
    if (args === null) {
      io.out(USAGE);
      return 0;
    }
    io.out(levelsCommand(args));
    return 0;
  } catch (e) {
    if (e instanceof CliUsageError) {
      io.err(`fieldbound: ${e.message}`);
      return 2;
    }
    io.err(`fieldbound: internal error: ${(e as Error).stack ?? String(e)}`);
    return 1;
  }
}
