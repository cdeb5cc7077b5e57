/**
 * Allocation-light complex arithmetic for the exact width solver.
 *
 * Complex vectors and matrices are stored interleaved in a Float64Array:
 * element k of a vector is (v[2k], v[2k+1]) = (Re, Im); a row-major n×n
 * matrix stores A_ij at index 2(i·n + j). Every routine writes into buffers
 * the caller owns, so the solver's inner loops allocate nothing.
 *
 * The matrices here are complex *symmetric* (Aᵀ = A, not Hermitian): the
 * natural inner product is the bilinear xᵀy (no conjugation), for which the
 * Rayleigh quotient xᵀAx / xᵀx is stationary at an eigenvector.
 *
 * Source of the method: Gaussian elimination with partial pivoting,
 * G. H. Golub and C. F. Van Loan, "Matrix Computations", 4th ed., §3.4 (2013);
 * complex symmetric eigenproblems: ibid. §7 and B. N. Parlett,
 * "The Symmetric Eigenvalue Problem" (1998) for inverse iteration.
 */

/**
 * In-place LU factorisation with partial pivoting of a complex n×n matrix.
 *
 * On return `a` holds L (unit lower, below the diagonal) and U, `piv[i]` the
 * row swapped into position i. A zero pivot is replaced by a tiny number
 * (1e-300) so that inverse iteration at an exact eigenvalue still works.
 *
 * @example
 * const a = new Float64Array([2, 0, 1, 0, 1, 0, 3, 0]); // [[2,1],[1,3]]
 * const piv = new Int32Array(2);
 * complexLuFactor(a, 2, piv); // a → [[2,1],[0.5,2.5]]
 */
export function complexLuFactor(a: Float64Array, n: number, piv: Int32Array): void {
  for (let k = 0; k < n; k++) {
    // pivot search on |Re| + |Im| (cheap, scale-equivalent to the modulus)
    let p = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const o = 2 * (i * n + k);
      const v = Math.abs(a[o]!) + Math.abs(a[o + 1]!);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    piv[k] = p;
    if (p !== k) {
      const rk = 2 * k * n;
      const rp = 2 * p * n;
      for (let j = 0; j < 2 * n; j++) {
        const t = a[rk + j]!;
        a[rk + j] = a[rp + j]!;
        a[rp + j] = t;
      }
    }
    const od = 2 * (k * n + k);
    let pr = a[od]!;
    let pi = a[od + 1]!;
    if (pr === 0 && pi === 0) {
      pr = 1e-300;
      a[od] = pr;
    }
    const den = pr * pr + pi * pi;
    const ir = pr / den;
    const ii = -pi / den;
    const rowK = 2 * k * n;
    for (let i = k + 1; i < n; i++) {
      const oi = 2 * (i * n + k);
      const xr = a[oi]!;
      const xi = a[oi + 1]!;
      const lr = xr * ir - xi * ii;
      const li = xr * ii + xi * ir;
      a[oi] = lr;
      a[oi + 1] = li;
      if (lr === 0 && li === 0) continue;
      const rowI = 2 * i * n;
      for (let j = k + 1; j < n; j++) {
        const ur = a[rowK + 2 * j]!;
        const ui = a[rowK + 2 * j + 1]!;
        a[rowI + 2 * j] = a[rowI + 2 * j]! - (lr * ur - li * ui);
        a[rowI + 2 * j + 1] = a[rowI + 2 * j + 1]! - (lr * ui + li * ur);
      }
    }
  }
}

/**
 * Solve A x = b in place (b ← x) with the factors from {@link complexLuFactor}.
 */
