/**
 * One step of the sixth-order Magnus integrator for the 2×2 linear system
 * dY/dt = A(t) Y, Y = (g, dg/dx), A(t) = x'(t)·[[0, 1], [q(t), 0]], q = 2(λw + ε).
 *
 * With A evaluated at the three Gauss–Legendre nodes t + c_i h
 * (c = ½ ∓ √15/10, ½) and the combinations
 *   α1 = h A2,  α2 = (√15 h/3)(A3 − A1),  α3 = (10h/3)(A3 − 2A2 + A1),
 * the step exponent is
 *   Ω = α1 + α3/12 + (1/240)[−20α1 − α3 + C1, α2 + C2],
 *   C1 = [α1, α2],  C2 = −(1/60)[α1, 2α3 + C1]
 * (S. Blanes, F. Casas, J. A. Oteo, J. Ros, "The Magnus expansion and some of
 * its applications", Phys. Rep. 470, 151 (2009), §5; S. Blanes, F. Casas,
 * J. Ros, BIT 40, 434 (2000)). Ω is traceless, Ω² = δ·I with
 * δ = Ωp² + Ωr·Ωs, so exp(Ω) = C(δ)·I + S(δ)·Ω exactly, with C = cosh√δ,
 * S = sinh√δ/√δ (cos/sin for δ < 0); the propagator has determinant 1 and
 * the Wronskian is conserved to rounding.
 *
 * The α's have zero diagonal: αj = [[0, Rj], [Sj, 0]]. Callers pass the six
 * numbers R1..R3, S1..S3 and receive the propagator entries in `out`
 * (out[0..3] = m11, m12, m21, m22). `sign` = +1 gives exp(Ω) (forward),
 * −1 gives exp(−Ω), the exact inverse (the scheme is time-symmetric).
 * No allocation: `out` is caller-owned scratch.
 */
export function magnusPropagator(
  R1: number,
  R2: number,
  R3: number,
  S1: number,
  S2: number,
  S3: number,
  sign: number,
  out: Float64Array,
): void {
  // C1 = [α1, α2] is diagonal: p-component only.
  const c1p = R1 * S2 - R2 * S1;
  // [α1, 2α3 + C1] with α1 = (0, R1, S1), Z = (c1p, 2R3, 2S3):
  //   p = 2(R1 S3 − R3 S1), r = −2 R1 c1p, s = 2 S1 c1p;  C2 = −(1/60)·that.
  const c2p = -(2 * (R1 * S3 - R3 * S1)) / 60;
  const c2r = (2 * R1 * c1p) / 60;
  const c2s = -(2 * S1 * c1p) / 60;
  // X = −20α1 − α3 + C1, Y = α2 + C2.
  const xp = c1p;
  const xr = -20 * R1 - R3;
  const xs = -20 * S1 - S3;
  const yp = c2p;
  const yr = R2 + c2r;
  const ys = S2 + c2s;
  // [X, Y] for sl(2) triples (p, r, s) ↔ [[p, r], [s, −p]].
  const kp = xr * ys - yr * xs;
  const kr = 2 * (xp * yr - xr * yp);
  const ks = 2 * (xs * yp - xp * ys);
  const op = (sign * kp) / 240;
  const or = sign * (R1 + R3 / 12 + kr / 240);
  const os = sign * (S1 + S3 / 12 + ks / 240);
  const d = op * op + or * os;
  let c: number;
  let s: number;
  const ad = d < 0 ? -d : d;
  if (ad < 1e-3) {
    // Taylor series of cosh√δ and sinh√δ/√δ; truncation < 1e-19 for |δ| < 1e-3.
    c = 1 + d * (1 / 2 + d * (1 / 24 + d * (1 / 720 + d * (1 / 40320 + d / 3628800))));
    s = 1 + d * (1 / 6 + d * (1 / 120 + d * (1 / 5040 + d * (1 / 362880 + d / 39916800))));
  } else if (d > 0) {
    const mu = Math.sqrt(d);
    c = Math.cosh(mu);
    s = Math.sinh(mu) / mu;
  } else {
    const mu = Math.sqrt(-d);
    c = Math.cos(mu);
    s = Math.sin(mu) / mu;
  }
  out[0] = c + s * op;
  out[1] = s * or;
  out[2] = s * os;
  out[3] = c - s * op;
}
