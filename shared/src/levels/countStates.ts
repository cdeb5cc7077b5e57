import { makeScaledPotential } from '../potential/index.js';
import { countBoundStates } from '../solver/solveBoundStates.js';
import { orbitalSolverOptions } from './orbitalSolverOptions.js';
import { validateOrbitalArgs } from './validateOrbitalArgs.js';

/**
 * Number of bound states of orbital m at scaled coupling λ = αB and cutoff
 * ρ_c = r_c√B: the zeros of the zero-energy solution of −½g'' + λw_m g = 0
 * on ζ > 0 for each parity (Sturm oscillation theorem), continued beyond the
 * numerical range with the exact solutions ζ·sin(k/ζ + φ), k = √λ, of the
 * −λ/(2ζ⁴) tail. Always ≥ 1 (B. Simon, Ann. Phys. 97, 279 (1976)). A level
 * exactly at threshold is not counted.
 *
 * Domain: integer m in 0…64, λ > 0, ρ_c > 0 finite; otherwise throws EngineInputError.
 *
 * @example
 * countStates(0, 100, 0.632455532) // 8 (α = 1000 a₀³, B = 0.1 a.u., r_c = 2 a₀)
 */
export function countStates(m: number, lambda: number, rhoC: number, tol?: number): number {
  validateOrbitalArgs(m, lambda, rhoC);
  return countBoundStates(makeScaledPotential(m, rhoC), { ...orbitalSolverOptions(lambda, rhoC), tol }).total;
}
