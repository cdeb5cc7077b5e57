/**
 * Whole maps against direct per-point solves. Reference for every value, count and flag:
 * consistency with the direct solver (`levels`, itself validated against exactly solvable
 * potentials, the weak-coupling series of B. Simon, Ann. Phys. 97, 279 (1976), and an independent
 * Numerov reference in levels.test.ts). Tolerance: 1e-6 relative per stored binding energy (issue 3,
 * item 6) in every regime.
 */
import { describe, expect, it } from 'vitest';
import { EngineInputError } from '../errors.js';
import { SetupValidationError } from '../setup/mapSetup.js';
import { bindingMap, bindingMapWindow } from './bindingMap.js';
import { bindingMapDirect } from './bindingMapDirect.js';
import { compareWithDirect } from './compareWithDirect.js';
import { MAP_FLAG, type MapProgress } from './mapTypes.js';
import { mulberry32 } from '../../test/seededRandom.js';
import { auToTesla, mapTestSetup } from './testSetups.js';

const TOL = 1e-6;
const N = Number(process.env.FIELDBOUND_MAP_TEST_N ?? 48);

const SETUPS = {
  // the benchmark's ranges (issue 3, item 9) on a small grid: weak to strong coupling, excited levels
  bench: mapTestSetup({ alpha: [1, 1000, 'log'], fieldTesla: [auToTesla(1e-6), auToTesla(1e-1), 'log'], grid: [N, N], mMax: 7, cutoffBohr: 2, floorKelvin: 0 }),
  // laboratory fields with the default 1 mK floor: most states fall below it
  laboratory: mapTestSetup({ alpha: [1, 1000, 'log'], fieldTesla: [1, 45, 'log'], grid: [N, N], mMax: 4, cutoffBohr: 2, floorKelvin: 1e-3 }),
  // linear axes, a small cutoff (m = 0 cutoff-dominated, many levels), strong fields
  linear: mapTestSetup({ alpha: [20, 400, 'linear'], fieldTesla: [2e3, 2e4, 'linear'], grid: [N, N - 7], mMax: 3, cutoffBohr: 0.7, floorKelvin: 0 }),
  // white-dwarf fields, large cutoff, a floor of 1 K
  whiteDwarf: mapTestSetup({ alpha: [1, 1000, 'log'], fieldTesla: [100, 1e5, 'log'], grid: [N - 5, N], mMax: 2, cutoffBohr: 5, floorKelvin: 1 }),
};

function randomCells(cellCount: number, n: number, seed: number): number[] {
  const rnd = mulberry32(seed);
  const out: number[] = [];
  for (let k = 0; k < n; k++) out.push(Math.floor(rnd() * cellCount));
  // plus the four corners
  return out;
}

describe('bindingMap against direct solves (consistency with the direct solver)', () => {
  for (const [name, setup] of Object.entries(SETUPS)) {
    it(`${name}: ${setup.grid.nAlpha}×${setup.grid.nField}, m ≤ ${setup.orbitals.mMax}: 60 seeded-random cells + corners, every value within ${TOL} relative, counts and flags equal`, () => {
      const map = bindingMap(setup);
      const cells = randomCells(map.cellCount, 60, 1234 + name.length);
      cells.push(0, map.nAlpha - 1, map.cellCount - map.nAlpha, map.cellCount - 1);
      const cmp = compareWithDirect(setup, map, cells, TOL);
      expect(cmp.mismatches.slice(0, 10)).toEqual([]);
      expect(cmp.worstRelError).toBeLessThanOrEqual(TOL);
      expect(map.maxRelError).toBeLessThanOrEqual(TOL);
      expect(cmp.statesCompared).toBeGreaterThan(0);
    });
  }
});

