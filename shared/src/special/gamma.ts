import { DomainError } from '../errors.js';

/*
 * Lanczos approximation with g = 7, n = 9 (coefficients as tabulated by
 * P. Godfrey and reproduced in W. H. Press et al., Numerical Recipes, 3rd ed.,
 * §6.1 (2007)); relative accuracy about 2e-15 for Re x > 0.5.
 * C. Lanczos, "A precision approximation of the gamma function",
 * SIAM J. Numer. Anal. B 1, 86 (1964).
 */
const LANCZOS_G = 7;
const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
  -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
  1.5056327351493116e-7,
];
const LN_SQRT_2PI = 0.91893853320467274178;
const SQRT_2PI = 2.5066282746310005024;

/** Exact factorials 0! … 170! (each exactly rounded product of integers, built once). */
const FACTORIALS: readonly number[] = (() => {
  const f = [1];
  for (let k = 1; k <= 170; k++) f.push(f[k - 1]! * k);
  return f;
})();

function lanczosSum(x: number): number {
  // x is the shifted argument (z − 1)
  let s = LANCZOS[0]!;
  for (let i = 1; i < LANCZOS.length; i++) s += LANCZOS[i]! / (x + i);
  return s;
}

/**
 * Gamma function Γ(x) for real x.
 *
 * Γ(x) = ∫₀^∞ t^(x−1) e^(−t) dt (DLMF 5.2.1); reflection Γ(x)Γ(1−x) = π / sin(πx)
 * (DLMF 5.5.3) for x < 0.5. Integers 1…171 return the exact factorial.
 *
 * Domain: finite x, not a non-positive integer. Returns +Infinity for x > 171.62
 * (overflow). Throws `DomainError` for NaN, ±Infinity and x ∈ {0, −1, −2, …}.
 *
 * Accuracy: ≤ 3e-15 relative against mpmath 1.3.0 on the test points (see tests).
 *
 * Source: C. Lanczos, SIAM J. Numer. Anal. B 1, 86 (1964); F. W. J. Olver et al.,
 * NIST Digital Library of Mathematical Functions, §5 (2010–).
 *
 * @example
 * gamma(0.5); // 1.7724538509055159 (√π)
 */
export function gamma(x: number): number {
  if (!Number.isFinite(x)) throw new DomainError('x', `gamma: x must be finite, got ${x}`);
  if (Number.isInteger(x)) {
    if (x <= 0) throw new DomainError('x', `gamma: pole at non-positive integer x = ${x}`);
    return x <= 171 ? FACTORIALS[x - 1]! : Infinity;
  }
  if (x < 0.5) {
    // reflection; sin(πx) evaluated with argument reduction to keep accuracy
    const s = sinPi(x);
    return Math.PI / (s * gamma(1 - x));
  }
  if (x > 171.7) return Infinity;
  if (x > 10) return gammaStirling(x);
  const z = x - 1;
  const t = z + LANCZOS_G + 0.5;
  // split the power to avoid premature overflow near x = 171
  const p = Math.pow(t, (z + 0.5) / 2);
  return ((SQRT_2PI * p) * (p * Math.exp(-t))) * lanczosSum(z);
}

/**
 * Stirling series for x > 10 (DLMF 5.11.1, Bernoulli terms through 1/x¹³, truncation
 * < 1e-17): Γ(x) = √(2π) x^(x−½) e^(−x) exp(Σ), the power split in two halves so that
 * nothing overflows below x = 171.6.
 */
function stirlingSeries(x: number): number {
  const ix = 1 / x;
  const ix2 = ix * ix;
  return (
    ix *
    (1 / 12 -
      ix2 * (1 / 360 - ix2 * (1 / 1260 - ix2 * (1 / 1680 - ix2 * (1 / 1188 - ix2 * (691 / 360360 - ix2 / 156))))))
  );
}

function gammaStirling(x: number): number {
  const p = Math.pow(x, (x - 0.5) / 2);
  return SQRT_2PI * p * (p * Math.exp(-x)) * Math.exp(stirlingSeries(x));
}

/**
 * Natural logarithm of |Γ(x)|.
 *
 * Lanczos form ln Γ(x) = ln√(2π) + (x − ½) ln t − t + ln A_g(x), t = x + g − ½,
 * reflection for x < 0.5. Domain as for `gamma`; finite for all finite
 * non-pole x (no overflow up to x ~ 1e305).
 *
 * Source: C. Lanczos (1964); DLMF §5.5.
 *
 * @example
 * lnGamma(100); // 359.1342053695754
 */
export function lnGamma(x: number): number {
  if (!Number.isFinite(x)) throw new DomainError('x', `lnGamma: x must be finite, got ${x}`);
  if (Number.isInteger(x) && x <= 0) throw new DomainError('x', `lnGamma: pole at x = ${x}`);
  if (x === 1 || x === 2) return 0;
  if (x < 0.5) return Math.log(Math.PI / Math.abs(sinPi(x))) - lnGamma(1 - x);
  if (x < 20) return Math.log(Math.abs(gamma(x)));
  // Stirling series (DLMF 5.11.1) with 1/(12x) − 1/(360x³) + 1/(1260x⁵) − 1/(1680x⁷)
  return (x - 0.5) * Math.log(x) - x + LN_SQRT_2PI + stirlingSeries(x);
}

/** sin(πx) with exact argument reduction (internal). */
export function sinPi(x: number): number {
  let r = x % 2; // exact
  if (r < 0) r += 2;
  if (r > 1) return -sinPi(r - 1);
  if (r > 0.5) r = 1 - r; // exact for r ∈ (0.5, 1]
  return Math.sin(Math.PI * r);
}

/** n! for integer 0 ≤ n ≤ 170 (exact to rounding), Infinity above. */
export function factorial(n: number): number {
  if (!Number.isInteger(n) || n < 0) throw new DomainError('n', `factorial: n must be a non-negative integer, got ${n}`);
  return n <= 170 ? FACTORIALS[n]! : Infinity;
}
