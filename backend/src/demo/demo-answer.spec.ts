import { describe, expect, it } from 'vitest';
import { CODATA2018, levels, motionSettingsFromSetup, motionStates, parseSetup, type MotionStateResult } from '@fieldbound/shared';
import { BUILTIN_SPECIES } from '../species/data/builtin-species';
import { DEMO_MAPS, LAB_SHORTLIST } from './demo-maps';
import { DEMO_PINS } from './demo-threads';

// The user guide walks a newcomer through one question on the demo data: "which of these species have a
// field-induced state that survives at 4 K in a 20 T magnet, and how strongly bound is it?" These checks keep
// the demo maps able to answer it, and keep the numbers the invented threads quote in line with the engine.
// They compare the engine with itself (no published values are involved), evaluated at the catalogue's α.

const MICRO_EV_PER_HARTREE = CODATA2018.hartreeInEV * 1e6;

function spec(key: (typeof DEMO_MAPS)[number]['key']) {
  const found = DEMO_MAPS.find((m) => m.key === key);
  if (!found) throw new Error(`no demo map ${key}`);
  return { ...found, setup: parseSetup(found.setup) };
}

function alphaOf(symbol: string): number {
  const row = BUILTIN_SPECIES.find((s) => s.symbol === symbol);
  if (!row) throw new Error(`${symbol} is not in the catalogue`);
  return row.polarizabilityA0;
}

/** The moving-ion states at a catalogue atom and a field in tesla, with the map's cutoff, orbitals and motion. */
function statesAt(key: (typeof DEMO_MAPS)[number]['key'], symbol: string, tesla: number, massNumber?: number): MotionStateResult[] {
  const { setup } = spec(key);
  const s = massNumber ? { ...setup, ion: { massNumber } } : setup;
  const fieldAu = tesla / CODATA2018.atomicFieldInTesla;
  const fixed = levels({ alpha: alphaOf(symbol), fieldAu, cutoffBohr: s.shortRange.cutoffBohr, mMax: s.orbitals.mMax });
  const motion = motionSettingsFromSetup(s);
  if (!motion) throw new Error(`${key} has no ion motion`);
  return motionStates({ fieldAu, states: fixed, motion });
}

function fixedBindingMicroEv(key: (typeof DEMO_MAPS)[number]['key'], symbol: string, tesla: number, m: number): number {
  const { setup } = spec(key);
  const fixed = levels({ alpha: alphaOf(symbol), fieldAu: tesla / CODATA2018.atomicFieldInTesla, cutoffBohr: setup.shortRange.cutoffBohr, mMax: setup.orbitals.mMax });
  const state = fixed.find((s) => s.m === m && s.nu === 0);
  return (state?.bindingHartree ?? 0) * MICRO_EV_PER_HARTREE;
}

