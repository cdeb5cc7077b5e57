/** 1/n! for the Taylor series of the step exponential (IF_n = 1/n!). */
const IF2 = 1 / 2;
const IF3 = 1 / 6;
const IF4 = 1 / 24;
const IF5 = 1 / 120;
const IF6 = 1 / 720;
const IF7 = 1 / 5040;
const IF8 = 1 / 40320;
const IF9 = 1 / 362880;
const IF10 = 1 / 3628800;
const IF11 = 1 / 39916800;
const IF12 = 1 / 479001600;
const IF13 = 1 / 6227020800;
const IF14 = 1 / 87178291200;
const IF15 = 1 / 1307674368000;
const IF16 = 1 / 20922789888000;
const IF17 = 1 / 355687428096000;
const IF18 = 1 / 6402373705728000;
const IF19 = 1 / 121645100408832000;

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
  if (d < 1 && d > -1) {
    // Taylor series of cosh√δ = Σ δ^k/(2k)! and sinh√δ/√δ = Σ δ^k/(2k+1)!, k = 0…9: the first
    // omitted terms are below 1/20! < 5e-19 for |δ| < 1 (most steps: the step density keeps
    // |δ| ≲ cOsc² where the potential matters). Horner form, no transcendental call.
    c = 1 + d * (IF2 + d * (IF4 + d * (IF6 + d * (IF8 + d * (IF10 + d * (IF12 + d * (IF14 + d * (IF16 + d * IF18))))))));
    s = 1 + d * (IF3 + d * (IF5 + d * (IF7 + d * (IF9 + d * (IF11 + d * (IF13 + d * (IF15 + d * (IF17 + d * IF19))))))));
  } else if (d > 0) {
    // one exponential for both (no cancellation to speak of for √δ ≥ 1)
    const mu = Math.sqrt(d);
    const e = Math.exp(mu);
    const ie = 1 / e;
    c = 0.5 * (e + ie);
    s = (0.5 * (e - ie)) / mu;
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

/**
 * The Magnus steps k of a mesh's step table `st` (MESH_STRIDE numbers per step: R1 R2 R3 P1 P2 P3 …,
 * see sinhMesh.ts) applied to y = (g, g') in place, for coupling and energy entering as
 * S_j = twoL·P_j + twoE·R_j: forward (sign = +1) over k = k0 … k1 − 1, or backward with the exact
 * inverse steps (sign = −1) over k = k1 − 1 down to k0. The arithmetic of each step is that of
 * `magnusPropagator` (repeated here so that the whole sweep is one function: a call per step would
 * box its six floating-point arguments, which made the sweeps allocation-bound). (g, g') is rescaled
 * when |g| + |g'| leaves 1e±150 (the ratio, all the callers use, is unchanged). Returns the number of
 * sign changes of g along the sweep, starting from a positive sign.
 */
export function magnusSweep(
  st: Float64Array,
  stride: number,
  k0: number,
  k1: number,
  sign: number,
  twoL: number,
  twoE: number,
  y: Float64Array,
): number {
  let g = y[0];
  let gp = y[1];
  let prevPos = true;
  let changes = 0;
  const n = k1 - k0;
  for (let q = 0; q < n; q++) {
    const k = sign > 0 ? k0 + q : k1 - 1 - q;
    const o = k * stride;
    const R1 = st[o];
    const R2 = st[o + 1];
    const R3 = st[o + 2];
    const S1 = twoL * st[o + 3] + twoE * R1;
    const S2 = twoL * st[o + 4] + twoE * R2;
    const S3 = twoL * st[o + 5] + twoE * R3;
    // --- magnusPropagator, inline ---
    const c1p = R1 * S2 - R2 * S1;
    const c2p = -(2 * (R1 * S3 - R3 * S1)) / 60;
    const c2r = (2 * R1 * c1p) / 60;
    const c2s = -(2 * S1 * c1p) / 60;
    const xp = c1p;
    const xr = -20 * R1 - R3;
    const xs = -20 * S1 - S3;
    const yp = c2p;
    const yr = R2 + c2r;
    const ys = S2 + c2s;
    const kp = xr * ys - yr * xs;
    const kr = 2 * (xp * yr - xr * yp);
    const ks = 2 * (xs * yp - xp * ys);
    const op = (sign * kp) / 240;
    const or = sign * (R1 + R3 / 12 + kr / 240);
    const os = sign * (S1 + S3 / 12 + ks / 240);
    const d = op * op + or * os;
    let c: number;
    let sh: number;
    if (d < 1 && d > -1) {
      c = 1 + d * (IF2 + d * (IF4 + d * (IF6 + d * (IF8 + d * (IF10 + d * (IF12 + d * (IF14 + d * (IF16 + d * IF18))))))));
      sh = 1 + d * (IF3 + d * (IF5 + d * (IF7 + d * (IF9 + d * (IF11 + d * (IF13 + d * (IF15 + d * (IF17 + d * IF19))))))));
    } else if (d > 0) {
      const mu = Math.sqrt(d);
      const e = Math.exp(mu);
      const ie = 1 / e;
      c = 0.5 * (e + ie);
      sh = (0.5 * (e - ie)) / mu;
    } else {
      const mu = Math.sqrt(-d);
      c = Math.cos(mu);
      sh = Math.sin(mu) / mu;
    }
    const m0 = c + sh * op;
    const m1 = sh * or;
    const m2 = sh * os;
    const m3 = c - sh * op;
    // --- end of the step exponential ---
    const g1 = m0 * g + m1 * gp;
    const gp1 = m2 * g + m3 * gp;
    g = g1;
    gp = gp1;
    if (g !== 0) {
      const pos = g > 0;
      if (pos !== prevPos) changes++;
      prevPos = pos;
    }
    const sz = Math.abs(g) + Math.abs(gp);
    if (sz > 1e150 || sz < 1e-150) {
      g /= sz;
      gp /= sz;
    }
  }
  y[0] = g;
  y[1] = gp;
  return changes;
}
