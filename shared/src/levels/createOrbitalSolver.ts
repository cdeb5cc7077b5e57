import { makeScaledPotential } from '../potential/index.js';
import { createBoundStateSolver, type SolveCallOptions } from '../solver/solveBoundStates.js';
import { orbitalSolverOptions } from './orbitalSolverOptions.js';
import type { OrbitalSpectrum } from './types.js';
import { validateOrbitalArgs } from './validateOrbitalArgs.js';

/** A solver for one orbital m at fixed ρ_c that keeps its potential samples between calls. */
export interface OrbitalSolver {
  readonly m: number;
  readonly rhoC: number;
  /** Scaled levels at coupling λ (as solveOrbital). */
  solve(lambda: number, call?: SolveCallOptions): OrbitalSpectrum;
  /** Number of bound states at coupling λ (as countStates). */
  count(lambda: number): number;
}

/**
 * Reusable solver of −½g'' + λ w_m(ζ; ρ_c) g = −ε̃ g for many λ at fixed
 * (m, ρ_c): w_m is sampled once on a mesh suited to λ ≤ lambdaMax (default 1;
 * a larger λ rebuilds it) and every call then costs only the integration.
 * Since V_m is linear in α at fixed (B, r_c), one OrbitalSolver per (m, B)
 * serves a whole row of a map in α (λ = αB). Results equal solveOrbital's to
 * within the error estimate.
 *
 * Domain: integer m in 0…64, ρ_c > 0 finite, tol and lambdaMax positive;
 * otherwise throws EngineInputError.
 *
 * @example
 * const s = createOrbitalSolver(1, 0.2, { tol: 2e-7, lambdaMax: 100 });
 * s.solve(10, { nuMax: 0, errorEstimate: false }).levels[0].epsilon // 1.32882584…
 */
export function createOrbitalSolver(
  m: number,
  rhoC: number,
  options: { tol?: number; lambdaMax?: number } = {},
): OrbitalSolver {
  validateOrbitalArgs(m, options.lambdaMax, rhoC);
  const lambdaMax = options.lambdaMax ?? 1;
  const solver = createBoundStateSolver(makeScaledPotential(m, rhoC), {
    ...orbitalSolverOptions(lambdaMax, rhoC),
    tol: options.tol,
    lambdaMax,
  });
  return {
    m,
    rhoC,
    count: (lambda) => solver.count(lambda).total,
    solve(lambda, call = {}) {
      const r = solver.solve(lambda, call);
      return {
        m,
        lambda,
        rhoC,
        levels: r.states.map((s) => ({ nu: s.nu, parity: s.parity, epsilon: s.epsilon, relError: s.relError, resolved: s.resolved })),
        count: r.count,
        countEven: r.countEven,
        countOdd: r.countOdd,
        depth: r.depth,
      };
    },
  };
}
