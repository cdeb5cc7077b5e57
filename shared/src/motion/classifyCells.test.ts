import { describe, expect, it } from 'vitest';
import { allocateCellMotionOutput, classifyCells, classifyCellsPerState, type CellBindings } from './classifyCells.js';
import { validateMotionSettings, type MotionSettingsInput } from './motionSettings.js';
import { mulberry32 } from '../../test/seededRandom.js';

const rng = mulberry32;

/**
 * A random map with the awkward cases the fused loop must hand to the per-state path or get right itself:
 * missing neighbours (p from another pair or none), sequences that rise (p ≤ 0), p beyond the table,
 * a row with B = 0 (F = 0), levels beyond the stored count, bindings from far below to far above E⊥.
 */
function randomMap(seed: number, nAlpha: number, nField: number, mMax: number, L: number): CellBindings {
  const r = rng(seed);
  const cellCount = nAlpha * nField;
  const fieldsAu = Float64Array.from({ length: nField }, (_, j) => (j === 0 ? 0 : 10 ** (-6 + 5 * r())));
  const bindingHartree = new Float64Array((mMax + 1) * L * cellCount);
  const counts = new Uint16Array((mMax + 1) * cellCount);
  for (let c = 0; c < cellCount; c++) {
    const scale = 10 ** (-11 + 8 * r());
    const p = r() < 0.1 ? 12 * r() : 2 + 7 * r(); // sometimes outside [2, 9] or a rising sequence
    for (let m = 0; m <= mMax; m++) {
      const n = Math.floor(r() * (L + 1));
      counts[m * cellCount + c] = n;
      for (let nu = 0; nu < L; nu++) {
        const u = r();
        // a few states beyond the count (not read) and a few holes (ε = 0) among the counted ones
        const e = u < 0.08 ? 0 : scale * (2 * m + 1) ** -p * 0.3 ** nu * (1 + 0.2 * (r() - 0.5));
        bindingHartree[(m * L + nu) * cellCount + c] = e;
      }
    }
  }
  return { bindingHartree, cellCount, nAlpha, mMax, levelsPerOrbital: L, fieldsAu, counts };
}

/** First index where two arrays differ bit for bit (NaN equals NaN), or −1. */
function firstDifference(a: Float64Array | Float32Array | Uint8Array | Uint16Array, b: typeof a): number {
  const x = new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  const y = new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
  if (x.length !== y.length) return 0;
  for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return Math.floor(i / a.BYTES_PER_ELEMENT);
  return -1;
}

describe('classifyCells (fused loop) equals the per-state evaluation bit for bit', () => {
  const cases: [string, MotionSettingsInput][] = [
    ['a fixed E⊥ of 1 K', { massNumber: 133, transverseEnergyHartree: 1 / 3.1577502480407e5 }],
    ['a fixed E⊥ of 1 mK', { massNumber: 7, transverseEnergyHartree: 1e-3 / 3.1577502480407e5 }],
    ['ion Landau level 3', { massNumber: 40, ionLandauLevel: 3 }],
    ['a temperature of 2 K', { massNumber: 88, temperatureKelvin: 2 }],
  ];
  it.each(cases)('%s, on random maps with m = 0…7 and m = 0…19 (beyond the table)', (_, input) => {
    const settings = validateMotionSettings(input);
    for (const [seed, mMax] of [
      [1, 7],
      [2, 7],
      [3, 19],
    ] as const) {
      const map = randomMap(seed, 23, 17, mMax, 3);
      const fast = allocateCellMotionOutput(map, settings);
      const slow = allocateCellMotionOutput(map, settings);
      classifyCells(map, settings, fast);
      classifyCellsPerState(map, settings, slow);
      expect(firstDifference(fast.stateClass, slow.stateClass)).toBe(-1);
      expect(firstDifference(fast.flags, slow.flags)).toBe(-1);
      expect(firstDifference(fast.survivors, slow.survivors)).toBe(-1);
      expect(firstDifference(fast.widthHartree, slow.widthHartree)).toBe(-1);
      if (slow.fractions) expect(firstDifference(fast.fractions!, slow.fractions)).toBe(-1);
      // the maps are not trivial: they hold bound, resonance and unbound states
      const classes = new Set(fast.stateClass);
      expect(classes.size).toBeGreaterThanOrEqual(3);
    }
  });
});
