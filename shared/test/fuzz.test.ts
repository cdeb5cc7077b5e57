/**
 * Fuzz tests of the setup validator and the engine (issue 11, "hostile and bad input").
 *
 * Every input comes from a seeded PRNG (mulberry32), so a failure reproduces exactly; each failing
 * check prints the case number, the seed and the offending input. The whole file runs in about 10 s
 * on two cores; the time limit is vitest's per-test timeout, and the assertions are on counts.
 */
import { describe, expect, it } from 'vitest';
import { EngineInputError } from '../src/errors.js';
import { levels } from '../src/levels/levels.js';
import type { LevelFlag, LevelState, LevelsInput } from '../src/levels/types.js';
import { bindingMap } from '../src/map/bindingMap.js';
import { axisNodes } from '../src/map/mapAxes.js';
import { canonicalJson, setupFingerprint } from '../src/setup/fingerprint.js';
import { SETUP_LIMITS, SetupValidationError, validateSetup, type MapSetup } from '../src/setup/mapSetup.js';
import { toAtomicField, toHartree } from '../src/units/convert.js';
import { defaultSetup } from '../src/setup/presets.js';
import { mulberry32 } from './seededRandom.js';
import {
  cloneSetup,
  deepJunk,
  defineOwn,
  edgeNumber,
  getAt,
  hostileValue,
  intIn,
  nextDown,
  nextUp,
  pathsOf,
  pick,
  pollutingObject,
  setAt,
  validSetup,
  type Rand,
} from './setupFuzzer.js';

const SEED = 0x5e7f_0011;
const CASES = 12_000;
/**
 * Per-call budget of validateSetup. A case over it is timed again (a loaded machine or a garbage
 * collection can stall one call); over it twice fails the test. Typical calls take under 1 ms.
 */
const VALIDATE_BUDGET_MS = 1_000;

// ---------------------------------------------------------------------------------------------
// An independent statement of what a valid setup is (not derived from the zod schema).

const L = SETUP_LIMITS;
const TOP_KEYS = ['alphaAxis', 'contours', 'display', 'energyFloorKelvin', 'fieldAxis', 'fieldBands', 'grid', 'ion', 'motion', 'observationTimeSeconds', 'orbitals', 'schemaVersion', 'shortRange', 'species'];

