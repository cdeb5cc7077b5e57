import type { BindingMapResult, PhaseMapResult } from '../map/mapTypes.js';
import { validateSetup, type MapSetup } from '../setup/mapSetup.js';
import { setupFingerprint } from '../setup/fingerprint.js';
import { jsonSyntaxError } from './jsonSyntaxError.js';
import { MAP_FILE_FORMAT, MAP_FILE_FORMAT_VERSION } from './mapJson.js';
import { ArrayDecodeError, decodeArray, type ArrayDType, type TypedArrayOf } from './typedArrayCodec.js';

/** One reason an import was refused: where (a dotted path, or "(file)") and what is wrong. */
export interface ImportProblem {
  path: string;
  message: string;
}

/** A successful import: the setup and, when the file had them, the results. */
export interface ImportedMap {
  /** 'map-file' for a file written by the JSON export, 'setup' for a bare setup object. */
  kind: 'map-file' | 'setup';
  setup: MapSetup;
  setupFingerprint: string;
  /** Engine version recorded in the file (null for a bare setup). */
  engineVersion: string | null;
  date: string | null;
  binding: BindingMapResult | null;
  phase: PhaseMapResult | null;
  /** Things worth saying that do not stop the import (e.g. results from another engine version). */
  warnings: string[];
}

export type ImportResult = { ok: true; value: ImportedMap } | { ok: false; problems: ImportProblem[] };

const ENVELOPE_KEYS = new Set(['format', 'formatVersion', 'engineVersion', 'setupFingerprint', 'date', 'caveat', 'setup', 'results']);

const describe = (v: unknown) => (v === null ? 'null' : Array.isArray(v) ? 'a list' : typeof v === 'object' ? 'an object' : `${typeof v} ${JSON.stringify(v)}`);

const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);

/**
 * Reads a map file written by the JSON export, or a bare setup object, from text (a file's contents or
 * pasted JSON) and validates it completely before returning anything: the JSON syntax (with line and
 * column), the file format and version, the setup with the same rules as the server (`validateSetup`,
 * every issue with its path), and the results' array types, lengths and grid against the setup. Returns
 * every problem found, or the setup and results; nothing is produced half-way.
 *
 * `currentEngineVersion`, when given, adds a warning if the file's results come from another version.
 *
 * @example
 * importMapJson('{"format":"fieldbound-map","formatVersion":2}')
 * // { ok: false, problems: [{ path: 'formatVersion', message: 'format version 2 is newer than this Fieldbound reads (version 1) …' }] }
 */
