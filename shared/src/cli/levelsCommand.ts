/// <reference types="node" />
import { EngineInputError } from '../errors.js';
import { levels } from '../levels/levels.js';
import type { LevelState } from '../levels/types.js';
import { hartreeTo } from '../units/convert.js';
import type { Hartree } from '../units/brand.js';
import { ENGINE_VERSION } from '../version.js';
import { formatNumber } from './formatNumber.js';
import { CliUsageError, type LevelsArgs } from './parseLevelsArgs.js';
import { CODATA2018 } from '../units/codata2018.js';

/** The JSON document printed by `fieldbound levels --json` (one object, states sorted by m then ν). */
export interface LevelsJson {
  engine: string;
  input: {
    alphaBohr3: number;
    field: number;
    fieldUnit: 'tesla' | 'au';
    fieldAu: number;
    cutoffBohr: number;
    mMax: number;
  };
  states: {
    m: number;
    nu: number;
    bindingHartree: number;
    bindingOverB: number;
    /** Half-step error estimate; null when the solver could not estimate it (unresolved level). */
    relError: number | null;
    flags: string[];
  }[];
}

const CLI_NAME: Record<string, string> = {
  alpha: '--alpha',
  fieldAu: '--field',
  cutoffBohr: '--cutoff',
  mMax: '--m-max',
};

/**
 * Runs `levels` for the parsed arguments and returns the text to print (JSON or a table).
 * Engine input errors are turned into CliUsageError naming the command-line option.
 */
export function levelsCommand(a: LevelsArgs): string {
  const fieldAu = a.fieldUnit === 'au' ? a.field : a.field / CODATA2018.atomicFieldInTesla;
  let states: LevelState[];
  try {
    states = levels({ alpha: a.alpha, fieldAu, cutoffBohr: a.cutoff, mMax: a.mMax });
  } catch (e) {
    if (e instanceof EngineInputError) throw new CliUsageError(CLI_NAME[e.parameter] ?? e.parameter, e.message);
    throw e;
  }
  states = [...states].sort((p, q) => p.m - q.m || p.nu - q.nu);
  if (a.json) {
    const doc: LevelsJson = {
      engine: ENGINE_VERSION,
      input: { alphaBohr3: a.alpha, field: a.field, fieldUnit: a.fieldUnit, fieldAu, cutoffBohr: a.cutoff, mMax: a.mMax },
      states: states.map((s) => ({
        m: s.m,
        nu: s.nu,
        bindingHartree: s.bindingHartree,
        bindingOverB: s.bindingOverB,
        relError: Number.isFinite(s.relError) ? s.relError : null,
        flags: [...s.flags],
      })),
    };
    return JSON.stringify(doc);
  }
  const head = [
    `Fieldbound engine ${ENGINE_VERSION} — field-induced bound states of a fixed polarizable atom`,
    `alpha = ${formatNumber(a.alpha)} a0^3, B = ${formatNumber(a.field)} ${a.fieldUnit === 'au' ? 'a.u.' : 'T'}` +
      ` (${formatNumber(fieldAu)} a.u. = ${formatNumber(fieldAu * CODATA2018.atomicFieldInTesla)} T), r_c = ${formatNumber(a.cutoff)} a0, m = 0…${a.mMax}`,
    'binding energies below the lowest-Landau-level threshold',
    '',
  ];
  const cols = ['m', 'nu', 'parity', 'binding (hartree)', 'binding (ueV)', 'binding (K)', 'eps/B', 'rel. error', 'flags'];
  const rows = states.map((s) => [
    String(s.m),
    String(s.nu),
    s.parity,
    formatNumber(s.bindingHartree),
    formatNumber(hartreeTo('ueV', s.bindingHartree as Hartree)),
    formatNumber(hartreeTo('K', s.bindingHartree as Hartree)),
    formatNumber(s.bindingOverB),
    Number.isFinite(s.relError) ? s.relError.toExponential(1) : 'n/a',
    s.flags.join(', ') || '-',
  ]);
  const width = cols.map((c, k) => Math.max(c.length, ...rows.map((r) => r[k].length)));
  const line = (r: string[]): string => r.map((c, k) => (k < 3 ? c.padStart(width[k]) : c.padEnd(width[k]))).join('  ').trimEnd();
  return [...head, line(cols), line(width.map((w) => '-'.repeat(w))), ...rows.map(line), '', `${states.length} states`].join('\n');
}
