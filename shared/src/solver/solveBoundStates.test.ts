/**
 * The 1D bound-state solver on exactly solvable potentials.
 * Every check names its source and its tolerance; failures print inputs,
 * expected, actual, difference and tolerance (expectClose).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { EngineInputError } from '../errors.js';
import { expectClose } from '../../test/expectClose.js';
import { countBoundStates, createBoundStateSolver, solveBoundStates } from './solveBoundStates.js';
import { magnusPropagator, magnusSweep } from './magnusStep.js';
import { mulberry32 } from '../../test/seededRandom.js';
import { thresholdCouplings } from './thresholdCouplings.js';

const PT_SOURCE =
  'Pöschl–Teller: L. D. Landau, E. M. Lifshitz, QM §23; F. Cooper, A. Khare, U. Sukhatme, Phys. Rep. 251, 267 (1995)';
const SW_SOURCE = 'finite square well: k tan(ka) = κ (even), −k cot(ka) = κ (odd), Landau & Lifshitz QM §22';

/** v = −λ(λ+1)/(2cosh²x), ε_n = (λ − n)²/2, n < λ. */
function poschlTeller(lambda: number): (x: number) => number {
  const c = (lambda * (lambda + 1)) / 2;
  return (x) => -c / (Math.cosh(x) * Math.cosh(x));
}

