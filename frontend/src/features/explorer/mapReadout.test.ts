import { describe, expect, it } from 'vitest';
import { CODATA2018, STATE_CLASS, type LevelState, type MotionStateResult, type PhaseMapResult } from '@fieldbound/shared';
import { bindingMapFromTable } from '../map-render/testGrids';
import type { GridAxis } from '../map-render/gridGeometry';
import { readoutAt } from './mapReadout';
import { probeAsText, probeRows } from './probeText';
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
  it('with ion motion: names the class of the orbital and counts the states that survive', () => {
    // The bound cell's one state is a resonance for the moving ion: it does not survive.
    const phase: PhaseMapResult = {
      engineVersion: 'test', stateClass: Uint8Array.from([STATE_CLASS.NONE, STATE_CLASS.NONE, STATE_CLASS.NONE, STATE_CLASS.RESONANCE]),
      widthHartree: new Float64Array(4), widthFlags: new Uint8Array(4), survivors: new Uint16Array(4), fractions: null, elapsedMs: 0,
    };
    expect(readoutAt(result, alpha, field, 10, 1e-5, { kind: 'orbital', m: 0 }, 'K', phase)).toMatch(/^m = 0: ε = .* K, 1 level · resonance with ion motion$/);
    expect(readoutAt(result, alpha, field, 10, 1e-5, { kind: 'survivors' }, 'K', phase)).toBe('0 states survive (m = 0…0, ion motion)');
  });
  it('returns null more than half a cell outside the grid', () => {
    expect(readoutAt(result, alpha, field, 100, 1e-5, { kind: 'orbital', m: 0 }, 'K')).toBeNull();
  });
});

describe('probeAsText', () => {
  it('writes the point, the ion motion and one tab-separated line per state in the chosen units', () => {
    const state: LevelState = { m: 1, nu: 0, parity: 'even', bindingHartree: 1e-9, bindingOverB: 2.5e-3, relError: 3e-9, flags: ['non-adiabatic'] };
    const text = probeAsText({ alpha: 164.2, tesla: 10 }, defaultSetup(), probeRows([state], null));
    const lines = text.split('\n');
    expect(lines[0]).toMatch(/^Fieldbound probe \(model estimate/);
    expect(lines[1]).toBe('α = 164.2 a₀³ (164.2 a₀³)');
    expect(lines[2]).toBe('B = 10 T (10 T)');
    expect(lines[4]).toBe('ion motion: atom held fixed (no ion motion: no widths)');
    // 1 nano-hartree = 0.0272114 µeV (CODATA 2018: 1 E_h = 27.211386245988 eV).
    expect(lines.at(-1)).toBe('1\t0\teven\t0.0272114\t—\t—\tbound\t0.0025\t3 × 10⁻⁹\tnon-adiabatic');
  });

  it('writes width, lifetime, class and thermal fractions of a moving ion', () => {
    const state: LevelState = { m: 0, nu: 0, parity: 'even', bindingHartree: 2e-9, bindingOverB: 1e-4, relError: 1e-9, flags: [] };
    const motion: MotionStateResult = {
      m: 0, nu: 0, bindingHartree: 2e-9, widthHartree: 1e-12, lifetimeSeconds: 2.4188843265857e-17 / 1e-12, shiftHartree: 0, class: 'resonance',
      flags: ['channel-closed'], shapeNumber: 3, xi: NaN, fractions: { bound: 0.25, resonance: 0.5, unbound: 0.25 },
    };
    const setup = { ...defaultSetup(), motion: { kind: 'temperature' as const, kelvin: 4 } };
    const line = probeAsText({ alpha: 10, tesla: 10 }, setup, probeRows([state], [motion])).split('\n').at(-1)!.split('\t');
    expect(line[4]).toBe('2.721 × 10⁻⁵'); // 10⁻¹² E_h in µeV
    expect(line[5]).toBe('2.419 × 10⁻⁵'); // ħ/Γ = 2.4188843265857 × 10⁻¹⁷ s / 10⁻¹² (CODATA 2018 atomic unit of time)
    expect(line[6]).toBe('resonance at kT (bound 25 %, resonance 50 %, unbound 25 %)');
    expect(line[9]).toBe('channel closed');
  });
});

describe('probeRows', () => {
  it('marks a state below the energy floor as such and gives it no width, whatever the motion part says', () => {
    const below: LevelState = { m: 2, nu: 0, parity: 'even', bindingHartree: 1e-15, bindingOverB: 1e-10, relError: 1e-9, flags: ['below-floor'] };
    const motion: MotionStateResult = { m: 2, nu: 0, bindingHartree: 0, widthHartree: NaN, lifetimeSeconds: NaN, shiftHartree: NaN, class: 'unbound', flags: [], shapeNumber: 3, xi: NaN };
    expect(probeRows([below], [motion])[0]).toMatchObject({ class: 'below floor', widthHartree: null, lifetimeSeconds: null, flags: ['below-floor'] });
  });

  it('refuses motion results that do not line up with the levels', () => {
    const state: LevelState = { m: 0, nu: 0, parity: 'even', bindingHartree: 1e-9, bindingOverB: 1e-4, relError: 1e-9, flags: [] };
    const other: MotionStateResult = { m: 1, nu: 0, bindingHartree: 1e-9, widthHartree: 0, lifetimeSeconds: Infinity, shiftHartree: 0, class: 'bound', flags: [], shapeNumber: 3, xi: 1 };
    expect(() => probeRows([state], [other])).toThrow(/motion state 0 is \(1, 0\), expected \(0, 0\)/);
  });
});