function validSetupProblems(s: MapSetup): string[] {
  const p: string[] = [];
  const keysAre = (at: string, o: object, keys: string[]) => {
    if (Object.getPrototypeOf(o) !== Object.prototype) p.push(`${at}: not a plain object`);
    const own = Object.keys(o).sort();
    if (own.join() !== [...keys].sort().join()) p.push(`${at}: keys ${own.join()} instead of ${keys.join()}`);
  };
  const within = (at: string, v: number, lim: { min: number; max: number }) => {
    if (!(Number.isFinite(v) && v >= lim.min && v <= lim.max)) p.push(`${at} = ${v} outside ${lim.min}…${lim.max}`);
  };
  const intWithin = (at: string, v: number, min: number, max: number) => {
    if (!(Number.isInteger(v) && v >= min && v <= max)) p.push(`${at} = ${v} not an integer in ${min}…${max}`);
  };
  const label = (at: string, v: string) => {
    if (typeof v !== 'string' || v !== v.trim() || v.length < 1 || v.length > L.maxLabelLength) p.push(`${at} = ${JSON.stringify(v)?.slice(0, 100)} is not a trimmed label of 1…${L.maxLabelLength}`);
  };
  keysAre('(setup)', s, TOP_KEYS);
  if (s.schemaVersion !== 1) p.push('schemaVersion');
  for (const [name, axis, lim] of [['alphaAxis', s.alphaAxis, L.alpha], ['fieldAxis', s.fieldAxis, L.fieldTesla]] as const) {
    keysAre(name, axis, ['min', 'max', 'scale']);
    within(`${name}.min`, axis.min, lim);
    within(`${name}.max`, axis.max, lim);
    if (!(axis.min < axis.max)) p.push(`${name}: min ${axis.min} not below max ${axis.max}`);
    if (axis.scale !== 'log' && axis.scale !== 'linear') p.push(`${name}.scale`);
  }
  keysAre('grid', s.grid, ['nAlpha', 'nField']);
  intWithin('grid.nAlpha', s.grid.nAlpha, L.minGridSide, L.maxGridSide);
  intWithin('grid.nField', s.grid.nField, L.minGridSide, L.maxGridSide);
  intWithin('orbitals.mMax', s.orbitals.mMax, 0, L.maxOrbital);
  if (s.shortRange.model !== 'regularized-polarization') p.push('shortRange.model');
  within('shortRange.cutoffBohr', s.shortRange.cutoffBohr, L.cutoffBohr);
  if (!(Number.isFinite(s.energyFloorKelvin) && s.energyFloorKelvin >= 0)) p.push(`energyFloorKelvin = ${s.energyFloorKelvin}`);
  const m = s.motion;
  if (m.kind === 'kinetic-energy' && !(Number.isFinite(m.energyKelvin) && m.energyKelvin >= 0)) p.push('motion.energyKelvin');
  if (m.kind === 'ion-level') intWithin('motion.level', m.level, 0, L.maxIonLevel);
  if (m.kind === 'temperature' && !(Number.isFinite(m.kelvin) && m.kelvin > 0)) p.push('motion.kelvin');
  if (!['none', 'kinetic-energy', 'ion-level', 'temperature'].includes(m.kind)) p.push('motion.kind');
  intWithin('ion.massNumber', s.ion.massNumber, L.massNumber.min, L.massNumber.max);
  within('observationTimeSeconds', s.observationTimeSeconds, L.observationTimeSeconds);
  const lv = s.contours.levelsKelvin;
  if (lv.length > L.maxContourLevels || new Set(lv).size !== lv.length || !lv.every((v) => Number.isFinite(v) && v > 0)) p.push('contours.levelsKelvin');
  const sh = s.display.shown;
  if (sh.kind === 'orbital') intWithin('display.shown.m', sh.m, 0, s.orbitals.mMax);
  if (s.species.length > L.maxSpecies) p.push('species: too many');
  s.species.forEach((name, i) => label(`species.${i}`, name));
  if (s.fieldBands.length > L.maxFieldBands) p.push('fieldBands: too many');
  s.fieldBands.forEach((b, i) => {
    keysAre(`fieldBands.${i}`, b, ['label', 'minTesla', 'maxTesla']);
    label(`fieldBands.${i}.label`, b.label);
    within(`fieldBands.${i}.minTesla`, b.minTesla, L.fieldTesla);
    within(`fieldBands.${i}.maxTesla`, b.maxTesla, L.fieldTesla);
    if (!(b.minTesla < b.maxTesla)) p.push(`fieldBands.${i}: inverted`);
  });
  return p;
}

/** How an issue path shows a key: plain when it is a simple name, else quoted and cut to 40 characters. */
function segmentOf(key: string): string {
  return key.length <= 40 && /^[\w$-]+$/.test(key) ? key : JSON.stringify(key.length > 40 ? `${key.slice(0, 40)}…` : key);
}

/** Issue paths are dotted; '(setup)' is the root. Two paths are related when one contains the other. */
function related(issuePath: string, changed: string[]): boolean {
  if (issuePath === '(setup)' || changed.length === 0) return true;
  const a = issuePath.split('.');
  const b = changed.map(segmentOf);
  if (b.some((seg) => seg.includes('.'))) return issuePath.startsWith(b[0]) || b.join('.').startsWith(issuePath);
  const n = Math.min(a.length, b.length);
  for (let i = 0; i < n; i++) if (a[i] !== b[i]) return false;
  return true;
}

function describeInput(value: unknown): string {
  try {
    const text = canonicalJson(value) ?? String(value);
    return text.length > 400 ? `${text.slice(0, 400)}… (${text.length} chars)` : text;
  } catch {
    return Object.prototype.toString.call(value);
  }
}

// ---------------------------------------------------------------------------------------------
// Case generation.

type Kind = 'valid' | 'hostile-field' | 'edge-number' | 'missing-field' | 'unknown-field' | 'junk';
interface FuzzCase {
  kind: Kind;
  input: unknown;
  /** The generator knows the input is valid (true), invalid (false) or cannot tell (null). */
  expectValid: boolean | null;
  /** For a single known-invalid change: where it was made. */
  changedPath?: string[];
}

