import { CUTOFF_DOMINATED_RATIO, NON_ADIABATIC_RATIO } from '../levels/levelFlags.js';
import { MAP_FLAG } from './mapTypes.js';

/**
 * MAP_FLAG bits of one (orbital, cell) (model.md §3; same thresholds as the per-point `levelFlags`):
 * CUTOFF_DOMINATED for m = 0 with α/r_c² ≥ 1; NON_ADIABATIC when the deepest stored level has
 * ε/B > 0.1; BELOW_FLOOR when some counted level was dropped (below the floor or unresolved);
 * DIRECT_SOLVE when the values were solved directly instead of interpolated.
 *
 * @example
 * orbitalCellFlags(0, 10, 2, 0.2, false, false) // MAP_FLAG.CUTOFF_DOMINATED | MAP_FLAG.NON_ADIABATIC = 3
 */
export function orbitalCellFlags(
  m: number,
  alpha: number,
  cutoffBohr: number,
  groundEpsOverB: number,
  belowFloor: boolean,
  direct: boolean,
): number {
  let f = 0;
  if (m === 0 && alpha / (cutoffBohr * cutoffBohr) >= CUTOFF_DOMINATED_RATIO) f |= MAP_FLAG.CUTOFF_DOMINATED;
  if (groundEpsOverB > NON_ADIABATIC_RATIO) f |= MAP_FLAG.NON_ADIABATIC;
  if (belowFloor) f |= MAP_FLAG.BELOW_FLOOR;
  if (direct) f |= MAP_FLAG.DIRECT_SOLVE;
  return f;
}
