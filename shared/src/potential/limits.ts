import { checkFinite, checkM, checkNonNegative, checkPositive } from './validate.js';

/**
 * Coefficients c_k of the far-field expansion of the scaled potential,
 *
 *   w_m(ζ; ρ_c) ~ −(1/(2D²)) Σ_k c_k D^(−k),   D = ζ² + ρ_c²,   c_k = (−2)^k (k+1) (m+1)_k,
 *
 * so c₀ = 1, c₁ = −4(m+1), c₂ = 12(m+1)(m+2). In physical units D → (z² + r_c²)/l², i.e.
 * V_m → −α/(2D²)[1 − 4(m+1)l²/D + 12(m+1)(m+2)l⁴/D² − …]. The series is asymptotic
 * (DLMF 13.7.3): truncate it where its terms stop decreasing.
 *
 * Domain: integer m ≥ 0, integer count ≥ 1; throws `DomainError` otherwise.
 * @example scaledTailCoefficients(0, 3); // Float64Array [1, -4, 24]
 */
export function scaledTailCoefficients(m: number, count: number): Float64Array {
  checkM(m);
  if (!Number.isSafeInteger(count) || count < 1) checkPositive('count', Number.NaN);
  const c = new Float64Array(count);
  let a = 1;
  for (let k = 0; k < count; k++) {
    c[k] = a;
    a *= (-2 * (k + 2) * (m + 1 + k)) / (k + 1);
  }
  return c;
}

/**
 * Truncated far-field expansion of w_m(ζ; ρ_c) with `terms` terms (see `scaledTailCoefficients`).
 * Leading term −1/(2ζ⁴) at ρ_c = 0: the −α/(2z⁴) polarization tail in scaled units.
 * Domain: as `scaledTailCoefficients`, finite ζ, finite ρ_c ≥ 0, ζ² + ρ_c² > 0.
 * @example scaledPotentialTail(0, 100, 0, 1); // -5e-9
 */
export function scaledPotentialTail(m: number, zeta: number, rhoC: number, terms: number): number {
  checkFinite('zeta', zeta);
  checkNonNegative('rhoC', rhoC);
  const c = scaledTailCoefficients(m, terms);
  const D = zeta * zeta + rhoC * rhoC;
  checkPositive('zeta² + rhoC²', D);
  let s = 0;
  for (let k = c.length - 1; k >= 0; k--) s = s / D + c[k]!;
  return -s / (2 * D * D);
}

/**
 * Value at the atom for zero cutoff, w_m(0; 0) = −1/(8m(m−1)), m ≥ 2
 * (U(2, 2−m, 0) = Γ(m−1)/Γ(m+1), DLMF 13.2.16). m = 0, 1 diverge.
 * Domain: integer m ≥ 2; throws `DomainError` otherwise.
 * @example scaledPotentialAtOriginZeroCutoff(2); // -0.0625
 */
export function scaledPotentialAtOriginZeroCutoff(m: number): number {
  checkM(m);
  checkPositive('m - 1', m - 1);
  return -1 / (8 * m * (m - 1));
}

/**
 * Leading near-atom form of the m = 0 scaled potential, −1/(4(ζ² + ρ_c²)) (from U(2, 2, b) ≈ 1/b,
 * b → 0; DLMF 13.2.16): the inverse-square core that makes m = 0 cutoff-dependent.
 * Relative error O(b ln b), b = (ζ² + ρ_c²)/2.
 * Domain: finite ζ, finite ρ_c ≥ 0, ζ² + ρ_c² > 0.
 * @example scaledPotentialNearAtomM0(0.01, 0); // -2500
 */
export function scaledPotentialNearAtomM0(zeta: number, rhoC: number): number {
  checkFinite('zeta', zeta);
  checkNonNegative('rhoC', rhoC);
  const D = zeta * zeta + rhoC * rhoC;
  checkPositive('zeta² + rhoC²', D);
  return -0.25 / D;
}
