import { tricomiU2Unchecked } from '../special/tricomiU2.js';
import { checkFinite, checkM, checkNonNegative } from './validate.js';

/**
 * Scaled adiabatic potential w_m(ζ; ρ_c) of the m-th lowest-Landau-level orbital,
 * in units of the magnetic length l = B^(−1/2) and of the cyclotron energy B, per unit
 * λ = αB:
 *
 *   w_m(ζ; ρ_c) = −(1/8) U(2, 2−m, (ζ² + ρ_c²)/2),      V_m(z) = B · λ · w_m(z√B; r_c√B).
 *
 * It is the transverse average ⟨φ_m| −1/(2(ρ² + ζ² + ρ_c²)²) |φ_m⟩ over the density
 * |φ_m|² = u^m e^(−u)/(2π m!), u = ρ²/2 (l = 1). Attractive, even in ζ, strictly
 * increasing in |ζ|; w_m → −1/(2ζ⁴) far away; w_m(0; 0) = −1/(8m(m−1)) for m ≥ 2,
 * −∞ for m = 0, 1 (m = 1: logarithmic, integrable).
 *
 * Domain: integer m ≥ 0, finite ζ, finite ρ_c ≥ 0; throws `DomainError` otherwise.
 * Returns −Infinity at ζ = ρ_c = 0 for m ≤ 1.
 * Accuracy: that of `tricomiU2`, ≤ 1e-14 relative (m ≤ 64).
 *
 * Source: model.md §1; DLMF 13.4.4 (F. W. J. Olver et al., 2010–). The closed form follows
 * from ∫₀^∞ u^m e^(−u) (2u + D)^(−2) du / m! = U(2, 2−m, D/2)/4.
 *
 * @example
 * scaledPotential(2, 0, 0); // -0.0625  (= −1/(8·2·1))
 */
export function scaledPotential(m: number, zeta: number, rhoC: number): number {
  checkM(m);
  checkFinite('zeta', zeta);
  checkNonNegative('rhoC', rhoC);
  return -0.125 * tricomiU2Unchecked(m, 0.5 * (zeta * zeta + rhoC * rhoC));
}

/** Largest number of asymptotic-series terms kept by the fast evaluator. */
const ASYM_TERMS = 24;
const EPS = 1.1102230246251565e-16;
/** Chebyshev table: interval width in t = ln b, number of coefficients per interval. */
const TABLE_DT = 0.5;
const TABLE_N = 16;
/** Below this b the fast evaluator falls back to the power series of `tricomiU2`. */
const TABLE_B_MIN = 1e-8;

/**
 * Chebyshev coefficients of f on [t0, t0 + dt] (TABLE_N first-kind points, DCT-II).
 * Source: J. C. Mason, D. C. Handscomb, Chebyshev Polynomials, §6 (2003).
 */
function chebyshevPiece(f: (t: number) => number, t0: number, dt: number, out: Float64Array, offset: number): void {
  const n = TABLE_N;
  const vals = new Float64Array(n);
  for (let k = 0; k < n; k++) vals[k] = f(t0 + 0.5 * dt * (1 + Math.cos((Math.PI * (k + 0.5)) / n)));
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let k = 0; k < n; k++) s += vals[k]! * Math.cos((Math.PI * j * (k + 0.5)) / n);
    out[offset + j] = ((j === 0 ? 1 : 2) / n) * s;
  }
}

/** Origin of the shared piece grid in t = ln b: piece k covers [T_ORIGIN + k·TABLE_DT, T_ORIGIN + (k+1)·TABLE_DT]. */
const T_ORIGIN = Math.log(TABLE_B_MIN);

/**
 * Chebyshev pieces of U(2, 2−m, e^t) on the fixed grid of t from T_ORIGIN, shared by every ρ_c of one m
 * (U does not depend on ρ_c: only the range of b = (ζ² + ρ_c²)/2 a fast evaluator needs does). Pieces
 * are computed once, when an evaluator first needs them; `built[k]` marks piece k as filled.
 */
interface PieceTable {
  table: Float64Array;
  built: Uint8Array;
}
const PIECE_TABLES = new Map<number, PieceTable>();

/** The pieces k = first…last of orbital m, computed where not yet built (module-level cache). */
function pieceTable(m: number, first: number, last: number): Float64Array {
  let pt = PIECE_TABLES.get(m);
  if (pt === undefined || pt.built.length <= last) {
    const n = Math.max(last + 1, 2 * (pt?.built.length ?? 0));
    const table = new Float64Array(n * TABLE_N);
    const built = new Uint8Array(n);
    if (pt !== undefined) {
      table.set(pt.table);
      built.set(pt.built);
    }
    pt = { table, built };
    PIECE_TABLES.set(m, pt);
  }
  const u = (t: number): number => tricomiU2Unchecked(m, Math.exp(t));
  for (let k = first; k <= last; k++) {
    if (pt.built[k] === 0) {
      chebyshevPiece(u, T_ORIGIN + k * TABLE_DT, TABLE_DT, pt.table, k * TABLE_N);
      pt.built[k] = 1;
    }
  }
  return pt.table;
}

