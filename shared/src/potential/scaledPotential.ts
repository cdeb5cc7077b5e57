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

/**
 * Fast evaluator of w_m(ζ; ρ_c) for fixed (m, ρ_c): the hot path of the bound-state solver.
 *
 * Validates (m, ρ_c) once and returns `(zeta) => w_m(zeta; rhoC)`, which allocates nothing.
 * Precomputed per (m, ρ_c): b_c = ρ_c²/2 and the coefficients
 * (−2)^k (k+1)(m+1)_k of the far-field series in b = (ζ² + ρ_c²)/2, which is used for
 * b ≥ b_asym(m) where 24 terms reach 1e-16; in between the continued fraction of
 * `tricomiU2`, below b = 1 its power series. The returned function does not check its
 * argument (NaN in → NaN out; ζ must be finite). Same values as `scaledPotential` to
 * within a few ulp.
 *
 * Domain: integer m ≥ 0, finite ρ_c ≥ 0; throws `DomainError` otherwise.
 * Speed: see docs/physics/adiabatic-potentials.md (measured ns per call).
 *
 * @example
 * const w = makeScaledPotential(3, 0.5);
 * w(2); // -0.010473… (equals scaledPotential(3, 2, 0.5))
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
  // smallest b at which the truncated series has converged: |a_{K}| b^(−K) ≤ EPS/4
  const last = Math.abs(coef[ASYM_TERMS - 1]!);
  let bAsym = Math.max(1, Math.pow(last / (EPS / 4), 1 / (ASYM_TERMS - 1)));
  // the series is asymptotic: also require that its terms still decrease at k = K
  bAsym = Math.max(bAsym, (ASYM_TERMS + 1) * (m + ASYM_TERMS) / ASYM_TERMS);
  return (zeta: number): number => {
    const b = 0.5 * zeta * zeta + bc;
    if (b >= bAsym) {
      const ib = 1 / b;
      let s = coef[ASYM_TERMS - 1]!;
      for (let k = ASYM_TERMS - 2; k >= 0; k--) s = s * ib + coef[k]!;
      return -0.125 * s * ib * ib;
    }
    return -0.125 * tricomiU2Unchecked(m, b);
  };
}