const UNKNOWN_KEYS = ['__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty', 'valueOf', '', ' ', 'min ', 'Min', 'nAlpha2', '💥', 'k'.repeat(10_000)];

function isStringLeafCandidate(v: unknown): boolean {
  return typeof v === 'string' && v.trim().length >= 1 && v.trim().length <= L.maxLabelLength;
}

function makeCase(rand: Rand): FuzzCase {
  const r = rand();
  if (r < 0.25) return { kind: 'valid', input: validSetup(rand), expectValid: true };
  if (r < 0.85) {
    const setup = cloneSetup(validSetup(rand));
    const paths = pathsOf(setup).filter((p) => p.length > 0);
    const which = rand();
    if (which < 0.35) {
      const path = pick(rand, paths);
      const value = hostileValue(rand);
      setAt(setup, path, value);
      return { kind: 'hostile-field', input: setup, expectValid: isStringLeafCandidate(value) ? null : false, changedPath: path };
    }
    if (which < 0.6) {
      const numeric = paths.filter((p) => typeof getAt(setup, p) === 'number');
      const n = intIn(rand, 1, 3);
      for (let i = 0; i < n; i++) setAt(setup, pick(rand, numeric), edgeNumber(rand));
      return { kind: 'edge-number', input: setup, expectValid: null };
    }
    const objectPaths = paths.filter((p) => {
      const v = getAt(setup, p);
      return v !== null && typeof v === 'object' && !Array.isArray(v);
    });
    if (which < 0.75) {
      // Every field of every object in a setup is required.
      const path = pick(rand, paths.filter((p) => !/^\d+$/.test(p[p.length - 1])));
      delete (getAt(setup, path.slice(0, -1)) as Record<string, unknown>)[path[path.length - 1]];
      return { kind: 'missing-field', input: setup, expectValid: false, changedPath: path };
    }
    const at = rand() < 0.3 ? [] : pick(rand, objectPaths);
    const key = pick(rand, UNKNOWN_KEYS);
    defineOwn(at.length ? (getAt(setup, at) as object) : setup, key, rand() < 0.5 ? pollutingObject() : hostileValue(rand));
    return { kind: 'unknown-field', input: setup, expectValid: false, changedPath: [...at, key] };
  }
  const junk: (() => unknown)[] = [
    () => hostileValue(rand),
    () => pollutingObject(),
    () => JSON.stringify(validSetup(rand)),
    () => [validSetup(rand)],
    () => ({ setup: validSetup(rand) }),
    () => ({}),
    () => [],
    () => 0,
    () => Object.assign(Object.create(validSetup(rand)) as object, {}),
    () => ({ ...validSetup(rand), grid: { nAlpha: 2 ** 31, nField: 2 ** 31 } }),
    () => ({ ...validSetup(rand), grid: { nAlpha: 1e9, nField: 1e9 } }),
  ];
  return { kind: 'junk', input: pick(rand, junk)(), expectValid: null };
}

// ---------------------------------------------------------------------------------------------

