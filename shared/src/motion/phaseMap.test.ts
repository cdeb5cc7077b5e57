import { describe, expect, it } from 'vitest';
import { bindingMap } from '../map/index.js';
import { STATE_CLASS, stateIndex, type BindingMapResult } from '../map/mapTypes.js';
import { defaultSetup } from '../setup/presets.js';
import type { MapSetup } from '../setup/mapSetup.js';
import { motionStates } from './motionStates.js';
import { motionSettingsFromSetup, phaseMap } from './phaseMap.js';

// A small laboratory-to-strong-field map where the motional field matters: 10 × 8 cells, m ≤ 3.
function smallSetup(motion: MapSetup['motion']): MapSetup {
  return {
    ...defaultSetup(),
    alphaAxis: { min: 20, max: 600, scale: 'log' },
    fieldAxis: { min: 5, max: 2000, scale: 'log' },
    grid: { nAlpha: 10, nField: 8 },
    orbitals: { mMax: 3 },
    energyFloorKelvin: 0,
    ion: { massNumber: 24 },
    motion,
  };
}

const CLASS_CODE = { bound: STATE_CLASS.BOUND, resonance: STATE_CLASS.RESONANCE, unbound: STATE_CLASS.UNBOUND } as const;

function statesOfCell(binding: BindingMapResult, cell: number) {
  const states = [];
  for (let m = 0; m <= binding.mMax; m++) {
    for (let nu = 0; nu < binding.levelsPerOrbital; nu++) {
      const e = binding.bindingHartree[stateIndex(m, nu, cell, binding.levelsPerOrbital, binding.cellCount)]!;
      if (e > 0) states.push({ m, nu, bindingHartree: e });
    }
  }
  return states;
}

describe('phaseMap', () => {
  const binding = bindingMap(smallSetup({ kind: 'none' }));

  it.each([
    ['a transverse kinetic energy of 2 K', { kind: 'kinetic-energy', energyKelvin: 2 }],
    ['ion Landau level 40', { kind: 'ion-level', level: 40 }],
    ['a temperature of 4 K', { kind: 'temperature', kelvin: 4 }],
  ] as const)('with %s, every cell equals the direct per-point evaluation (class, width to 1e-12, survivors; consistency with motionStates)', (_label, motion) => {
    const setup = smallSetup(motion);
    const phase = phaseMap(setup, binding);
    const settings = motionSettingsFromSetup(setup)!;
    let checked = 0;
    for (let cell = 0; cell < binding.cellCount; cell++) {
      const row = Math.floor(cell / binding.nAlpha);
      const direct = motionStates({ fieldAu: binding.fieldsAu[row]!, states: statesOfCell(binding, cell), motion: settings });
      let bound = 0;
      for (const s of direct) {
        const k = stateIndex(s.m, s.nu, cell, binding.levelsPerOrbital, binding.cellCount);
        expect(phase.stateClass[k], `cell ${cell} m ${s.m} ν ${s.nu}`).toBe(CLASS_CODE[s.class]);
        const w = phase.widthHartree[k]!;
        if (Number.isFinite(s.widthHartree) && s.widthHartree > 0) expect(Math.abs(w - s.widthHartree) / s.widthHartree).toBeLessThanOrEqual(1e-12);
        else expect(w).toBe(s.widthHartree);
        if (s.fractions) {
          expect(phase.fractions![3 * k]).toBeCloseTo(s.fractions.bound, 6);
          expect(phase.fractions![3 * k + 2]).toBeCloseTo(s.fractions.unbound, 6);
        }
        if (s.class === 'bound') bound++;
        checked++;
      }
      expect(phase.survivors[cell]).toBe(bound);
    }
    expect(checked).toBeGreaterThan(binding.cellCount);
  });

  it('finds all three classes somewhere on this map at 4 K (the motion matters in this regime)', () => {
    const phase = phaseMap(smallSetup({ kind: 'temperature', kelvin: 4 }), binding);
    const seen = new Set(phase.stateClass);
    expect(seen.has(STATE_CLASS.BOUND)).toBe(true);
    expect(seen.has(STATE_CLASS.RESONANCE) || seen.has(STATE_CLASS.UNBOUND)).toBe(true);
  });

  it('thermal fractions of every existing state sum to 1 (to float32 precision)', () => {
    const phase = phaseMap(smallSetup({ kind: 'temperature', kelvin: 4 }), binding);
    for (let k = 0; k < phase.stateClass.length; k++) {
      if (phase.stateClass[k] === STATE_CLASS.NONE) continue;
      const sum = phase.fractions![3 * k]! + phase.fractions![3 * k + 1]! + phase.fractions![3 * k + 2]!;
      expect(Math.abs(sum - 1)).toBeLessThan(1e-6);
    }
  });

  it('for a fixed atom marks every existing state bound with zero width, and survivors equal the level counts', () => {
    const phase = phaseMap(smallSetup({ kind: 'none' }), binding);
    for (let cell = 0; cell < binding.cellCount; cell++) {
      let levels = 0;
      for (let m = 0; m <= binding.mMax; m++) levels += binding.counts[m * binding.cellCount + cell]!;
      expect(phase.survivors[cell]).toBe(levels);
    }
    for (let k = 0; k < phase.stateClass.length; k++) {
      if (binding.bindingHartree[k]! > 0) {
        expect(phase.stateClass[k]).toBe(STATE_CLASS.BOUND);
        expect(phase.widthHartree[k]).toBe(0);
      } else {
        expect(phase.stateClass[k]).toBe(STATE_CLASS.NONE);
        expect(Number.isNaN(phase.widthHartree[k])).toBe(true);
      }
    }
  });

  it('reuses the binding map without changing it: a different motion or observation time reruns only the classification', () => {
    const before = binding.bindingHartree.slice();
    const a = phaseMap(smallSetup({ kind: 'temperature', kelvin: 4 }), binding);
    const b = phaseMap({ ...smallSetup({ kind: 'temperature', kelvin: 4 }), observationTimeSeconds: 1e-6 }, binding);
    expect(binding.bindingHartree).toEqual(before);
    // A shorter observation time can only keep or raise the number of bound states (ħ/τ grows).
    for (let cell = 0; cell < binding.cellCount; cell++) expect(b.survivors[cell]).toBeGreaterThanOrEqual(a.survivors[cell]!);
  });

  it('refuses to start when the signal is already aborted (AbortError)', () => {
    const controller = new AbortController();
    controller.abort();
    expect(() => phaseMap(smallSetup({ kind: 'temperature', kelvin: 4 }), binding, { signal: controller.signal })).toThrow(expect.objectContaining({ name: 'AbortError' }));
  });
});
