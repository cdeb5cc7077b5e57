/**
 * Serializable interpolation model of one orbital over one map (internal data of the fast map;
 * plain numbers and typed arrays, so it can be structured-cloned to a worker).
 *
 * Coordinates: s = ln B (B in atomic units) and, per level ν,
 *   u = ln(λ − λ_c,ν(s)),  λ = αB,  λ_c,0 ≡ 0,
 * with the interpolated quantity G_ν(u, s) = ln ε̃ − 2u, ε̃ = ε/B (nearly constant both in the weak-
 * coupling limit, where ε̃ ∝ λ², and near a threshold, where ε̃ ∝ (λ − λ_c)²).
 */

/** One level's tensor Chebyshev interpolant of G over ξ ∈ [−1, 1] (u) × y ∈ [−1, 1] (s). */
export interface SurfaceModel {
  nu: number;
  /** s-range [sA, sB] (s = ln B) of the surface: y = 2(s − sA)/(sB − sA) − 1. */
  sA: number;
  sB: number;
  /**
   * Row-wise affine map ξ ↔ u: u = uLow(s) + (ξ + 1)(uHigh(s) − uLow(s))/2 with uLow = uA + shA·s,
   * uHigh = uB + shB·s. Ground state: shA = shB = 1 (ξ is ln α); excited: shA = 0, shB = 1 with
   * uB = ln α_max (the upper end is ln λ_max(B), the largest λ of the row).
   */
  uA: number;
  shA: number;
  uB: number;
  shB: number;
  /**
   * Excited levels: the ends are relative to the threshold, uLow = ln λ_c,ν(s) + uA and
   * uHigh = ln λ_c,ν(s) + uB, i.e. ξ is affine in v = ln((λ − λ_c)/λ_c).
   */
  relThreshold: boolean;
  degU: number;
  degS: number;
  /** Chebyshev coefficients c[i·(degS + 1) + k] of G(ξ, y). */
  coef: Float64Array;
  /** Estimated largest |G_interp − G| on the surface (≈ relative error of ε). */
  errG: number;
  /** Parts of errG: Chebyshev tails in u and in s, discretisation error of the node values. */
  tailU: number;
  tailS: number;
  disc: number;
}

/**
 * A threshold curve ln λ_c,ν(s) as a Chebyshev series over [sA, sB], the fields where level ν exists
 * somewhere in the map (below sA, λ_c,ν > α_max·B: the level is absent from every cell of the row).
 */
export interface ThresholdModel {
  nu: number;
  sA: number;
  sB: number;
  deg: number;
  coef: Float64Array;
  /** Estimated largest relative error of λ_c,ν (interpolation + discretisation). */
  relErr: number;
}

/** Levels interpolated over one s-range [sA, sB]. */
export interface GroupModel {
  sA: number;
  sB: number;
  surfaces: SurfaceModel[];
}

export interface OrbitalModel {
  m: number;
  /** Ground state over the whole field range. */
  ground: GroupModel;
  /** Excited levels ν = 1…, each over the fields where it exists somewhere in the map (null if none). */
  excited: GroupModel | null;
  /** Threshold curves of the excited levels ν = 1…levels − 1. */
  thresholds: ThresholdModel[];
  /** Largest number of levels in any cell of the map (1 + number of excited surfaces). */
  levels: number;
  /** Work: node solves and Magnus sweeps spent building the model. */
  nodeSolves: number;
  sweeps: number;
}
