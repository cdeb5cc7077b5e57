import { makeScaledPotential } from '../potential/scaledPotential.js';
import { W_TAIL_C4 } from '../levels/orbitalSolverOptions.js';
import { brentRoot } from '../solver/brentRoot.js';
import { pruferMismatch } from '../solver/pruferMismatch.js';
import { buildMesh } from '../solver/solveBoundStates.js';
import type { SinhMesh } from '../solver/sinhMesh.js';
import { zeroEnergyPhase } from '../solver/zeroEnergyPhase.js';

/** Absolute tolerance in ln ε̃ of a node solve (≈ relative accuracy of the root search). */
const LN_EPS_TOL = 1e-12;
/** Absolute tolerance in ln λ of a threshold search. */
const LN_LAMBDA_TOL = 1e-14;
/** Bound on |F''/(2F')| in ln ε used to stop the secant iteration (with a 1e-3 floor on e₀ below). */
const SECANT_C = 10;
/** Estimated |ln ε̃ error| at which a secant iterate is accepted (node values need ~1e-9). */
const SECANT_ACCEPT = 1e-9;

/**
 * Solver for one row of a map surface: orbital m at fixed ρ_c = r_c√B (one field), any coupling
 * λ ≤ lambdaRef (internal to the map). The scaled potential w_m(ζ; ρ_c) is sampled once on the
 * solver's sinh mesh (solver/sinhMesh.ts, step density set by lambdaRef and tol) and every call then
 * costs only the Magnus sweeps of the Prüfer matching function (solver/pruferMismatch.ts) or of the
 * zero-energy phase (solver/zeroEnergyPhase.ts). Levels, thresholds and counts found here all refer
 * to the same discretised potential, so a level near its threshold and the threshold itself are
 * consistent to rounding. Unlike `solveOrbital`, a level is found from a predicted value by a
 * narrow bracket and Brent's method (2–6 sweeps instead of ~30).
 */
export class OrbitalRowSolver {
  readonly mesh: SinhMesh;
  /** |w_m(0; ρ_c)|: the depth per unit λ. */
  readonly depthPerLambda: number;
  /**
   * Number of Magnus sweeps done (matching functions and zero-energy phases), counted in `work`
   * (shared by the solvers of one build, so the build need not keep every solver alive to sum them).
   */
  get sweeps(): number {
    return this.work.sweeps;
  }
  /** dF/d ln ε near the root found by the last lnLevel call (a hint for the next node's search). */
  lastSlope = NaN;
  /** dΨ/d ln λ near the root found by the last threshold call (a hint for the next row's search). */
  lastThresholdSlope = NaN;

  constructor(
    readonly m: number,
    readonly rhoC: number,
    readonly lambdaRef: number,
    tol: number,
    refine = 1,
    private readonly work: { sweeps: number } = { sweeps: 0 },
  ) {
    const w = makeScaledPotential(m, rhoC);
    this.mesh = buildMesh(w, { scale: Math.min(rhoC, 1) / 2, c4: W_TAIL_C4, tol }, refine, lambdaRef);
    this.depthPerLambda = Math.abs(w(0));
  }

  /** Zero-energy phase Ψ(λ) of one parity (number of levels of that parity = ⌊Ψ/π⌋). */
  phase(lambda: number, odd: boolean): number {
    this.work.sweeps++;
    return zeroEnergyPhase(this.mesh, lambda, odd, W_TAIL_C4);
  }

  /** Number of bound levels at coupling λ (Sturm count from the zero-energy solution). */
  count(lambda: number): number {
    return Math.floor(this.phase(lambda, false) / Math.PI) + Math.floor(this.phase(lambda, true) / Math.PI);
  }

  /**
   * ln ε̃ of level ν at coupling λ, from the prediction `guess` (ln ε̃) with uncertainty `spread`:
   * secant steps on the matching function F(ε) − jπ in ln ε (monotone, one root per level), stopped
   * when a step is below 1e-10 (superlinear convergence puts the result well below that); if the
   * secant misbehaves, a bracket widened ×4 per try and Brent's method. Returns −Infinity when the
   * level is bound more weakly than e^lnEpsMin (or does not exist).
   */
  lnLevel(lambda: number, nu: number, guess: number, spread: number, lnEpsMin: number, slopeHint = NaN): number {
    const odd = (nu & 1) === 1;
    const target = (nu >> 1) * Math.PI;
    const mesh = this.mesh;
    const G = (s: number): number => {
      this.work.sweeps++;
      return pruferMismatch(mesh, lambda, Math.exp(s), odd) - target;
    };
    void G;
    const lnTop = Math.log(lambda * this.depthPerLambda * 1.0001);
    const d0 = Math.min(Math.max(spread, 1e-9), 0.5);
    // bracket bookkeeping: lo has G > 0 (below the level), hi has G < 0
    let lo = -Infinity;
    let glo = NaN;
    let hi = Infinity;
    let ghi = NaN;
    const note = (s: number, g: number): void => {
      if (g > 0) {
        if (s > lo) {
          lo = s;
          glo = g;
        }
      } else if (s < hi) {
        hi = s;
        ghi = g;
      }
    };
    let x0 = Math.min(guess, lnTop - d0);
    let g0 = G(x0);
    note(x0, g0);
    // second point: a Newton step with the hinted slope if it is plausible, else ± spread
    let x1 = g0 > 0 ? x0 + d0 : x0 - d0;
    if (slopeHint < 0) {
      const nt = x0 - g0 / slopeHint;
      if (Math.abs(nt - x0) < 4 * d0) x1 = nt === x0 ? x0 + 1e-12 : nt;
    }
    let g1 = G(x1);
    note(x1, g1);
    for (let it = 0; it < 8; it++) {
      if (g1 === g0) break;
      this.lastSlope = (g1 - g0) / (x1 - x0);
      const step = (-g1 * (x1 - x0)) / (g1 - g0);
      if (!Number.isFinite(step) || Math.abs(step) > 2) break;
      const x2 = x1 + step;
      if (x2 <= lo || x2 >= hi) break; // outside the known bracket: fall back
      // secant error: e₂ ≈ C·e₁·e₀ with e₁ ≈ |step|, e₀ ≈ |x₀ − x₂|; C = F''/(2F') is O(1) in ln ε
      if (Math.abs(step) * (Math.abs(x0 - x2) + 1e-6) * SECANT_C < SECANT_ACCEPT || Math.abs(step) < 1e-13) return x2;
      x0 = x1;
      g0 = g1;
      x1 = x2;
      g1 = G(x1);
      note(x1, g1);
      if (g1 === 0) return x1;
    }
    // Fallback: complete the bracket and use Brent's method.
    let d = 4 * d0;
    while (!(hi < Infinity)) {
      const b = Math.min(lo + d, lnTop);
      const gb = G(b);
      note(b, gb);
      if (gb > 0 && b >= lnTop) return -Infinity;
      d *= 4;
    }
    while (!(lo > -Infinity)) {
      const a = Math.max(hi - d, lnEpsMin);
      const ga = G(a);
      note(a, ga);
      if (ga <= 0 && a <= lnEpsMin) return -Infinity;
      d *= 4;
    }
    return brentRoot(G, lo, hi, glo, ghi, LN_EPS_TOL).x;
  }

