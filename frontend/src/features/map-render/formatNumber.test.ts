import { describe, expect, it } from 'vitest';
import { formatScientific, formatWithUnit, parseScientific, powerOfTen, superscript } from './formatNumber';

describe('superscript and powerOfTen', () => {
  it('writes negative and multi-digit exponents with superscript characters', () => {
    expect(superscript(-12)).toBe('⁻¹²');
    expect(superscript(0)).toBe('⁰');
    expect(powerOfTen(-3)).toBe('10⁻³');
    expect(powerOfTen(5)).toBe('10⁵');
  });
});

describe('formatScientific', () => {
  it('writes 2.4e-9 as "2.4 × 10⁻⁹"', () => {
    expect(formatScientific(2.4e-9)).toBe('2.4 × 10⁻⁹');
  });
  it('drops a mantissa of exactly one: 1e-9 → "10⁻⁹"', () => {
    expect(formatScientific(1e-9)).toBe('10⁻⁹');
  });
  it('keeps plain decimals between 10⁻³ and 10⁴ and trims trailing zeros', () => {
    expect(formatScientific(0.0421)).toBe('0.0421');
    expect(formatScientific(45)).toBe('45');
    expect(formatScientific(67.4869, { digits: 4 })).toBe('67.49');
    expect(formatScientific(2.5)).toBe('2.5');
  });
  it('decides plain or scientific after rounding (9999.7 with 3 digits is 10⁴)', () => {
    expect(formatScientific(9999.7)).toBe('10⁴');
  });
  it('uses the typographic minus sign and handles zero and non-finite values', () => {
    expect(formatScientific(-3.2e-7)).toBe('−3.2 × 10⁻⁷');
    expect(formatScientific(-0.5)).toBe('−0.5');
    expect(formatScientific(0)).toBe('0');
    expect(formatScientific(Number.NaN)).toBe('—');
    expect(formatScientific(Number.POSITIVE_INFINITY)).toBe('∞');
  });
  it('never produces e-notation for very large or small numbers', () => {
    expect(formatScientific(2.350517567581e5, { digits: 4 })).toBe('2.351 × 10⁵');
    expect(formatScientific(6.02e-300)).toBe('6.02 × 10⁻³⁰⁰');
  });
  it('keeps significant trailing zeros on request', () => {
    expect(formatScientific(2.4e-9, { digits: 3, keepZeros: true })).toBe('2.40 × 10⁻⁹');
  });
});

describe('formatWithUnit', () => {
  it('joins the number and the unit with a narrow no-break space', () => {
    expect(formatWithUnit(2.4e-9, 'µeV')).toBe('2.4 × 10⁻⁹\u202fµeV');
  });
});

describe('parseScientific', () => {
  it('reads back what formatScientific writes', () => {
    for (const x of [2.4e-9, 1e-9, 0.0421, 45, -3.2e-7, 6.02e23]) expect(parseScientific(formatScientific(x))).toBeCloseTo(x, 12 - Math.log10(Math.abs(x)));
  });
  it('reads e-notation, caret exponents and a bare power of ten', () => {
    expect(parseScientific('2.4e-9')).toBe(2.4e-9);
    expect(parseScientific('2.4 x 10^-9')).toBeCloseTo(2.4e-9, 22);
    expect(parseScientific('10⁻³')).toBeCloseTo(1e-3, 18);
  });
  it('returns NaN for text that is not a number', () => {
    expect(parseScientific('ten')).toBeNaN();
    expect(parseScientific('')).toBeNaN();
    expect(parseScientific('1,5')).toBeNaN();
  });
});
