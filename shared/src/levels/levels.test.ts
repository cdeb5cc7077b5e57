/**
 * The per-point levels API and the scaled orbital solver: physics checks
 * (weak coupling, scaling, monotonicity, ordering, counting, thresholds),
 * an independent Numerov shooting reference, flags and input validation.
 */
import { describe, expect, it } from 'vitest';
import { EngineInputError } from '../errors.js';
import { adiabaticPotential, makeScaledPotential, scaledPotentialIntegral } from '../potential/index.js';
import { solveBoundStates } from '../solver/solveBoundStates.js';
import type { AtomicField, AtomicPolarizability, Bohr } from '../units/brand.js';
import { expectClose } from '../../test/expectClose.js';
import { countStates } from './countStates.js';
import { createOrbitalSolver } from './createOrbitalSolver.js';
import { levels } from './levels.js';
import { orbitalThresholds } from './orbitalThresholds.js';
import { orbitalWeakCoupling, orbitalWeakCouplingCoefficients } from './orbitalWeakCoupling.js';
import { solveOrbital } from './solveOrbital.js';
import { weakCouplingCoefficients } from './weakCouplingCoefficients.js';

const SIMON = 'B. Simon, Ann. Phys. 97, 279 (1976)';

describe('weak-coupling coefficients (quadrature) against closed forms', () => {
  it('w = −sech²x: W1 = −2, D2 = 4, M2 = −π²/6, W1²M2 + D3 = −16 (κ = λ′ of Pöschl–Teller, λ′(λ′+1)/2 = λ), 1e-12', () => {
    // λ′ = (√(1+8λ) − 1)/2 = 2λ − 4λ² + 16λ³ − … (Landau & Lifshitz QM §23, expanded)
    const c = weakCouplingCoefficients((x) => -1 / Math.cosh(x) ** 2, 0.5);
    expectClose(c.W1, -2, { rel: 1e-12, inputs: 'W1, sech²' });
    expectClose(c.D2, 4, { rel: 1e-12, inputs: 'D2, sech²' });
    expectClose(c.M2, -(Math.PI ** 2) / 6, { rel: 1e-12, inputs: 'M2, sech²' });
    expectClose(c.W1 * c.W1 * c.M2 + c.D3, -16, { rel: 1e-12, inputs: 'third-order coefficient, sech²' });
  });

  it('w = −e^(−x²): W1 = −√π, M2 = −√π/2, D2 = √(2π) (Gaussian integrals), 1e-12', () => {
    const c = weakCouplingCoefficients((x) => -Math.exp(-x * x), 0.5);
    expectClose(c.W1, -Math.sqrt(Math.PI), { rel: 1e-12, inputs: 'W1, Gaussian' });
    expectClose(c.M2, -Math.sqrt(Math.PI) / 2, { rel: 1e-12, inputs: 'M2, Gaussian' });
    expectClose(c.D2, Math.sqrt(2 * Math.PI), { rel: 1e-12, inputs: 'D2, Gaussian' });
  });

  it.each([
    [0, 0.05],
    [0, 0.6],
    [1, 0.02],
    [3, 0.2],
    [10, 1.5],
  ])('w_m, m = %s, ρ_c = %s: W1 equals −(π/(8√2))U(3/2, 3/2−m, ρ_c²/2) to 1e-12', (m, rhoC) => {
    const c = orbitalWeakCouplingCoefficients(m, rhoC);
    expectClose(c.W1, scaledPotentialIntegral(m, rhoC), { rel: 1e-12, inputs: { m, rhoC }, source: 'model.md §1 closed form' });
  });
});

