import { describe, expect, it } from 'vitest';
import { DomainError } from '../errors.js';
import { expectClose } from '../../test/expectClose.js';
import { loadSpecialOracle } from '../../test/oracle.js';
import { expectValidationCase } from '../../test/validationData.js';
import { factorial, gamma, lnGamma } from './gamma.js';

const oracle = loadSpecialOracle();
const DLMF5 = 'F. W. J. Olver et al., NIST Digital Library of Mathematical Functions, §5 (2010–)';

describe('gamma', () => {
  it('matches mpmath at all fixture points within 1e-14 relative (validation case "gamma", also run by fieldbound check)', () => {
    expect(expectValidationCase('gamma').points).toBe(oracle.gamma.length);
  });
  it('returns exact factorials for integers, Γ(n+1) = n! (DLMF 5.4.1), within 1e-15', () => {
    let f = 1;
    for (let n = 1; n <= 22; n++) {
      f *= n; // exact up to 22!
      expect(gamma(n + 1)).toBe(f);
      expect(factorial(n)).toBe(f);
    }
  });
  it('satisfies the reflection formula Γ(x)Γ(1−x) = π/sin(πx) (DLMF 5.5.3) within 1e-14', () => {
    for (const x of [0.1, 0.25, 0.3, 0.45, -2.7, -10.3]) {
      expectClose(gamma(x) * gamma(1 - x), Math.PI / Math.sin(Math.PI * x), { rel: 1e-14, inputs: { x }, source: DLMF5 });
    }
  });
  it('gives Γ(1/2) = √π (DLMF 5.4.6) within 1e-15', () => {
    expectClose(gamma(0.5), Math.sqrt(Math.PI), { rel: 1e-15, inputs: { x: 0.5 }, source: DLMF5 });
  });
  it('overflows to +Infinity above 171.62 and throws DomainError at poles and non-finite x', () => {
    expect(gamma(172)).toBe(Infinity);
    expect(gamma(180.5)).toBe(Infinity);
    for (const x of [0, -1, -5, NaN, Infinity]) expect(() => gamma(x)).toThrow(DomainError);
  });
});

describe('lnGamma', () => {
  it('matches mpmath ln|Γ(x)| within 1e-14 (relative, absolute where |lnΓ| < 1; validation case "ln-gamma")', () => {
    expect(expectValidationCase('ln-gamma').points).toBe(oracle.lnGamma.length);
  });
  it('is exactly 0 at x = 1 and x = 2 and throws DomainError at poles', () => {
    expect(lnGamma(1)).toBe(0);
    expect(lnGamma(2)).toBe(0);
    expect(() => lnGamma(-3)).toThrow(DomainError);
  });
});