describe(`validateSetup under ${CASES.toLocaleString('en')} generated inputs (seed ${SEED.toString(16)})`, () => {
  it('never throws; accepts every generated valid setup; a valid result satisfies every limit and re-validates identically; every rejection lists issues with a path and a message', () => {
    const rand = mulberry32(SEED);
    const failures: string[] = [];
    const kinds: Record<Kind, number> = { valid: 0, 'hostile-field': 0, 'edge-number': 0, 'missing-field': 0, 'unknown-field': 0, junk: 0 };
    let accepted = 0;
    let rejected = 0;
    let overBudget = 0;
    let slowest = 0;
    let mostIssues = 0;
    let validating = 0;
    const started = performance.now();
    for (let n = 0; n < CASES; n++) {
      const c = makeCase(rand);
      kinds[c.kind]++;
      const fail = (what: string) => failures.push(`case ${n} (${c.kind}${c.changedPath ? ` at ${c.changedPath.join('.')}` : ''}): ${what}\n  input: ${describeInput(c.input)}`);
      const t0 = performance.now();
      let result: ReturnType<typeof validateSetup>;
      try {
        result = validateSetup(c.input);
      } catch (error) {
        fail(`threw ${String(error)}`);
        continue;
      }
      const dt = performance.now() - t0;
      validating += dt;
      slowest = Math.max(slowest, dt);
      if (dt > VALIDATE_BUDGET_MS) {
        const t1 = performance.now();
        validateSetup(c.input);
        const again = performance.now() - t1;
        if (again > VALIDATE_BUDGET_MS) {
          overBudget++;
          fail(`took ${dt.toFixed(0)} ms, then ${again.toFixed(0)} ms (budget ${VALIDATE_BUDGET_MS} ms)`);
        }
      }
      if (result.ok) {
        accepted++;
        if (c.expectValid === false) fail('accepted an input the generator made invalid');
        for (const problem of validSetupProblems(result.setup)) fail(`accepted but ${problem}`);
        const again = validateSetup(result.setup);
        if (!again.ok) fail(`the validated setup no longer validates: ${JSON.stringify(again.issues)}`);
        else if (canonicalJson(again.setup) !== canonicalJson(result.setup) || !Object.is(again.setup.energyFloorKelvin, result.setup.energyFloorKelvin)) fail('re-validation changed the setup');
        // What the server stores is JSON: the stored text must mean the same setup (checked on every fourth, for time).
        if (accepted % 4 === 0) {
          const viaJson = validateSetup(JSON.parse(JSON.stringify(result.setup)));
          if (!viaJson.ok) fail(`the JSON of a valid setup does not validate: ${JSON.stringify(viaJson.issues)}`);
          else if (setupFingerprint(viaJson.setup) !== setupFingerprint(result.setup)) fail('the JSON round trip changed the fingerprint');
        }
      } else {
        rejected++;
        if (c.expectValid === true) fail(`rejected a valid setup: ${JSON.stringify(result.issues)}`);
        const issues = result.issues;
        mostIssues = Math.max(mostIssues, issues.length);
        if (!Array.isArray(issues) || issues.length === 0) fail('rejected without issues');
        for (const issue of issues) {
          if (typeof issue.path !== 'string' || issue.path.length === 0 || typeof issue.message !== 'string' || issue.message.trim().length === 0) fail(`malformed issue ${JSON.stringify(issue)}`);
        }
        if (c.changedPath && c.expectValid === false && !issues.some((i) => related(i.path, c.changedPath!))) fail(`no issue names the changed field: ${JSON.stringify(issues).slice(0, 400)}`);
      }
      if (failures.length > 20) break;
    }
    const seconds = (performance.now() - started) / 1000;
    console.info(`setup fuzz: ${CASES} cases in ${seconds.toFixed(2)} s with checks, ${(validating / 1000).toFixed(2)} s in validateSetup (${Math.round(CASES / (validating / 1000))} cases/s), ${accepted} accepted, ${rejected} rejected; slowest ${slowest.toFixed(1)} ms; most issues in one answer ${mostIssues}; kinds ${JSON.stringify(kinds)}`);
    expect(failures, failures.slice(0, 5).join('\n')).toEqual([]);
    expect(accepted + rejected).toBe(CASES);
    expect(overBudget).toBe(0);
    for (const count of Object.values(kinds)) expect(count).toBeGreaterThan(300);
    expect(accepted).toBeGreaterThan(CASES / 5);
  });

  it('leaves Object.prototype untouched after inputs carrying __proto__, constructor and prototype keys', () => {
    const before = Object.getOwnPropertyNames(Object.prototype).sort();
    const setup = validSetup(mulberry32(7)) as unknown as Record<string, unknown>;
    for (const at of [setup, setup.grid, setup.motion, setup.display]) defineOwn(at as object, '__proto__', { polluted: 'yes' });
    const result = validateSetup(setup);
    expect(result.ok).toBe(false);
    expect(result.ok ? [] : result.issues.map((i) => i.path)).toEqual(expect.arrayContaining(['__proto__', 'grid.__proto__', 'motion.__proto__', 'display.__proto__']));
    validateSetup(pollutingObject());
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(Object.getOwnPropertyNames(Object.prototype).sort()).toEqual(before);
  });

  it('names unknown fields with odd keys (empty, blank, dotted, 10,000 characters) by a non-empty quoted path of bounded length', () => {
    const setup = validSetup(mulberry32(5)) as unknown as Record<string, unknown>;
    for (const key of ['', ' ', 'a.b', 'k'.repeat(10_000)]) defineOwn(setup, key, 1);
    const result = validateSetup(setup);
    expect(result.ok).toBe(false);
    const paths = result.ok ? [] : result.issues.map((i) => i.path);
    expect(paths).toEqual(['""', '" "', '"a.b"', `"${'k'.repeat(40)}…"`]);
    for (const issue of result.ok ? [] : result.issues) expect(issue.message.length).toBeLessThan(80);
  });

  it('accepts every numeric limit exactly and rejects the next double beyond it, naming that field', () => {
    const base = validSetup(mulberry32(11));
    base.orbitals.mMax = L.maxOrbital;
    base.display.shown = { kind: 'survivors' };
    base.motion = { kind: 'ion-level', level: 0 };
    const limits: [string[], number, number, 'real' | 'int'][] = [
      [['alphaAxis', 'min'], L.alpha.min, nextDown(L.alpha.min), 'real'],
      [['alphaAxis', 'max'], L.alpha.max, nextUp(L.alpha.max), 'real'],
      [['fieldAxis', 'min'], L.fieldTesla.min, nextDown(L.fieldTesla.min), 'real'],
      [['fieldAxis', 'max'], L.fieldTesla.max, nextUp(L.fieldTesla.max), 'real'],
      [['shortRange', 'cutoffBohr'], L.cutoffBohr.min, nextDown(L.cutoffBohr.min), 'real'],
      [['shortRange', 'cutoffBohr'], L.cutoffBohr.max, nextUp(L.cutoffBohr.max), 'real'],
      [['observationTimeSeconds'], L.observationTimeSeconds.min, nextDown(L.observationTimeSeconds.min), 'real'],
      [['observationTimeSeconds'], L.observationTimeSeconds.max, nextUp(L.observationTimeSeconds.max), 'real'],
      [['grid', 'nAlpha'], L.maxGridSide, L.maxGridSide + 1, 'int'],
      [['grid', 'nField'], L.minGridSide, L.minGridSide - 1, 'int'],
      [['orbitals', 'mMax'], L.maxOrbital, L.maxOrbital + 1, 'int'],
      [['ion', 'massNumber'], L.massNumber.min, L.massNumber.min - 1, 'int'],
      [['ion', 'massNumber'], L.massNumber.max, L.massNumber.max + 1, 'int'],
      [['motion', 'level'], L.maxIonLevel, L.maxIonLevel + 1, 'int'],
      [['energyFloorKelvin'], 0, -Number.MIN_VALUE, 'real'],
    ];
    for (const [path, atLimit, beyond, type] of limits) {
      const ok = cloneSetup(base);
      // Keep the other end of a range out of the way so only the limit is tested.
      if (path[1] === 'min') setAt(ok, [path[0], 'max'], getAt(L, [path[0] === 'alphaAxis' ? 'alpha' : 'fieldTesla', 'max']));
      if (path[1] === 'max') setAt(ok, [path[0], 'min'], getAt(L, [path[0] === 'alphaAxis' ? 'alpha' : 'fieldTesla', 'min']));
      // The levels-per-orbital rule (√α_max / r_c ≤ 32) couples α and r_c: keep it satisfied at both ends.
      if (path[0] === 'shortRange') setAt(ok, ['alphaAxis'], { min: L.alpha.min, max: (L.maxLevelsPerOrbital * L.cutoffBohr.min) ** 2, scale: 'log' });
      else setAt(ok, ['shortRange', 'cutoffBohr'], L.cutoffBohr.max);
      setAt(ok, path, atLimit);
      expect(validateSetup(ok), `${path.join('.')} = ${atLimit}`).toMatchObject({ ok: true });
      const bad = cloneSetup(ok);
      setAt(bad, path, beyond);
      const result = validateSetup(bad);
      expect(result.ok, `${path.join('.')} = ${beyond}`).toBe(false);
      if (!result.ok) expect(result.issues.map((i) => i.path)).toContain(path.join('.'));
      if (type === 'int') {
        setAt(bad, path, atLimit + (atLimit > 0 ? -0.5 : 0.5));
        const frac = validateSetup(bad);
        expect(frac.ok ? [] : frac.issues.map((i) => i.path), `${path.join('.')} fractional`).toContain(path.join('.'));
      }
    }
  });
});

