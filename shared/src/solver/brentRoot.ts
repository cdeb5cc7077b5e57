/**
 * Root of f on a bracket [a, b] with f(a)·f(b) ≤ 0 by Brent's method
 * (inverse quadratic interpolation, secant and bisection safeguards):
 * R. P. Brent, "Algorithms for Minimization without Derivatives" (1973),
 * ch. 4 ("zero"). Converges superlinearly for smooth f, never slower than
 * bisection; stops when the bracket is below 2·xTol (absolute in x).
 *
 * Bad input: throws RangeError if f(a) and f(b) have the same strict sign.
 *
 * @example
 * brentRoot((x) => x * x - 2, 0, 2, -2, 2, 1e-15).x // 1.4142135623730951
 */
export function brentRoot(
  f: (x: number) => number,
  a: number,
  b: number,
  fa: number,
  fb: number,
  xTol: number,
  maxIter = 100,
): { x: number; evaluations: number } {
  if (fa * fb > 0) throw new RangeError(`brentRoot: no sign change on [${a}, ${b}] (f = ${fa}, ${fb})`);
  if (fa === 0) return { x: a, evaluations: 0 };
  if (fb === 0) return { x: b, evaluations: 0 };
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  let evaluations = 0;
  for (let iter = 0; iter < maxIter; iter++) {
    if (fb * fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xTol;
    const mid = 0.5 * (c - b);
    if (Math.abs(mid) <= tol || fb === 0) return { x: b, evaluations };
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      let p: number;
      let q: number;
      const s = fb / fa;
      if (a === c) {
        p = 2 * mid * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * mid * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * mid * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = mid;
        e = d;
      }
    } else {
      d = mid;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : mid > 0 ? tol : -tol;
    fb = f(b);
    evaluations++;
  }
  return { x: b, evaluations };
}
