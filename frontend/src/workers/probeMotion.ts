import type { LevelState, MotionStateInput } from '@fieldbound/shared';

/**
 * The fixed-atom states of a probe as the engine's `motionStates` takes them. A state below the energy floor is
 * passed as ε = 0 (no state), as the map stores it, so the probe's classes match the map's cell by cell.
 */
export function probeMotionInputs(states: readonly LevelState[]): MotionStateInput[] {
  return states.map((s) => ({ m: s.m, nu: s.nu, bindingHartree: s.flags.includes('below-floor') ? 0 : s.bindingHartree }));
}
