/**
 * Exact widths of field-induced states of a moving ion in the lowest Landau
 * level, by the zero-range reduction (offline and tests; slow by design).
 *
 * Model (atomic units, ħ = mₑ = e = 1). In the atom's frame the electron feels
 * the motional field F along x; restricted to the lowest Landau level
 *   H = F X + p_z²/2 − Σ_j κ_j |j⟩⟨j| δ(z),
 * X the guiding-centre coordinate ([X, Y] = i l², l = B^(−1/2)), |j⟩ the
 * symmetric-gauge orbitals, κ_j = √(2 ε_j) the zero-range strength that
 * reproduces the F = 0 binding ε_j of orbital j. At fixed X the solution off
 * z = 0 is φ(X) e^(−Λ(X)|z|), Λ(X) = √(2(F X − E)) (outgoing branch
 * −i√(2(E − F X)) for X < X_t = E/F), and matching at z = 0 gives
 *   det[1 − G(E) K] = 0,   K = diag κ_j,   G_jk(E) = ∫ dX u_j(X) u_k(X) / Λ(X),
 * with u_j(X) = l^(−1/2) ψ_j(X/l) the Hermite functions (⟨j+1|X|j⟩ = l√((j+1)/2)).
 *
 * Scaled form used here: energies in units of the target binding ε = ε_m,
 * X in units of l, so F → 1/ξ with ξ = ε/(F l); κ̃_j = √(2 ε_j/ε).
 * With x = x_t ± t² (x_t = Ẽ ξ) the square-root singularity disappears:
 *   G(Ẽ) = √(2ξ) [ ∫₀^∞ f(x_t + t²) dt + e^{i(θ+π)/2} ∫₀^∞ f(x_t − t² e^{iθ}) dt ],
 * f = ψ_j ψ_k. For complex Ẽ this is the analytic continuation through the cut
 * (the left ray leaves the real axis into the lower half plane at the complex
 * turning point x_t; θ rotates it further), so the complex root
 * Ẽ = Ẽ_r − i Γ̃/2 is the resonance pole. Both rays are even-extended in t and
 * summed with the trapezoidal rule, which converges geometrically for these
 * entire, super-Gaussian integrands (L. N. Trefethen and J. A. C. Weideman,
 * SIAM Rev. 56, 385 (2014)).
 *
 * The pole is found by Newton iteration on the eigenvalue μ(Ẽ) of
 * N = K^{1/2} G K^{1/2} that continues from the target orbital (μ = 1 at the
 * pole): eigenpair by inverse iteration with shift 1, dμ/dẼ = xᵀN'x / xᵀx
 * (complex-symmetric Hellmann–Feynman), N' from the derivatives of the Hermite
 * functions. States are labelled by continuation in ξ from F → 0 (ξ → ∞).
 *
 * First-order route (small Γ): split G = G_R + i G_I at the real turning point,
 * solve det[1 − G_R K] = 0 for real Ẽ_r, then
 *   Γ̃ = 2 cᵀ G_I c / cᵀ (dG_R/dẼ) c,  c = K^{1/2} v (v the real null vector).
 *
 * Sources: zero-range (Fermi) pseudopotential reduction and the golden-rule
 * tunnelling width: Yu. N. Demkov and V. N. Ostrovskii, "Zero-Range Potentials
 * and Their Applications in Atomic Physics" (Plenum, 1988); guiding-centre
 * algebra of the lowest Landau level: M. H. Johnson and B. A. Lippmann,
 * Phys. Rev. 76, 828 (1949); resonances by complex contour deformation:
 * N. Moiseyev, "Non-Hermitian Quantum Mechanics" (Cambridge, 2011), ch. 5.
 */
import { complexLuFactor, complexLuSolve, complexNormalizeByLargest, complexDivide } from './complexLinearAlgebra.js';
import { HermiteCoefficients, hermiteFunctions } from './hermiteFunctions.js';

/** Options of the exact solver. */
export interface ZeroRangeOptions {
  /** Rotation angle θ (radians) of the left ray; 0 keeps tiny widths exact to relative precision. */
  theta?: number;
  /** Quadrature resolution factor (≥ 1; step h = π / (k_max · resolution)). */
  resolution?: number;
  /** Extra orbitals beyond ξ²/2 + 2.5 ξ + 10 (convergence studies). */
  extraOrbitals?: number;
}