  /**
   * Threshold coupling λ_c,ν (ν ≥ 1) on this row's mesh: the root of Ψ(λ) = (⌊ν/2⌋ + 1)π for the
   * parity ν mod 2 (Ψ increases with λ), searched in ln λ from the prediction `guessLn` ± `spread`:
   * secant steps (the first a Newton step when `slopeHint` ≈ dΨ/d ln λ is given and plausible),
   * stopped when the estimated error of the iterate is below 1e-14 in ln λ; if the secant
   * misbehaves, a bracket and Brent's method to the same tolerance. Returns +Infinity if the level
   * does not appear below 4·lambdaRef (0 if it exists at every coupling down to e^−700).
   * `lastThresholdSlope` is left at dΨ/d ln λ near the root (a hint for the next row).
   */
  threshold(nu: number, guessLn: number, spread: number, slopeHint = NaN): number {
    const odd = (nu & 1) === 1;
    const target = ((nu >> 1) + 1) * Math.PI;
    const H = (x: number): number => this.phase(Math.exp(x), odd) - target;
    const xMax = Math.log(4 * this.lambdaRef);
    const d0 = Math.min(Math.max(spread, 1e-12), 0.5);
    // bracket bookkeeping: lo has H < 0 (level absent), hi has H ≥ 0
    let lo = -Infinity;
    let hi = Infinity;
    const note = (x: number, h: number): void => {
      if (h < 0) lo = Math.max(lo, x);
      else hi = Math.min(hi, x);
    };
    let x0 = Math.min(guessLn, xMax);
    let h0 = H(x0);
    note(x0, h0);
    let x1 = h0 < 0 ? x0 + d0 : x0 - d0;
    if (slopeHint > 0) {
      const nt = x0 - h0 / slopeHint;
      if (Math.abs(nt - x0) < 4 * d0) x1 = nt === x0 ? x0 + 1e-14 : nt;
    }
    x1 = Math.min(x1, xMax);
    let h1 = H(x1);
    note(x1, h1);
    for (let it = 0; it < 10; it++) {
      if (h1 === h0 || x1 === x0) break;
      const slope = (h1 - h0) / (x1 - x0);
      if (slope > 0) this.lastThresholdSlope = slope;
      const step = -h1 / slope;
      if (!Number.isFinite(step) || Math.abs(step) > 1) break;
      const x2 = x1 + step;
      if (x2 <= lo || x2 >= hi || x2 > xMax) break;
      // secant error: e₂ ≈ C·e₁·e₀, e₁ ≈ |step|, e₀ ≈ |x₀ − x₂|, C = Ψ''/(2Ψ') = O(1) in ln λ
      if (Math.abs(step) * (Math.abs(x0 - x2) + 1e-6) * SECANT_C < LN_LAMBDA_TOL || Math.abs(step) < LN_LAMBDA_TOL) return Math.exp(x2);
      x0 = x1;
      h0 = h1;
      x1 = x2;
      h1 = H(x1);
      note(x1, h1);
      if (h1 === 0) return Math.exp(x1);
    }
    return this.thresholdBracketed(H, xMax, Number.isFinite(lo) ? lo : x0, d0);
  }


  /** Fallback of `threshold`: a bracket grown ×4 per try from `start` ± d, then Brent's method. */
  private thresholdBracketed(H: (x: number) => number, xMax: number, start: number, spread: number): number {
    let d = Math.max(spread, 1e-12);
    let a = Math.min(start - d, xMax);
    let ha = H(a);
    let b: number;
    let hb: number;
    if (ha >= 0) {
      b = a;
      hb = ha;
      do {
        b = a;
        hb = ha;
        d *= 4;
        a -= d;
        ha = H(a);
      } while (ha >= 0 && a > -700);
      if (ha >= 0) return 0;
    } else {
      b = Math.min(start + d, xMax);
      hb = H(b);
      while (hb < 0) {
        if (b >= xMax) return Infinity;
        a = b;
        ha = hb;
        d *= 4;
        b = Math.min(b + d, xMax);
        hb = H(b);
      }
    }
    return Math.exp(brentRoot(H, a, b, ha, hb, LN_LAMBDA_TOL).x);
  }
}
