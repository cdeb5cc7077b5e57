import { makeScaledPotential } from '../potential/index.js';
import { thresholdCouplings } from '../solver/thresholdCouplings.js';
import { W_TAIL_C4 } from './orbitalSolverOptions.js';
import { validateOrbitalArgs } from './validateOrbitalArgs.js';

/**
 * Threshold couplings λ_c,ν(ρ_c), ν = 0…nuMax, of orbital m: level ν exists
 * for λ = αB > λ_c,ν (λ_c,0 = 0). Found as the roots of the zero-energy phase,
 * where the tail solution ζ·sin(√λ/ζ + φ) has tan φ = 0 (model.md §2).
 * Accuracy ≈ 1e-10 relative at the default tol.
 *
 * Domain: integer m in 0…64, ρ_c > 0 finite, integer nuMax ≥ 0; otherwise throws EngineInputError.
 *
 * @example
 * orbitalThresholds(1, 0.3, 2) // [0, 7.16931170…, 16.4282130…]
 */
export function orbitalThresholds(m: number, rhoC: number, nuMax: number, tol?: number): number[] {
  validateOrbitalArgs(m, undefined, rhoC);
  return thresholdCouplings(makeScaledPotential(m, rhoC), nuMax, {
    scale: Math.min(rhoC, 1) / 2,
    c4: W_TAIL_C4,
    tol,
  });
}
