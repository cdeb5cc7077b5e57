import { describe, expect, it } from 'vitest';
import { CODATA2018, type LevelState } from '@fieldbound/shared';
import { bindingMapFromTable } from '../map-render/testGrids';
import type { GridAxis } from '../map-render/gridGeometry';
import { readoutAt } from './mapReadout';
import { probeAsText } from './probeText';
import { defaultSetup } from '@fieldbound/shared';

// 2 × 2 map: α = 1 and 10 a₀³, B = 10⁻⁶ and 10⁻⁵ a.u.; only the cell (α = 10, B = 10⁻⁵) binds, by 10⁻⁹ hartree.
const result = bindingMapFromTable([
  [0, 0],
  [0, 1e-9],
]);
const alpha: GridAxis = { kind: 'log', first: 1, last: 10, n: 2 };
const field: GridAxis = { kind: 'log', first: 1e-6, last: 1e-5, n: 2 };

describe('readoutAt', () => {
  it('reads the nearest node: 10⁻⁹ hartree in µeV (27.211386245988 × 10⁻³ µeV) at α = 9, B = 0.9 × 10⁻⁵', () => {
    const text = readoutAt(result, alpha, field, 9, 0.9e-5, { kind: 'orbital', m: 0 }, 'ueV');
    const microEv = 1e-9 * CODATA2018.hartreeInEV * 1e6; // 0.0272…
    expect(text).toBe(`m = 0: ε = ${microEv.toPrecision(3)} µeV, 1 level`);
  });
  it('says unbound where the orbital has no state, and counts survivors', () => {
    expect(readoutAt(result, alpha, field, 1.2, 1e-6, { kind: 'orbital', m: 0 }, 'K')).toBe('m = 0: unbound');
    expect(readoutAt(result, alpha, field, 10, 1e-5, { kind: 'survivors' }, 'K')).toBe('1 bound state (m = 0…0)');
  });
  it('returns null more than half a cell outside the grid', () => {
    expect(readoutAt(result, alpha, field, 100, 1e-5, { kind: 'orbital', m: 0 }, 'K')).toBeNull();
  });
});

describe('probeAsText', () => {
  it('writes the point and one tab-separated line per state in the chosen units', () => {
    const state: LevelState = { m: 1, nu: 0, parity: 'even', bindingHartree: 1e-9, bindingOverB: 2.5e-3, relError: 3e-9, flags: ['non-adiabatic'] };
    const text = probeAsText({ alpha: 164.2, tesla: 10 }, defaultSetup(), [state]);
    const lines = text.split('\n');
    expect(lines[0]).toMatch(/^Fieldbound probe \(model estimate/);
    expect(lines[1]).toBe('α = 164.2 a₀³ (164.2 a₀³)');
    expect(lines[2]).toBe('B = 10 T (10 T)');
    expect(lines.at(-1)).toBe('1\t0\teven\t0.0272114\t0.0025\t3 × 10⁻⁹\tnon-adiabatic');
  });
});
