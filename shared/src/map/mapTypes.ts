/**
 * The contract between the engine's whole-map routines and everything that draws, exports or stores
 * their results (the browser workers, the command line, the figure and data exports).
 *
 * Grid: node-centred. Column i (0 ≤ i < nAlpha) sits at `alphas[i]` (a₀³), row j (0 ≤ j < nField) at
 * `fieldsAu[j]` (atomic units of field, B₀ = 2.350517567581 × 10⁵ T), both spaced evenly on the axis
 * scale (log or linear) from the setup's minimum to its maximum inclusive. A cell index is
 * `cell = j * nAlpha + i` (rows of constant field).
 *
 * State layout: for orbital m (0…mMax) and longitudinal level ν (0…levelsPerOrbital−1),
 * `stateIndex(m, ν, cell) = (m * levelsPerOrbital + ν) * cellCount + cell`.
 */

/** Bit flags per (orbital, cell) in `BindingMapResult.flags`. */
export const MAP_FLAG = {
  /** m = 0 with α/r_c² ≳ 1: the result depends on the short-range cutoff. */
  CUTOFF_DOMINATED: 1,
  /** Some level of this orbital has ε/B > 0.1: the single-orbital reduction is doubtful. */
  NON_ADIABATIC: 2,
  /** Some level of this orbital lies below the setup's energy floor and is counted as not bound. */
  BELOW_FLOOR: 4,
  /** The interpolated value could not be certified to the map tolerance and was solved directly. */
  DIRECT_SOLVE: 8,
} as const;

export interface BindingMapResult {
  /** Engine version that produced the numbers (results are a pure function of setup and version). */
  engineVersion: string;
  nAlpha: number;
  nField: number;
  cellCount: number;
  mMax: number;
  /** Levels stored per orbital: the largest number of bound levels of any orbital in any cell. */
  levelsPerOrbital: number;
  /** Polarizability at each column, a₀³. */
  alphas: Float64Array;
  /** Field at each row, atomic units. */
  fieldsAu: Float64Array;
  /** Binding energy ε > 0 in hartree, at `stateIndex(m, ν, cell)`; exactly 0 where that state does not exist or is below the floor. */
  bindingHartree: Float64Array;
  /** Number of bound levels above the floor, per orbital and cell: index `m * cellCount + cell`. */
  counts: Uint16Array;
  /** MAP_FLAG bits per orbital and cell: index `m * cellCount + cell`. */
  flags: Uint8Array;
  /** Largest estimated relative error of any stored binding energy. */
  maxRelError: number;
  /** Number of (orbital, cell) pairs that were solved directly (MAP_FLAG.DIRECT_SOLVE); absent if not tracked. */
  directSolves?: number;
  /** Wall time spent, milliseconds. */
  elapsedMs: number;
}

/** Region class of one state, as stored in `PhaseMapResult.stateClass`. */
export const STATE_CLASS = { NONE: 0, BOUND: 1, RESONANCE: 2, UNBOUND: 3 } as const;
export type StateClassCode = (typeof STATE_CLASS)[keyof typeof STATE_CLASS];

/** The moving-ion classification of a binding map (same grid and state layout). */
export interface PhaseMapResult {
  engineVersion: string;
  /** STATE_CLASS per state, at `stateIndex(m, ν, cell)`. */
  stateClass: Uint8Array;
  /** Width Γ in hartree per state: 0 when bound with no decay channel, +Infinity where destroyed, NaN exactly where stateClass is NONE. */
  widthHartree: Float64Array;
  /** WIDTH_FLAG bits per state (non-adiabatic, outside the width table, channel closed, destroyed, no state). */
  widthFlags: Uint8Array;
  /** States that survive the observation time (class BOUND), per cell. */
  survivors: Uint16Array;
  /** With a temperature: fractions bound / resonance / unbound per state, at 3 · stateIndex + k; otherwise null. */
  fractions: Float32Array | null;
  elapsedMs: number;
}

/** Progress of a whole-map computation, in cells. */
export interface MapProgress {
  done: number;
  total: number;
}

export function stateIndex(m: number, nu: number, cell: number, levelsPerOrbital: number, cellCount: number): number {
  return (m * levelsPerOrbital + nu) * cellCount + cell;
}
