/** Grid and versions of the committed width table (shared by generator and tests). */
export const GENERATOR_NAME = 'shared/scripts/width-table/generateWidthTable.ts';
/**
 * Version of the exact solver's output: keys the per-(m, p) column cache
 * (.cache/<SOLVER_VERSION>/) and the held-out fixture. Bump it when the solver changes.
 */
export const SOLVER_VERSION = '1.0.0';
/**
 * Version of the generator (table layout and post-processing). 1.1.0: per-m p nodes (the base grid
 * plus refinement blocks merged by `--refine`), pole-switch intervals evaluated at the nearer node.
 */
export const GENERATOR_VERSION = '1.1.0';
export const TABLE_M = Array.from({ length: 17 }, (_, i) => i); // 0 … 16
/** Base p grid of every m; refinement blocks add nodes between these for single m. */
export const TABLE_P = Array.from({ length: 15 }, (_, i) => 2 + 0.5 * i); // 2, 2.5, …, 9
export const TABLE_XI = [
  ...Array.from({ length: 16 }, (_, i) => 1 + 0.125 * i), // 1 … 2.875
  ...Array.from({ length: 35 }, (_, i) => 3 + 0.25 * i), // 3 … 11.5
];
/** ln(Γ/ε) below which the solver's width is not resolved in double precision. */
export const RESOLVABLE_LN_WIDTH = -55;
/** Laboratory regime of the accuracy test and of the jump detector: ln(Γ/ε) ≤ this. */
export const LAB_MAX_LN_WIDTH = -0.5;
