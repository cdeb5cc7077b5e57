/**
 * Normalised Hermite functions ψ_n(x) = H_n(x) e^(−x²/2) / √(2ⁿ n! √π) and
 * their derivatives, for complex x, n = 0 … nMax.
 *
 * In the lowest Landau level the guiding-centre coordinate X obeys
 * [X, Y] = i l², so X/l acts like an oscillator coordinate and the symmetric-gauge
 * orbital |m⟩ is represented in X by u_m(X) = l^(−1/2) ψ_m(X/l) with
 * ⟨m+1|X|m⟩ = l √((m+1)/2).
 *
 * Recurrence (DLMF 18.9.1 for H_n, normalised):
 *   ψ_0 = π^(−1/4) e^(−x²/2),  ψ_{n+1} = √(2/(n+1)) x ψ_n − √(n/(n+1)) ψ_{n−1};
 * derivative ψ_n' = √(n/2) ψ_{n−1} − √((n+1)/2) ψ_{n+1}. The upward recurrence is
 * stable for the normalised functions (it is the minimal-growth direction inside
 * and beyond the classical region). e^(−x²/2) underflows to 0 for Re x² > 1490;
 * callers keep |x| well inside that.
 *
 * Source: F. W. J. Olver et al., NIST DLMF §18.9 and §18.39 (2010–).
 */

const PI_M14 = 0.75112554446494248286; // π^(−1/4)

/** Recurrence coefficients up to a given order, built once per solver workspace. */
export class HermiteCoefficients {
  readonly a: Float64Array; // √(2/(n+1))
  readonly b: Float64Array; // √(n/(n+1))
  readonly d: Float64Array; // √(n/2)
  constructor(readonly nMax: number) {
    this.a = new Float64Array(nMax + 2);
    this.b = new Float64Array(nMax + 2);
    this.d = new Float64Array(nMax + 3);
    for (let n = 0; n <= nMax + 1; n++) {
      this.a[n] = Math.sqrt(2 / (n + 1));
      this.b[n] = Math.sqrt(n / (n + 1));
    }
    for (let n = 0; n <= nMax + 2; n++) this.d[n] = Math.sqrt(n / 2);
  }
}

/**
 * ψ_0 … ψ_{n} at complex x = xr + i xi, written interleaved into `psi`
 * (length ≥ 2(n+1)). If `dpsi` is given, also the derivatives (needs ψ_{n+1},
 * so `psi` must have length ≥ 2(n+2)).
 *
 * @example
 * const c = new HermiteCoefficients(4); const p = new Float64Array(12);
 * hermiteFunctions(0, 0, 4, c, p); // p[0] = π^(−1/4) = 0.7511255444649425
 */
export function hermiteFunctions(
  xr: number,
  xi: number,
  n: number,
  c: HermiteCoefficients,
  psi: Float64Array,
  dpsi?: Float64Array,
): void {
  const top = dpsi ? n + 1 : n;
  // ψ_0 = π^(−1/4) exp(−(xr² − xi²)/2 − i xr xi)
  const mag = PI_M14 * Math.exp(-0.5 * (xr * xr - xi * xi));
  let p0r: number;
  let p0i: number;
  if (xi === 0) {
    p0r = mag;
    p0i = 0;
  } else {
    const ph = -xr * xi;
    p0r = mag * Math.cos(ph);
    p0i = mag * Math.sin(ph);
  }
  psi[0] = p0r;
  psi[1] = p0i;
  if (top >= 1) {
    const s = c.a[0]!; // √2
    psi[2] = s * (xr * p0r - xi * p0i);
    psi[3] = s * (xr * p0i + xi * p0r);
  }
  const a = c.a;
  const b = c.b;
  for (let k = 1; k < top; k++) {
    const ak = a[k]!;
    const bk = b[k]!;
    const pr = psi[2 * k]!;
    const pi = psi[2 * k + 1]!;
    psi[2 * k + 2] = ak * (xr * pr - xi * pi) - bk * psi[2 * k - 2]!;
    psi[2 * k + 3] = ak * (xr * pi + xi * pr) - bk * psi[2 * k - 1]!;
  }
  if (dpsi) {
    const d = c.d;
    dpsi[0] = -d[1]! * psi[2]!;
    dpsi[1] = -d[1]! * psi[3]!;
    for (let k = 1; k <= n; k++) {
      dpsi[2 * k] = d[k]! * psi[2 * k - 2]! - d[k + 1]! * psi[2 * k + 2]!;
      dpsi[2 * k + 1] = d[k]! * psi[2 * k - 1]! - d[k + 1]! * psi[2 * k + 3]!;
    }
  }
}
