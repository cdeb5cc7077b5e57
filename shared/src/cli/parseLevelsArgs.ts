/// <reference types="node" />
import { parseArgs } from 'node:util';

import { CliUsageError } from './cliUsageError.js';
import { ionMotionFromArgs, type CliMotion } from './ionMotionArgs.js';

export { CliUsageError };

/** Parsed arguments of `fieldbound levels`. */
export interface LevelsArgs {
  alpha: number;
  field: number;
  fieldUnit: 'tesla' | 'au';
  cutoff: number;
  mMax: number;
  json: boolean;
  /** Ion motion (null: the atom is held fixed). */
  motion: CliMotion | null;
}

const OPTIONS = {
  alpha: { type: 'string' },
  field: { type: 'string' },
  'field-unit': { type: 'string' },
  cutoff: { type: 'string' },
  'm-max': { type: 'string' },
  'mass-number': { type: 'string' },
  'kinetic-energy': { type: 'string' },
  'energy-unit': { type: 'string' },
  'ion-level': { type: 'string' },
  temperature: { type: 'string' },
  tau: { type: 'string' },
  json: { type: 'boolean', default: false },
  help: { type: 'boolean', short: 'h', default: false },
} as const;

function positiveNumber(name: string, raw: string | undefined): number {
  if (raw === undefined) throw new CliUsageError(`--${name}`, 'is required');
  const v = Number(raw);
  if (raw.trim() === '' || !Number.isFinite(v) || !(v > 0)) {
    throw new CliUsageError(`--${name}`, `must be a positive finite number, got '${raw}'`);
  }
  return v;
}

/**
 * Parses the options of `fieldbound levels` (node:util parseArgs, strict: unknown options and
 * stray positionals are errors). Returns null when --help was asked for. The ion-motion options
 * (--mass-number, --kinetic-energy/--energy-unit, --ion-level, --temperature, --tau) are checked
 * by the server's setup rules (see ionMotionFromArgs).
 *
 * @example
 * parseLevelsArgs(['--alpha', '10', '--field', '1', '--field-unit', 'tesla', '--cutoff', '2', '--m-max', '3'])
 * // { alpha: 10, field: 1, fieldUnit: 'tesla', cutoff: 2, mMax: 3, json: false, motion: null }
 */
export function parseLevelsArgs(argv: string[]): LevelsArgs | null {
  // `--alpha -1` would read "-1" as an option: glue a value that looks like a number to its option,
  // so the error names the bad value instead.
  const args: string[] = [];
  for (let k = 0; k < argv.length; k++) {
    const a = argv[k];
    const next = argv[k + 1];
    const name = a.startsWith('--') ? a.slice(2) : '';
    if (name in OPTIONS && OPTIONS[name as keyof typeof OPTIONS].type === 'string' && next !== undefined && /^-[\d.]/.test(next)) {
      args.push(`${a}=${next}`);
      k++;
    } else args.push(a);
  }
  let parsed;
  try {
    parsed = parseArgs({ args, options: OPTIONS, strict: true, allowPositionals: false });
  } catch (e) {
    const msg = (e as Error).message;
    const opt = /'(-{1,2}[\w-]+)/.exec(msg)?.[1] ?? /(--?[\w-]+)/.exec(msg)?.[1] ?? 'arguments';
    throw new CliUsageError(opt, msg.split('\n')[0].replace(/\s+/g, ' '));
  }
  const v = parsed.values;
  if (v.help) return null;
  const alpha = positiveNumber('alpha', v.alpha);
  const field = positiveNumber('field', v.field);
  const unit = v['field-unit'];
  if (unit === undefined) throw new CliUsageError('--field-unit', "is required ('tesla' or 'au')");
  const fieldUnit = unit === 'tesla' || unit === 'T' ? 'tesla' : unit === 'au' ? 'au' : null;
  if (fieldUnit === null) throw new CliUsageError('--field-unit', `must be 'tesla' or 'au', got '${unit}'`);
  const cutoff = positiveNumber('cutoff', v.cutoff);
  const rawM = v['m-max'];
  if (rawM === undefined) throw new CliUsageError('--m-max', 'is required');
  const mMax = Number(rawM);
  if (rawM.trim() === '' || !Number.isInteger(mMax) || mMax < 0 || mMax > 64) {
    throw new CliUsageError('--m-max', `must be a whole number in 0…64, got '${rawM}'`);
  }
  const motion = ionMotionFromArgs({
    massNumber: v['mass-number'],
    kineticEnergy: v['kinetic-energy'],
    energyUnit: v['energy-unit'],
    ionLevel: v['ion-level'],
    temperature: v.temperature,
    tau: v.tau,
  });
  return { alpha, field, fieldUnit, cutoff, mMax, json: v.json, motion };
}
