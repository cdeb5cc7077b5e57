import { levelFlags } from './levelFlags.js';
import { solveOrbital } from './solveOrbital.js';
import type { LevelState, LevelsInput } from './types.js';
import { validateLevelsInput } from './validateLevelsInput.js';

/**
 * All field-induced bound states of an electron at a fixed polarizable atom
 * in a magnetic field, in the adiabatic (single lowest-Landau-level orbital)
 * reduction (model.md §1): for each orbital m = 0…mMax the 1D problem
 *   −½ g'' + V_m(z) g = −ε g,  V_m(z) = −(αB²/8) U(2, 2−m, (z² + r_c²)B/2),
 * solved in scaled form with λ = αB, ρ_c = r_c√B (ε = B·ε̃; solveOrbital).
 * Every m has at least one state (B. Simon, Ann. Phys. 97, 279 (1976); J. Avron,
 * I. Herbst, B. Simon, Commun. Math. Phys. 79, 529 (1981)).
 *
 * Units: α in a₀³, B in atomic units (2.350517567581e5 T), r_c in a₀, energies
 * in hartree, measured below the lowest-Landau-level threshold.
 * Returns every state sorted by m, then ν, with its half-step relative error
 * estimate and validity flags (see levelFlags). States below the energy floor
 * are returned, flagged 'below-floor'.
 *
 * Bad input: throws EngineInputError naming the parameter (α, B, r_c not
 * positive and finite; mMax not an integer in 0…64; negative floor) before
 * any work.
 *
 * @example
 * levels({ alpha: 10, fieldAu: 0.1, cutoffBohr: 2, mMax: 1 }).map((s) => [s.m, s.nu, s.bindingOverB, s.flags])
 * // [[0, 0, 0.0985747063…, ['cutoff-dominated']], [1, 0, 0.0131344230…, []]]
 */
export function levels(input: LevelsInput): LevelState[] {
  validateLevelsInput(input);
  const { alpha, fieldAu: B, cutoffBohr: rc, mMax } = input;
  const floor = input.energyFloorHartree ?? 0;
  const lambda = alpha * B;
  const rhoC = rc * Math.sqrt(B);
  const p = { alpha, cutoffBohr: rc, floor, anion: input.hasFieldFreeAnion ?? false };
  const out: LevelState[] = [];
  for (let m = 0; m <= mMax; m++) {
    const orb = solveOrbital(m, lambda, rhoC, {
      tol: input.tol,
      // search a little below the floor so that states just under it are still reported
      epsMin: floor > 0 ? (floor / B) * 1e-3 : undefined,
    });
    for (const lv of orb.levels) {
      const bindingHartree = B * lv.epsilon;
      out.push({
        m,
        nu: lv.nu,
        parity: lv.parity,
        bindingHartree,
        bindingOverB: lv.epsilon,
        relError: lv.relError,
        flags: levelFlags({ m, epsOverB: lv.epsilon, bindingHartree, resolved: lv.resolved }, p),
      });
    }
  }
  return out;
}
