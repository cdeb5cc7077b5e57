/**
 * Generators for the setup fuzz test (test/fuzz.test.ts): valid setups drawn across the whole of
 * SETUP_LIMITS with extra weight on the limits themselves, hostile values, and mutations that
 * break one field of a valid setup in a known way. Tests only; every draw comes from a seeded PRNG.
 */
import { SETUP_LIMITS, SETUP_SCHEMA_VERSION, type MapSetup } from '../src/setup/mapSetup.js';

export type Rand = () => number;

export const pick = <T>(rand: Rand, xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)];
export const intIn = (rand: Rand, lo: number, hi: number): number => lo + Math.floor(rand() * (hi - lo + 1));

const f64 = new Float64Array(1);
const i64 = new BigInt64Array(f64.buffer);
/** The next double above x (x finite). */
export function nextUp(x: number): number {
  if (x === 0) return Number.MIN_VALUE;
  f64[0] = x;
  i64[0] += x > 0 ? 1n : -1n;
  return f64[0];
}
/** The next double below x (x finite). */
export function nextDown(x: number): number {
  return -nextUp(-x);
}

/** A number in [min, max]: often exactly a limit or one step inside it, else log-uniform. */
export function boundedPositive(rand: Rand, min: number, max: number): number {
  const r = rand();
  if (r < 0.1) return min;
  if (r < 0.2) return max;
  if (r < 0.25) return nextUp(min);
  if (r < 0.3) return nextDown(max);
  return Math.min(max, Math.max(min, Math.exp(Math.log(min) + rand() * (Math.log(max) - Math.log(min)))));
}

function boundedInt(rand: Rand, min: number, max: number): number {
  const r = rand();
  if (r < 0.15) return min;
  if (r < 0.3) return max;
  return intIn(rand, min, max);
}

/** An ordered pair min < max inside the limits. */
function range(rand: Rand, limits: { min: number; max: number }): { min: number; max: number } {
  for (;;) {
    const a = boundedPositive(rand, limits.min, limits.max);
    const b = boundedPositive(rand, limits.min, limits.max);
    if (a !== b) return a < b ? { min: a, max: b } : { min: b, max: a };
  }
}

const LABEL_PIECES = ['Ar', 'Xe', 'Cs', 'Rb', 'He*', 'Sr 5s5p ³P₀', '<script>alert(1)</script>', '"quoted"', "O'Brien", '→ΔΩ', '😀', 'a\u0000b', '\u202eevil', '   padded   ', 'x'.repeat(SETUP_LIMITS.maxLabelLength)];

/** A label that is valid after trimming: 1…80 characters, any content. */
function label(rand: Rand): string {
  for (;;) {
    const s = pick(rand, LABEL_PIECES) + (rand() < 0.5 ? ` ${intIn(rand, 0, 999)}` : '');
    const t = s.trim();
    if (t.length >= 1 && t.length <= SETUP_LIMITS.maxLabelLength) return rand() < 0.3 ? `  ${s}\t` : s;
  }
}

function distinctPositives(rand: Rand, n: number): number[] {
  const set = new Set<number>();
  while (set.size < n) set.add(rand() < 0.2 ? pick(rand, [Number.MIN_VALUE, Number.MAX_VALUE, 1e-3, 1]) : Math.exp((2 * rand() - 1) * 690));
  return [...set];
}

/** A setup the schema must accept, anywhere in SETUP_LIMITS. */
export function validSetup(rand: Rand): MapSetup {
  const L = SETUP_LIMITS;
  const mMax = boundedInt(rand, 0, L.maxOrbital);
  const motionKind = pick(rand, ['none', 'kinetic-energy', 'ion-level', 'temperature'] as const);
  const motion: MapSetup['motion'] =
    motionKind === 'none'
      ? { kind: 'none' }
      : motionKind === 'kinetic-energy'
        ? { kind: 'kinetic-energy', energyKelvin: pick(rand, [0, -0, 1e-300, 1, 1e300, Number.MAX_VALUE]) }
        : motionKind === 'ion-level'
          ? { kind: 'ion-level', level: boundedInt(rand, 0, L.maxIonLevel) }
          : { kind: 'temperature', kelvin: pick(rand, [Number.MIN_VALUE, 1e-9, 300, 1e12, Number.MAX_VALUE]) };
  const bands = Array.from({ length: rand() < 0.7 ? intIn(rand, 0, 3) : boundedInt(rand, 0, L.maxFieldBands) }, () => {
    const r = range(rand, L.fieldTesla);
    return { label: label(rand), minTesla: r.min, maxTesla: r.max };
  });
  const alphaRange = range(rand, L.alpha);
  // The schema bounds the levels per orbital: √α_max / r_c ≤ maxLevelsPerOrbital.
  const smallestCutoff = Math.sqrt(alphaRange.max) / L.maxLevelsPerOrbital;
  return {
    schemaVersion: SETUP_SCHEMA_VERSION,
    alphaAxis: { ...alphaRange, scale: pick(rand, ['log', 'linear'] as const) },
    fieldAxis: { ...range(rand, L.fieldTesla), scale: pick(rand, ['log', 'linear'] as const) },
    grid: { nAlpha: boundedInt(rand, L.minGridSide, L.maxGridSide), nField: boundedInt(rand, L.minGridSide, L.maxGridSide) },
    orbitals: { mMax },
    shortRange: { model: 'regularized-polarization', cutoffBohr: boundedPositive(rand, Math.max(L.cutoffBohr.min, smallestCutoff), L.cutoffBohr.max) },
    energyFloorKelvin: pick(rand, [0, -0, 1e-6, 1e-3, 1, 1e6, 1e300]),
    motion,
    ion: { massNumber: boundedInt(rand, L.massNumber.min, L.massNumber.max) },
    observationTimeSeconds: boundedPositive(rand, L.observationTimeSeconds.min, L.observationTimeSeconds.max),
    contours: { levelsKelvin: distinctPositives(rand, rand() < 0.8 ? intIn(rand, 0, 6) : boundedInt(rand, 0, L.maxContourLevels)) },
    display: {
      alphaUnit: pick(rand, ['a0^3', 'A^3', '1e-24cm^3'] as const),
      fieldUnit: pick(rand, ['T', 'au'] as const),
      energyUnit: pick(rand, ['ueV', 'meV', 'K', 'GHz'] as const),
      shown: rand() < 0.7 ? { kind: 'orbital', m: intIn(rand, 0, mMax) } : { kind: 'survivors' },
    },
    species: Array.from({ length: rand() < 0.8 ? intIn(rand, 0, 5) : boundedInt(rand, 0, L.maxSpecies) }, () => label(rand)),
    fieldBands: bands,
  };
}