// ---------------------------------------------------------------------------------------------
// The engine on valid setups.

/**
 * Points are run only where the scaled coupling λ = αB (atomic units) is at most this, to keep this
 * file fast; the cost of the rest is bounded by the levels-per-orbital rule of the setup schema
 * (√α_max / r_c ≤ 32) and checked at the worst allowed corner in the test at the end. The fuzz run
 * first found it unbounded: α = 1000 a₀³, B = 10¹⁰ T, r_c = 10⁻³ bohr did not finish in 250 s.
 * The skipped points are counted and reported.
 */
const LAMBDA_ENVELOPE = 30;
const ENGINE_POINTS = 40;
const FLAGS: readonly LevelFlag[] = ['cutoff-dominated', 'non-adiabatic', 'field-free-anion', 'below-floor', 'unresolved'];

function levelsProblems(input: Required<Pick<LevelsInput, 'alpha' | 'fieldAu' | 'cutoffBohr' | 'mMax' | 'energyFloorHartree' | 'hasFieldFreeAnion'>>, states: LevelState[]): string[] {
  const p: string[] = [];
  if (!Array.isArray(states)) return ['not an array'];
  const seen = new Set<number>();
  states.forEach((s, k) => {
    const at = `state ${k} (m=${s.m}, ν=${s.nu})`;
    if (!Number.isInteger(s.m) || s.m < 0 || s.m > input.mMax) p.push(`${at}: m out of range`);
    if (!Number.isInteger(s.nu) || s.nu < 0) p.push(`${at}: ν not a natural number`);
    if (k > 0) {
      const prev = states[k - 1];
      if (s.m < prev.m || (s.m === prev.m && s.nu !== prev.nu + 1)) p.push(`${at}: not sorted by m then consecutive ν`);
    }
    if (s.nu === 0) seen.add(s.m);
    if (!s.flags.every((f) => FLAGS.includes(f))) p.push(`${at}: unknown flag ${s.flags.join()}`);
    const unresolved = s.flags.includes('unresolved');
    for (const [name, v] of [['bindingHartree', s.bindingHartree], ['bindingOverB', s.bindingOverB], ['relError', s.relError]] as const) {
      if (!Number.isFinite(v) && !unresolved) p.push(`${at}: ${name} = ${v} without a flag that explains it`);
    }
    if (Number.isFinite(s.bindingHartree) && !(s.bindingHartree >= 0)) p.push(`${at}: negative binding ${s.bindingHartree}`);
    if (Number.isFinite(s.bindingHartree) && Math.abs(s.bindingHartree - input.fieldAu * s.bindingOverB) > 1e-12 * Math.abs(s.bindingHartree)) p.push(`${at}: bindingHartree ≠ B·bindingOverB`);
    if (Number.isFinite(s.relError) && !(s.relError >= 0)) p.push(`${at}: negative relError ${s.relError}`);
    const want = {
      'cutoff-dominated': s.m === 0 && input.alpha / input.cutoffBohr ** 2 >= 1,
      'non-adiabatic': s.bindingOverB > 0.1,
      'field-free-anion': s.m === 0 && input.hasFieldFreeAnion,
      'below-floor': unresolved || s.bindingHartree < input.energyFloorHartree,
    };
    for (const [flag, expected] of Object.entries(want)) if (s.flags.includes(flag as LevelFlag) !== expected) p.push(`${at}: flag ${flag} should be ${expected ? 'set' : 'absent'} (flags ${s.flags.join() || 'none'}, ε/B = ${s.bindingOverB})`);
  });
  // Every orbital binds at least one state in any field (Simon 1976; Avron, Herbst & Simon 1981).
  for (let m = 0; m <= input.mMax; m++) if (!seen.has(m)) p.push(`orbital m = ${m} has no state`);
  return p;
}

