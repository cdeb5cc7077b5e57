import { describe, expect, it } from 'vitest';
import { DomainError } from '../errors.js';
import { expectClose, relDiff } from '../../test/expectClose.js';
import { loadSpecialOracle } from '../../test/oracle.js';
import { expectValidationCase } from '../../test/validationData.js';
import { expnScaled } from './expint.js';
import { erfcx } from './erfc.js';
import { gamma } from './gamma.js';
import { tricomiU2 } from './tricomiU2.js';
import { tricomiU32 } from './tricomiU32.js';
import { integrateToInfinity } from '../../test/quadrature.js';
import { mulberry32 } from '../../test/seededRandom.js';

const oracle = loadSpecialOracle();
const DLMF13 = 'F. W. J. Olver et al., NIST Digital Library of Mathematical Functions, §13 (2010–)';


describe('tricomiU2: U(2, 2−m, x)', () => {
  const rows = oracle.tricomiU2['rows [m, x, value]'];
  it(`matches mpmath hyperu at ${rows.length} points, m = 0…64, 1e-30 ≤ x ≤ 1e30, route transitions included, within 1e-14`, () => {
    expect(expectValidationCase('tricomi-u2').points).toBe(rows.length); // shared with fieldbound check
  });
  it('equals e^x[E_m(x) − E_{m+1}(x)] (DLMF 13.6.6 with 8.19) where that difference is well conditioned, within 1e-13', () => {
    for (const m of [1, 3, 10]) {
      for (const x of [0.5, 2, 5]) {
        expectClose(tricomiU2(m, x), expnScaled(m, x) - expnScaled(m + 1, x), { rel: 1e-13, inputs: { m, x }, source: DLMF13 });
      }
    }
  });
  it('is continuous across the route switches x = 1 and x = 30 + 2m (relative jump < 1e-13 between neighbouring doubles)', () => {
    for (const m of [0, 1, 2, 9, 64]) {
      for (const x0 of [1, 30 + 2 * m]) {
        const lo = tricomiU2(m, x0 * (1 - 1e-15));
        const hi = tricomiU2(m, x0 * (1 + 1e-15));
        expect(relDiff(lo, hi)).toBeLessThan(1e-13);
      }
    }
  });
  it('equals Gauss–Kronrod quadrature of ∫₀^∞ e^(−xt) t (1+t)^(−m−1) dt (DLMF 13.4.4) at 40 seeded random (m, x), within 1e-12', () => {
    const rand = mulberry32(20260101);
    for (let i = 0; i < 40; i++) {
      const m = Math.floor(rand() * 65);
      const x = Math.pow(10, -3 + 6 * rand());
      const f = (t: number): number => Math.exp(-x * t - (m + 1) * Math.log1p(t)) * t;
      const sc = 1 / (x + m + 1);
      const q = integrateToInfinity(f, [0, sc / 4, sc, 4 * sc, 16 * sc, 64 * sc], 1e-13);
      expectClose(tricomiU2(m, x), q, { rel: 1e-12, inputs: { seed: 20260101, i, m, x }, source: 'QK15 quadrature of DLMF 13.4.4' });
    }
  });
  it('has U(2, 2−m, 0) = 1/(m(m−1)) for m ≥ 2 (DLMF 13.2.16) and +Infinity for m ≤ 1', () => {
    expect(tricomiU2(2, 0)).toBe(0.5);
    expect(tricomiU2(5, 0)).toBe(0.05);
    expect(tricomiU2(0, 0)).toBe(Infinity);
    expect(tricomiU2(1, 0)).toBe(Infinity);
  });
  it('throws DomainError for m non-integer or negative and x negative or non-finite', () => {
    for (const [m, x] of [[1.5, 1], [-1, 1], [1, -1e-300], [1, NaN], [1, Infinity]] as const) {
      expect(() => tricomiU2(m, x)).toThrow(DomainError);
    }
  });
});

describe('tricomiU32: U(3/2, 3/2−m, s)', () => {
  const rows = oracle.tricomiU32['rows [m, s, value]'];
  it(`matches mpmath hyperu at ${rows.length} points, m = 0…64, 1e-30 ≤ s ≤ 1e30, within 1e-14`, () => {
    expect(expectValidationCase('tricomi-u32').points).toBe(rows.length); // shared with fieldbound check
  });
  it('equals 2/√s − 2√π erfcx(√s) for m = 0 (DLMF 13.6.6, 8.4.6) within 1e-13 for s ≤ 4', () => {
    for (const s of [1e-6, 0.01, 0.3, 1, 4]) {
      const r = Math.sqrt(s);
      expectClose(tricomiU32(0, s), 2 / r - 2 * Math.sqrt(Math.PI) * erfcx(r), { rel: 1e-13, inputs: { s }, source: DLMF13 });
    }
  });
  it('tends to Γ(m − ½)/m! as s → 0 for m ≥ 1 (DLMF 13.2.16) within 1e-14 at s = 1e-30', () => {
    for (const m of [1, 2, 7, 64]) {
      expectClose(tricomiU32(m, 1e-30), gamma(m - 0.5) / gamma(m + 1), { rel: 1e-14, inputs: { m, s: 1e-30 }, source: DLMF13 });
    }
  });
  it('approaches s^(−3/2) at large s (DLMF 13.7.3) within 1e-15 at s = 1e25', () => {
    expectClose(tricomiU32(3, 1e25), Math.pow(1e25, -1.5), { rel: 1e-15, abs: 0, inputs: { m: 3, s: 1e25 }, source: DLMF13 });
  });
  it('is continuous across the route switches s = 0.05 and s = 30 + 2m (relative jump < 1e-13)', () => {
    for (const m of [0, 1, 2, 9, 64]) {
      for (const s0 of [0.05, 30 + 2 * m]) {
        expect(relDiff(tricomiU32(m, s0 * (1 - 1e-15)), tricomiU32(m, s0 * (1 + 1e-15)))).toBeLessThan(1e-13);
      }
    }
  });
  it('throws DomainError for bad m or s', () => {
    expect(() => tricomiU32(0.5, 1)).toThrow(DomainError);
    expect(() => tricomiU32(1, -1)).toThrow(DomainError);
  });
});