/** One solved state at one ξ (scaled units: energies in ε_m). */
export interface ZeroRangeState {
  xi: number;
  /** Re Ẽ (negative; −1 at F → 0). */
  energy: number;
  /** Γ̃ = Γ/ε (≥ 0). */
  width: number;
  /** 'pole' (complex root) or 'first-order'. */
  method: 'pole' | 'first-order';
  /** Number of orbitals used. */
  orbitals: number;
  /** Quadrature nodes used (both rays). */
  nodes: number;
  /** Newton iterations. */
  iterations: number;
  converged: boolean;
}

/** Strength function κ̃_j (scaled, κ̃_m = √2) for all orbitals j ≥ 0. */
export type KappaFunction = (j: number) => number;

/**
 * κ̃_j for the local power law ε_j ∝ (2j+1)^(−p) around the target m:
 * κ̃_j = √2 ((2m+1)/(2j+1))^(p/2). This defines the table's problem, whose
 * ln(Γ/ε) depends only on (m, p, ξ).
 */
export function powerLawKappa(m: number, p: number): KappaFunction {
  return (j: number) => Math.SQRT2 * Math.pow((2 * m + 1) / (2 * j + 1), p / 2);
}

/** Orbitals needed at a given ξ: out to ≈ ξ²/2 (ring radius |X_t|) plus a margin. */
export function orbitalsNeeded(m: number, xi: number, extra = 0): number {
  return Math.max(m + 20, Math.ceil(0.5 * xi * xi + 2.5 * xi + 10)) + extra;
}

const MAX_NODES = 40000;

/**
 * Workspace-carrying solver for one target orbital m and one κ̃ sequence.
 * Not thread-safe; create one per worker.
 */
export class ZeroRangeSolver {
  readonly m: number;
  private readonly kappa: KappaFunction;
  private readonly theta: number;
  private readonly resolution: number;
  private readonly extra: number;
  private n = 0; // orbitals
  private xi = 1;
  private coef: HermiteCoefficients = new HermiteCoefficients(8);
  private sqk = new Float64Array(0);
  private g = new Float64Array(0); // N (complex), later copied into lu
  private lu = new Float64Array(0);
  private piv = new Int32Array(0);
  private psi = new Float64Array(0);
  private dpsi = new Float64Array(0);
  private vec = new Float64Array(0); // eigenvector (complex)
  private tmp = new Float64Array(0);
  private readonly nx = new Float64Array(2 * MAX_NODES);
  private readonly nw = new Float64Array(2 * MAX_NODES);
  private nodeCount = 0;
  private leftStart = 0; // index of the first left-ray node
  private readonly c2 = new Float64Array(2);
  /** Last evaluated eigenvalue μ and derivative dμ/dẼ (complex). */
  readonly mu = new Float64Array(2);
  readonly dmu = new Float64Array(2);

  constructor(m: number, kappa: KappaFunction, options: ZeroRangeOptions = {}) {
    this.m = m;
    this.kappa = kappa;
    this.theta = options.theta ?? 0;
    this.resolution = options.resolution ?? 1;
    this.extra = options.extraOrbitals ?? 0;
  }

  /** Number of orbitals in the current basis. */
  get orbitals(): number {
    return this.n;
  }

  get nodes(): number {
    return this.nodeCount;
  }

  /** Set the basis size (keeps the eigenvector, zero-padded or truncated). */
  setBasis(n: number): void {
    if (n === this.n) return;
    const old = this.vec;
    const oldN = this.n;
    this.n = n;
    if (this.coef.nMax < n + 2) this.coef = new HermiteCoefficients(n + 8);
    this.sqk = new Float64Array(n);
    for (let j = 0; j < n; j++) this.sqk[j] = Math.sqrt(this.kappa(j));
    this.g = new Float64Array(2 * n * n);
    this.lu = new Float64Array(2 * n * n);
    this.piv = new Int32Array(n);
    this.psi = new Float64Array(2 * (n + 2));
    this.dpsi = new Float64Array(2 * (n + 2));
    this.tmp = new Float64Array(2 * n);
    this.vec = new Float64Array(2 * n);
    if (oldN === 0) {
      this.vec[2 * this.m] = 1;
    } else {
      this.vec.set(old.subarray(0, 2 * Math.min(oldN, n)));
    }
  }

