import { describe, expect, it } from 'vitest';
import { DomainError } from '../errors.js';
import { expectClose } from '../../test/expectClose.js';
import { loadSpecialOracle } from '../../test/oracle.js';
import { expectValidationCase } from '../../test/validationData.js';
import { expint1, expn, expnScaled } from './expint.js';

const oracle = loadSpecialOracle();
const DLMF8 = 'F. W. J. Olver et al., NIST Digital Library of Mathematical Functions, §8.19 (2010–)';

describe('expnScaled (e^x E_n(x))', () => {
  it('matches mpmath for n ∈ {0,…,65}, 1e-30 ≤ x ≤ 1e30 within 1e-14 relative (series x ≤ 1, continued fraction x > 1)', () => {
    expect(expectValidationCase('expn-scaled').points).toBe(oracle.expnScaled.length); // shared with fieldbound check
  });
  it('satisfies the recurrence n E_{n+1}(x) = e^(−x) − x E_n(x) (DLMF 8.19.12) within 1e-13', () => {
    for (const x of [0.3, 1, 2.5, 10]) {
      for (const n of [1, 2, 7, 30]) {
        expectClose(n * expnScaled(n + 1, x), 1 - x * expnScaled(n, x), { rel: 1e-13, inputs: { n, x }, source: DLMF8 });
      }
    }
  });
  it('gives E_n(0) = 1/(n−1) for n ≥ 2 and +Infinity for n ≤ 1 (DLMF 8.19.6)', () => {
    expect(expnScaled(5, 0)).toBe(0.25);
    expect(expnScaled(1, 0)).toBe(Infinity);
    expect(expn(0, 0)).toBe(Infinity);
  });
  it('throws DomainError for non-integer or negative n and negative or non-finite x', () => {
    expect(() => expnScaled(1.5, 1)).toThrow(DomainError);
    expect(() => expnScaled(-1, 1)).toThrow(DomainError);
    expect(() => expnScaled(1, -1)).toThrow(DomainError);
    expect(() => expnScaled(1, Infinity)).toThrow(DomainError);
  });
});

describe('expn and expint1', () => {
  it('match mpmath E_n(x) for 1e-10 ≤ x ≤ 700 within 1e-14 relative', () => {
    expect(expectValidationCase('expn').points).toBe(oracle.expn.length); // shared with fieldbound check
  });
  it('E1(1) = 0.21938393439552027368 (A&S Table 5.1) within 1e-14 (series route at x = 1)', () => {
    expectClose(expint1(1), 0.21938393439552027368, {
      rel: 1e-14,
      inputs: { x: 1 },
      source: 'M. Abramowitz, I. A. Stegun, Handbook of Mathematical Functions, Table 5.1 (1964)',
    });
  });
  it('underflows to 0 for x > 745', () => {
    expect(expn(3, 800)).toBe(0);
  });
});
