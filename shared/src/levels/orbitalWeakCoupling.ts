import { makeScaledPotential } from '../potential/index.js';
import { validateOrbitalArgs } from './validateOrbitalArgs.js';
import { weakCouplingCoefficients, weakCouplingKappa, type WeakCouplingCoefficients } from './weakCouplingCoefficients.js';

/**
 * Weak-coupling coefficients (W1, M2, D2, D3) of the scaled adiabatic
 * potential w_m(ζ; ρ_c), for κ̃ = √(2ε̃) = −λW1 − λ²D2 − λ³(W1²M2 + D3) + O(λ⁴ ln λ)
 * (B. Simon, Ann. Phys. 97, 279 (1976)). W1 has the closed form
 * −(π/(8√2)) U(3/2, 3/2 − m, ρ_c²/2) (model.md §1), which the tests use as a check.
 *
 * Domain: integer m in 0…64, ρ_c > 0 finite; otherwise throws EngineInputError.
 */
export function orbitalWeakCouplingCoefficients(m: number, rhoC: number): WeakCouplingCoefficients {
  validateOrbitalArgs(m, undefined, rhoC);
  return weakCouplingCoefficients(makeScaledPotential(m, rhoC), Math.min(rhoC, 1) / 2);
}

/**
 * Scaled binding ε̃ of the ground state of orbital m from the weak-coupling
 * series to the given order (default 3), with the separate terms of κ̃.
 * Valid for λ small enough that terms[2] ≪ κ̃ (m ≥ 1: λ ≲ 0.1; m = 0 needs in
 * addition λ/ρ_c ≪ 1 because W1 ∝ 1/ρ_c there).
 *
 * @example
 * orbitalWeakCoupling(2, 1e-3, 0.02).epsilon // 7.5581486e-9 (solver: 7.5581485994e-9)
 */
export function orbitalWeakCoupling(
  m: number,
  lambda: number,
  rhoC: number,
  order: 1 | 2 | 3 = 3,
): { kappa: number; epsilon: number; terms: [number, number, number]; coefficients: WeakCouplingCoefficients } {
  validateOrbitalArgs(m, lambda, rhoC);
  const c = orbitalWeakCouplingCoefficients(m, rhoC);
  return { ...weakCouplingKappa(c, lambda, order), coefficients: c };
}