describe('weak-coupling series against the solver (Simon 1976)', () => {
  it.each([
    [1, 0.2],
    [2, 0.05],
    [5, 0.5],
  ])('m = %s, ρ_c = %s: the k-th order error shrinks like λ^(k+1); 3rd-order error ≤ |W1|·λ⁴ln(1/λ) (measured ≤ 0.3×)', (m, rhoC) => {
    const c = orbitalWeakCouplingCoefficients(m, rhoC);
    for (const lambda of [1e-3, 1e-2]) {
      const eps = solveOrbital(m, lambda, rhoC, { nuMax: 0 }).levels[0].epsilon;
      const kappa = Math.sqrt(2 * eps);
      const k1 = orbitalWeakCoupling(m, lambda, rhoC, 1).kappa;
      const k2 = orbitalWeakCoupling(m, lambda, rhoC, 2).kappa;
      const k3 = orbitalWeakCoupling(m, lambda, rhoC, 3).kappa;
      const e1 = Math.abs(k1 - kappa);
      const e2 = Math.abs(k2 - kappa);
      const e3 = Math.abs(k3 - kappa);
      const scale = Math.abs(c.W1); // κ ≈ λ|W1|: errors measured in units of |W1|
      const report = `m=${m} ρc=${rhoC} λ=${lambda} κ=${kappa} errors ${e1}, ${e2}, ${e3} (${SIMON})`;
      if (!(e2 < e1 && e3 < e2)) throw new Error(`orders do not improve: ${report}`);
      if (!(e3 <= scale * lambda ** 4 * Math.log(1 / lambda))) throw new Error(`3rd order off: ${report}`);
    }
  });

  it('m = 0 follows the series with its ρ_c-dependent W1 (λ = 1e-4, ρ_c = 0.1): 2nd order to 1e-6 relative in κ', () => {
    const m = 0;
    const rhoC = 0.1;
    const lambda = 1e-4;
    const eps = solveOrbital(m, lambda, rhoC, { nuMax: 0 }).levels[0].epsilon;
    const k2 = orbitalWeakCoupling(m, lambda, rhoC, 2).kappa;
    expectClose(Math.sqrt(2 * eps), k2, { rel: 1e-6, inputs: { m, rhoC, lambda }, source: SIMON });
  });
});

/**
 * Even ground state by Numerov shooting on a uniform grid z_i = i·h, h = L/n (test-side reference,
 * fourth order; B. V. Numerov 1924, any numerical-analysis text): g(0) = 1, g(−h) = g(h), bisection
 * on ε using the node count (a node ⇒ ε below the ground-state binding).
 */
function numerovGround(v: (z: number) => number, L: number, n: number, lo: number, hi: number): number {
  const h = L / n;
  const vz = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) vz[i] = v(i * h);
  const k = (h * h) / 12;
  const shoot = (eps: number): number => {
    const f0 = 2 * (vz[0] + eps);
    const f1 = 2 * (vz[1] + eps);
    let gPrev = 1;
    let cPrev = 1 - k * f0;
    // symmetric start: (1 − k f1) g1 · 2 = 2(1 + 5k f0) g0
    let g = (1 + 5 * k * f0) / (1 - k * f1);
    let fCur = f1;
    for (let i = 1; i < n; i++) {
      const fNext = 2 * (vz[i + 1] + eps);
      const gn = (2 * (1 + 5 * k * fCur) * g - cPrev * gPrev) / (1 - k * fNext);
      if (gn < 0) return -1; // a node: ε is below the ground-state binding
      cPrev = 1 - k * fCur;
      gPrev = g;
      g = gn;
      fCur = fNext;
    }
    return g; // no node: g grows ⇒ ε above (or at) the binding
  };
  let a = lo;
  let b = hi;
  for (let i = 0; i < 80; i++) {
    const mid = 0.5 * (a + b);
    if (shoot(mid) > 0) b = mid;
    else a = mid;
  }
  return 0.5 * (a + b);
}

describe('solveOrbital against an independent Numerov shooting solver', () => {
  it('m = 1, λ = 10, ρ_c = 0.2 and m = 0, λ = 1, ρ_c = 0.6: ground state agrees to 1e-9 (Numerov h → h/2 Richardson)', () => {
    for (const [m, lambda, rhoC] of [
      [1, 10, 0.2],
      [0, 1, 0.6],
    ] as const) {
      const w = makeScaledPotential(m, rhoC);
      const v = (z: number): number => lambda * w(z);
      const mine = solveOrbital(m, lambda, rhoC, { nuMax: 0 }).levels[0].epsilon;
      const L = 40 / Math.sqrt(2 * mine);
      const lo = mine * 0.9;
      const hi = mine * 1.1;
      const e1 = numerovGround(v, L, 40000, lo, hi);
      const e2 = numerovGround(v, L, 80000, lo, hi);
      const ref = e2 + (e2 - e1) / 15; // Numerov is fourth order
      expectClose(mine, ref, { rel: 1e-9, inputs: { m, lambda, rhoC, numerovH: L / 80000 }, source: 'Numerov shooting (test-side)' });
    }
  });
});