/**
 * Fast evaluator of w_m(ζ; ρ_c) for fixed (m, ρ_c): the hot path of the bound-state solver.
 *
 * Validates (m, ρ_c) once and returns `(zeta) => w_m(zeta; rhoC)`, which allocates nothing.
 * In b = (ζ² + ρ_c²)/2 it uses three routes, all prepared at construction:
 * - b ≥ b_asym(m): the far-field series U ≈ b⁻² Σ_{k<K} (−1)^k (k+1)(m+1)_k b^(−k)
 *   (DLMF 13.7.3), K ∈ {4, 8, 14, 24} the fewest terms whose truncation error is below
 *   3e-17 at that b (thresholds precomputed);
 * - max(b_c, 1e-8) ≤ b < b_asym: piecewise Chebyshev interpolation of U in t = ln b
 *   (intervals of 0.5 in t on a fixed grid from t = ln 1e-8, 16 coefficients each, built from
 *   `tricomiU2`). U is analytic in the strip |Im t| < π, so the interpolation error is far below the
 *   1e-14 accuracy of the nodes' values. U does not depend on ρ_c, so the pieces are computed once
 *   per m and shared by all evaluators of that m (a map makes ~1000 evaluators, one per row and mesh);
 * - b < 1e-8 (only when ρ_c < 1.5e-4): `tricomiU2` directly (power series).
 * Construction costs ≈ 1 ms the first time an m needs its pieces (≤ 60 intervals × 16 evaluations
 * of `tricomiU2`), then a few microseconds.
 * The returned function does not check its argument (NaN in → NaN out; ζ must be finite).
 * It agrees with `scaledPotential` to within 1e-14 relative (tested on m = 0…64).
 *
 * Domain: integer m ≥ 0, finite ρ_c ≥ 0; throws `DomainError` otherwise.
 * Speed: ≈ 20–40 ns per call (see docs/physics/adiabatic-potentials.md for the measurement).
 *
 * Sources: DLMF §13.7 (F. W. J. Olver et al., 2010–); J. C. Mason, D. C. Handscomb,
 * Chebyshev Polynomials (2003); L. N. Trefethen, Approximation Theory and Approximation
 * Practice, Ch. 8 (2013).
 *
 * @example
 * const w = makeScaledPotential(3, 0.5);
 * w(2); // equals scaledPotential(3, 2, 0.5) to 1e-14
 */
export function makeScaledPotential(m: number, rhoC: number): (zeta: number) => number {
  checkM(m);
  checkNonNegative('rhoC', rhoC);
  const bc = 0.5 * rhoC * rhoC;
  // far-field series U ≈ b⁻² Σ a_k b^(−k), a_k = (−1)^k (k+1)(m+1)_k
  const coef = new Float64Array(ASYM_TERMS);
  let a = 1;
  for (let k = 0; k < ASYM_TERMS; k++) {
    coef[k] = a;
    a *= (-(k + 2) * (m + 1 + k)) / (k + 1);
  }
  // smallest b at which K terms of the series have converged, |a_K| b^(−K) ≤ EPS/4, and the
  // terms still decrease at k = K (the series is only asymptotic); tiers K = 4, 8, 14, 24
  const threshold = (K: number): number => {
    let aK = 1;
    for (let k = 0; k < K; k++) aK *= ((k + 2) * (m + 1 + k)) / (k + 1);
    return Math.max(1, Math.pow(aK / (EPS / 4), 1 / K), ((K + 1) * (m + K)) / K);
  };
  const b4 = threshold(4);
  const b8 = threshold(8);
  const b14 = threshold(14);
  const bAsym = threshold(ASYM_TERMS);
  const bLo = Math.max(bc, TABLE_B_MIN);
  const useTable = bLo < bAsym;
  const invDt = 1 / TABLE_DT;
  // shared pieces firstPiece…lastPiece cover [bLo, bAsym]
  const firstPiece = useTable ? Math.max(0, Math.floor((Math.log(bLo) - T_ORIGIN) * invDt)) : 0;
  const lastPiece = useTable ? Math.max(firstPiece, Math.ceil((Math.log(bAsym) - T_ORIGIN) * invDt) - 1) : 0;
  const table = useTable ? pieceTable(m, firstPiece, lastPiece) : new Float64Array(0);
  const t0 = T_ORIGIN;

  return (zeta: number): number => {
    const b = 0.5 * zeta * zeta + bc;
    if (b >= bAsym) {
      const ib = 1 / b;
      const K = b >= b4 ? 4 : b >= b8 ? 8 : b >= b14 ? 14 : ASYM_TERMS;
      let s = coef[K - 1]!;
      for (let k = K - 2; k >= 0; k--) s = s * ib + coef[k]!;
      return -0.125 * s * ib * ib;
    }
    if (b < bLo) return -0.125 * tricomiU2Unchecked(m, b);
    const v = (Math.log(b) - t0) * invDt;
    let i = Math.floor(v);
    if (i < firstPiece) i = firstPiece;
    else if (i > lastPiece) i = lastPiece;
    const x = 2 * (v - i) - 1;
    const x2 = 2 * x;
    // Clenshaw recurrence
    const o = i * TABLE_N;
    let b1 = 0;
    let b2 = 0;
    for (let j = TABLE_N - 1; j >= 1; j--) {
      const tmp = x2 * b1 - b2 + table[o + j]!;
      b2 = b1;
      b1 = tmp;
    }
    return -0.125 * (x * b1 - b2 + table[o]!);
  };
}