  /**
   * Basis size used at ξ: ξ²/2 + 2.5ξ + 10 orbitals, at least m + 45 (broad
   * resonances at small ξ mix many orbitals); m + 40 (at most the
   * ξ = 12.5 basis) above ξ = 12.5, where only the real part (labelling) is needed.
   */
  basisFor(xi: number): number {
    if (xi > 12.5) return Math.min(orbitalsNeeded(this.m, 12.5, this.extra), this.m + 40 + this.extra);
    return Math.max(orbitalsNeeded(this.m, xi, this.extra), this.m + 45 + this.extra);
  }

  /** Reset the tracked eigenvector to the bare target orbital. */
  resetVector(): void {
    this.vec.fill(0);
    this.vec[2 * this.m] = 1;
  }

  /** Restore a tracked eigenvector (from {@link eigenvector}); zero-padded or truncated. */
  setVector(v: Float64Array): void {
    this.vec.fill(0);
    this.vec.set(v.subarray(0, Math.min(v.length, this.vec.length)));
  }

  /** Modulus overlap Σ|a_k||b_k| / (‖a‖‖b‖) of the tracked vector with v (1 = same state). */
  overlap(v: Float64Array): number {
    let ov = 0;
    let n1 = 0;
    let n2 = 0;
    const len = Math.min(v.length, this.vec.length) / 2;
    for (let k = 0; k < len; k++) {
      const a = Math.hypot(this.vec[2 * k]!, this.vec[2 * k + 1]!);
      const b = Math.hypot(v[2 * k]!, v[2 * k + 1]!);
      ov += a * b;
    }
    for (let k = 0; k < this.vec.length / 2; k++) n1 += this.vec[2 * k]! ** 2 + this.vec[2 * k + 1]! ** 2;
    for (let k = 0; k < v.length / 2; k++) n2 += v[2 * k]! ** 2 + v[2 * k + 1]! ** 2;
    return ov / Math.sqrt(n1 * n2);
  }

  /** Copy of the current (normalised) eigenvector, interleaved complex. */
  eigenvector(): Float64Array {
    return this.vec.slice();
  }

  private buildNodes(xtr: number, xti: number, includeLeft: boolean): void {
    const n = this.n;
    const xi = this.xi;
    const xhi = Math.sqrt(2 * (n - 1) + 1) + 7;
    const norm = Math.sqrt(2 * xi);
    let count = 0;
    // right ray x = x_t + t², t ∈ [t0, t1]
    const t0 = Math.sqrt(Math.max(0, -xhi - xtr));
    const t1 = Math.sqrt(Math.max(0, xhi - xtr));
    const h = this.stepFor(xtr, t0, t1, 1, 0);
    if (t1 > t0) {
      for (let t = t0, k = 0; t <= t1 + 1e-12; k++, t = t0 + k * h) {
        const w = t0 === 0 && k === 0 ? 0.5 * h * norm : h * norm;
        this.nx[2 * count] = xtr + t * t;
        this.nx[2 * count + 1] = xti;
        this.nw[2 * count] = w;
        this.nw[2 * count + 1] = 0;
        count++;
        if (count >= MAX_NODES / 2) break;
      }
    }
    this.leftStart = count;
    if (includeLeft) {
      const ct = Math.cos(this.theta);
      const st = Math.sin(this.theta);
      const fr = norm * Math.cos((this.theta + Math.PI) / 2);
      const fi = norm * Math.sin((this.theta + Math.PI) / 2);
      const u0 = Math.sqrt(Math.max(0, xtr - xhi));
      const u1 = Math.sqrt(Math.max(6, xtr + xhi));
      const hl = this.stepFor(xtr, u0, u1, -ct, -st);
      for (let t = u0, k = 0; t <= u1 + 1e-12; k++, t = u0 + k * hl) {
        const w = u0 === 0 && k === 0 ? 0.5 * hl : hl;
        this.nx[2 * count] = xtr - t * t * ct;
        this.nx[2 * count + 1] = xti - t * t * st;
        this.nw[2 * count] = w * fr;
        this.nw[2 * count + 1] = w * fi;
        count++;
        if (count >= MAX_NODES) break;
      }
    }
    this.nodeCount = count;
  }

