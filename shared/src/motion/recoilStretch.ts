/**
 * Recoil correction of the tunnelling exponent.
 *
 * In the atom's frame the moving ion adds B²ρ²/(2M) (ρ the electron's distance
 * from the atom across the field): it pulls the guiding centre back to the atom
 * and closes the decay channel entirely when the transverse energy cannot pay
 * for the binding, E⊥ ≤ ε_eff = (Stark-shifted binding) − (m + ½)Ω. Below that
 * the width is exactly 0. Above it the quadratic barrier lengthens the
 * tunnelling path; the width is the fixed-ion one evaluated at
 *   ξ_eff = ξ √(2 φ(a)/a),   φ(a) = −ln(1 − a)/a − 1,   a = ε_eff/E⊥ < 1,
 * (φ(a) = a/2 + a²/3 + a³/4 + … so ξ_eff → ξ as a → 0 and → ∞ as a → 1).
 *
 * Source of the picture (charged system in crossed fields, pseudomomentum,
 * threshold of the transverse channel): J. E. Avron, I. W. Herbst, B. Simon,
 * Ann. Phys. 114, 431 (1978); P. Schmelcher and L. S. Cederbaum, Phys. Rev. A 43,
 * 287 (1991); the stretch factor is the project's model (model.md §4).
 */

/**
 * √(2φ(a)/a), the factor ξ_eff/ξ. Domain a < 1 (any sign); returns +Infinity
 * for a ≥ 1 (channel closed) and NaN for NaN.
 *
 * @example recoilStretch(0) // 1
 * @example recoilStretch(0.5) // 1.2416 (√(2(2 ln 2 − 1)/0.5))
 */
export function recoilStretch(a: number): number {
  if (!(a < 1)) return Number.isNaN(a) ? NaN : Infinity;
  let ratio: number; // 2φ(a)/a
  if (Math.abs(a) < 1e-3) {
    // 2φ/a = 1 + 2a/3 + a²/2 + 2a³/5 + …  (series of −2 ln(1−a)/a² − 2/a)
    ratio = 1 + a * (2 / 3 + a * (0.5 + a * 0.4));
  } else {
    ratio = (2 * (-Math.log1p(-a) / a - 1)) / a;
  }
  return Math.sqrt(ratio);
}
