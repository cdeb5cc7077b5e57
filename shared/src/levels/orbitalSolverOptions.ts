import type { BoundStateOptions } from '../solver/types.js';

/** Tail coefficient of w_m: w_m(ζ) → −1/(2ζ⁴) (model.md §1). */
export const W_TAIL_C4 = 0.5;

/**
 * Solver options for λ·w_m(ζ; ρ_c): map scale a = min(ρ_c, 1)/2 (the core of
 * w_m has width ~ρ_c for m = 0 and ~1 for m ≥ 1), tail coefficient ½. Internal.
 */
export function orbitalSolverOptions(lambda: number, rhoC: number): BoundStateOptions {
  return { coupling: lambda, scale: Math.min(rhoC, 1) / 2, c4: W_TAIL_C4 };
}