  /** Step for the even-extended trapezoidal rule along x = x_t + t²(dr + i di). */
  private stepFor(xtr: number, t0: number, t1: number, dr: number, _di: number): number {
    const n2 = 2 * (this.n - 1) + 1;
    let kmax = 1;
    const samples = 400;
    for (let s = 0; s <= samples; s++) {
      const t = t0 + ((t1 - t0) * s) / samples;
      const x = xtr + t * t * dr;
      const inside = n2 - x * x;
      const om = 2 * Math.sqrt(Math.max(inside, 0)) + 2 + Math.abs(x) * (inside < 0 ? 1 : 0);
      const k = 2 * t * om + om * 0.5;
      if (k > kmax) kmax = k;
    }
    return Math.min(0.05, Math.PI / (kmax * this.resolution));
  }

  /**
   * Assemble N(Ẽ) = K^{1/2} G(Ẽ) K^{1/2} at scaled energy Ẽ = er + i ei and ξ.
   * `includeLeft = false` gives the real-part operator K^{1/2} G_R K^{1/2}.
   */
  assemble(xi: number, er: number, ei: number, includeLeft: boolean): void {
    this.xi = xi;
    const n = this.n;
    const xtr = er * xi;
    const xti = ei * xi;
    this.buildNodes(xtr, xti, includeLeft);
    const g = this.g;
    g.fill(0);
    const psi = this.psi;
    const c = this.coef;
    const real = !includeLeft && ei === 0;
    for (let q = 0; q < this.nodeCount; q++) {
      const xr = this.nx[2 * q]!;
      const xim = this.nx[2 * q + 1]!;
      const wr = this.nw[2 * q]!;
      const wi = this.nw[2 * q + 1]!;
      hermiteFunctions(xr, xim, n - 1, c, psi);
      // highest orbital with non-negligible value at this node (skip the tail)
      let top = n - 1;
      while (top > 0 && Math.abs(psi[2 * top]!) + Math.abs(psi[2 * top + 1]!) < 1e-300) top--;
      if (real) {
        for (let a = 0; a <= top; a++) {
          const va = wr * psi[2 * a]!;
          if (va === 0) continue;
          const row = 2 * a * n;
          for (let b = a; b <= top; b++) g[row + 2 * b] += va * psi[2 * b]!;
        }
      } else {
        for (let a = 0; a <= top; a++) {
          const pr = psi[2 * a]!;
          const pi = psi[2 * a + 1]!;
          const vr = wr * pr - wi * pi;
          const vi = wr * pi + wi * pr;
          if (vr === 0 && vi === 0) continue;
          const row = 2 * a * n;
          for (let b = a; b <= top; b++) {
            const br = psi[2 * b]!;
            const bi = psi[2 * b + 1]!;
            g[row + 2 * b] += vr * br - vi * bi;
            g[row + 2 * b + 1] += vr * bi + vi * br;
          }
        }
      }
    }
    // symmetrise and scale by K^{1/2}
    const sk = this.sqk;
    for (let a = 0; a < n; a++) {
      for (let b = a; b < n; b++) {
        const s = sk[a]! * sk[b]!;
        const o = 2 * (a * n + b);
        const vr = g[o]! * s;
        const vi = g[o + 1]! * s;
        g[o] = vr;
        g[o + 1] = vi;
        const o2 = 2 * (b * n + a);
        g[o2] = vr;
        g[o2 + 1] = vi;
      }
    }
  }

