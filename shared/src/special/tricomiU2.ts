import { DomainError } from '../errors.js';
import { digammaInteger, expnScaled } from './expint.js';
import { tricomiRatio } from './tricomiRatio.js';

const EPS = 1.1102230246251565e-16;
/** Below this x the power series is used, above it the continued fraction. */
export const U2_SERIES_MAX_X = 1;

/**
 * Asymptotic series U(2, 2−m, x) ~ x^(−2) Σ_k (k+1)(m+1)_k (−1/x)^k (DLMF 13.7.3).
 * Returns NaN if it does not reach double precision before its terms grow.
 */
export function tricomiU2Asymptotic(m: number, x: number, maxTerms = 60): number {
  const ix = -1 / x;
  let term = 1; // (2)_k (m+1)_k / k! (−1/x)^k
  let sum = 1;
  for (let k = 0; k < maxTerms; k++) {
    const next = (term * (k + 2) * (m + 1 + k) * ix) / (k + 1);
    if (Math.abs(next) > Math.abs(term)) return NaN; // divergence sets in
    sum += next;
    term = next;
    if (Math.abs(term) <= EPS * Math.abs(sum)) return sum / (x * x);
  }
  return NaN;
}

/**
 * Power series of U(2, 2−m, x) for m ≥ 1, 0 < x ≤ 1, from U = eˣ[E_m(x) − E_{m+1}(x)]
 * with the two Eₙ series (DLMF 8.19.8) subtracted term by term, p_k = (−x)^k/k!:
 *   e^(−x) U = p_{m−1}(ψ(m) − ln x − 1) − p_m(ψ(m+1) − ln x + 1) + Σ_{k∉{m−1,m}} p_k / ((k−m)(k−m+1)).
 */
function seriesU2(m: number, x: number): number {
  const lnx = Math.log(x);
  let pk = 1;
  let sum = 0;
  for (let k = 0; k < m + 400; k++) {
    if (k === m - 1) sum += pk * (digammaInteger(m) - lnx - 1);
    else if (k === m) sum -= pk * (digammaInteger(m + 1) - lnx + 1);
    else {
      const t = pk / ((k - m) * (k - m + 1));
      sum += t;
      if (k > m && Math.abs(t) <= EPS * Math.abs(sum)) break;
    }
    pk *= -x / (k + 1);
  }
  return Math.exp(x) * sum;
}

/**
 * Tricomi's confluent hypergeometric function U(2, 2−m, x) for integer m ≥ 0, x ≥ 0.
 *
 * U(a, b, x) = (1/Γ(a)) ∫₀^∞ e^(−xt) t^(a−1) (1+t)^(b−a−1) dt (DLMF 13.4.4), so here
 * U(2, 2−m, x) = ∫₀^∞ e^(−xt) t (1+t)^(−m−1) dt = eˣ[E_m(x) − E_{m+1}(x)]
 * (m = 0: 1/x − eˣE₁(x)). It is the transverse average of the polarization potential
 * over the m-th lowest-Landau-level orbital (see `potential/`).
 *
 * Routes: x ≤ 1: power series (E_m − E_{m+1} subtracted term by term; m = 0 via E₁);
 * x > 1: asymptotic series DLMF 13.7.3 where it reaches double precision, otherwise
 * U = r₀r₁ with the ratios r_a = U(a+1)/U(a) (U(0, b, x) = 1) from the continued
 * fraction of the recurrence in a (see `tricomiRatio`) — no subtraction, no cancellation.
 * x = 0: 1/(m(m−1)) for m ≥ 2, +Infinity for m ≤ 1. Large x: U ≈ x^(−2).
 *
 * Domain: integer m ≥ 0, finite x ≥ 0; throws `DomainError` otherwise.
 * Accuracy: ≤ 1e-14 relative against mpmath 1.3.0 for m ≤ 64, 1e-30 ≤ x ≤ 1e30 (see tests
 * and docs/physics/units-and-special-functions.md).
 *
 * Sources: DLMF §13.2, §13.3, §13.7, §8.19 (F. W. J. Olver et al., 2010–);
 * W. Gautschi, SIAM Rev. 9, 24 (1967).
 *
 * @example
 * tricomiU2(0, 1); // 0.40365636569180906  (= 1 − e·E₁(1))
 */
export function tricomiU2(m: number, x: number): number {
  if (!Number.isInteger(m) || m < 0) throw new DomainError('m', `tricomiU2: m must be an integer ≥ 0, got ${m}`);
  if (!(x >= 0) || !Number.isFinite(x)) throw new DomainError('x', `tricomiU2: x must be finite and ≥ 0, got ${x}`);
  return tricomiU2Unchecked(m, x);
}

/** `tricomiU2` without argument checks (m integer ≥ 0, x ≥ 0 finite assumed). */
export function tricomiU2Unchecked(m: number, x: number): number {
  if (x === 0) return m >= 2 ? 1 / (m * (m - 1)) : Infinity;
  if (x <= U2_SERIES_MAX_X) {
    if (m === 0) return 1 / x - expnScaled(1, x);
    return seriesU2(m, x);
  }
  if (x > 30 + 2 * m) {
    const a = tricomiU2Asymptotic(m, x);
    if (a === a) return a;
  }
  const b = 2 - m;
  const r1 = tricomiRatio(1, b, x);
  const r0 = 1 / (x + m - m * r1);
  return r0 * r1;
}