export function importMapJson(text: string, options: { currentEngineVersion?: string } = {}): ImportResult {
  const fail = (problems: ImportProblem[]): ImportResult => ({ ok: false, problems });
  if (text.trim() === '') return fail([{ path: '(file)', message: 'the text is empty: choose a file or paste a setup' }]);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    const where = jsonSyntaxError(text);
    const message = where ? `not readable JSON at line ${where.line} column ${where.column}: ${where.message}` : 'not readable JSON';
    return fail([{ path: '(file)', message }]);
  }
  if (!isObject(data)) {
    return fail([{ path: '(file)', message: `expected a JSON object (a Fieldbound map file or a setup), found ${describe(data)}` }]);
  }

  // A bare setup (what the server stores and the setup panel edits).
  if (!('format' in data)) {
    if (!('schemaVersion' in data)) {
      return fail([{ path: '(file)', message: 'not a Fieldbound map file or setup: it has neither "format" nor "schemaVersion"' }]);
    }
    const v = validateSetup(data);
    if (!v.ok) return fail(v.issues);
    return {
      ok: true,
      value: { kind: 'setup', setup: v.setup, setupFingerprint: setupFingerprint(v.setup), engineVersion: null, date: null, binding: null, phase: null, warnings: [] },
    };
  }

  if (data.format !== MAP_FILE_FORMAT) {
    return fail([{ path: 'format', message: `unknown format ${JSON.stringify(data.format)}: expected "${MAP_FILE_FORMAT}"` }]);
  }
  const fv = data.formatVersion;
  if (typeof fv !== 'number' || !Number.isInteger(fv)) {
    return fail([{ path: 'formatVersion', message: `formatVersion must be a whole number, found ${describe(fv)}` }]);
  }
  if (fv > MAP_FILE_FORMAT_VERSION) {
    return fail([{ path: 'formatVersion', message: `format version ${fv} is newer than this Fieldbound reads (version ${MAP_FILE_FORMAT_VERSION}); open it with a newer Fieldbound` }]);
  }
  if (fv !== MAP_FILE_FORMAT_VERSION) {
    return fail([{ path: 'formatVersion', message: `unknown format version ${fv} (this Fieldbound reads version ${MAP_FILE_FORMAT_VERSION})` }]);
  }

  const problems: ImportProblem[] = [];
  for (const key of Object.keys(data)) if (!ENVELOPE_KEYS.has(key)) problems.push({ path: key, message: `unknown field "${key}"` });
  if (typeof data.engineVersion !== 'string' || data.engineVersion === '') problems.push({ path: 'engineVersion', message: 'engineVersion must be text' });
  if (typeof data.setupFingerprint !== 'string') problems.push({ path: 'setupFingerprint', message: 'setupFingerprint must be text' });
  if (data.date !== undefined && typeof data.date !== 'string') problems.push({ path: 'date', message: 'date must be text' });
  if (!('setup' in data)) problems.push({ path: 'setup', message: 'setup is required' });
  const v = validateSetup(data.setup);
  if ('setup' in data && !v.ok) for (const issue of v.issues) problems.push({ path: issue.path === '(setup)' ? 'setup' : `setup.${issue.path}`, message: issue.message });
  if (problems.length > 0 || !v.ok) return fail(problems);

  const setup = v.setup;
  const fingerprint = setupFingerprint(setup);
  const warnings: string[] = [];
  const results = data.results;
  if (data.setupFingerprint !== fingerprint) {
    if (results !== null && results !== undefined) {
      return fail([
        {
          path: 'setupFingerprint',
          message: `the setup was changed after export (fingerprint ${fingerprint}, the file says ${String(data.setupFingerprint)}), so the results no longer belong to it; set "results" to null to import the setup alone`,
        },
      ]);
    }
    warnings.push(`the setup was changed after export (fingerprint ${fingerprint}, the file says ${String(data.setupFingerprint)})`);
  }

  let binding: BindingMapResult | null = null;
  let phase: PhaseMapResult | null = null;
  if (results !== null && results !== undefined) {
    const decoded = decodeResults(results, setup, problems);
    if (problems.length > 0 || !decoded) return fail(problems);
    ({ binding, phase } = decoded);
    if (options.currentEngineVersion !== undefined && binding.engineVersion !== options.currentEngineVersion) {
      warnings.push(`the results were computed by engine ${binding.engineVersion}; this is engine ${options.currentEngineVersion}, so recomputing may give different numbers`);
    }
  }
  return {
    ok: true,
    value: {
      kind: 'map-file',
      setup,
      setupFingerprint: fingerprint,
      engineVersion: data.engineVersion as string,
      date: (data.date as string | undefined) ?? null,
      binding,
      phase,
      warnings,
    },
  };
}

