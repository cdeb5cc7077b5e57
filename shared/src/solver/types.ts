/** An even potential v(x) (hartree-like units of the caller), attractive (v ≤ 0), v → 0 as |x| → ∞. */
export type EvenPotential = (x: number) => number;

/** Parity of a bound state of an even potential. */
export type Parity = 'even' | 'odd';

/** Options of the bound-state solver (all optional). */
export interface BoundStateOptions {
  /**
   * Coupling λ multiplying the potential: the solver treats λ·v(x).
   * Default 1.
   */
  coupling?: number;
  /** Map scale a in x = a·sinh t: about half the width of the core of v. Default 1. */
  scale?: number;
  /**
   * Accuracy knob: target relative accuracy of ε. Sets the step parameters
   * hMax = 0.07·(tol/1e-8)^(1/6), cOsc = 2·hMax (hMax clamped to [0.004, 0.25]).
   * Default 1e-10. Measured accuracies are in docs/physics/solver.md.
   */
  tol?: number;
  /** Explicit largest step in t (overrides tol). */
  hMax?: number;
  /** Explicit step per radian of the local WKB phase (overrides tol). */
  cOsc?: number;
  /** Tail coefficient: v(x) ≈ −c4/x⁴ at large |x| (enables the exact 1/x⁴ tail in counting). */
  c4?: number;
  /** Positions x > 0 where v is discontinuous (made mesh nodes). */
  breakpoints?: readonly number[];
  /** Largest |x| the integration may reach. Default 1e15. */
  xMax?: number;
  /**
   * Smallest binding energy searched (same units as v). Default 1e-26·depth.
   * Counted states bound more weakly are returned with resolved = false.
   */
  epsMin?: number;
  /** Solve only levels ν ≤ nuMax (default: all counted levels). nuMax = 0 skips the count. */
  nuMax?: number;
  /** Re-solve each level on a mesh with all steps halved and report the difference. Default true. */
  errorEstimate?: boolean;
}

/** One bound state of −½g'' + λv(x)g = −εg. */
export interface BoundState {
  /** Level index ν = 0, 1, 2, … in order of decreasing binding; parity = ν mod 2. */
  nu: number;
  parity: Parity;
  /** Binding energy ε > 0 (E = −ε), units of v. For resolved = false: an upper bound (epsMin). */
  epsilon: number;
  /** Estimated relative error of epsilon (NaN if not estimated or not resolved). */
  relError: number;
  /** False when the state is counted but bound more weakly than epsMin. */
  resolved: boolean;
}

/** Result of solveBoundStates. */
export interface BoundStateSpectrum {
  states: BoundState[];
  /** Number of bound states of each parity and in total (from the zero-energy solution); NaN if not counted. */
  countEven: number;
  countOdd: number;
  count: number;
  /** Depth max λ|v| seen on the mesh. */
  depth: number;
  /** Work done: potential evaluations and matching-function evaluations. */
  potentialEvaluations: number;
  mismatchEvaluations: number;
}
