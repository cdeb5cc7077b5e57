import { useEffect, useState } from 'react';
import { canonicalJson, toHartree, type BindingMapResult, type MapSetup, type MotionSettingsInput, type PhaseMapResult } from '@fieldbound/shared';
import type { EnginePool } from '../../../workers/enginePool';
import type { MapComputeError } from '../../../workers/engineContract';

/** The engine's motion settings for a setup, or null when the atom is held fixed. */
export function motionInput(setup: MapSetup): MotionSettingsInput | null {
  const base = { massNumber: setup.ion.massNumber, observationTimeSeconds: setup.observationTimeSeconds };
  switch (setup.motion.kind) {
    case 'kinetic-energy':
      return { ...base, transverseEnergyHartree: toHartree('K', setup.motion.energyKelvin) };
    case 'ion-level':
      return { ...base, ionLandauLevel: setup.motion.level };
    case 'temperature':
      return { ...base, temperatureKelvin: setup.motion.kelvin };
    default:
      return null;
  }
}

/**
 * Moving-ion classes of a binding map, in an engine worker. Only the motion settings and the binding map matter:
 * changing them reruns the (fast) classification, never the binding energies.
 */
export function usePhaseMap(pool: EnginePool | null, binding: BindingMapResult | null, setup: MapSetup) {
  const input = motionInput(setup);
  const key = input ? canonicalJson(input) : null;
  const [state, setState] = useState<{ phase: PhaseMapResult | null; forResult: BindingMapResult | null; error: MapComputeError | null }>({ phase: null, forResult: null, error: null });
  useEffect(() => {
    if (!pool || !binding || !key) {
      setState({ phase: null, forResult: null, error: null });
      return;
    }
    let live = true;
    pool.run((api) => api.phaseMap(binding, JSON.parse(key) as MotionSettingsInput), { timeoutMs: 120_000 }).then(
      (phase) => live && setState({ phase, forResult: binding, error: null }),
      (error: MapComputeError) => live && setState({ phase: null, forResult: null, error }),
    );
    return () => {
      live = false;
    };
  }, [pool, binding, key]);
  // Only a classification of this very map counts (layouts must match).
  return { phase: state.forResult === binding ? state.phase : null, error: state.error, wanted: key !== null };
}
