/**
 * Exact zero-range width solver: limits, identities and convergence.
 * Tolerances are stated per regime; every failure prints inputs, expected,
 * actual, difference and tolerance (shared/test/expectClose.ts).
 */
import { describe, expect, it } from 'vitest';
import { expectClose } from '../../../test/expectClose.js';
import { complexLuFactor, complexLuSolve } from './complexLinearAlgebra.js';
import { HermiteCoefficients, hermiteFunctions } from './hermiteFunctions.js';
import { powerLawKappa, ZeroRangeSolver } from './zeroRangeSolver.js';

/** Solve the m = 0 state (no labelling ambiguity) at ξ: first-order, then the pole. */
function solveM0(p: number, xi: number, opts = {}) {
  const s = new ZeroRangeSolver(0, powerLawKappa(0, p), opts);
  const fo = s.solveFirstOrder(xi, -1);
  const pole = s.solvePole(xi, fo.energy, -Math.max(fo.width, 1e-300) / 2);
  return { fo, pole };
}

/**
 * Single-orbital golden rule at scaled energy Ẽ (ε units, l = 1, F = 1/ξ):
 * Γ̃ = 2κ³ ∫_{−∞}^{x_t} ψ₀(x)² / √(2F(x_t − x)) dx, κ = √(2|Ẽ|), x_t = Ẽξ,
 * ψ₀² = e^{−x²}/√π; with x = x_t − t² the integral is √(2ξ) ∫₀^∞ ψ₀(x_t − t²)² dt.
 */
function goldenRule(energy: number, xi: number): number {
  const kappa = Math.sqrt(2 * Math.abs(energy));
  const xt = energy * xi;
  const h = 1e-3;
  let sum = 0;
  for (let k = 0; k < 20000; k++) {
    const t = k * h;
    const x = xt - t * t;
    sum += (k === 0 ? 0.5 : 1) * Math.exp(-x * x) / Math.sqrt(Math.PI);
  }
  return 2 * kappa ** 3 * Math.sqrt(2 * xi) * sum * h;
}

describe('complex linear algebra', () => {
  it('LU solve of a seeded random complex 12×12 system has residual ≤ 1e-13 (exact identity)', () => {
    let seed = 12345;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) - 0.5;
    const n = 12;
    const a = Float64Array.from({ length: 2 * n * n }, rnd);
    const x = Float64Array.from({ length: 2 * n }, rnd);
    const b = new Float64Array(2 * n);
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        const ar = a[2 * (i * n + j)]!, ai = a[2 * (i * n + j) + 1]!;
        b[2 * i] += ar * x[2 * j]! - ai * x[2 * j + 1]!;
        b[2 * i + 1] += ar * x[2 * j + 1]! + ai * x[2 * j]!;
      }
    const lu = a.slice();
    const piv = new Int32Array(n);
    complexLuFactor(lu, n, piv);
    complexLuSolve(lu, n, piv, b);
    for (let k = 0; k < 2 * n; k++) expectClose(b[k]!, x[k]!, { rel: 0, abs: 1e-13, inputs: { k }, source: 'exact identity' });
  });
});

describe('Hermite functions', () => {
  it('are orthonormal to 1e-13 (trapezoid on [−30, 30]) up to n = 80 (exact identity)', () => {
    const n = 80;
    const c = new HermiteCoefficients(n);
    const psi = new Float64Array(2 * (n + 2));
    const h = 0.02;
    const gram = new Float64Array((n + 1) * (n + 1));
    for (let x = -30; x <= 30; x += h) {
      hermiteFunctions(x, 0, n, c, psi);
      for (let a = 0; a <= n; a += 10) for (let b = a; b <= n; b += 5) gram[a * (n + 1) + b] += h * psi[2 * a]! * psi[2 * b]!;
    }
    for (let a = 0; a <= n; a += 10)
      for (let b = a; b <= n; b += 5)
        expectClose(gram[a * (n + 1) + b]!, a === b ? 1 : 0, { rel: 0, abs: 1e-13, inputs: { a, b }, source: 'exact identity' });
  });

  it('derivative ψ′ matches a complex-step-free central difference to 1e-8 at complex x (exact identity)', () => {
    const n = 30;
    const c = new HermiteCoefficients(n);
    const p = new Float64Array(2 * (n + 2));
    const d = new Float64Array(2 * (n + 2));
    const pp = new Float64Array(2 * (n + 2));
    const pm = new Float64Array(2 * (n + 2));
    const [xr, xi, h] = [-2.3, -0.4, 1e-5];
    hermiteFunctions(xr, xi, n, c, p, d);
    hermiteFunctions(xr + h, xi, n, c, pp);
    hermiteFunctions(xr - h, xi, n, c, pm);
    for (let k = 0; k <= n; k += 3) {
      expectClose(d[2 * k]!, (pp[2 * k]! - pm[2 * k]!) / (2 * h), { rel: 1e-8, abs: 1e-9, inputs: { k, part: 're' }, source: 'exact identity' });
      expectClose(d[2 * k + 1]!, (pp[2 * k + 1]! - pm[2 * k + 1]!) / (2 * h), { rel: 1e-8, abs: 1e-9, inputs: { k, part: 'im' }, source: 'exact identity' });
    }
  });
});