describe('createOrbitalSolver (one potential sampling per row of constant B)', () => {
  it('a row α = 1…1000 at B = 1e-4, r_c = 2, m = 0, 2: ground states equal solveOrbital at tol 1e-12 to 1e-7 (tol 2e-7)', () => {
    const B = 1e-4;
    const rhoC = 2 * Math.sqrt(B);
    for (const m of [0, 2]) {
      const row = createOrbitalSolver(m, rhoC, { tol: 2e-7, lambdaMax: 1000 * B });
      for (const alpha of [1, 10, 100, 1000]) {
        const fast = row.solve(alpha * B, { nuMax: 0, errorEstimate: false }).levels[0].epsilon;
        const ref = solveOrbital(m, alpha * B, rhoC, { nuMax: 0, tol: 1e-12 }).levels[0].epsilon;
        expectClose(fast, ref, { rel: 1e-7, inputs: { m, alpha, B, rhoC } });
      }
    }
  });
});

describe('levels: scaling ε = B·f(αB, r_c√B) against a direct unscaled solve of V_m(z)', () => {
  it.each([
    [0, 100, 1e-4, 2],
    [1, 1000, 1e-2, 2],
    [3, 10, 0.1, 1],
  ])('m = %s, α = %s, B = %s, r_c = %s: every level agrees to 1e-11 relative', (m, alpha, B, rc) => {
    const lv = levels({ alpha, fieldAu: B, cutoffBohr: rc, mMax: m }).filter((s) => s.m === m);
    const V = (z: number): number =>
      adiabaticPotential(m, z as Bohr, alpha as AtomicPolarizability, B as AtomicField, rc as Bohr);
    const direct = solveBoundStates(V, { scale: Math.min(rc, 1 / Math.sqrt(B)) / 2, c4: alpha / 2 });
    expect(lv.length).toBe(direct.states.length);
    lv.forEach((s, i) =>
      expectClose(s.bindingHartree, direct.states[i].epsilon, { rel: 1e-11, inputs: { m, alpha, B, rc, nu: s.nu }, source: 'direct solve in bohr/hartree' }),
    );
  });

  it('the same scaled point (λ, ρ_c) at B = 1e-6, 1e-4, 1e-2 gives the same ε/B to 1e-12 and ε ∝ B', () => {
    const lambda = 0.5;
    const rhoC = 0.3;
    const ref = levels({ alpha: lambda / 1e-6, fieldAu: 1e-6, cutoffBohr: rhoC / Math.sqrt(1e-6), mMax: 3 });
    for (const B of [1e-4, 1e-2]) {
      const lv = levels({ alpha: lambda / B, fieldAu: B, cutoffBohr: rhoC / Math.sqrt(B), mMax: 3 });
      expect(lv.length).toBe(ref.length);
      lv.forEach((s, i) => {
        expectClose(s.bindingOverB, ref[i].bindingOverB, { rel: 1e-12, inputs: { B, m: s.m, nu: s.nu } });
        expectClose(s.bindingHartree / B, ref[i].bindingHartree / 1e-6, { rel: 1e-12, inputs: { B, m: s.m, nu: s.nu } });
      });
    }
  });
});

