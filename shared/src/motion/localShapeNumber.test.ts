/** The per-cell (strided) shape number equals the plain one, fast path and fallbacks alike. */
import { describe, expect, it } from 'vitest';
import { localShapeNumber, localShapeNumberStrided } from './localShapeNumber.js';

describe('localShapeNumberStrided', () => {
  it('equals localShapeNumber on 3000 seeded random orbital sequences with missing states (exact identity up to the last bit: 1e-15)', () => {
    let seed = 11;
    const rnd = (): number => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
    for (let k = 0; k < 3000; k++) {
      const mMax = Math.floor(rnd() * 9);
      const stride = 3;
      const offset = 1;
      const seq = Array.from({ length: mMax + 1 }, (_, j) => (rnd() < 0.15 ? 0 : 1e-6 * (2 * j + 1) ** -(2 + 7 * rnd())));
      const flat = new Float64Array(offset + stride * (mMax + 1));
      seq.forEach((v, j) => (flat[offset + j * stride] = v));
      for (let m = 0; m <= mMax; m++) {
        const a = localShapeNumber(seq, m);
        const b = localShapeNumberStrided(flat, offset, stride, mMax, m);
        if (Number.isNaN(a)) expect(b, `m=${m} ${seq}`).toBeNaN();
        else expect(Math.abs(b - a) <= 1e-15 * a, `m=${m} ${seq}: ${b} vs ${a}`).toBe(true);
      }
    }
  });

  it('p = ln(ε_m/ε_{m+2})/ln((2m+5)/(2m+1)) for a pure power law gives its exponent (3, to 1e-14)', () => {
    const seq = Float64Array.from({ length: 8 }, (_, j) => (2 * j + 1) ** -3);
    for (let m = 0; m < 8; m++) expect(Math.abs(localShapeNumberStrided(seq, 0, 1, 7, m) - 3)).toBeLessThan(1e-14);
  });
});
