import { describe, expect, it } from 'vitest';
import { formatNumber } from './formatNumber.js';

describe('formatNumber (terminal output)', () => {
  it('writes 6 significant digits, exponent form outside 1e-3…1e6, trailing zeros dropped', () => {
    expect(formatNumber(2.4e-9)).toBe('2.4e-9');
    expect(formatNumber(4.254381e-6)).toBe('4.25438e-6');
    expect(formatNumber(0.09857470631700452)).toBe('0.0985747');
    expect(formatNumber(36.53829)).toBe('36.5383');
    expect(formatNumber(235051.7567581)).toBe('235052');
    expect(formatNumber(2.350517567581e7)).toBe('2.35052e+7');
    expect(formatNumber(0)).toBe('0');
    expect(formatNumber(NaN)).toBe('n/a');
  });
});