describe('the demo answers the guide’s question (4 K ion motion, 20 T)', () => {
  it('has a laboratory map with 4 K ion motion, the shortlist overlaid and a field band ending at 20 T', () => {
    const { setup } = spec('lab4K');
    expect(setup.motion).toEqual({ kind: 'temperature', kelvin: 4 });
    expect(setup.species).toEqual(LAB_SHORTLIST);
    expect(setup.fieldAxis.min).toBeLessThanOrEqual(20);
    expect(setup.fieldAxis.max).toBeGreaterThanOrEqual(20);
    expect(setup.fieldBands.some((b) => b.maxTesla === 20)).toBe(true);
    for (const symbol of LAB_SHORTLIST) {
      const alpha = alphaOf(symbol);
      expect(alpha).toBeGreaterThanOrEqual(setup.alphaAxis.min);
      expect(alpha).toBeLessThanOrEqual(setup.alphaAxis.max);
    }
  });

  it('keeps Mg and Cd bound in m = 0 at 20 T and 4 K, turns Zn, Be, Hg and Xe into resonances and loses Kr and Ar', () => {
    const classOf = (symbol: string) => statesAt('lab4K', symbol, 20).find((s) => s.m === 0 && s.nu === 0)?.class;
    expect(['Mg', 'Cd'].map(classOf)).toEqual(['bound', 'bound']);
    expect(['Zn', 'Be', 'Hg', 'Xe'].map(classOf)).toEqual(['resonance', 'resonance', 'resonance', 'resonance']);
    expect(['Kr', 'Ar'].map(classOf)).toEqual(['unbound', 'unbound']);
  });

  it('destroys every m ≥ 1 state of the shortlist at 20 T and 4 K', () => {
    for (const symbol of LAB_SHORTLIST) {
      const survivors = statesAt('lab4K', symbol, 20).filter((s) => s.m >= 1 && s.class !== 'unbound');
      expect(survivors, symbol).toEqual([]);
    }
  });

  it('matches the binding energies the demo threads quote (Mg ≈ 71 µeV at 20 T, Cd ≈ 115 µeV at 40 T, Mg m = 1 ≈ 0.01 µeV)', () => {
    expect(fixedBindingMicroEv('lab', 'Mg', 20, 0)).toBeGreaterThan(65);
    expect(fixedBindingMicroEv('lab', 'Mg', 20, 0)).toBeLessThan(77);
    expect(fixedBindingMicroEv('lab', 'Mg', 20, 1)).toBeGreaterThan(0.005);
    expect(fixedBindingMicroEv('lab', 'Mg', 20, 1)).toBeLessThan(0.02);
    expect(fixedBindingMicroEv('lab', 'Cd', 40, 0)).toBeGreaterThan(100);
    expect(fixedBindingMicroEv('lab', 'Cd', 40, 0)).toBeLessThan(130);
    // The cutoff maps move Mg's m = 0 state by a factor of about four each way.
    expect(fixedBindingMicroEv('cutoffSmall', 'Mg', 20, 0)).toBeGreaterThan(250);
    expect(fixedBindingMicroEv('cutoffLarge', 'Mg', 20, 0)).toBeLessThan(20);
  });

  it('shows the thread’s other claims: at 10 T Mg is only a resonance, at 77 K Mg is a resonance, and Cd with its own mass stays bound', () => {
    expect(statesAt('lab4K', 'Mg', 10).find((s) => s.m === 0)?.class).toBe('resonance');
    expect(statesAt('lab77K', 'Mg', 20).find((s) => s.m === 0)?.class).toBe('resonance');
    const cd = statesAt('lab4K', 'Cd', 20, 114).find((s) => s.m === 0);
    expect(cd?.class).toBe('bound');
    expect(cd?.fractions?.bound).toBeGreaterThan(0.95);
  });
});

describe('the demo pins leave the guide’s probe points free', () => {
  // The guide's screenshots and steps show these points; no area pin should lie over them.
  const probed: { map: (typeof DEMO_MAPS)[number]['key']; symbol: string; tesla: number }[] = [
    { map: 'lab4K', symbol: 'Mg', tesla: 20 },
    { map: 'lab4K', symbol: 'Cd', tesla: 20 },
    { map: 'cutoffSmall', symbol: 'Mg', tesla: 20 },
    { map: 'cutoffLarge', symbol: 'Mg', tesla: 20 },
  ];

  it.each(probed)('no region pin on $map covers $symbol at $tesla T', ({ map, symbol, tesla }) => {
    const alpha = alphaOf(symbol);
    const covering = DEMO_PINS.filter((p) => p.map === map && p.geometry.kind === 'rect').filter((p) => {
      const g = p.geometry as { min: { alpha: number; fieldTesla: number }; max: { alpha: number; fieldTesla: number } };
      return alpha >= g.min.alpha && alpha <= g.max.alpha && tesla >= g.min.fieldTesla && tesla <= g.max.fieldTesla;
    });
    expect(covering.map((p) => p.title)).toEqual([]);
    expect(DEMO_PINS.some((p) => p.map === map && p.geometry.kind === 'polygon')).toBe(false);
  });
});
