/** Grid and version of the committed width table (shared by generator and tests). */
export const GENERATOR_NAME = 'shared/scripts/width-table/generateWidthTable.ts';
export const GENERATOR_VERSION = '1.0.0';
export const TABLE_M = Array.from({ length: 17 }, (_, i) => i); // 0 … 16
export const TABLE_P = Array.from({ length: 15 }, (_, i) => 2 + 0.5 * i); // 2, 2.5, …, 9
export const TABLE_XI = [
  ...Array.from({ length: 16 }, (_, i) => 1 + 0.125 * i), // 1 … 2.875
  ...Array.from({ length: 35 }, (_, i) => 3 + 0.25 * i), // 3 … 11.5
];
/** ln(Γ/ε) below which the solver's width is not resolved in double precision. */
export const RESOLVABLE_LN_WIDTH = -55;
