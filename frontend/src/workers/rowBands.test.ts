import { describe, expect, it } from 'vitest';
import { defaultSetup, stateIndex, validateSetup, type BindingMapResult } from '@fieldbound/shared';
import { bandSetup, coarseSetup, rowFieldTesla, splitRows } from './rowBands';
import { mergeBands } from './mergeBands';

describe('splitRows', () => {
  it('splits 10 rows into bands of 4, 3, 3 covering every row once', () => {
    expect(splitRows(10, 3)).toEqual([{ start: 0, end: 3 }, { start: 4, end: 6 }, { start: 7, end: 9 }]);
  });
  it('never makes a band under two rows (5 rows in at most 2 bands)', () => {
    expect(splitRows(5, 4)).toEqual([{ start: 0, end: 2 }, { start: 3, end: 4 }]);
  });
});

describe('bandSetup', () => {
  it('gives a valid setup whose rows fall on the parent rows (log field axis 1…45 T)', () => {
    const setup = { ...defaultSetup(), grid: { nAlpha: 8, nField: 9 } };
    const band = bandSetup(setup, { start: 3, end: 6 });
    expect(validateSetup(band).ok).toBe(true);
    expect(band.grid.nField).toBe(4);
    for (let r = 0; r < 4; r++) expect(rowFieldTesla(band, r)).toBeCloseTo(rowFieldTesla(setup, 3 + r), 12);
  });
  it('coarse setup caps each side at 64', () => {
    expect(coarseSetup({ ...defaultSetup(), grid: { nAlpha: 256, nField: 32 } }).grid).toEqual({ nAlpha: 64, nField: 32 });
  });
});

function band(nField: number, levels: number, fill: (m: number, nu: number, row: number, i: number) => number, rowOffset: number): BindingMapResult {
  const nAlpha = 2;
  const cellCount = nAlpha * nField;
  const mMax = 1;
  const bindingHartree = new Float64Array((mMax + 1) * levels * cellCount);
  const counts = new Uint16Array((mMax + 1) * cellCount);
  for (let m = 0; m <= mMax; m++)
    for (let nu = 0; nu < levels; nu++)
      for (let j = 0; j < nField; j++)
        for (let i = 0; i < nAlpha; i++) {
          const e = fill(m, nu, rowOffset + j, i);
          bindingHartree[stateIndex(m, nu, j * nAlpha + i, levels, cellCount)] = e;
          if (e > 0) counts[m * cellCount + j * nAlpha + i]++;
        }
  return {
    engineVersion: 't', nAlpha, nField, cellCount, mMax, levelsPerOrbital: levels,
    alphas: Float64Array.of(1, 2), fieldsAu: Float64Array.from({ length: nField }, (_, j) => rowOffset + j),
    bindingHartree, counts, flags: new Uint8Array((mMax + 1) * cellCount).fill(rowOffset), maxRelError: rowOffset * 1e-9, elapsedMs: 5,
  };
}

describe('mergeBands', () => {
  // ε(m, ν, row, column) = 1000·m + 100·ν + 10·row + column + 1; the lower band stores one level, the upper two.
  const value = (m: number, nu: number, row: number, i: number) => 1000 * m + 100 * nu + 10 * row + i + 1;
  const lower = band(2, 1, value, 0);
  const upper = band(3, 2, value, 2);
  const merged = mergeBands([lower, upper]);

  it('stacks the rows and pads the lower band to the larger number of levels with 0', () => {
    expect(merged.nField).toBe(5);
    expect(merged.levelsPerOrbital).toBe(2);
    expect(Array.from(merged.fieldsAu)).toEqual([0, 1, 2, 3, 4]);
    const at = (m: number, nu: number, row: number, i: number) => merged.bindingHartree[stateIndex(m, nu, row * 2 + i, 2, merged.cellCount)];
    expect(at(1, 0, 4, 1)).toBe(value(1, 0, 4, 1));
    expect(at(1, 1, 3, 0)).toBe(value(1, 1, 3, 0));
    expect(at(0, 1, 1, 0)).toBe(0);
    expect(at(0, 0, 1, 0)).toBe(value(0, 0, 1, 0));
  });
  it('keeps counts and flags per orbital and cell and the largest error', () => {
    expect(merged.counts[1 * merged.cellCount + 4 * 2 + 1]).toBe(2);
    expect(merged.counts[0 * merged.cellCount + 0]).toBe(1);
    expect(merged.flags[1 * merged.cellCount + 2 * 2]).toBe(2);
    expect(merged.maxRelError).toBe(2e-9);
  });
});
