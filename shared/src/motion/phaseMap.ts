import { STATE_CLASS, type BindingMapResult, type MapProgress, type PhaseMapResult } from '../map/mapTypes.js';
import type { MapSetup } from '../setup/mapSetup.js';
import { toHartree } from '../units/convert.js';
import { ENGINE_VERSION } from '../version.js';
import { allocateCellMotionOutput, classifyCells } from './classifyCells.js';
import { validateMotionSettings, type MotionSettings } from './motionSettings.js';

/**
 * The validated motion settings a setup asks for, or null for a fixed atom (`motion.kind = 'none'`).
 * Energies in the setup are in kelvin (k_B·T); the engine works in hartree.
 *
 * Only `motion`, `ion` and `observationTimeSeconds` are read (the command line passes just those).
 *
 * Bad input: an `EngineInputError` naming the parameter (the setup schema normally catches it first).
 */
export function motionSettingsFromSetup(setup: Pick<MapSetup, 'motion' | 'ion' | 'observationTimeSeconds'>): MotionSettings | null {
  const base = { massNumber: setup.ion.massNumber, observationTimeSeconds: setup.observationTimeSeconds };
  switch (setup.motion.kind) {
    case 'none':
      return null;
    case 'kinetic-energy':
      return validateMotionSettings({ ...base, transverseEnergyHartree: toHartree('K', setup.motion.energyKelvin) });
    case 'ion-level':
      return validateMotionSettings({ ...base, ionLandauLevel: setup.motion.level });
    case 'temperature':
      return validateMotionSettings({ ...base, temperatureKelvin: setup.motion.kelvin });
  }
}

export interface PhaseMapOptions {
  onProgress?: (progress: MapProgress) => void;
  signal?: AbortSignal;
}

function abortError(): Error {
  const error = new Error('the computation was cancelled');
  error.name = 'AbortError';
  return error;
}

/**
 * Classifies every state of a binding map for the setup's ion motion (model.md §4): bound when
 * Γ < ħ/τ (including Γ = 0 below the recoil threshold), unbound when destroyed or Γ ≥ ε, a
 * resonance otherwise; the survivors of a cell are its bound states. For a temperature the class
 * and width are those at E⊥ = kT and `fractions` holds the thermal fractions per state.
 *
 * It reuses `binding` as it is: changing only the motion settings or the observation time reruns
 * this step, never the binding energies. A fixed atom (`motion: none`) marks every existing state bound.
 *
 * Width values: Γ in hartree; 0 for a bound state with no decay channel; +Infinity where the state is
 * destroyed; NaN exactly where `stateClass` is NONE (there is no state to have a width).
 *
 * @example
 * const binding = bindingMap(setup);
 * const phase = phaseMap({ ...setup, motion: { kind: 'temperature', kelvin: 4 } }, binding);
 * phase.survivors[cell]; // bound states in that cell at 4 K
 */
export function phaseMap(setup: MapSetup, binding: BindingMapResult, options: PhaseMapOptions = {}): PhaseMapResult {
  const started = performance.now();
  if (options.signal?.aborted) throw abortError();
  const total = binding.cellCount;
  const settings = motionSettingsFromSetup(setup);
  if (!settings) {
    const n = binding.bindingHartree.length;
    const stateClass = new Uint8Array(n);
    const widthHartree = new Float64Array(n);
    const survivors = new Uint16Array(total);
    for (let i = 0; i < n; i++) {
      const present = binding.bindingHartree[i]! > 0;
      stateClass[i] = present ? STATE_CLASS.BOUND : STATE_CLASS.NONE;
      widthHartree[i] = present ? 0 : Number.NaN;
      if (present) survivors[i % total]!++;
    }
    options.onProgress?.({ done: total, total });
    return { engineVersion: ENGINE_VERSION, stateClass, widthHartree, widthFlags: new Uint8Array(n), survivors, fractions: null, elapsedMs: performance.now() - started };
  }
  const out = allocateCellMotionOutput(binding, settings);
  classifyCells(binding, settings, out);
  if (options.signal?.aborted) throw abortError();
  options.onProgress?.({ done: total, total });
  return {
    engineVersion: ENGINE_VERSION,
    stateClass: out.stateClass,
    widthHartree: out.widthHartree,
    widthFlags: out.flags,
    survivors: out.survivors,
    fractions: out.fractions,
    elapsedMs: performance.now() - started,
  };
}