describe('levels: monotonicity, ordering, counting, existence', () => {
  it('every level binds more strongly as α grows (B = 1e-3, r_c = 2, m = 0…4, α = 1…3000)', () => {
    let prev = levels({ alpha: 1, fieldAu: 1e-3, cutoffBohr: 2, mMax: 4 });
    for (const alpha of [3, 10, 30, 100, 300, 1000, 3000]) {
      const cur = levels({ alpha, fieldAu: 1e-3, cutoffBohr: 2, mMax: 4 });
      for (const p of prev) {
        const c = cur.find((s) => s.m === p.m && s.nu === p.nu);
        if (!c || !(c.bindingHartree > p.bindingHartree)) {
          throw new Error(`α=${alpha} m=${p.m} ν=${p.nu}: ${c?.bindingHartree} not > ${p.bindingHartree}`);
        }
      }
      prev = cur;
    }
  });

  it('every level binds more strongly as B grows (α = 300, r_c = 2, m = 0…4, B = 1e-6…1e-1)', () => {
    let prev = levels({ alpha: 300, fieldAu: 1e-6, cutoffBohr: 2, mMax: 4 });
    for (const B of [1e-5, 1e-4, 1e-3, 1e-2, 1e-1]) {
      const cur = levels({ alpha: 300, fieldAu: B, cutoffBohr: 2, mMax: 4 });
      for (const p of prev) {
        const c = cur.find((s) => s.m === p.m && s.nu === p.nu);
        if (!c || !(c.bindingHartree > p.bindingHartree)) {
          throw new Error(`B=${B} m=${p.m} ν=${p.nu}: ${c?.bindingHartree} not > ${p.bindingHartree}`);
        }
      }
      prev = cur;
    }
  });

  it('within each m the levels are strictly decreasing in ν with parity alternating from even (α = 1000, B = 0.1, r_c = 2)', () => {
    const lv = levels({ alpha: 1000, fieldAu: 0.1, cutoffBohr: 2, mMax: 7 });
    for (let m = 0; m <= 7; m++) {
      const s = lv.filter((x) => x.m === m);
      expect(s.length).toBeGreaterThan(0);
      s.forEach((x, i) => {
        expect(x.nu).toBe(i);
        expect(x.parity).toBe(i % 2 === 0 ? 'even' : 'odd');
        if (i > 0 && !(x.bindingHartree < s[i - 1].bindingHartree)) {
          throw new Error(`m=${m}: ε_${i} = ${x.bindingHartree} not below ε_${i - 1} = ${s[i - 1].bindingHartree}`);
        }
      });
    }
  });

  it('countStates equals the number of levels found for each m (α = 1000, B = 0.1 and 0.01, r_c = 2)', () => {
    for (const B of [0.1, 0.01]) {
      const lv = levels({ alpha: 1000, fieldAu: B, cutoffBohr: 2, mMax: 7 });
      for (let m = 0; m <= 7; m++) {
        const n = countStates(m, 1000 * B, 2 * Math.sqrt(B));
        expect({ B, m, n: lv.filter((s) => s.m === m).length }).toEqual({ B, m, n });
      }
    }
  });

  it('every m = 0…64 has at least one bound state, also at λ = 1e-6 (Simon 1976; Avron, Herbst, Simon 1981)', () => {
    for (const [alpha, B] of [
      [1, 1e-6],
      [1000, 0.1],
    ]) {
      const lv = levels({ alpha, fieldAu: B, cutoffBohr: 2, mMax: 64 });
      for (let m = 0; m <= 64; m++) {
        const g = lv.find((s) => s.m === m && s.nu === 0);
        if (!g || !(g.bindingHartree > 0) || g.flags.includes('unresolved')) {
          throw new Error(`α=${alpha} B=${B} m=${m}: no resolved ground state`);
        }
      }
    }
  });
});

describe('threshold couplings λ_c,ν(ρ_c) (tan φ = 0 of the 1/ζ⁴ tail solution)', () => {
  it.each([
    [0, 0.3],
    [1, 0.3],
    [4, 1],
  ])('m = %s, ρ_c = %s: count jumps from ν to ν+1 across λ_c,ν (±1e-6) and the new level is very weakly bound', (m, rhoC) => {
    const th = orbitalThresholds(m, rhoC, 3);
    expect(th[0]).toBe(0);
    for (let nu = 1; nu <= 3; nu++) {
      expect(th[nu]).toBeGreaterThan(th[nu - 1]);
      expect(countStates(m, th[nu] * (1 - 1e-6), rhoC)).toBe(nu);
      expect(countStates(m, th[nu] * (1 + 1e-6), rhoC)).toBe(nu + 1);
      const s = solveOrbital(m, th[nu] * (1 + 1e-6), rhoC);
      const newest = s.levels[nu];
      // ε ∝ (λ − λ_c)²: far below the previous level
      if (!(newest.resolved && newest.epsilon < 1e-8 * s.levels[nu - 1].epsilon)) {
        throw new Error(`m=${m} ν=${nu}: new level ε=${newest.epsilon} vs previous ${s.levels[nu - 1].epsilon}`);
      }
    }
  });
});