  /**
   * Eigenpair of the assembled N continuing from the tracked vector: inverse
   * iteration with shift 1, then the bilinear Rayleigh quotient μ = xᵀNx/xᵀx.
   * Writes μ into `this.mu`; returns the overlap |x_newᵀ x_old| / (‖‖‖‖) (label check).
   */
  eigen(maxIterations = 60): number {
    const n = this.n;
    const lu = this.lu;
    lu.set(this.g);
    for (let j = 0; j < n; j++) lu[2 * (j * n + j)] -= 1;
    complexLuFactor(lu, n, this.piv);
    const x = this.vec;
    const old = this.tmp;
    const start = x.slice();
    complexNormalizeByLargest(x, n);
    for (let it = 0; it < maxIterations; it++) {
      old.set(x);
      complexLuSolve(lu, n, this.piv, x);
      complexNormalizeByLargest(x, n);
      let diff = 0;
      for (let k = 0; k < 2 * n; k++) diff = Math.max(diff, Math.abs(x[k]! - old[k]!));
      if (diff < 1e-14) break;
    }
    // Rayleigh quotient
    let nr = 0;
    let ni = 0;
    let dr = 0;
    let di = 0;
    const g = this.g;
    for (let a = 0; a < n; a++) {
      let sr = 0;
      let si = 0;
      const row = 2 * a * n;
      for (let b = 0; b < n; b++) {
        const gr = g[row + 2 * b]!;
        const gi = g[row + 2 * b + 1]!;
        const xr = x[2 * b]!;
        const xim = x[2 * b + 1]!;
        sr += gr * xr - gi * xim;
        si += gr * xim + gi * xr;
      }
      const ar = x[2 * a]!;
      const ai = x[2 * a + 1]!;
      nr += ar * sr - ai * si;
      ni += ar * si + ai * sr;
      dr += ar * ar - ai * ai;
      di += 2 * ar * ai;
    }
    complexDivide(nr, ni, dr, di, this.mu);
    // overlap with the start vector (moduli, label check)
    let ov = 0;
    let n1 = 0;
    let n2 = 0;
    for (let k = 0; k < n; k++) {
      const a = Math.hypot(x[2 * k]!, x[2 * k + 1]!);
      const b = Math.hypot(start[2 * k]!, start[2 * k + 1]!);
      ov += a * b;
      n1 += a * a;
      n2 += b * b;
    }
    return ov / Math.sqrt(n1 * n2);
  }

  /**
   * Contract the quadrature with c = K^{1/2} x over the current nodes:
   * writes dμ/dẼ = ξ Σ w (2 cᵀψ' cᵀψ) / xᵀx into `this.dmu` and returns
   * [Re, Im] of the left-ray part of cᵀGc / xᵀx (i·cᵀG_I c / xᵀx at θ = 0, real Ẽ).
   */
  contract(rightOnlyDerivative: boolean): Float64Array {
    const n = this.n;
    const x = this.vec;
    const sk = this.sqk;
    let xr2 = 0;
    let xi2 = 0;
    for (let k = 0; k < n; k++) {
      xr2 += x[2 * k]! * x[2 * k]! - x[2 * k + 1]! * x[2 * k + 1]!;
      xi2 += 2 * x[2 * k]! * x[2 * k + 1]!;
    }
    let dr = 0;
    let di = 0;
    let lr = 0;
    let li = 0;
    for (let q = 0; q < this.nodeCount; q++) {
      const left = q >= this.leftStart;
      hermiteFunctions(this.nx[2 * q]!, this.nx[2 * q + 1]!, n - 1, this.coef, this.psi, this.dpsi);
      let ar = 0;
      let ai = 0;
      let br = 0;
      let bi = 0;
      for (let k = 0; k < n; k++) {
        const cr = sk[k]! * x[2 * k]!;
        const ci = sk[k]! * x[2 * k + 1]!;
        const pr = this.psi[2 * k]!;
        const pi = this.psi[2 * k + 1]!;
        const qr = this.dpsi[2 * k]!;
        const qi = this.dpsi[2 * k + 1]!;
        ar += cr * pr - ci * pi;
        ai += cr * pi + ci * pr;
        br += cr * qr - ci * qi;
        bi += cr * qi + ci * qr;
      }
      const wr = this.nw[2 * q]!;
      const wi = this.nw[2 * q + 1]!;
      // 2 (cᵀψ)(cᵀψ') w
      const pr = 2 * (ar * br - ai * bi);
      const pi = 2 * (ar * bi + ai * br);
      if (!(left && rightOnlyDerivative)) {
        dr += wr * pr - wi * pi;
        di += wr * pi + wi * pr;
      }
      if (left) {
        const sr = ar * ar - ai * ai;
        const si = 2 * ar * ai;
        lr += wr * sr - wi * si;
        li += wr * si + wi * sr;
      }
    }
    complexDivide(this.xi * dr, this.xi * di, xr2, xi2, this.dmu);
    const out = new Float64Array(2);
    complexDivide(lr, li, xr2, xi2, out);
    return out;
  }