describe('zero-range pole, m = 0', () => {
  it('weak field: Stark shift equals the second-order result −(3/8)(Fl)²/ε · [1 + (2/3)κ₁/(κ₀ − κ₁)] to 1e-4 relative at ξ = 200', () => {
    // fourth-order terms are O(ξ⁻²) ≈ 2.5e-5 relative at ξ = 200
    // Second-order perturbation theory of the zero-range model (derivation in
    // docs/physics/moving-ion.md; the bracket → 1 as κ₁ → 0 gives model.md's −(3/8)(Fl)²/ε).
    for (const p of [9, 3]) {
      const xi = 200;
      const s = new ZeroRangeSolver(0, powerLawKappa(0, p));
      const r = s.solveFirstOrder(xi, -1);
      const k1 = 3 ** (-p / 2); // κ₁/κ₀
      const expected = -(3 / 8) * (1 + ((2 / 3) * k1) / (1 - k1)) / (xi * xi);
      expectClose(r.energy + 1, expected, { rel: 1e-4, inputs: { p, xi }, source: 'second-order perturbation theory (exact identity of the model)' });
    }
  });

  it('golden-rule limit at large ξ with the Stark-shifted energy: |Δ ln Γ| ≤ 1/ξ² (p = 9, ξ = 5…8)', () => {
    // Γ_GR = 2κ³∫u₀²/√(2F(X_t − X)) at the shifted energy (Yu. N. Demkov and
    // V. N. Ostrovskii, "Zero-Range Potentials and Their Applications in Atomic Physics", 1988).
    for (const xi of [5, 6, 7, 8]) {
      const { pole } = solveM0(9, xi);
      const gr = goldenRule(pole.energy, xi);
      expectClose(Math.log(pole.width), Math.log(gr), { rel: 0, abs: 1 / (xi * xi), inputs: { m: 0, p: 9, xi }, source: 'golden rule at the Stark-shifted energy (Demkov & Ostrovskii 1988)' });
    }
  });

  it('large-ξ asymptote Γ ≈ 2√2 ε_s e^{−ξ_s²} (shifted ε_s, ξ_s = ε_s/(Fl)) within |Δ ln Γ| ≤ 1/ξ² (p = 9)', () => {
    for (const xi of [6, 8, 10]) {
      const { pole } = solveM0(9, xi);
      const es = -pole.energy;
      const xs = es * xi;
      const asym = 2 * Math.SQRT2 * es * Math.exp(-xs * xs);
      expectClose(Math.log(pole.width), Math.log(asym), { rel: 0, abs: 1 / (xi * xi), inputs: { m: 0, p: 9, xi }, source: 'model.md §4 large-ξ golden rule, m = 0' });
    }
  });

  it('the unshifted energy misses the width by ≈ e^{−3/4} at large ξ (why the shift matters)', () => {
    const xi = 8;
    const { pole } = solveM0(9, xi);
    const unshifted = 2 * Math.SQRT2 * Math.exp(-xi * xi);
    // ξ_s² − ξ² ≈ 2ξ²·(3/8)/ξ² = 3/4 (common practice: expand the exponent to first order in the shift)
    expectClose(Math.log(unshifted / pole.width), 0.75, { rel: 0, abs: 0.05, inputs: { xi }, source: 'second-order Stark shift in the exponent' });
  });

  it('first-order route agrees with the complex pole where Γ/ε ≤ 1e-3: |Δ ln Γ| ≤ 1e-4 (m = 0)', () => {
    // first order neglects O(Γ/ε) and the multiple escape through the outer orbitals (small for m = 0)
    for (const [p, xi] of [[9, 3], [9, 4], [9, 6], [5, 4], [5, 6]] as const) {
      const { fo, pole } = solveM0(p, xi);
      expectClose(Math.log(fo.width), Math.log(pole.width), { rel: 0, abs: 1e-4, inputs: { m: 0, p, xi, widthOverEps: pole.width }, source: 'first order in the tunnelling amplitude (exact in the limit Γ → 0)' });
    }
  });

  it('the pole does not depend on the contour angle θ or the quadrature step: 1e-9 relative (Cauchy; exact identity)', () => {
    for (const xi of [2.5, 4]) {
      const base = solveM0(6, xi).pole;
      for (const opts of [{ theta: 0.2 }, { resolution: 1.7 }]) {
        const other = solveM0(6, xi, opts).pole;
        expectClose(other.energy, base.energy, { rel: 1e-9, inputs: { xi, ...opts }, source: 'exact identity (Cauchy theorem / quadrature convergence)' });
        expectClose(other.width, base.width, { rel: 1e-8, inputs: { xi, ...opts }, source: 'exact identity (Cauchy theorem / quadrature convergence)' });
      }
    }
  });

  it('width grows monotonically as ξ decreases (stronger field), ξ = 8 … 1.5', () => {
    const s = new ZeroRangeSolver(0, powerLawKappa(0, 4));
    let E = -1;
    let Ei = 0;
    let prev = 0;
    for (let xi = 8; xi >= 1.5; xi -= 0.5) {
      const fo = s.solveFirstOrder(xi, E);
      const pole = s.solvePole(xi, Ei ? E : fo.energy, Ei || -fo.width / 2);
      E = pole.energy;
      Ei = -pole.width / 2;
      expect(pole.converged).toBe(true);
      expect(pole.width, `ξ = ${xi}: Γ/ε = ${pole.width} should exceed ${prev}`).toBeGreaterThan(prev);
      prev = pole.width;
    }
  });
});
