import { DomainError } from '../errors.js';
import { tricomiRatio } from './tricomiRatio.js';

const EULER_GAMMA = 0.57721566490153286061;
const EPS = 1.1102230246251565e-16;

/** ψ(n) = −γ + Σ_{k<n} 1/k for integer n ≥ 1 (DLMF 5.4.14). Internal. */
export function digammaInteger(n: number): number {
  let s = -EULER_GAMMA;
  for (let k = 1; k < n; k++) s += 1 / k;
  return s;
}

/**
 * Power series of Eₙ(x), n ≥ 1, 0 < x ≤ 1 (DLMF 8.19.8 / A&S 5.1.12):
 * Eₙ(x) = (−x)^(n−1)/(n−1)! (ψ(n) − ln x) − Σ_{k≥0, k≠n−1} (−x)^k / ((k−n+1) k!).
 */
function expnSeries(n: number, x: number): number {
  let sum = 0;
  let pow = 1; // (−x)^k / k!
  let logTerm = 0;
  for (let k = 0; k < n + 400; k++) {
    if (k === n - 1) {
      logTerm = pow * (digammaInteger(n) - Math.log(x));
    } else {
      const t = pow / (k - n + 1);
      sum -= t;
      if (k > n && Math.abs(t) <= EPS * Math.abs(sum + logTerm)) break;
    }
    pow *= -x / (k + 1);
  }
  return logTerm + sum;
}

function checkArgs(fn: string, n: number, x: number): void {
  if (!Number.isInteger(n) || n < 0) throw new DomainError('n', `${fn}: n must be an integer ≥ 0, got ${n}`);
  if (!(x >= 0) || !Number.isFinite(x)) throw new DomainError('x', `${fn}: x must be finite and ≥ 0, got ${x}`);
}

/**
 * Scaled generalized exponential integral eˣ Eₙ(x), n = 0, 1, 2, …, x ≥ 0.
 *
 * Eₙ(x) = ∫₁^∞ e^(−xt) t^(−n) dt (DLMF 8.19.3). Routes: x > 1: continued fraction
 * eˣEₙ(x) = 1/(x + n − 1·n/(x + n + 2 − 2(n+1)/(x + n + 4 − …))) (DLMF 8.19.17, the
 * a = 0 case of `tricomiRatio`), no exponential is formed so nothing over- or
 * underflows up to x = 1e300; x ≤ 1: eˣ × power series (DLMF 8.19.8). n = 0: 1/x.
 * At x = 0: 1/(n − 1) for n ≥ 2, +Infinity for n ≤ 1.
 *
 * Domain: integer n ≥ 0, finite x ≥ 0; throws `DomainError` otherwise.
 * Accuracy: ≤ 3e-15 relative against mpmath 1.3.0 for n ≤ 65, 1e-30 ≤ x ≤ 1e30.
 *
 * Source: F. W. J. Olver et al., NIST Digital Library of Mathematical Functions, §8.19 (2010–);
 * W. H. Press et al., Numerical Recipes, 3rd ed., §6.3 (2007).
 *
 * @example
 * expnScaled(1, 10); // 0.09156333393978808
 */
export function expnScaled(n: number, x: number): number {
  checkArgs('expnScaled', n, x);
  if (x === 0) return n <= 1 ? Infinity : 1 / (n - 1);
  if (n === 0) return 1 / x;
  if (x > 1) return tricomiRatio(0, 2 - n, x);
  return Math.exp(x) * expnSeries(n, x);
}

/**
 * Generalized exponential integral Eₙ(x) = ∫₁^∞ e^(−xt) t^(−n) dt, n = 0, 1, 2, …, x ≥ 0
 * (DLMF 8.19.3). E₀(x) = e^(−x)/x. Routes as `expnScaled`; underflows to 0 for x ≳ 740.
 *
 * Domain: integer n ≥ 0, finite x ≥ 0; throws `DomainError` otherwise.
 *
 * Source: DLMF §8.19 (2010–).
 *
 * @example
 * expn(2, 1); // 0.14849550677592205
 */
export function expn(n: number, x: number): number {
  checkArgs('expn', n, x);
  if (x === 0) return n <= 1 ? Infinity : 1 / (n - 1);
  if (n === 0) return Math.exp(-x) / x;
  if (x > 1) {
    if (x > 745) return 0;
    return Math.exp(-x) * tricomiRatio(0, 2 - n, x);
  }
  return expnSeries(n, x);
}

/**
 * Exponential integral E₁(x) = ∫ₓ^∞ e^(−t)/t dt, x ≥ 0 (DLMF 6.2.1, 8.19.1).
 * E₁(0) = +Infinity.
 *
 * Domain: finite x ≥ 0; throws `DomainError` otherwise.
 *
 * Source: DLMF §6.2, §6.6 (2010–).
 *
 * @example
 * expint1(1); // 0.21938393439552029
 */
export function expint1(x: number): number {
  return expn(1, x);
}