  /**
   * Complex pole Ẽ = Ẽ_r − iΓ̃/2 at ξ by Newton iteration from (er, ei),
   * continuing the tracked eigenvector.
   */
  solvePole(xi: number, er: number, ei: number, maxIterations = 25): ZeroRangeState {
    this.setBasis(this.basisFor(xi));
    let Er = er;
    let Ei = ei;
    let converged = false;
    let it = 0;
    const step = this.c2;
    for (; it < maxIterations; it++) {
      this.assemble(xi, Er, Ei, true);
      this.eigen();
      this.contract(false);
      // Newton: Ẽ ← Ẽ + (1 − μ)/μ'
      complexDivide(1 - this.mu[0]!, -this.mu[1]!, this.dmu[0]!, this.dmu[1]!, step);
      let sr = step[0]!;
      let si = step[1]!;
      const mag = Math.hypot(sr, si);
      const cap = 0.1 * Math.max(Math.abs(Er), 0.05);
      if (mag > cap) {
        sr *= cap / mag;
        si *= cap / mag;
      }
      Er += sr;
      Ei += si;
      if (Math.abs(sr) <= 1e-13 * Math.abs(Er) && Math.abs(si) <= 1e-9 * Math.abs(Ei) + 1e-300) {
        converged = true;
        it++;
        break;
      }
      // a width near the double-precision floor stalls at a relative noise level:
      // accept a real part converged to 1e-12 with an imaginary step below 1e-6
      if (it >= 8 && Math.abs(sr) <= 1e-12 * Math.abs(Er) && Math.abs(si) <= 1e-6 * Math.abs(Ei)) {
        converged = true;
        it++;
        break;
      }
    }
    return {
      xi,
      energy: Er,
      width: Math.max(0, -2 * Ei),
      method: 'pole',
      orbitals: this.n,
      nodes: this.nodeCount,
      iterations: it,
      converged,
    };
  }

  /**
   * First order in the tunnelling amplitude: real Ẽ_r from det[1 − G_R K] = 0,
   * then Γ̃ = 2 cᵀG_I c / cᵀG_R' c.
   */
  solveFirstOrder(xi: number, er: number, maxIterations = 40, needWidth = true): ZeroRangeState {
    this.setBasis(this.basisFor(xi));
    // the tracked vector must be real for the real problem
    for (let k = 0; k < this.n; k++) this.vec[2 * k + 1] = 0;
    let Er = er;
    let converged = false;
    let it = 0;
    for (; it < maxIterations; it++) {
      this.assemble(xi, Er, 0, false);
      this.eigen();
      this.contract(true);
      let s = (1 - this.mu[0]!) / this.dmu[0]!;
      const cap = 0.1 * Math.max(Math.abs(Er), 0.05);
      if (Math.abs(s) > cap) s = Math.sign(s) * cap;
      Er += s;
      if (Math.abs(s) <= 1e-13 * Math.abs(Er)) {
        converged = true;
        it++;
        break;
      }
    }
    let width = 0;
    if (needWidth) {
      // one more pass with both rays at the converged real energy: the left-ray
      // contraction is i cᵀG_I c / xᵀx, the right-ray derivative cᵀG_R'c / xᵀx
      this.assemble(xi, Er, 0, false);
      this.eigen();
      this.buildNodes(Er * xi, 0, true);
      const left = this.contract(true);
      width = (2 * left[1]!) / this.dmu[0]!;
    }
    return {
      xi,
      energy: Er,
      width: Math.max(0, width),
      method: 'first-order',
      orbitals: this.n,
      nodes: this.nodeCount,
      iterations: it,
      converged,
    };
  }
}
