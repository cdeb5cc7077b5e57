/**
 * The step mesh of the solver in the sinh-mapped coordinate x = a·sinh t.
 *
 * The mesh is independent of the energy: its step density in t is
 *   1/h(t) = max(1/hMax, ω(t)/cOsc),   ω(t) = x'(t)·√(2·λref·|w(x(t))|),
 * i.e. at least 1/hMax steps per unit t and at least 1/cOsc steps per radian
 * of the local zero-energy WKB phase. Where the potential is negligible
 * against ε the Magnus step is exact for any step length (A(t) is then a
 * scalar function times a constant matrix), so the energy does not enter the
 * density. The potential is sampled once, at the three Gauss nodes of every
 * step, and stored as the ε-independent combinations the Magnus step needs:
 *   R1 = h x'₂,  R2 = (√15h/3)(x'₃ − x'₁),  R3 = (10h/3)(x'₃ − 2x'₂ + x'₁),
 *   P_j = the same combinations of x'·w,
 * so that for coupling λ and binding ε the step's α_j = [[0, R_j], [S_j, 0]]
 * with S_j = 2(λP_j + εR_j). Every mismatch evaluation then costs only
 * arithmetic. The mesh grows outward on demand (`ensure`), up to xMax.
 * In the far tail, where (x')²·2λ|w| < 1e-2, the step may grow by up to 4×
 * (see TAIL_G). Breakpoints (positions of discontinuities of w) become mesh nodes, which
 * keeps the sixth order for piecewise-smooth potentials.
 *
 * Internal to the solver; not exported from the package.
 */

const SQ15 = Math.sqrt(15);
const C1 = 0.5 - SQ15 / 10;
const C3 = 0.5 + SQ15 / 10;
const STRIDE = 8; // R1 R2 R3 P1 P2 P3 maxAbsW(start & Gauss nodes) h
/**
 * Far tail: where (x')²·2λ|w| < TAIL_G the potential is a small perturbation of
 * the free motion, which the Magnus step integrates exactly for any step; the
 * step may grow there as (TAIL_G/((x')²·2λ|w|))^(1/7), by at most TAIL_STRETCH.
 */
const TAIL_G = 1e-2;
const TAIL_STRETCH = 4;
/** (TAIL_G/g)^(1/7) exceeds TAIL_STRETCH (with room for rounding) beyond this ratio: no pow needed. */
const TAIL_FULL = Math.pow(TAIL_STRETCH, 7) * (1 + 1e-9);

/**
 * cosh t and sinh t of a mesh position (t ≥ 0) into HYP[0], HYP[1]: from one exponential where
 * t ≥ 1 (no cancellation to speak of in e^t − e^(−t) there), the library functions below.
 */
const HYP = new Float64Array(2);
function coshSinh(t: number): void {
  if (t >= 1) {
    const e = Math.exp(t);
    const ie = 1 / e;
    HYP[0] = 0.5 * (e + ie);
    HYP[1] = 0.5 * (e - ie);
  } else {
    HYP[0] = Math.cosh(t);
    HYP[1] = Math.sinh(t);
  }
}

export interface MeshSpec {
  /** w(x), even, → 0 at infinity; evaluated only for x ≥ 0. */
  w: (x: number) => number;
  /** Map scale a in x = a·sinh t (same length unit as x). */
  a: number;
  hMax: number;
  cOsc: number;
  /** Coupling used for the step density (the mesh serves any λ ≤ λref well). */
  lambdaRef: number;
  /** Positions x > 0 of discontinuities of w. */
  breakpoints: readonly number[];
  /** Outermost x the mesh may reach. */
  xMax: number;
}

export class SinhMesh {
  readonly a: number;
  /** Number of steps built; nodes are 0..n. */
  n = 0;
  /** Step data, STRIDE numbers per step. */
  step: Float64Array;
  /** Node positions t_k, x_k = a sinh t_k, w(x_k). */
  t: Float64Array;
  x: Float64Array;
  wNode: Float64Array;
  /** Largest |w| seen over all nodes (≈ the depth of the well). */
  maxAbsW = 0;
  /** Number of potential evaluations made. */
  evaluations = 0;
  readonly tMax: number;
  private readonly spec: MeshSpec;
  private readonly tBreak: number[];

  constructor(spec: MeshSpec) {
    this.spec = spec;
    this.a = spec.a;
    this.tMax = Math.asinh(spec.xMax / spec.a);
    this.tBreak = spec.breakpoints
      .filter((b) => b > 0 && b < spec.xMax)
      .map((b) => Math.asinh(b / spec.a))
      .sort((p, q) => p - q);
    const cap = 256;
    this.step = new Float64Array(cap * STRIDE);
    this.t = new Float64Array(cap + 1);
    this.x = new Float64Array(cap + 1);
    this.wNode = new Float64Array(cap + 1);
    const w0 = spec.w(0);
    this.evaluations++;
    this.wNode[0] = w0;
    this.maxAbsW = Math.abs(w0);
  }