function decodeResults(results: unknown, setup: MapSetup, problems: ImportProblem[]): { binding: BindingMapResult; phase: PhaseMapResult | null } | null {
  if (!isObject(results)) {
    problems.push({ path: 'results', message: `results must be an object or null, found ${describe(results)}` });
    return null;
  }
  for (const key of Object.keys(results)) if (!['units', 'binding', 'phase'].includes(key)) problems.push({ path: `results.${key}`, message: `unknown field "${key}"` });
  const b = results.binding;
  if (!isObject(b)) {
    problems.push({ path: 'results.binding', message: `binding must be an object, found ${describe(b)}` });
    return null;
  }
  const nAlpha = setup.grid.nAlpha;
  const nField = setup.grid.nField;
  const cellCount = nAlpha * nField;
  const mMax = setup.orbitals.mMax;
  const int = (path: string, value: unknown, expected?: number, min = 0, max = Number.MAX_SAFE_INTEGER): number => {
    if (typeof value !== 'number' || !Number.isInteger(value) || value < min || value > max) {
      problems.push({ path, message: `must be a whole number from ${min} to ${max}, found ${describe(value)}` });
      return NaN;
    }
    if (expected !== undefined && value !== expected) problems.push({ path, message: `is ${value} but the setup's grid gives ${expected}` });
    return value;
  };
  int('results.binding.nAlpha', b.nAlpha, nAlpha);
  int('results.binding.nField', b.nField, nField);
  int('results.binding.cellCount', b.cellCount, cellCount);
  int('results.binding.mMax', b.mMax, mMax);
  const L = int('results.binding.levelsPerOrbital', b.levelsPerOrbital, undefined, 1, 65535);
  if (typeof b.engineVersion !== 'string') problems.push({ path: 'results.binding.engineVersion', message: 'engineVersion must be text' });
  const num = (path: string, value: unknown): number => {
    if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
      problems.push({ path, message: `must be a number ≥ 0, found ${describe(value)}` });
      return NaN;
    }
    return value;
  };
  const maxRelError = num('results.binding.maxRelError', b.maxRelError);
  const elapsedMs = b.elapsedMs === undefined ? 0 : num('results.binding.elapsedMs', b.elapsedMs);
  if (problems.length > 0) return null;
  const states = (mMax + 1) * L * cellCount;
  const arr = <D extends ArrayDType>(path: string, value: unknown, dtype: D, length: number): TypedArrayOf<D> | null => {
    try {
      return decodeArray(value, { dtype, length });
    } catch (e) {
      if (e instanceof ArrayDecodeError) {
        problems.push({ path, message: value === undefined ? 'is required' : e.message });
        return null;
      }
      throw e;
    }
  };
  const alphas = arr('results.binding.alphas', b.alphas, 'float64', nAlpha);
  const fieldsAu = arr('results.binding.fieldsAu', b.fieldsAu, 'float64', nField);
  const bindingHartree = arr('results.binding.bindingHartree', b.bindingHartree, 'float64', states);
  const counts = arr('results.binding.counts', b.counts, 'uint16', (mMax + 1) * cellCount);
  const flags = arr('results.binding.flags', b.flags, 'uint8', (mMax + 1) * cellCount);
  if (!alphas || !fieldsAu || !bindingHartree || !counts || !flags) return null;
  for (let k = 0; k < bindingHartree.length; k++) {
    const e = bindingHartree[k];
    if (!(e >= 0) || e === Infinity) {
      problems.push({ path: 'results.binding.bindingHartree', message: `value ${k} is ${e}; binding energies must be finite and ≥ 0` });
      return null;
    }
  }
  const binding: BindingMapResult = {
    engineVersion: b.engineVersion as string,
    nAlpha,
    nField,
    cellCount,
    mMax,
    levelsPerOrbital: L,
    alphas,
    fieldsAu,
    bindingHartree,
    counts,
    flags,
    maxRelError,
    elapsedMs,
  };
  const p = results.phase;
  if (p === null || p === undefined) return { binding, phase: null };
  if (!isObject(p)) {
    problems.push({ path: 'results.phase', message: `phase must be an object or null, found ${describe(p)}` });
    return null;
  }
  if (typeof p.engineVersion !== 'string') problems.push({ path: 'results.phase.engineVersion', message: 'engineVersion must be text' });
  const stateClass = arr('results.phase.stateClass', p.stateClass, 'uint8', states);
  const widthHartree = arr('results.phase.widthHartree', p.widthHartree, 'float64', states);
  const widthFlags = arr('results.phase.widthFlags', p.widthFlags, 'uint8', states);
  const survivors = arr('results.phase.survivors', p.survivors, 'uint16', cellCount);
  const fractions = p.fractions === undefined || p.fractions === null ? null : arr('results.phase.fractions', p.fractions, 'float32', 3 * states);
  if (problems.length > 0 || !stateClass || !widthHartree || !widthFlags || !survivors) return null;
  for (let k = 0; k < stateClass.length; k++) {
    if (stateClass[k] > 3) {
      problems.push({ path: 'results.phase.stateClass', message: `value ${k} is ${stateClass[k]}; classes are 0 to 3` });
      return null;
    }
  }
  const phase: PhaseMapResult = {
    engineVersion: p.engineVersion as string,
    stateClass,
    widthHartree,
    widthFlags,
    survivors,
    fractions,
    elapsedMs: typeof p.elapsedMs === 'number' ? p.elapsedMs : 0,
  };
  return { binding, phase };
}
