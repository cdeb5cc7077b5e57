import type { LevelFlag } from './types.js';

/** ε/B above which the adiabatic (single-orbital) reduction is flagged (model.md §3). */
export const NON_ADIABATIC_RATIO = 0.1;
/** α/r_c² at and above which m = 0 is flagged as cutoff-dominated (model.md §3: "α/r_c² ≳ 1"). */
export const CUTOFF_DOMINATED_RATIO = 1;

/**
 * Validity flags of one state (model.md §3):
 *  - cutoff-dominated: m = 0 and α/r_c² ≥ 1;
 *  - non-adiabatic: ε/B > 0.1;
 *  - field-free-anion: m = 0 and the atom has a field-free anion;
 *  - below-floor: ε < energy floor, or not resolved;
 *  - unresolved: counted but bound more weakly than the solver searched.
 *
 * @example
 * levelFlags({ m: 0, epsOverB: 0.2, bindingHartree: 0.02, resolved: true }, { alpha: 10, cutoffBohr: 2, floor: 0, anion: false })
 * // ['cutoff-dominated', 'non-adiabatic']
 */
export function levelFlags(
  s: { m: number; epsOverB: number; bindingHartree: number; resolved: boolean },
  p: { alpha: number; cutoffBohr: number; floor: number; anion: boolean },
): LevelFlag[] {
  const flags: LevelFlag[] = [];
  if (s.m === 0 && p.alpha / (p.cutoffBohr * p.cutoffBohr) >= CUTOFF_DOMINATED_RATIO) flags.push('cutoff-dominated');
  if (s.epsOverB > NON_ADIABATIC_RATIO) flags.push('non-adiabatic');
  if (s.m === 0 && p.anion) flags.push('field-free-anion');
  if (!s.resolved || s.bindingHartree < p.floor) flags.push('below-floor');
  if (!s.resolved) flags.push('unresolved');
  return flags;
}
