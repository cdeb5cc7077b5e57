import { solveOrbital } from '../levels/solveOrbital.js';

/** Scaled levels of one orbital at one point, as the direct solver returns them. */
export interface DirectOrbitalLevels {
  /** Scaled binding ε̃ = ε/B of each counted level ν = 0…count−1 (epsMin for unresolved levels). */
  epsilon: Float64Array;
  /** Estimated relative error of each level (half-step re-solve; NaN when unresolved). */
  relError: Float64Array;
  /** False for a level counted but bound more weakly than the search went. */
  resolved: boolean[];
}

/**
 * All levels of orbital m at (α, B, r_c) from a direct solve, with exactly the options `levels`
 * uses (default tolerance; search down to 10⁻³ of the floor when a floor is set), so a map cell
 * solved this way carries the same numbers as `levels` for that point.
 *
 * Units: α in a₀³, B in atomic units, r_c in bohr, floor in hartree.
 * Domain: as `solveOrbital` (throws EngineInputError on bad input).
 *
 * @example
 * directOrbital(0, 10, 0.1, 2, 0).epsilon[0] // 0.09857… (ε/B, see levels())
 */
export function directOrbital(m: number, alpha: number, fieldAu: number, cutoffBohr: number, floorHartree: number): DirectOrbitalLevels {
  const r = solveOrbital(m, alpha * fieldAu, cutoffBohr * Math.sqrt(fieldAu), {
    epsMin: floorHartree > 0 ? (floorHartree / fieldAu) * 1e-3 : undefined,
  });
  const n = r.levels.length;
  const epsilon = new Float64Array(n);
  const relError = new Float64Array(n);
  const resolved: boolean[] = [];
  for (let k = 0; k < n; k++) {
    epsilon[k] = r.levels[k].epsilon;
    relError[k] = r.levels[k].relError;
    resolved.push(r.levels[k].resolved);
  }
  return { epsilon, relError, resolved };
}
