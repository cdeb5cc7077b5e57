import { toHartree, type MapSetup, type MotionSettingsInput } from '@fieldbound/shared';

/**
 * The engine's motion settings for a setup (as `motionSettingsFromSetup` builds them, before validation), or null
 * when the atom is held fixed. Used as the key of what the moving-ion classes depend on.
 */
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
