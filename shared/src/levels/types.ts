import type { Parity } from '../solver/types.js';

/** Validity flags of a state (docs/physics/solver.md; model.md §3). */
export type LevelFlag =
  /** m = 0 with α/r_c² ≥ 1: the binding depends on the short-range cutoff. */
  | 'cutoff-dominated'
  /** ε/B > 0.1: binding not small against the Landau spacing; the adiabatic reduction is unreliable. */
  | 'non-adiabatic'
  /** m = 0 for an atom with a field-free negative ion: this channel connects to the real anion. */
  | 'field-free-anion'
  /** ε below the requested energy floor: treat as not bound. */
  | 'below-floor'
  /** Counted (zero-energy nodes) but bound more weakly than the solver's smallest searched ε. */
  | 'unresolved';

/** Input of `levels` (atomic units). */
export interface LevelsInput {
  /** Static dipole polarizability α, a₀³. */
  alpha: number;
  /** Magnetic field B in atomic units (B₀ = 2.350517567581e5 T). */
  fieldAu: number;
  /** Cutoff r_c of V = −α/(2(r² + r_c²)²), bohr. */
  cutoffBohr: number;
  /** Largest orbital m solved, integer 0…64. */
  mMax: number;
  /** States bound by less than this (hartree) are flagged below-floor. Default 0. */
  energyFloorHartree?: number;
  /** The atom has a bound field-free negative ion: flag m = 0. Default false. */
  hasFieldFreeAnion?: boolean;
  /** Accuracy knob of the solver (target relative accuracy). Default 1e-10. */
  tol?: number;
}

/** One field-induced bound state of the fixed atom. */
export interface LevelState {
  /** Orbital: the electron's angular momentum about B is −m. */
  m: number;
  /** Level index along z within orbital m (0 = deepest). */
  nu: number;
  parity: Parity;
  /** Binding energy ε below the lowest-Landau-level threshold, hartree. */
  bindingHartree: number;
  /** ε/B (the scaled binding ε̃ = f(αB, r_c√B)). */
  bindingOverB: number;
  /** Estimated relative error of the binding (half-step re-solve). */
  relError: number;
  flags: LevelFlag[];
}

/** One level of the scaled single-orbital problem. */
export interface OrbitalLevel {
  nu: number;
  parity: Parity;
  /** Scaled binding ε̃ = ε/B. */
  epsilon: number;
  relError: number;
  resolved: boolean;
}

/** Scaled levels of orbital m: −½g'' + λ w_m(ζ; ρ_c) g = −ε̃ g. */
export interface OrbitalSpectrum {
  m: number;
  lambda: number;
  rhoC: number;
  levels: OrbitalLevel[];
  /** Number of bound states (NaN when only the ground state was asked for: nuMax = 0). */
  count: number;
  countEven: number;
  countOdd: number;
  /** Depth λ·|w_m(0; ρ_c)| (scaled). */
  depth: number;
}

/** Options of solveOrbital. */
export interface OrbitalOptions {
  /** Target relative accuracy (the solver's tol). Default 1e-10; 2e-7 is ~4× faster. */
  tol?: number;
  /** Solve only ν ≤ nuMax (0 = ground state only, skips counting). Default: all. */
  nuMax?: number;
  /** Half-step re-solve for relError. Default true. */
  errorEstimate?: boolean;
  /** Smallest scaled binding searched. Default 1e-26·depth. */
  epsMin?: number;
  /** Warm start: approximate ε̃ per ν (speed only; see SolveCallOptions.guess). */
  guess?: readonly number[];
}