/** Plain bisection for f with a sign change on [lo, hi] (test-side, independent of the solver). */
function bisect(f: (x: number) => number, lo: number, hi: number): number {
  let flo = f(lo);
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    if (mid === lo || mid === hi) break;
    const fm = f(mid);
    if (fm === 0) return mid;
    if (fm > 0 === flo > 0) {
      lo = mid;
      flo = fm;
    } else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/**
 * Finite square well v = −V0 on |x| < a: z = k a, z0 = a√(2V0), κa = √(z0² − z²).
 * Level n lies in z ∈ (nπ/2, min((n+1)π/2, z0)); even n: z sin z − √(z0²−z²) cos z = 0,
 * odd n: z cos z + √(z0²−z²) sin z = 0 (the textbook equations cleared of poles).
 */
function squareWellLevels(V0: number, a: number): number[] {
  const z0 = a * Math.sqrt(2 * V0);
  const out: number[] = [];
  for (let n = 0; (n * Math.PI) / 2 < z0; n++) {
    const w = (z: number): number => Math.sqrt(Math.max(z0 * z0 - z * z, 0));
    const f =
      n % 2 === 0
        ? (z: number) => z * Math.sin(z) - w(z) * Math.cos(z)
        : (z: number) => z * Math.cos(z) + w(z) * Math.sin(z);
    const z = bisect(f, (n * Math.PI) / 2, Math.min(((n + 1) * Math.PI) / 2, z0));
    // ε = κ²/2 with κ = √(z0² − z²)/a; use (z0 − z)(z0 + z) to keep digits near threshold.
    out.push(((z0 - z) * (z0 + z)) / (2 * a * a));
  }
  return out;
}


/** Exact 1D energies from the committed generator shared/scripts/oracle/make_exact_1d_oracle.py. */
const EXACT_1D_ORACLE = JSON.parse(readFileSync(new URL('../../test/fixtures/exact-1d-oracle.json', import.meta.url), 'utf8')) as {
  poschl_teller: { lambda: string; levels: { f64: number }[] };
  finite_square_well: { cases: { V0: string; a: string; levels: { f64: number }[] }[] };
};

describe('solveBoundStates: Pöschl–Teller −λ(λ+1)/(2cosh²x), ε_n = (λ−n)²/2', () => {
  // Committed fixture from shared/scripts/oracle/make_exact_1d_oracle.py (mpmath 1.3.0, 50 digits).
  const oracle = { physics: EXACT_1D_ORACLE };

  it('reproduces the oracle levels (mpmath, λ = 2.5) to 1e-10 relative', () => {
    const pt = oracle.physics.poschl_teller;
    const lambda = Number(pt.lambda);
    const r = solveBoundStates(poschlTeller(lambda), { scale: 0.5 });
    expect(r.states.length).toBe(pt.levels.length);
    r.states.forEach((s, n) =>
      expectClose(s.epsilon, -pt.levels[n].f64, { rel: 1e-10, inputs: { lambda, n }, source: PT_SOURCE }),
    );
  });

  it.each([0.3, 1.7, 4.2, 7.5, 12.9])('λ = %s: count ⌈λ⌉, parities alternate, every ε_n to 1e-10 relative', (lambda) => {
    const r = solveBoundStates(poschlTeller(lambda), { scale: 0.5 });
    expect(r.count).toBe(Math.ceil(lambda));
    expect(r.states.length).toBe(Math.ceil(lambda));
    r.states.forEach((s, n) => {
      expect(s.nu).toBe(n);
      expect(s.parity).toBe(n % 2 === 0 ? 'even' : 'odd');
      expectClose(s.epsilon, (lambda - n) ** 2 / 2, { rel: 1e-10, inputs: { lambda, n }, source: PT_SOURCE });
    });
  });

  it('the half-step error estimate bounds the actual error of every level (λ = 0.3 … 12.9)', () => {
    for (const lambda of [0.3, 1.7, 4.2, 7.5, 12.9]) {
      const r = solveBoundStates(poschlTeller(lambda), { scale: 0.5, tol: 1e-7 });
      r.states.forEach((s, n) => {
        const exact = (lambda - n) ** 2 / 2;
        const err = Math.abs(s.epsilon - exact) / exact;
        if (!(err <= s.relError + 1e-15)) {
          throw new Error(`λ=${lambda} n=${n}: actual error ${err} exceeds estimate ${s.relError}`);
        }
      });
    }
  });

  it('is sixth order: halving the steps divides the error by 2⁶ (accepted 35…120)', () => {
    const lambda = 2.5;
    const exact = 1.125;
    const e1 = solveBoundStates(poschlTeller(lambda), { scale: 0.5, hMax: 0.2, cOsc: 0.4, errorEstimate: false });
    const e2 = solveBoundStates(poschlTeller(lambda), { scale: 0.5, hMax: 0.1, cOsc: 0.2, errorEstimate: false });
    const d1 = Math.abs(e1.states[1].epsilon - exact);
    const d2 = Math.abs(e2.states[1].epsilon - exact);
    const ratio = d1 / d2;
    if (!(ratio > 35 && ratio < 120)) throw new Error(`error ratio ${ratio} (errors ${d1}, ${d2}), expected ≈ 64`);
  });

  // λ = 2 + δ: level n = 2 is bound by ε = δ²/2. The coupling A = λ(λ+1) is chosen exactly
  // representable, A = 6 + 5e, and δ = 10e/(5 + √(25 + 20e)) is its well-conditioned inverse.
  // Near threshold the level is ill conditioned: an absolute error Δκ of κ = √(2ε) gives a
  // relative error 2Δκ/κ of ε. The integrator's absolute κ accuracy is ~1e-12·√(2·depth) at the
  // default tol (1e-10) and ~1e-14 at tol = 1e-13 (rounding), so the tolerances below are
  // 2·Δκ/κ with those Δκ and a safety factor 3.
  it('λ = 2 + δ, ε₂/depth ≈ 1e-8: level 2 to 1e-8 relative (conditioning-limited, default tol)', () => {
    const e = 2 ** -12;
    const A = 6 + 5 * e;
    const delta = (10 * e) / (5 + Math.sqrt(25 + 20 * e));
    const r = solveBoundStates((x) => -(A / 2) / Math.cosh(x) ** 2, { scale: 0.5 });
    expect(r.count).toBe(3);
    expectClose(r.states[2].epsilon, (delta * delta) / 2, { rel: 1e-8, inputs: { A, delta }, source: PT_SOURCE });
  });

  it('λ = 2 + δ, ε₂/depth ≈ 9e-21: the state is counted, found, and accurate to 3e-4 relative at tol = 1e-13', () => {
    const e = 2 ** -32;
    const A = 6 + 5 * e;
    const delta = (10 * e) / (5 + Math.sqrt(25 + 20 * e));
    const r = solveBoundStates((x) => -(A / 2) / Math.cosh(x) ** 2, { scale: 0.5, tol: 1e-13 });
    expect(r.count).toBe(3);
    expect(r.states[2].resolved).toBe(true);
    expectClose(r.states[2].epsilon, (delta * delta) / 2, { rel: 3e-4, inputs: { A, delta, ratio: (delta * delta) / A }, source: PT_SOURCE });
    // the two deep levels are unaffected by the conditioning
    expectClose(r.states[0].epsilon, (2 + delta) ** 2 / 2, { rel: 1e-12, inputs: { A, n: 0 }, source: PT_SOURCE });
    expectClose(r.states[1].epsilon, (1 + delta) ** 2 / 2, { rel: 1e-12, inputs: { A, n: 1 }, source: PT_SOURCE });
  });

  it('λ = 3 − δ (level 3 just unbound): counts exactly 3 states', () => {
    const e = 2 ** -30;
    // λ = 3 − δ ↔ A = λ(λ+1) = 12 − 7δ + δ²; pick A = 12 − 7e (exact), λ < 3.
    const A = 12 - 7 * e;
    expect(countBoundStates((x) => -(A / 2) / Math.cosh(x) ** 2, { scale: 0.5 }).total).toBe(3);
  });

  it('threshold couplings of −c/cosh²x are c = ν(ν+1)/2, ν = 1…5, to 1e-10 relative', () => {
    const th = thresholdCouplings((x) => -1 / Math.cosh(x) ** 2, 5, { scale: 0.5 });
    expect(th[0]).toBe(0);
    for (let nu = 1; nu <= 5; nu++) {
      expectClose(th[nu], (nu * (nu + 1)) / 2, { rel: 1e-10, inputs: { nu }, source: PT_SOURCE });
    }
  });
});

describe('solveBoundStates: finite square well −V0 on |x| < a (test solves the textbook equations by bisection)', () => {
  const oracle = { physics: EXACT_1D_ORACLE };

  // 1e-13: the shallowest level (ε/V0 ≈ 2.5e-3) loses about a digit to the cancellation in V0 − k²/2.
  it('the test-side bisection agrees with the mpmath oracle to 1e-13 (checks the checker)', () => {
    for (const c of oracle.physics.finite_square_well.cases) {
      const lv = squareWellLevels(Number(c.V0), Number(c.a));
      expect(lv.length).toBe(c.levels.length);
      lv.forEach((e, n) => expectClose(e, -c.levels[n].f64, { rel: 1e-13, inputs: { V0: c.V0, a: c.a, n }, source: SW_SOURCE }));
    }
  });

  it.each([
    [1, 1],
    [1, 2],
    [0.5, 3],
    [20, 1.5],
    [3, 0.4],
  ])('V0 = %s, a = %s: every level to 1e-10 relative, count matches', (V0, a) => {
    const exact = squareWellLevels(V0, a);
    const r = solveBoundStates((x) => (Math.abs(x) < a ? -V0 : 0), { scale: a / 2, breakpoints: [a] });
    expect(r.count).toBe(exact.length);
    r.states.forEach((s, n) =>
      expectClose(s.epsilon, exact[n], { rel: 1e-10, inputs: { V0, a, n }, source: SW_SOURCE }),
    );
  });

  it('narrow deep well (V0·2a = g fixed, a → 0) approaches the δ well ε = g²/2 as κ = g − (2/3)g²a + O(a²)', () => {
    // δ well: ε = g²/2 (D. J. Griffiths, Introduction to QM, §2.5); the O(a) term follows from
    // expanding k tan(ka) = κ for ka → 0. Each width is also checked against the exact equation.
    const g = 1;
    for (const a of [1e-2, 1e-3, 1e-4]) {
      const V0 = g / (2 * a);
      const exact = squareWellLevels(V0, a);
      const r = solveBoundStates((x) => (Math.abs(x) < a ? -V0 : 0), { scale: a / 2, breakpoints: [a] });
      expect(r.count).toBe(1);
      expectClose(r.states[0].epsilon, exact[0], { rel: 1e-10, inputs: { g, a, V0 }, source: SW_SOURCE });
      const kappa = Math.sqrt(2 * r.states[0].epsilon);
      const slope = (kappa - g) / (g * g * a);
      // next term is O(g³a²): |slope + 2/3| ≤ 2ga
      if (!(Math.abs(slope + 2 / 3) <= 2 * g * a)) {
        throw new Error(`a=${a}: (κ−g)/(g²a) = ${slope}, expected −2/3 ± ${2 * g * a}`);
      }
    }
  });
});

describe('solveBoundStates: exponential well −V0 e^(−|x|) (test computes zeros of J_ν and J′_ν in the order ν)', () => {
  // With ξ = 2√(2V0) e^(−x/2) the decaying solution is J_ν(ξ), ν = 2√(2ε) (Bessel's equation);
  // even states: J′_ν(ξ0) = 0, odd states: J_ν(ξ0) = 0, ξ0 = 2√(2V0)
  // (Landau & Lifshitz QM §22 problem 4 treats U = −U0 e^(−x/a) on a half line the same way).
  // Series without the positive factor (ξ/2)^ν/Γ(ν+1):
  //   J: Σ (−1)^k (ξ/2)^{2k} / (k! (ν+1)_k),  J′: Σ (−1)^k (2k+ν)(ξ/2)^{2k} / (k! (ν+1)_k).
  function besselSeries(nu: number, xi: number, derivative: boolean): number {
    const q = (xi / 2) ** 2;
    let term = 1;
    let sum = derivative ? nu : 1;
    for (let k = 1; k < 200; k++) {
      term *= -q / (k * (nu + k));
      sum += derivative ? term * (2 * k + nu) : term;
      if (Math.abs(term) < 1e-18 * Math.abs(sum) && k > 5) break;
    }
    return sum;
  }
  function expWellLevels(V0: number): { even: number[]; odd: number[] } {
    const xi0 = 2 * Math.sqrt(2 * V0);
    const find = (derivative: boolean): number[] => {
      const roots: number[] = [];
      const N = 20000;
      let prevNu = xi0;
      let prev = besselSeries(prevNu, xi0, derivative);
      for (let i = N - 1; i >= 1; i--) {
        const nu = (xi0 * i) / N;
        const f = besselSeries(nu, xi0, derivative);
        if (f === 0 || f > 0 !== prev > 0) roots.push(bisect((n) => besselSeries(n, xi0, derivative), nu, prevNu));
        prev = f;
        prevNu = nu;
      }
      return roots.map((nu) => (nu * nu) / 8); // ε = ν²/8, descending
    };
    return { even: find(true), odd: find(false) };
  }

  it.each([0.5, 3, 12])('V0 = %s: every level to 1e-10 relative and the count', (V0) => {
    const ex = expWellLevels(V0);
    const r = solveBoundStates((x) => -V0 * Math.exp(-Math.abs(x)), { scale: 0.5 });
    expect(r.countEven).toBe(ex.even.length);
    expect(r.countOdd).toBe(ex.odd.length);
    for (const s of r.states) {
      const exact = s.parity === 'even' ? ex.even[s.nu >> 1] : ex.odd[s.nu >> 1];
      expectClose(s.epsilon, exact, { rel: 1e-10, inputs: { V0, nu: s.nu }, source: 'J_ν zeros in ν (test-side series + bisection)' });
    }
  });
});

describe('createBoundStateSolver: one sampled mesh for the family c·(−1/cosh²x)', () => {
  it('levels for c = λ′(λ′+1)/2, λ′ = 0.4, 2.5, 6.3 (≤ lambdaMax) and 9.7 (> lambdaMax, rebuild) match (λ′−n)²/2 to 1e-10', () => {
    const solver = createBoundStateSolver((x) => -1 / Math.cosh(x) ** 2, { scale: 0.5, lambdaMax: 30 });
    for (const lp of [0.4, 2.5, 6.3, 9.7]) {
      const c = (lp * (lp + 1)) / 2;
      const r = solver.solve(c);
      expect(r.count).toBe(Math.ceil(lp));
      r.states.forEach((s, n) =>
        expectClose(s.epsilon, (lp - n) ** 2 / 2, { rel: 1e-10, inputs: { coupling: c, lambdaPrime: lp, n }, source: PT_SOURCE }),
      );
      expect(solver.count(c).total).toBe(Math.ceil(lp));
    }
  });

  it('a warm-start guess gives the same levels (1e-13) with fewer matching evaluations', () => {
    const solver = createBoundStateSolver((x) => -1 / Math.cosh(x) ** 2, { scale: 0.5, lambdaMax: 30 });
    const c = 4.375; // λ′ = 2.5
    const cold = solver.solve(c, { errorEstimate: false });
    const warm = solver.solve(c, { errorEstimate: false, guess: [3.125 * 1.001, 1.125 * 0.999, 0.125 * 1.01] });
    warm.states.forEach((s, n) => expectClose(s.epsilon, cold.states[n].epsilon, { rel: 1e-13, inputs: { n } }));
    expect(warm.mismatchEvaluations).toBeLessThan(cold.mismatchEvaluations);
    // a useless guess (far off, or invalid) still converges to the same levels
    const bad = solver.solve(c, { errorEstimate: false, guess: [1e-30, -1, Number.NaN] });
    bad.states.forEach((s, n) => expectClose(s.epsilon, cold.states[n].epsilon, { rel: 1e-13, inputs: { n, guess: 'bad' } }));
  });

  it('a call after the first one reuses the mesh: no new potential evaluations for λ ≤ lambdaMax', () => {
    const solver = createBoundStateSolver((x) => -1 / Math.cosh(x) ** 2, { scale: 0.5, lambdaMax: 30 });
    const first = solver.solve(3, { errorEstimate: false });
    const second = solver.solve(5, { errorEstimate: false });
    expect(first.potentialEvaluations).toBeGreaterThan(0);
    expect(second.potentialEvaluations).toBe(0);
  });
});

describe('magnusPropagator: the step exponential of a traceless 2×2 matrix', () => {
  // With R2 = R3 = S2 = S3 = 0 the step exponent is Ω = [[0, R1], [S1, 0]] (all commutators vanish), and
  // Ω² = δ·I with δ = R1·S1, so exp(Ω) = cosh√δ·I + (sinh√δ/√δ)·Ω exactly (cos/sin for δ < 0): the
  // closed form of the exponential of a 2×2 matrix with zero trace (Cayley–Hamilton; e.g. Blanes, Casas,
  // Oteo, Ros, Phys. Rep. 470, 151 (2009), §5). Checked across the three evaluation routes of the step —
  // the Taylor polynomial for |δ| < 1, one exponential for δ ≥ 1, cos/sin for δ ≤ −1 — and at their seams.
  it('equals cosh√δ, sinh√δ/√δ (cos, sin for δ < 0) within 2e-15 relative for δ = −60 … 60, and has determinant 1', () => {
    const SRC = 'exp of a traceless 2×2 matrix: cosh√δ·I + (sinh√δ/√δ)·Ω (Cayley–Hamilton)';
    const out = new Float64Array(4);
    const deltas = [-60, -9, -1.0000001, -1, -0.9999999, -0.3, -1e-3, -1e-9, 0, 1e-9, 1e-3, 0.3, 0.9999999, 1, 1.0000001, 4, 30, 60];
    for (const d of deltas) {
      for (const R1 of [0.7, 3.1]) {
        const S1 = d / R1;
        magnusPropagator(R1, 0, 0, S1, 0, 0, 1, out);
        const mu = Math.sqrt(Math.abs(d));
        const c = d > 0 ? Math.cosh(mu) : d < 0 ? Math.cos(mu) : 1;
        const sc = d > 0 ? Math.sinh(mu) / mu : d < 0 ? Math.sin(mu) / mu : 1;
        const inputs = { delta: d, R1, S1 };
        expectClose(out[0], c, { rel: 2e-15, abs: 1e-300, inputs, source: SRC });
        expectClose(out[3], c, { rel: 2e-15, abs: 1e-300, inputs, source: SRC });
        expectClose(out[1], R1 * sc, { rel: 2e-15, abs: 1e-300, inputs, source: SRC });
        expectClose(out[2], S1 * sc, { rel: 2e-15, abs: 1e-300, inputs, source: SRC });
        expectClose(out[0] * out[3] - out[1] * out[2], 1, { rel: 1e-13 * Math.max(1, c * c), inputs, source: 'det exp(Ω) = e^(tr Ω) = 1' });
      }
    }
  });
});

describe('magnusSweep: a whole sweep in one call', () => {
  it('gives bit-for-bit the result of stepping with magnusPropagator (forward and inverse), and counts the sign changes of g', () => {
    // a synthetic step table (8 numbers per step, as the mesh stores them) with steps from quiet
    // (|δ| ≪ 1) to strongly oscillating or growing ones, so every route of the step exponential is used
    const rand = mulberry32(31);
    const S = 8;
    const n = 60;
    const st = new Float64Array(n * S);
    for (let k = 0; k < n; k++) {
      const h = 0.02 + 0.5 * rand();
      st[k * S] = h;
      st[k * S + 1] = 0.1 * h * (rand() - 0.5);
      st[k * S + 2] = 0.01 * h * (rand() - 0.5);
      st[k * S + 3] = -h * 10 * rand();
      st[k * S + 4] = 0.3 * h * (rand() - 0.5);
      st[k * S + 5] = 0.03 * h * (rand() - 0.5);
    }
    for (const [twoL, twoE] of [[40, 0.5], [2, 30], [0.01, 0]]) {
      for (const sign of [1, -1]) {
        let g = 1;
        let gp = -0.3;
        let prevPos = true;
        let changes = 0;
        const m = new Float64Array(4);
        for (let q = 0; q < n; q++) {
          const k = sign > 0 ? q : n - 1 - q;
          const o = k * S;
          magnusPropagator(st[o], st[o + 1], st[o + 2], twoL * st[o + 3] + twoE * st[o], twoL * st[o + 4] + twoE * st[o + 1], twoL * st[o + 5] + twoE * st[o + 2], sign, m);
          const g1 = m[0] * g + m[1] * gp;
          gp = m[2] * g + m[3] * gp;
          g = g1;
          if (g !== 0) {
            if (g > 0 !== prevPos) changes++;
            prevPos = g > 0;
          }
          const sz = Math.abs(g) + Math.abs(gp);
          if (sz > 1e150 || sz < 1e-150) {
            g /= sz;
            gp /= sz;
          }
        }
        const y = new Float64Array([1, -0.3]);
        const c = magnusSweep(st, S, 0, n, sign, twoL, twoE, y);
        expect({ twoL, twoE, sign, g: y[0], gp: y[1], changes: c }).toEqual({ twoL, twoE, sign, g, gp, changes });
      }
    }
  });
});

describe('solver input validation', () => {
  it('throws EngineInputError naming the option for non-positive or non-finite options', () => {
    const v = (x: number) => -1 / Math.cosh(x) ** 2;
    for (const [name, opts] of [
      ['scale', { scale: 0 }],
      ['tol', { tol: -1 }],
      ['coupling', { coupling: Number.NaN }],
      ['xMax', { xMax: Infinity }],
      ['nuMax', { nuMax: 1.5 }],
    ] as const) {
      let caught: unknown;
      try {
        solveBoundStates(v, opts);
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(EngineInputError);
      expect((caught as EngineInputError).parameter).toBe(name);
    }
  });
});