function clampGrid(setup: MapSetup, side: number, mMax: number): MapSetup {
  return { ...setup, grid: { nAlpha: Math.min(setup.grid.nAlpha, side), nField: Math.min(setup.grid.nField, side) }, orbitals: { mMax: Math.min(setup.orbitals.mMax, mMax) }, display: { ...setup.display, shown: { kind: 'survivors' } } };
}

describe('the engine on valid generated setups', () => {
  it(`levels() at ${ENGINE_POINTS} random grid points (grids clamped to 12 × 12, m ≤ 2, λ = αB ≤ ${LAMBDA_ENVELOPE}) returns sorted states, at least one per orbital, finite numbers or an explaining flag, and consistent flags`, () => {
    const rand = mulberry32(SEED + 1);
    const failures: string[] = [];
    let run = 0;
    let skipped = 0;
    let slowest = 0;
    let states = 0;
    const started = performance.now();
    while (run < ENGINE_POINTS) {
      const setup = validSetup(rand);
      expect(validateSetup(setup).ok).toBe(true);
      const small = clampGrid(setup, 12, 2);
      const alphas = axisNodes(small.alphaAxis.min, small.alphaAxis.max, small.alphaAxis.scale, small.grid.nAlpha);
      const tesla = axisNodes(small.fieldAxis.min, small.fieldAxis.max, small.fieldAxis.scale, small.grid.nField);
      const input = {
        alpha: alphas[intIn(rand, 0, alphas.length - 1)],
        fieldAu: toAtomicField('T', tesla[intIn(rand, 0, tesla.length - 1)]) as number,
        cutoffBohr: small.shortRange.cutoffBohr,
        mMax: small.orbitals.mMax,
        energyFloorHartree: toHartree('K', small.energyFloorKelvin) as number,
        hasFieldFreeAnion: rand() < 0.5,
      };
      if (input.alpha * input.fieldAu > LAMBDA_ENVELOPE) {
        skipped++;
        continue;
      }
      run++;
      const t0 = performance.now();
      let out: LevelState[];
      try {
        out = levels(input);
      } catch (error) {
        failures.push(`levels(${JSON.stringify(input)}) threw ${String(error)}`);
        continue;
      }
      slowest = Math.max(slowest, performance.now() - t0);
      states += out.length;
      for (const problem of levelsProblems(input, out)) failures.push(`levels(${JSON.stringify(input)}): ${problem}`);
    }
    const seconds = (performance.now() - started) / 1000;
    console.info(`engine fuzz: ${run} levels() calls (${states} states) in ${seconds.toFixed(2)} s, slowest ${slowest.toFixed(0)} ms; ${skipped} points above λ = ${LAMBDA_ENVELOPE} skipped`);
    expect(failures, failures.slice(0, 5).join('\n')).toEqual([]);
    expect(run).toBe(ENGINE_POINTS);
  });

  it('bindingMap on valid setups clamped to 3 × 3 cells and m ≤ 1 returns arrays of the contract sizes with finite non-negative bindings', () => {
    const rand = mulberry32(SEED + 2);
    let maps = 0;
    while (maps < 4) {
      const setup = clampGrid(validSetup(rand), 3, 1);
      if (setup.alphaAxis.max * toAtomicField('T', setup.fieldAxis.max) > LAMBDA_ENVELOPE) continue;
      maps++;
      const r = bindingMap(setup);
      const cells = setup.grid.nAlpha * setup.grid.nField;
      const orbitals = setup.orbitals.mMax + 1;
      const context = describeInput(setup);
      expect(r.cellCount, context).toBe(cells);
      expect(r.alphas.length).toBe(setup.grid.nAlpha);
      expect(r.fieldsAu.length).toBe(setup.grid.nField);
      expect(r.counts.length).toBe(orbitals * cells);
      expect(r.flags.length).toBe(orbitals * cells);
      expect(r.bindingHartree.length).toBe(orbitals * r.levelsPerOrbital * cells);
      expect(r.bindingHartree.every((v) => Number.isFinite(v) && v >= 0), context).toBe(true);
      expect(r.counts.every((c) => c <= r.levelsPerOrbital), context).toBe(true);
      expect(Number.isFinite(r.maxRelError) && r.maxRelError >= 0, context).toBe(true);
    }
  });

  it('bindingMap refuses 300 invalid setups (10⁹-cell grids, NaN ranges, unknown fields) with a SetupValidationError before any work', () => {
    const rand = mulberry32(SEED + 3);
    let refused = 0;
    for (let n = 0; n < 300; n++) {
      const setup = cloneSetup(validSetup(rand));
      const breakIt = pick(rand, [
        () => (setup.grid = { nAlpha: 1e9, nField: 1e9 }),
        () => (setup.grid = { nAlpha: L.maxGridSide + 1, nField: 2 }),
        () => (setup.alphaAxis.min = Number.NaN),
        () => (setup.fieldAxis.max = Number.POSITIVE_INFINITY),
        () => (setup.orbitals.mMax = L.maxOrbital + 1),
        () => (setup.shortRange.cutoffBohr = -0),
        () => defineOwn(setup, 'extra', deepJunk(1000, 'array')),
      ]);
      breakIt();
      const expected = validateSetup(setup);
      expect(expected.ok).toBe(false);
      let thrown: unknown;
      try {
        bindingMap(setup);
      } catch (error) {
        thrown = error;
      }
      expect(thrown).toBeInstanceOf(SetupValidationError);
      if (!expected.ok) expect((thrown as SetupValidationError).issues).toEqual(expected.issues);
      refused++;
    }
    expect(refused).toBe(300);
  });

  it('levels() rejects 2,000 inputs with one bad parameter (non-positive or non-finite α, B, r_c; mMax outside 0…64; bad floor or tol) with an EngineInputError naming it', () => {
    const rand = mulberry32(SEED + 4);
    const badPositive = [0, -0, -1, -Number.MIN_VALUE, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, '1', null, undefined, {}, [], true, 10n];
    const badM = [65, 1000, -1, 1.5, Number.NaN, Number.POSITIVE_INFINITY, '3', null, undefined, 2 ** 53];
    const badFloor = [-1, -Number.MIN_VALUE, Number.NaN, Number.POSITIVE_INFINITY, '0', null];
    const badTol = [0, -1e-8, Number.NaN, Number.POSITIVE_INFINITY, '1e-8', null];
    let named = 0;
    for (let n = 0; n < 2_000; n++) {
      const input: Record<string, unknown> = { alpha: 10 ** (rand() * 6 - 3), fieldAu: 10 ** (rand() * 6 - 6), cutoffBohr: 10 ** (rand() * 3 - 2), mMax: intIn(rand, 0, 64) };
      const parameter = pick(rand, ['alpha', 'fieldAu', 'cutoffBohr', 'mMax', 'energyFloorHartree', 'tol'] as const);
      const value = parameter === 'mMax' ? pick(rand, badM) : parameter === 'energyFloorHartree' ? pick(rand, badFloor) : parameter === 'tol' ? pick(rand, badTol) : pick(rand, badPositive);
      if (value === null && (parameter === 'energyFloorHartree' || parameter === 'tol')) input[parameter] = null;
      else input[parameter] = value;
      let thrown: unknown;
      try {
        levels(input as unknown as LevelsInput);
      } catch (error) {
        thrown = error;
      }
      const context = `${parameter} = ${String(value)}`;
      expect(thrown, context).toBeInstanceOf(EngineInputError);
      expect((thrown as EngineInputError).name, context).toBe('EngineInputError');
      expect((thrown as EngineInputError).parameter, context).toBe(parameter);
      expect((thrown as Error).message, context).toContain(parameter);
      named++;
    }
    expect(named).toBe(2_000);
    for (const input of [null, undefined, 42, 'alpha']) expect(() => levels(input as unknown as LevelsInput)).toThrow(EngineInputError);
  });

  it('the setup that once never finished is refused, and the worst allowed corner (√α/r_c = 32, B = 10¹⁰ T) has at most 32 levels per orbital', () => {
    const hanging = { ...defaultSetup(), alphaAxis: { min: 1, max: 1000, scale: 'log' as const }, fieldAxis: { min: 1, max: 1e10, scale: 'log' as const }, shortRange: { model: 'regularized-polarization' as const, cutoffBohr: 1e-3 } };
    const verdict = validateSetup(hanging);
    expect(verdict.ok).toBe(false);
    if (!verdict.ok) expect(verdict.issues.map((i) => i.path)).toContain('shortRange.cutoffBohr');
    const corner = levels({ alpha: 1024, fieldAu: toAtomicField('T', 1e10), cutoffBohr: 1, mMax: 1 });
    for (const m of [0, 1]) {
      const count = corner.filter((s) => s.m === m).length;
      expect(count).toBeGreaterThan(0);
      expect(count).toBeLessThanOrEqual(SETUP_LIMITS.maxLevelsPerOrbital);
    }
  });
});
