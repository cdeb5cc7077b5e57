import { describe, expect, it } from 'vitest';
import { fieldDisplayToTesla, fieldTeslaToDisplay } from './displayUnits';

describe('field display units', () => {
  it('keeps a field typed in tesla exactly as typed (no round trip through atomic units)', () => {
    for (const t of [20, 0.1, 45, 1e-3, 2.35e5]) {
      expect(fieldDisplayToTesla(t, 'T')).toBe(t);
      expect(fieldTeslaToDisplay(t, 'T')).toBe(t);
    }
  });

  it('converts atomic units with B₀ = 2.35051756758e5 T (CODATA 2018, atomic unit of magnetic flux density)', () => {
    expect(fieldDisplayToTesla(1, 'au')).toBeCloseTo(2.35051756758e5, 0);
    expect(fieldTeslaToDisplay(2.35051756758e5, 'au')).toBeCloseTo(1, 11);
    expect(fieldDisplayToTesla(fieldTeslaToDisplay(20, 'au'), 'au')).toBeCloseTo(20, 12);
  });
});
