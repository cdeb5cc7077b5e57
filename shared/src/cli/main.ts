/// <reference types="node" />
import { ENGINE_VERSION } from '../version.js';
import { checkCommand, parseCheckArgs } from './checkCommand.js';
import { CliUsageError } from './cliUsageError.js';
import { levelsCommand } from './levelsCommand.js';
import { CliInputError, mapCommand, parseMapArgs } from './mapCommand.js';
import { parseLevelsArgs } from './parseLevelsArgs.js';

export const USAGE = `fieldbound ${ENGINE_VERSION} — field-induced negative ions of polarizable atoms

Usage:
  fieldbound levels --alpha <a0^3> --field <value> --field-unit <tesla|au> --cutoff <a0> --m-max <n>
                    [--mass-number <A> (--kinetic-energy <value> --energy-unit <hartree|K|eV>
                     | --ion-level <N> | --temperature <K>) [--tau <s>]] [--json]
  fieldbound map SETUP.json --out FILE.csv|FILE.json [--threads <n>] [--date <text>] [--quiet]
  fieldbound check [--json]
  fieldbound --help | --version

levels   every bound state (m = 0…m-max, all levels ν) of an electron at a fixed atom of
         polarizability alpha (a0^3) in the field B, with the polarization potential
         -alpha/(2(r^2 + r_c^2)^2) cut off at r_c = --cutoff (bohr).
         --json prints one JSON object {"engine", "input", "states": [{m, nu, bindingHartree,
         bindingOverB, relError, flags}]} sorted by m then nu; otherwise a table with
         binding energies in hartree, ueV and kelvin.
         With an ion motion (mass number A = 1…300 and one of a transverse kinetic energy, an ion
         Landau level N or a temperature; observation time tau, default 1 s) each state also has
         "widthHartree", "lifetimeSeconds", "shiftHartree", "class" (bound | resonance | unbound)
         and "motionFlags"; with a temperature also "fractions": {bound, resonance, unbound}
         (width, lifetime, shift and class then at E_perp = kT). JSON has no infinity: a null
         width means the state is destroyed, a null lifetime that the width is 0.
map      the whole classified map of a setup file (the JSON the app exports or a map file) on
         worker threads (default: one per core), progress on stderr; writes the same CSV or JSON
         as the app's data export. Ctrl-C stops it without writing anything.
check    runs the engine's validation cases (exactly solvable potentials, special functions
         against mpmath, weak-coupling and golden-rule limits, …) and prints each with its
         published source, value, reference and tolerance.

Exit codes: 0 success, 1 a check failed or an internal error, 2 bad arguments or input, 130 cancelled.`;

/** Where the CLI writes (injectable for tests). */
export interface CliIo {
  out: (text: string) => void;
  err: (text: string) => void;
}

const nodeIo: CliIo = {
  out: (t) => process.stdout.write(t + '\n'),
  err: (t) => process.stderr.write(t + '\n'),
};

const COMMANDS = ['levels', 'map', 'check'];

/**
 * Runs the command line with `argv` (arguments after the program name) and resolves to the exit
 * code: 0 on success, 2 for bad arguments or input (stderr names the argument; one line for an
 * option), 1 when a check fails or on an internal error, 130 when a map is cancelled with Ctrl-C.
 *
 * @example
 * await main(['levels', '--alpha', '10', '--field', '0.1', '--field-unit', 'au', '--cutoff', '2', '--m-max', '1', '--json']) // 0
 */
export async function main(argv: string[], io: CliIo = nodeIo): Promise<number> {
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
    if (!COMMANDS.includes(command)) throw new CliUsageError('command', `unknown command '${command}' (expected one of ${COMMANDS.join(', ')}; see --help)`);
    if (command === 'levels') {
      const args = parseLevelsArgs(rest);
      if (args === null) {
        io.out(USAGE);
        return 0;
      }
      io.out(levelsCommand(args));
      return 0;
    }
    if (command === 'map') {
      const args = parseMapArgs(rest);
      if (args === null) {
        io.out(USAGE);
        return 0;
      }
      return await mapCommand(args, io);
    }
    const args = parseCheckArgs(rest);
    if (args === null) {
      io.out(USAGE);
      return 0;
    }
    return checkCommand(args, io);
  } catch (e) {
    if (e instanceof CliUsageError || e instanceof CliInputError) {
      io.err(`fieldbound: ${e.message}`);
      return 2;
    }
    io.err(`fieldbound: internal error: ${(e as Error).stack ?? String(e)}`);
    return 1;
  }
}