  /** Extend the mesh until its last node reaches x ≥ xTarget (or xMax). */
  ensure(xTarget: number): void {
    const tTarget = Math.min(Math.asinh(xTarget / this.a), this.tMax);
    while (this.t[this.n] < tTarget * (1 - 1e-15) && this.t[this.n] < this.tMax) this.addStep();
  }

  /** Index of the first node with x_k ≥ x (n if none). */
  nodeAtOrBeyond(x: number): number {
    const xs = this.x;
    let lo = 0;
    let hi = this.n;
    if (xs[hi] < x) return hi;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (xs[mid] >= x) hi = mid;
      else lo = mid + 1;
    }
    return lo;
  }

  private grow(): void {
    const cap = this.t.length - 1;
    const nc = cap * 2;
    const st = new Float64Array(nc * STRIDE);
    st.set(this.step);
    this.step = st;
    const t = new Float64Array(nc + 1);
    t.set(this.t);
    this.t = t;
    const x = new Float64Array(nc + 1);
    x.set(this.x);
    this.x = x;
    const wn = new Float64Array(nc + 1);
    wn.set(this.wNode);
    this.wNode = wn;
  }

  private addStep(): void {
    if (this.n + 1 >= this.t.length) this.grow();
    const { w, a, hMax, cOsc, lambdaRef } = this.spec;
    const k = this.n;
    const t0 = this.t[k];
    const w0 = this.wNode[k];
    const twoL = 2 * lambdaRef;
    coshSinh(t0);
    const d0 = a * HYP[0];
    const g0 = d0 * d0 * twoL * Math.abs(w0); // (x')²·2λ|w|: the potential's weight in a unit step
    const stretch = g0 < TAIL_G ? (TAIL_G / g0 > TAIL_FULL ? TAIL_STRETCH : Math.min(TAIL_STRETCH, Math.pow(TAIL_G / g0, 1 / 7))) : 1;
    let h = Math.min(hMax * stretch, cOsc / (d0 * Math.sqrt(twoL * Math.abs(w0)) + 1e-300));
    // Land exactly on the next breakpoint if it falls inside this step.
    for (const tb of this.tBreak) {
      if (tb > t0 * (1 + 1e-14) + 1e-300 && tb < t0 + h) {
        h = tb - t0;
        break;
      }
    }
    if (t0 + h > this.tMax) h = this.tMax - t0;
    let tA = 0, tB = 0, tC = 0, dA = 0, dB = 0, dC = 0, wA = 0, wB = 0, wC = 0;
    for (let attempt = 0; attempt < 3; attempt++) {
      tA = t0 + C1 * h;
      tB = t0 + 0.5 * h;
      tC = t0 + C3 * h;
      coshSinh(tA);
      dA = a * HYP[0];
      wA = w(a * HYP[1]);
      coshSinh(tB);
      dB = a * HYP[0];
      wB = w(a * HYP[1]);
      coshSinh(tC);
      dC = a * HYP[0];
      wC = w(a * HYP[1]);
      this.evaluations += 3;
      const om = Math.max(
        dA * Math.sqrt(twoL * Math.abs(wA)),
        dB * Math.sqrt(twoL * Math.abs(wB)),
        dC * Math.sqrt(twoL * Math.abs(wC)),
      );
      if (om * h <= 1.25 * cOsc) break;
      h = cOsc / om;
    }
    const r2c = (SQ15 * h) / 3;
    const r3c = (10 * h) / 3;
    const o = k * STRIDE;
    const st = this.step;
    st[o] = h * dB;
    st[o + 1] = r2c * (dC - dA);
    st[o + 2] = r3c * (dC - 2 * dB + dA);
    const pA = dA * wA;
    const pB = dB * wB;
    const pC = dC * wC;
    st[o + 3] = h * pB;
    st[o + 4] = r2c * (pC - pA);
    st[o + 5] = r3c * (pC - 2 * pB + pA);
    const mx = Math.max(Math.abs(w0), Math.abs(wA), Math.abs(wB), Math.abs(wC));
    st[o + 6] = mx;
    st[o + 7] = h;
    const t1 = t0 + h;
    coshSinh(t1);
    const x1 = a * HYP[1];
    const w1 = w(x1);
    this.evaluations++;
    this.t[k + 1] = t1;
    this.x[k + 1] = x1;
    this.wNode[k + 1] = w1;
    if (mx > this.maxAbsW) this.maxAbsW = mx;
    if (Math.abs(w1) > this.maxAbsW) this.maxAbsW = Math.abs(w1);
    this.n = k + 1;
  }
}

export const MESH_STRIDE = STRIDE;
