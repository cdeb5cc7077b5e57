/**
 * Chebyshev–Lobatto interpolation on [−1, 1] (internal to the map): nodes, coefficients, tails and
 * Clenshaw evaluation. Nodes are ascending, x_k = −cos(πk/n), k = 0…n, so the nodes of degree n
 * are the even-indexed nodes of degree 2n (nested grids). The interpolant is
 * p(x) = Σ_j c_j T_j(x) with c_j = (2/n) Σ''_k f_k T_j(x_k) (halved first and last terms and
 * halved c_0, c_n) — the discrete cosine transform of type I (J. P. Boyd, Chebyshev and Fourier
 * Spectral Methods, 2nd ed. (Dover 2001), §4.4; L. N. Trefethen, Approximation Theory and
 * Approximation Practice (SIAM 2013), ch. 3).
 */

/** Chebyshev–Lobatto nodes of degree n (n + 1 points) on [−1, 1], ascending. */
export function lobattoNodes(n: number): Float64Array {
  const x = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) x[k] = -Math.cos((Math.PI * k) / n);
  x[0] = -1;
  x[n] = 1;
  if (n % 2 === 0) x[n / 2] = 0;
  return x;
}

/**
 * Chebyshev coefficients of the degree-n interpolant of values f at the ascending Lobatto nodes
 * (read as f[offset + k·stride], k = 0…n), written to out[outOffset + j·outStride].
 */
export function chebCoefficients(
  f: ArrayLike<number>,
  n: number,
  offset: number,
  stride: number,
  out: Float64Array,
  outOffset: number,
  outStride: number,
  cosTable: Float64Array,
): void {
  // cosTable[q] = cos(π q / n), q = 0…2n−1; node k (ascending) is at angle π(n − k)/n.
  for (let j = 0; j <= n; j++) {
    let s = 0;
    for (let k = 0; k <= n; k++) {
      const w = k === 0 || k === n ? 0.5 : 1;
      s += w * f[offset + k * stride] * cosTable[(j * (n - k)) % (2 * n)];
    }
    s *= 2 / n;
    if (j === 0 || j === n) s *= 0.5;
    out[outOffset + j * outStride] = s;
  }
}

/** cos(πq/n) for q = 0…2n−1 (the table chebCoefficients needs). */
export function cosTable(n: number): Float64Array {
  const t = new Float64Array(2 * n);
  for (let q = 0; q < 2 * n; q++) t[q] = Math.cos((Math.PI * q) / n);
  return t;
}

/** Σ_j c[offset + j·stride] T_j(x), j = 0…n (Clenshaw's recurrence). */
export function clenshaw(c: ArrayLike<number>, n: number, offset: number, stride: number, x: number): number {
  let b1 = 0;
  let b2 = 0;
  const x2 = 2 * x;
  for (let j = n; j >= 1; j--) {
    const b0 = c[offset + j * stride] + x2 * b1 - b2;
    b2 = b1;
    b1 = b0;
  }
  return c[offset] + x * b1 - b2;
}

/**
 * 2D coefficients of the tensor interpolant of values v[i·(ns+1) + k] at (u-node i, s-node k),
 * degrees nu (first index) and ns (second). Returns c[i·(ns+1) + k].
 */
export function chebCoefficients2d(v: Float64Array, nu: number, ns: number): Float64Array {
  const tmp = new Float64Array(v.length);
  const out = new Float64Array(v.length);
  const cu = cosTable(nu);
  const cs = cosTable(ns);
  // along s for each u-node
  for (let i = 0; i <= nu; i++) chebCoefficients(v, ns, i * (ns + 1), 1, tmp, i * (ns + 1), 1, cs);
  // along u for each s-coefficient
  for (let k = 0; k <= ns; k++) chebCoefficients(tmp, nu, k, ns + 1, out, k, ns + 1, cu);
  return out;
}

/**
 * Tail estimates of a 2D coefficient array (degrees nu × ns): the sum over the other index of the
 * magnitudes of the last two coefficients in each direction. For a resolved smooth function the
 * coefficients decay geometrically and the interpolation error is of the size of these tails.
 */
export function coefficientTails(c: Float64Array, nu: number, ns: number): { u: number; s: number } {
  let tu = 0;
  let ts = 0;
  const w = ns + 1;
  for (let k = 0; k <= ns; k++) tu += Math.abs(c[nu * w + k]) + Math.abs(c[(nu - 1) * w + k]);
  for (let i = 0; i <= nu; i++) ts += Math.abs(c[i * w + ns]) + Math.abs(c[i * w + ns - 1]);
  return { u: tu, s: ts };
}
