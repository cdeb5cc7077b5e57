import { makeScaledPotential } from '../potential/index.js';
import { createBoundStateSolver } from '../solver/solveBoundStates.js';
import { orbitalSolverOptions } from './orbitalSolverOptions.js';
import type { OrbitalOptions, OrbitalSpectrum } from './types.js';
import { validateOrbitalArgs } from './validateOrbitalArgs.js';

/**
 * Scaled bound states of orbital m:
 *   −½ g''(ζ) + λ w_m(ζ; ρ_c) g = −ε̃ g,  w_m = −(1/8) U(2, 2−m, (ζ² + ρ_c²)/2),
 * with λ = αB, ρ_c = r_c√B, ζ = z√B (lengths in l = B^(−1/2)); the physical
 * binding is ε = B·ε̃ (model.md §1, scaling). Every level ν (parity ν mod 2)
 * with its half-step error estimate, the state count from the zero-energy
 * solution (exact x·sin(k/x + φ) tail beyond ζ where w_m = −1/(2ζ⁴) to 1e-9),
 * and the depth. Solver: sinh mesh a = min(ρ_c, 1)/2, sixth-order Magnus,
 * Prüfer matching (see solveBoundStates).
 *
 * Speed (warm, CPU time, one core): ground state only (nuMax: 0, errorEstimate:
 * false) median 0.4 ms (max 1.3 ms) at tol 2e-7, 0.6 ms (max 2.5 ms) at tol 1e-10
 * over typical map points; ≈ 0.1 ms per call with createOrbitalSolver, which
 * keeps the sampled potential. See docs/physics/solver.md.
 *
 * Domain: integer m in 0…64, λ > 0, ρ_c > 0 finite; otherwise throws
 * EngineInputError naming the parameter.
 *
 * @example
 * solveOrbital(0, 1, 0.632455532, { nuMax: 0 }).levels[0].epsilon
 * // 0.09857… (α = 10 a₀³, B = 0.1 a.u., r_c = 2 a₀)
 */
export function solveOrbital(m: number, lambda: number, rhoC: number, options: OrbitalOptions = {}): OrbitalSpectrum {
  validateOrbitalArgs(m, lambda, rhoC);
  const w = makeScaledPotential(m, rhoC);
  const r = createBoundStateSolver(w, { ...orbitalSolverOptions(lambda, rhoC), tol: options.tol }).solve(lambda, {
    nuMax: options.nuMax,
    errorEstimate: options.errorEstimate,
    epsMin: options.epsMin,
    guess: options.guess,
  });
  return {
    m,
    lambda,
    rhoC,
    levels: r.states.map((s) => ({
      nu: s.nu,
      parity: s.parity,
      epsilon: s.epsilon,
      relError: s.relError,
      resolved: s.resolved,
    })),
    count: r.count,
    countEven: r.countEven,
    countOdd: r.countOdd,
    depth: r.depth,
  };
}