/** Deeply nested junk: arrays and objects `depth` levels down (built iteratively). */
export function deepJunk(depth: number, kind: 'array' | 'object'): unknown {
  let v: unknown = 'bottom';
  for (let i = 0; i < depth; i++) v = kind === 'array' ? [v] : { nested: v };
  return v;
}

/** An object whose own enumerable keys include prototype-pollution names (as JSON.parse would make them). */
export function pollutingObject(): Record<string, unknown> {
  return JSON.parse('{"__proto__": {"polluted": "yes"}, "constructor": {"prototype": {"polluted": "yes"}}, "prototype": {"polluted": "yes"}}') as Record<string, unknown>;
}

// Large hostile values are built once and shared (validation never mutates its input).
const BIG = {
  strings: ['x'.repeat(10_000), `${'<b>'.repeat(20_000)}`, 'y'.repeat(200_000)],
  arrays: [Array.from({ length: 1_000 }, (_, i) => i), Array.from({ length: 50_000 }, (_, i) => i + 0.5)],
  deep: [deepJunk(100, 'array'), deepJunk(5_000, 'object'), deepJunk(20_000, 'array'), deepJunk(20_000, 'object')],
};

/** Values no field of a setup accepts in place of a number, a string, an object or an array (wrong type or not finite). */
export function hostileValue(rand: Rand): unknown {
  const choices: (() => unknown)[] = [
    () => Number.NaN,
    () => Number.POSITIVE_INFINITY,
    () => Number.NEGATIVE_INFINITY,
    () => null,
    () => undefined,
    () => true,
    () => '1',
    () => '',
    () => 'NaN',
    () => pick(rand, BIG.strings),
    () => 10n,
    () => Symbol('s'),
    () => () => 1,
    () => new Date(0),
    () => new Map([['min', 1]]),
    () => new Float64Array(4),
    () => pick(rand, BIG.deep),
    () => pollutingObject(),
    () => Object.create(null),
    () => pick(rand, BIG.arrays),
  ];
  return pick(rand, choices)();
}

/** Numbers that may or may not be acceptable depending on the field: edges, non-integers, extremes. */
export function edgeNumber(rand: Rand): number {
  const L = SETUP_LIMITS;
  const limits = [L.alpha.min, L.alpha.max, L.fieldTesla.min, L.fieldTesla.max, L.cutoffBohr.min, L.cutoffBohr.max, L.maxGridSide, L.minGridSide, L.maxOrbital, L.maxIonLevel, L.massNumber.min, L.massNumber.max];
  const lim = pick(rand, limits);
  return pick(rand, [0, -0, -1, 0.5, 1.5, 2 ** 53, 2 ** 53 + 2, Number.MAX_VALUE, -Number.MAX_VALUE, Number.MIN_VALUE, Number.EPSILON, lim, nextUp(lim), nextDown(lim), -lim, lim * 1e9]);
}

/** A dotted path to every leaf and container of a value (arrays by index). */
export function pathsOf(value: unknown, prefix: string[] = [], out: string[][] = []): string[][] {
  out.push(prefix);
  if (Array.isArray(value)) value.forEach((v, i) => pathsOf(v, [...prefix, String(i)], out));
  else if (value !== null && typeof value === 'object') for (const [k, v] of Object.entries(value)) pathsOf(v, [...prefix, k], out);
  return out;
}

export function getAt(root: unknown, path: string[]): unknown {
  let v = root;
  for (const k of path) v = (v as Record<string, unknown>)[k];
  return v;
}

export function setAt(root: unknown, path: string[], value: unknown): void {
  const parent = getAt(root, path.slice(0, -1)) as Record<string, unknown>;
  parent[path[path.length - 1]] = value;
}

/** Sets an own enumerable property, even for names such as `__proto__` that plain assignment treats specially. */
export function defineOwn(target: object, key: string, value: unknown): void {
  Object.defineProperty(target, key, { value, enumerable: true, writable: true, configurable: true });
}

/** A structured clone that keeps the values JSON cannot carry (NaN, -0, undefined). */
export function cloneSetup(setup: MapSetup): MapSetup {
  return structuredClone(setup);
}

export { SETUP_SCHEMA_VERSION };
