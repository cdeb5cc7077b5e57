/**
 * Ratio r_a = U(a+1, b, z) / U(a, b, z) of Tricomi functions, from the
 * three-term recurrence in a (DLMF 13.3.7)
 *
 *   U(a−1, b, z) + (b − 2a − z) U(a, b, z) + a(a − b + 1) U(a+1, b, z) = 0,
 *
 * of which U(·, b, z) is the minimal solution as a → +∞ (z > 0). Pincherle's
 * theorem then gives the convergent continued fraction
 *
 *   r_a = 1 / (d₁ − c₁ / (d₂ − c₂ / (d₃ − …))),  d_j = z + 2(a+j) − b,  c_j = (a+j)(a+j−b+1),
 *
 * evaluated here by the modified Lentz method. With a = 0, b = 2 − n it is the
 * classical continued fraction of eᶻ Eₙ(z) (DLMF 8.19.17). Converges for every
 * z > 0, quickly for z ≳ 1; internal, no argument checks.
 *
 * Sources: W. Gautschi, "Computational aspects of three-term recurrence relations",
 * SIAM Rev. 9, 24 (1967); DLMF §13.3 (2010–); W. J. Lentz, Appl. Opt. 15, 668 (1976).
 *
 * @returns r_a, or NaN if the fraction has not converged after `maxIter` terms.
 */
export function tricomiRatio(a: number, b: number, z: number, maxIter = 20000): number {
  const EPS = 1.1102230246251565e-16;
  const TINY = 1e-300;
  // T = d₁ + (−c₁)/(d₂ + (−c₂)/(d₃ + …)), r = 1/T
  let f = z + 2 * (a + 1) - b;
  if (f === 0) f = TINY;
  let c = f;
  let d = 0;
  for (let j = 1; j <= maxIter; j++) {
    const aj = a + j;
    const num = -aj * (aj - b + 1);
    const den = z + 2 * (aj + 1) - b;
    d = den + num * d;
    if (d === 0) d = TINY;
    c = den + num / c;
    if (c === 0) c = TINY;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) <= EPS) return 1 / f;
  }
  return NaN;
}