describe('levels: flags (model.md §3)', () => {
  it('m = 0 is cutoff-dominated iff α/r_c² ≥ 1; m ≥ 1 never', () => {
    const a = levels({ alpha: 4, fieldAu: 1e-3, cutoffBohr: 2, mMax: 1 }); // α/r_c² = 1
    const b = levels({ alpha: 3.9, fieldAu: 1e-3, cutoffBohr: 2, mMax: 1 });
    expect(a.filter((s) => s.m === 0).every((s) => s.flags.includes('cutoff-dominated'))).toBe(true);
    expect(a.filter((s) => s.m === 1).some((s) => s.flags.includes('cutoff-dominated'))).toBe(false);
    expect(b.some((s) => s.flags.includes('cutoff-dominated'))).toBe(false);
  });

  it('non-adiabatic exactly when ε/B > 0.1', () => {
    const lv = levels({ alpha: 1000, fieldAu: 0.1, cutoffBohr: 2, mMax: 3 });
    expect(lv.some((s) => s.bindingOverB > 0.1)).toBe(true);
    expect(lv.some((s) => s.bindingOverB <= 0.1)).toBe(true);
    for (const s of lv) expect(s.flags.includes('non-adiabatic')).toBe(s.bindingOverB > 0.1);
  });

  it('field-free-anion marks exactly the m = 0 states when requested', () => {
    const on = levels({ alpha: 100, fieldAu: 1e-3, cutoffBohr: 2, mMax: 2, hasFieldFreeAnion: true });
    const off = levels({ alpha: 100, fieldAu: 1e-3, cutoffBohr: 2, mMax: 2 });
    for (const s of on) expect(s.flags.includes('field-free-anion')).toBe(s.m === 0);
    expect(off.some((s) => s.flags.includes('field-free-anion'))).toBe(false);
  });

  it('below-floor marks exactly the states with ε < floor', () => {
    const all = levels({ alpha: 300, fieldAu: 1e-3, cutoffBohr: 2, mMax: 6 });
    const sorted = all.map((s) => s.bindingHartree).sort((p, q) => p - q);
    const floor = sorted[Math.floor(sorted.length / 2)];
    const lv = levels({ alpha: 300, fieldAu: 1e-3, cutoffBohr: 2, mMax: 6, energyFloorHartree: floor });
    expect(lv.length).toBe(all.length);
    for (const s of lv) expect(s.flags.includes('below-floor')).toBe(s.bindingHartree < floor);
  });
});

describe('levels: states far below the floor', () => {
  it('a floor above the weak m ≥ 1 levels: they are reported as below-floor and unresolved, with an upper bound ≤ floor/1000', () => {
    // α = 1, B = 1e-6: ε(m = 1) ≈ 1.2e-19 hartree; floor 1e-9 hartree, solver searched down to 1e-12.
    const floor = 1e-9;
    const lv = levels({ alpha: 1, fieldAu: 1e-6, cutoffBohr: 2, mMax: 3, energyFloorHartree: floor });
    const weak = lv.filter((s) => s.m >= 1);
    expect(weak.length).toBeGreaterThan(0);
    for (const s of weak) {
      expect(s.flags).toContain('below-floor');
      expect(s.flags).toContain('unresolved');
      expect(s.bindingHartree).toBeLessThanOrEqual(floor * 1e-3 * (1 + 1e-12));
      expect(Number.isNaN(s.relError)).toBe(true);
    }
  });
});

describe('levels: input validation before any work', () => {
  const good = { alpha: 10, fieldAu: 1e-3, cutoffBohr: 2, mMax: 3 };
  it.each([
    ['alpha', { alpha: 0 }],
    ['alpha', { alpha: -1 }],
    ['alpha', { alpha: Number.NaN }],
    ['fieldAu', { fieldAu: Infinity }],
    ['fieldAu', { fieldAu: 0 }],
    ['cutoffBohr', { cutoffBohr: 0 }],
    ['mMax', { mMax: 65 }],
    ['mMax', { mMax: 1.5 }],
    ['mMax', { mMax: -1 }],
    ['energyFloorHartree', { energyFloorHartree: -1e-9 }],
    ['tol', { tol: 0 }],
    ['hasFieldFreeAnion', { hasFieldFreeAnion: 'yes' as unknown as boolean }],
  ])('throws EngineInputError naming %s for %o', (name, patch) => {
    let caught: unknown;
    try {
      levels({ ...good, ...patch });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(EngineInputError);
    expect((caught as EngineInputError).parameter).toBe(name);
  });
});
