import type { BindingMapResult, PhaseMapResult } from '../map/mapTypes.js';
import type { MapSetup } from '../setup/mapSetup.js';
import { setupFingerprint } from '../setup/fingerprint.js';
import { checkExportSize, type ExportSizeCheck } from './exportLimits.js';
import { MODEL_CAVEAT } from './figureMetadata.js';
import { base64Slices, dtypeOf } from './typedArrayCodec.js';

/** Name and version of the map file format written by `mapJsonChunks` and read by `importMapJson`. */
export const MAP_FILE_FORMAT = 'fieldbound-map';
export const MAP_FILE_FORMAT_VERSION = 1;

/** What a JSON export is made from. Without `binding` the file carries the setup only. */
export interface MapJsonInput {
  setup: MapSetup;
  engineVersion: string;
  binding?: BindingMapResult | null;
  phase?: PhaseMapResult | null;
  /** Creation date from the caller (the engine has no clock); omitted when absent. */
  date?: string;
}

type AnyTyped = Float64Array | Float32Array | Uint16Array | Uint8Array;

const UNITS = {
  alphas: 'a0^3 (static dipole polarizability, atomic units)',
  fieldsAu: 'atomic units of magnetic field, B0 = hbar/(e a0^2) = 235051.7567581 T (CODATA 2018)',
  bindingHartree: 'hartree; binding energy below the lowest-Landau-level threshold at stateIndex(m, nu, cell) = (m * levelsPerOrbital + nu) * cellCount + cell, cell = row * nAlpha + column; 0 where no state',
  widthHartree: 'hartree; decay width of the moving ion, same layout (0 no decay channel, Infinity destroyed, NaN no state)',
  widthFlags: 'bits per state: see WIDTH_FLAG (non-adiabatic, outside the width table, channel closed, destroyed, no state)',
  counts: 'bound levels above the floor per orbital and cell, at m * cellCount + cell',
  flags: 'bits per orbital and cell: 1 cutoff-dominated, 2 non-adiabatic, 4 below-floor, 8 direct-solve',
  stateClass: '0 none, 1 bound, 2 resonance, 3 unbound',
  fractions: 'thermal fractions bound, resonance, unbound at 3 * stateIndex + k',
} as const;

function* arrayField(name: string, a: AnyTyped, last = false): Generator<string, void, undefined> {
  yield `${JSON.stringify(name)}:{"dtype":"${dtypeOf(a)}","length":${a.length},"base64":"`;
  yield* base64Slices(a);
  yield `"}${last ? '' : ','}`;
}

/**
 * The JSON map file as a generator of text chunks:
 * `{ format: 'fieldbound-map', formatVersion: 1, engineVersion, setupFingerprint, date?, caveat, units,
 *    setup, results: null | { binding: {...scalars, arrays}, phase: null | {...} } }`.
 * Arrays are `{ dtype, length, base64 }` with the little-endian bytes, so every number reads back bit
 * for bit. Large arrays are yielded in slices; nothing builds the whole file unless the caller joins it.
 *
 * Bad input: throws `RangeError` when the results do not belong to the setup, before yielding.
 */
export function* mapJsonChunks(input: MapJsonInput): Generator<string, void, undefined> {
  const { setup, binding, phase } = input;
  if (binding && (binding.nAlpha !== setup.grid.nAlpha || binding.nField !== setup.grid.nField || binding.mMax !== setup.orbitals.mMax)) {
    throw new RangeError('the binding map does not belong to this setup (grid or orbitals differ)');
  }
  if (phase && !binding) throw new RangeError('a phase map needs its binding map');
  const head: Record<string, unknown> = {
    format: MAP_FILE_FORMAT,
    formatVersion: MAP_FILE_FORMAT_VERSION,
    engineVersion: binding?.engineVersion ?? input.engineVersion,
    setupFingerprint: setupFingerprint(setup),
  };
  if (input.date !== undefined) head.date = input.date;
  head.caveat = MODEL_CAVEAT;
  const headText = JSON.stringify(head, null, 1).replace(/\n\s*/g, '');
  yield `${headText.slice(0, -1)},"setup":${JSON.stringify(setup)},"results":`;
  if (!binding) {
    yield 'null}\n';
    return;
  }
  yield `{"units":${JSON.stringify(UNITS)},"binding":{`;
  yield `"engineVersion":${JSON.stringify(binding.engineVersion)},"nAlpha":${binding.nAlpha},"nField":${binding.nField},"cellCount":${binding.cellCount},"mMax":${binding.mMax},"levelsPerOrbital":${binding.levelsPerOrbital},"maxRelError":${JSON.stringify(binding.maxRelError)},"elapsedMs":${JSON.stringify(binding.elapsedMs)},`;
  yield* arrayField('alphas', binding.alphas);
  yield* arrayField('fieldsAu', binding.fieldsAu);
  yield* arrayField('bindingHartree', binding.bindingHartree);
  yield* arrayField('counts', binding.counts);
  yield* arrayField('flags', binding.flags, true);
  yield '},"phase":';
  if (!phase) {
    yield 'null}}\n';
    return;
  }
  yield `{"engineVersion":${JSON.stringify(phase.engineVersion)},"elapsedMs":${JSON.stringify(phase.elapsedMs)},`;
  yield* arrayField('stateClass', phase.stateClass);
  yield* arrayField('widthHartree', phase.widthHartree);
  yield* arrayField('widthFlags', phase.widthFlags);
  yield* arrayField('survivors', phase.survivors, phase.fractions === null);
  if (phase.fractions) yield* arrayField('fractions', phase.fractions, true);
  yield '}}}\n';
}

/** The whole JSON map file as one string (fine for setups and small maps; use the chunks for big ones). */
export function mapJsonText(input: MapJsonInput): string {
  let s = '';
  for (const c of mapJsonChunks(input)) s += c;
  return s;
}

/** Exact size in bytes of the JSON export (computed from the array sizes; nothing is formatted), with the size check. */
export function estimateMapJson(input: MapJsonInput, options: { maxBytes?: number } = {}): ExportSizeCheck {
  const { binding, phase } = input;
  const b64 = (a: AnyTyped | null | undefined) => (a ? 4 * Math.ceil(a.byteLength / 3) + 60 : 0);
  let bytes = 2000 + 3 * JSON.stringify(input.setup).length;
  if (binding) bytes += 1200 + b64(binding.alphas) + b64(binding.fieldsAu) + b64(binding.bindingHartree) + b64(binding.counts) + b64(binding.flags);
  if (phase) bytes += 200 + b64(phase.stateClass) + b64(phase.widthHartree) + b64(phase.widthFlags) + b64(phase.survivors) + b64(phase.fractions);
  return checkExportSize('json', bytes, 'this map', options.maxBytes);
}