export function complexLuSolve(lu: Float64Array, n: number, piv: Int32Array, b: Float64Array): void {
  for (let k = 0; k < n; k++) {
    const p = piv[k]!;
    if (p !== k) {
      const tr = b[2 * k]!;
      const ti = b[2 * k + 1]!;
      b[2 * k] = b[2 * p]!;
      b[2 * k + 1] = b[2 * p + 1]!;
      b[2 * p] = tr;
      b[2 * p + 1] = ti;
    }
  }
  // forward: L y = b (unit diagonal)
  for (let i = 1; i < n; i++) {
    let sr = b[2 * i]!;
    let si = b[2 * i + 1]!;
    const row = 2 * i * n;
    for (let j = 0; j < i; j++) {
      const lr = lu[row + 2 * j]!;
      const li = lu[row + 2 * j + 1]!;
      const yr = b[2 * j]!;
      const yi = b[2 * j + 1]!;
      sr -= lr * yr - li * yi;
      si -= lr * yi + li * yr;
    }
    b[2 * i] = sr;
    b[2 * i + 1] = si;
  }
  // backward: U x = y
  for (let i = n - 1; i >= 0; i--) {
    let sr = b[2 * i]!;
    let si = b[2 * i + 1]!;
    const row = 2 * i * n;
    for (let j = i + 1; j < n; j++) {
      const ur = lu[row + 2 * j]!;
      const ui = lu[row + 2 * j + 1]!;
      const xr = b[2 * j]!;
      const xi = b[2 * j + 1]!;
      sr -= ur * xr - ui * xi;
      si -= ur * xi + ui * xr;
    }
    const dr = lu[row + 2 * i]!;
    const di = lu[row + 2 * i + 1]!;
    const den = dr * dr + di * di;
    b[2 * i] = (sr * dr + si * di) / den;
    b[2 * i + 1] = (si * dr - sr * di) / den;
  }
}

/**
 * Bilinear product xᵀy of two complex vectors of length n, written to out[0..1].
 */
export function complexDotU(x: Float64Array, y: Float64Array, n: number, out: Float64Array): void {
  let sr = 0;
  let si = 0;
  for (let k = 0; k < n; k++) {
    const xr = x[2 * k]!;
    const xi = x[2 * k + 1]!;
    const yr = y[2 * k]!;
    const yi = y[2 * k + 1]!;
    sr += xr * yr - xi * yi;
    si += xr * yi + xi * yr;
  }
  out[0] = sr;
  out[1] = si;
}

/**
 * Scale a complex vector so that its component of largest modulus becomes
 * exactly 1 (real). Fixing the phase this way keeps a nearly real eigenvector
 * nearly real, so tiny imaginary parts (tiny widths) keep their relative accuracy.
 * Returns the index of that component.
 */
export function complexNormalizeByLargest(x: Float64Array, n: number): number {
  let best = -1;
  let idx = 0;
  for (let k = 0; k < n; k++) {
    const v = x[2 * k]! * x[2 * k]! + x[2 * k + 1]! * x[2 * k + 1]!;
    if (v > best) {
      best = v;
      idx = k;
    }
  }
  const pr = x[2 * idx]!;
  const pi = x[2 * idx + 1]!;
  const den = pr * pr + pi * pi;
  const ir = pr / den;
  const ii = -pi / den;
  for (let k = 0; k < n; k++) {
    const xr = x[2 * k]!;
    const xi = x[2 * k + 1]!;
    x[2 * k] = xr * ir - xi * ii;
    x[2 * k + 1] = xr * ii + xi * ir;
  }
  x[2 * idx] = 1;
  x[2 * idx + 1] = 0;
  return idx;
}

/** Complex division (ar + i ai)/(br + i bi) written to out[0..1]. */
export function complexDivide(ar: number, ai: number, br: number, bi: number, out: Float64Array): void {
  // Smith's algorithm (R. L. Smith, Commun. ACM 5, 435 (1962)) avoids overflow
  if (Math.abs(br) >= Math.abs(bi)) {
    const r = bi / br;
    const d = br + bi * r;
    out[0] = (ar + ai * r) / d;
    out[1] = (ai - ar * r) / d;
  } else {
    const r = br / bi;
    const d = bi + br * r;
    out[0] = (ar * r + ai) / d;
    out[1] = (ai * r - ar) / d;
  }
}
