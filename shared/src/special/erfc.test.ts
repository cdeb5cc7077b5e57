import { describe, expect, it } from 'vitest';
import { DomainError } from '../errors.js';
import { expectClose } from '../../test/expectClose.js';
import { loadSpecialOracle } from '../../test/oracle.js';
import { expectValidationCase } from '../../test/validationData.js';
import { erfc, erfcx } from './erfc.js';

const oracle = loadSpecialOracle();

describe('erfc', () => {
  it('matches mpmath for −6 ≤ x ≤ 26.5 within 1e-14 relative (series x < 1, continued fraction x ≥ 1)', () => {
    expect(expectValidationCase('erfc').points).toBe(oracle.erfc.length); // shared with fieldbound check
  });
  it('satisfies erfc(−x) = 2 − erfc(x) (DLMF 7.4.2) within 1e-15', () => {
    for (const x of [0.2, 1, 3]) expectClose(erfc(-x), 2 - erfc(x), { rel: 1e-15, inputs: { x }, source: 'DLMF 7.4.2' });
  });
  it('underflows to exactly 0 for x > 27 and throws DomainError for non-finite x', () => {
    expect(erfc(30)).toBe(0);
    expect(() => erfc(NaN)).toThrow(DomainError);
    expect(() => erfc(-Infinity)).toThrow(DomainError);
  });
});

describe('erfcx', () => {
  it('matches mpmath e^(x²)erfc(x) for −6 ≤ x ≤ 1e300 within 1e-14 relative', () => {
    expect(expectValidationCase('erfcx').points).toBe(oracle.erfcx.length); // shared with fieldbound check
  });
  it('approaches 1/(x√π) for large x (DLMF 7.12.1) within 1e-15 at x = 1e9', () => {
    expectClose(erfcx(1e9), 1 / (1e9 * Math.sqrt(Math.PI)), { rel: 1e-15, inputs: { x: 1e9 }, source: 'DLMF 7.12.1' });
  });
});