describe('bindingMap result layout and flags', () => {
  it('axes are node-centred and even on the axis scale, arrays have the contract sizes, no NaN anywhere', () => {
    const s = SETUPS.linear;
    const map = bindingMap(s);
    expect(map.alphas[0]).toBe(20);
    expect(map.alphas[map.nAlpha - 1]).toBe(400);
    expect(map.alphas[1] - map.alphas[0]).toBeCloseTo(380 / (map.nAlpha - 1), 12);
    expect(map.fieldsAu[0]).toBeCloseTo(2e3 / 2.350517567581e5, 17);
    expect(map.cellCount).toBe(map.nAlpha * map.nField);
    expect(map.bindingHartree.length).toBe((map.mMax + 1) * map.levelsPerOrbital * map.cellCount);
    expect(map.counts.length).toBe((map.mMax + 1) * map.cellCount);
    expect(map.flags.length).toBe((map.mMax + 1) * map.cellCount);
    expect(map.bindingHartree.every((v) => Number.isFinite(v) && v >= 0)).toBe(true);
    expect(map.engineVersion).toMatch(/^\d+\.\d+\.\d+/);
  });

  it('every cell of every orbital has at least one state without a floor (Simon 1976: 1D weak coupling), CUTOFF_DOMINATED exactly where m = 0 and α/r_c² ≥ 1', () => {
    const s = SETUPS.linear;
    const map = bindingMap(s);
    for (let m = 0; m <= map.mMax; m++) {
      for (let c = 0; c < map.cellCount; c++) {
        expect(map.counts[m * map.cellCount + c]).toBeGreaterThanOrEqual(1);
        const cut = (map.flags[m * map.cellCount + c] & MAP_FLAG.CUTOFF_DOMINATED) !== 0;
        expect(cut).toBe(m === 0 && map.alphas[c % map.nAlpha] / 0.49 >= 1);
      }
    }
  });

  it('states below the floor are stored as 0 and flagged BELOW_FLOOR; the count excludes them', () => {
    const s = SETUPS.laboratory;
    const map = bindingMap(s);
    const floor = 1e-3 / 3.1577502480407e5;
    let below = 0;
    for (let m = 0; m <= map.mMax; m++) {
      for (let c = 0; c < map.cellCount; c++) {
        const n = map.counts[m * map.cellCount + c];
        for (let nu = 0; nu < map.levelsPerOrbital; nu++) {
          const v = map.bindingHartree[(m * map.levelsPerOrbital + nu) * map.cellCount + c];
          if (nu < n) expect(v).toBeGreaterThanOrEqual(floor);
          else expect(v).toBe(0);
        }
        if ((map.flags[m * map.cellCount + c] & MAP_FLAG.BELOW_FLOOR) !== 0) below++;
      }
    }
    expect(below).toBeGreaterThan(0);
  });
});

describe('bindingMapWindow and the direct reference map', () => {
  const s = mapTestSetup({ alpha: [5, 800, 'log'], fieldTesla: [auToTesla(1e-3), auToTesla(5e-2), 'log'], grid: [20, 18], mMax: 2, cutoffBohr: 1.5, floorKelvin: 0 });

  it('a window of rows has exactly the numbers of those rows of the full map (same model, bit-identical)', () => {
    const full = bindingMap(s);
    const w = bindingMapWindow(s, 5, 12);
    expect(w.nField).toBe(7);
    expect(w.levelsPerOrbital).toBe(full.levelsPerOrbital);
    expect(Array.from(w.fieldsAu)).toEqual(Array.from(full.fieldsAu.subarray(5, 12)));
    const L = full.levelsPerOrbital;
    for (let m = 0; m <= full.mMax; m++) {
      for (let c = 0; c < w.cellCount; c++) {
        const cf = 5 * full.nAlpha + c;
        expect(w.counts[m * w.cellCount + c]).toBe(full.counts[m * full.cellCount + cf]);
        expect(w.flags[m * w.cellCount + c]).toBe(full.flags[m * full.cellCount + cf]);
        for (let nu = 0; nu < L; nu++) {
          expect(w.bindingHartree[(m * L + nu) * w.cellCount + c]).toBe(full.bindingHartree[(m * L + nu) * full.cellCount + cf]);
        }
      }
    }
  });

  it('the fast map agrees with the all-direct reference map cell by cell within 1e-6 (consistency with the direct solver)', () => {
    const small = { ...s, grid: { nAlpha: 9, nField: 7 } };
    const fast = bindingMap(small);
    const ref = bindingMapDirect(small);
    expect(Array.from(fast.counts)).toEqual(Array.from(ref.counts));
    const L = Math.min(fast.levelsPerOrbital, ref.levelsPerOrbital);
    for (let m = 0; m <= fast.mMax; m++) {
      for (let c = 0; c < fast.cellCount; c++) {
        for (let nu = 0; nu < fast.counts[m * fast.cellCount + c]; nu++) {
          const a = fast.bindingHartree[(m * fast.levelsPerOrbital + nu) * fast.cellCount + c];
          const b = ref.bindingHartree[(m * ref.levelsPerOrbital + nu) * ref.cellCount + c];
          expect(Math.abs(a - b) / b, `m=${m} cell=${c} ν=${nu}`).toBeLessThanOrEqual(TOL);
        }
        expect(fast.flags[m * fast.cellCount + c] & ~MAP_FLAG.DIRECT_SOLVE).toBe(ref.flags[m * ref.cellCount + c] & ~MAP_FLAG.DIRECT_SOLVE);
      }
    }
    expect(L).toBeGreaterThanOrEqual(1);
  });
});

describe('bindingMap: progress, cancellation, determinism, bad input', () => {
  const small = mapTestSetup({ alpha: [1, 1000, 'log'], fieldTesla: [auToTesla(1e-4), auToTesla(1e-1), 'log'], grid: [24, 20], mMax: 2, cutoffBohr: 2, floorKelvin: 0 });

  it('progress is reported in cells, monotone non-decreasing, ending at done = total = cellCount', () => {
    const seen: MapProgress[] = [];
    const map = bindingMap(small, { onProgress: (p) => seen.push({ ...p }) });
    expect(seen.length).toBeGreaterThan(2);
    for (let k = 1; k < seen.length; k++) expect(seen[k].done).toBeGreaterThanOrEqual(seen[k - 1].done);
    expect(seen.every((p) => p.total === map.cellCount)).toBe(true);
    expect(seen[seen.length - 1].done).toBe(map.cellCount);
  });

  it('an aborted signal stops the computation with an AbortError (before any work when aborted up front)', () => {
    const c0 = new AbortController();
    c0.abort();
    let calls = 0;
    expect(() => bindingMap(small, { signal: c0.signal, onProgress: () => calls++ })).toThrow(expect.objectContaining({ name: 'AbortError' }));
    expect(calls).toBe(0);
    const c1 = new AbortController();
    let after = 0;
    const run = (): unknown =>
      bindingMap(small, {
        signal: c1.signal,
        onProgress: (p) => {
          if (p.done > 0) c1.abort();
          if (c1.signal.aborted) after++;
        },
      });
    expect(run).toThrow(expect.objectContaining({ name: 'AbortError' }));
    expect(after).toBe(1);
  });

  it('two runs are bit-identical (deterministic: no randomness, no clock in the numbers)', () => {
    const a = bindingMap(small);
    const b = bindingMap(small);
    expect(Buffer.from(a.bindingHartree.buffer).equals(Buffer.from(b.bindingHartree.buffer))).toBe(true);
    expect(a.counts).toEqual(b.counts);
    expect(a.flags).toEqual(b.flags);
    expect(a.maxRelError).toBe(b.maxRelError);
    expect(a.levelsPerOrbital).toBe(b.levelsPerOrbital);
  });

  it('invalid setups throw SetupValidationError and bad options EngineInputError, before any work', () => {
    let calls = 0;
    const onProgress = (): void => void calls++;
    const bad = [
      { ...small, grid: { nAlpha: 2000, nField: 10 } },
      { ...small, alphaAxis: { min: 100, max: 10, scale: 'log' as const } },
      { ...small, alphaAxis: { min: -1, max: 10, scale: 'log' as const } },
      { ...small, fieldAxis: { min: Number.NaN, max: 10, scale: 'log' as const } },
      { ...small, orbitals: { mMax: 65 } },
      { ...small, shortRange: { model: 'regularized-polarization' as const, cutoffBohr: 0 } },
    ];
    for (const s of bad) expect(() => bindingMap(s, { onProgress })).toThrow(SetupValidationError);
    expect(() => bindingMap(small, { tolerance: 0, onProgress })).toThrow(EngineInputError);
    expect(() => bindingMap(small, { tolerance: Number.NaN, onProgress })).toThrow(/tolerance/);
    expect(calls).toBe(0);
  });
});
