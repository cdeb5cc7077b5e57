import { describe, expect, it } from 'vitest';
import { DomainError } from '../errors.js';
import { expectClose, relDiff } from '../../test/expectClose.js';
import { loadSpecialOracle, ORACLE_SOURCE } from '../../test/oracle.js';
import { integrateToInfinity } from '../../test/quadrature.js';
import { mulberry32 } from '../../test/seededRandom.js';
import { erfcx } from '../special/erfc.js';
import { atomicField, atomicPolarizability, bohr } from '../units/constructors.js';
import {
  adiabaticPotential, makeScaledPotential, potentialIntegral, scaledPotential, scaledPotentialAtOriginZeroCutoff,
  scaledPotentialIntegral, scaledPotentialIntegralZeroCutoff, scaledPotentialNearAtomM0, scaledPotentialTail,
  scaledTailCoefficients,
} from './index.js';

const oracle = loadSpecialOracle();
const MODEL = 'shared/physics/model.md §1 (closed forms and limits)';
const QUAD = 'adaptive Gauss–Kronrod 7/15 quadrature (QUADPACK QK15, Piessens et al. 1983), test/quadrature.ts';

/** ln m! by a plain product (independent of the engine's gamma). */
function lnFactorial(m: number): number {
  let s = 0;
  for (let k = 2; k <= m; k++) s += Math.log(k);
  return s;
}

/**
 * V_m(z) by direct quadrature of the transverse average ∫|φ_m(ρ)|² V(ρ, z) 2πρ dρ,
 * |φ_m|² = u^m e^(−u)/(2π l² m!), u = ρ²/(2l²), V = −α/(2(ρ² + z² + r_c²)²).
 */
function transverseAverage(m: number, z: number, alpha: number, B: number, rc: number): number {
  const l2 = 1 / B;
  const D = z * z + rc * rc;
  const lnmf = lnFactorial(m);
  const f = (rho: number): number => {
    if (rho === 0) return m === 0 ? (-alpha / (2 * D * D)) / l2 : 0;
    const u = (rho * rho) / (2 * l2);
    const dens = Math.exp(m * Math.log(u) - u - lnmf) / (2 * Math.PI * l2);
    return dens * (-alpha / (2 * (rho * rho + D) ** 2)) * 2 * Math.PI * rho;
  };
  const ring = Math.sqrt(2 * (m + 1) * l2);
  const sd = Math.sqrt(D);
  return integrateToInfinity(f, [0, sd / 4, sd, 4 * sd, ring / 4, ring / 2, ring, 2 * ring, 4 * ring].filter((x) => x >= 0), 1e-13);
}

describe('scaledPotential w_m(ζ; ρ_c) = −U(2, 2−m, (ζ² + ρ_c²)/2)/8', () => {
  it('matches the mpmath tanh-sinh transverse average (independent route) within 1e-13', () => {
    for (const [m, zeta, rhoC, v] of oracle.scaledPotentialDirect['rows [m, zeta, rhoC, value]']) {
      expectClose(scaledPotential(m, zeta, rhoC), Number(v), { rel: 1e-13, inputs: { m, zeta, rhoC }, source: ORACLE_SOURCE });
    }
  });
  it('is even in ζ, attractive and strictly increasing in |ζ| (model.md §1), for m = 0…64', () => {
    for (const m of [0, 1, 2, 7, 30, 64]) {
      for (const rhoC of [0.001, 0.5, 3]) {
        let prev = -Infinity;
        for (let i = 0; i <= 400; i++) {
          const zeta = 1e-4 * Math.pow(1e10, i / 400); // 1e-4 … 1e6
          const w = scaledPotential(m, zeta, rhoC);
          expect(w).toBeLessThan(0);
          expect(w).toBeGreaterThan(prev);
          expect(scaledPotential(m, -zeta, rhoC)).toBe(w);
          prev = w;
        }
      }
    }
  });
  it('has w_m(0; 0) = −1/(8m(m−1)) for m ≥ 2 (model.md §1) within 1e-15', () => {
    for (const m of [2, 3, 10, 64]) {
      expectClose(scaledPotential(m, 0, 0), -1 / (8 * m * (m - 1)), { rel: 1e-15, inputs: { m }, source: MODEL });
      expect(scaledPotentialAtOriginZeroCutoff(m)).toBe(-1 / (8 * m * (m - 1)));
    }
    expect(scaledPotential(0, 0, 0)).toBe(-Infinity);
    expect(scaledPotential(1, 0, 0)).toBe(-Infinity);
  });
  it('follows the far tail −(1/(2D²))Σ c_k D^(−k) with remainder below 2|c_K|/D^K (DLMF 13.7.3, model.md §1)', () => {
    expect(Array.from(scaledTailCoefficients(2, 3))).toEqual([1, -12, 144]); // 1, −4(m+1), 12(m+1)(m+2)
    for (const m of [0, 1, 5, 20]) {
      for (const zeta of [30, 100, 1e3, 1e5]) {
        const D = zeta * zeta;
        if (D < 8 * (m + 4)) continue;
        for (const K of [1, 2, 3, 4]) {
          const c = scaledTailCoefficients(m, K + 1);
          const bound = 2 * Math.abs(c[K]!) / D ** K + 4e-16;
          const rd = relDiff(scaledPotentialTail(m, zeta, 0, K), scaledPotential(m, zeta, 0));
          if (rd > bound) throw new Error(`tail m=${m} zeta=${zeta} K=${K}: rel ${rd} > ${bound}`);
        }
      }
    }
    expectClose(scaledPotential(0, 1e6, 0), -1 / (2 * 1e24), { rel: 1e-11, inputs: { zeta: 1e6 }, source: MODEL });
  });
  it('approaches the m = 0 inverse-square core −1/(4(ζ² + ρ_c²)) near the atom (model.md §1), relative error ≤ 2b|ln b|', () => {
    for (const D of [1e-12, 1e-8, 1e-4]) {
      const b = D / 2;
      const rd = relDiff(scaledPotential(0, Math.sqrt(D), 0), scaledPotentialNearAtomM0(Math.sqrt(D), 0));
      expect(rd).toBeLessThan(2 * b * Math.abs(Math.log(b)));
    }
  });
  it('throws DomainError naming the parameter for bad m, ζ or ρ_c', () => {
    expect(() => scaledPotential(-1, 0, 1)).toThrow(DomainError);
    expect(() => scaledPotential(1, NaN, 1)).toThrow(/zeta/);
    expect(() => scaledPotential(1, 0, -1)).toThrow(/rhoC/);
    expect(() => makeScaledPotential(2.5, 1)).toThrow(/m/);
  });
});

describe('makeScaledPotential (fast path)', () => {
  it('agrees with scaledPotential within 3e-14 relative on a sinh grid 1e-9 … 1e12 for m = 0…64', () => {
    for (const m of [0, 1, 2, 3, 8, 17, 40, 64]) {
      for (const rhoC of [0, 1e-3, 0.2, 1, 5]) {
        const w = makeScaledPotential(m, rhoC);
        for (let t = -20; t <= 30; t += 0.173) {
          const zeta = 1e-3 * Math.sinh(t);
          const e = scaledPotential(m, zeta, rhoC);
          const a = w(zeta);
          if (!(relDiff(a, e) <= 3e-14) && !(a === e)) {
            throw new Error(`m=${m} rhoC=${rhoC} zeta=${zeta}: fast ${a} vs ${e} (rel ${relDiff(a, e)}, tol 3e-14)`);
          }
        }
      }
    }
  });
});

describe('makeScaledPotential against mpmath', () => {
  it('equals −U(2, 2−m, ζ²/2)/8 from mpmath hyperu within 2e-14 for 1e-30 ≤ ζ²/2 ≤ 1e30, m = 0…64 (ρ_c = 0)', () => {
    const byM = new Map<number, (zeta: number) => number>();
    for (const [m, x, v] of oracle.tricomiU2['rows [m, x, value]']) {
      let w = byM.get(m);
      if (!w) byM.set(m, (w = makeScaledPotential(m, 0)));
      const zeta = Math.sqrt(2 * x); // b = ζ²/2 reproduces x to 1 ulp
      expectClose(w(zeta), -Number(v) / 8, { rel: 2e-14, inputs: { m, zeta, b: x }, source: ORACLE_SOURCE });
    }
  });
});

describe('adiabaticPotential V_m(z) in hartree', () => {
  const cases: [number, number, number, number, number][] = [];
  for (const m of [0, 1, 2, 5, 20]) {
    for (const [alpha, B, rc] of [[400, 1e-4, 1], [10, 2e-4, 0.3], [160, 5e-5, 3]] as const) {
      const l = 1 / Math.sqrt(B);
      for (const z of [0, 0.1 * l, l, 7 * l, 40 * l]) cases.push([m, z, alpha, B, rc]);
    }
  }
  it(`equals direct quadrature of the transverse average ∫|φ_m|² V 2πρ dρ within 1e-12 (${cases.length} cases)`, () => {
    for (const [m, z, alpha, B, rc] of cases) {
      const v = adiabaticPotential(m, bohr(z), atomicPolarizability(alpha), atomicField(B), bohr(rc));
      expectClose(v, transverseAverage(m, z, alpha, B, rc), { rel: 1e-12, inputs: { m, z, alpha, B, rc }, source: QUAD });
    }
  });
  it('equals the quadrature of the transverse average at 30 seeded random (m, z, α, B, r_c) within 1e-12', () => {
    const rand = mulberry32(7);
    for (let i = 0; i < 30; i++) {
      const m = Math.floor(rand() * 40);
      const B = Math.pow(10, -6 + 3 * rand()); // 0.24 T … 235 T
      const alpha = Math.pow(10, 3 * rand());
      const rc = Math.pow(10, -1 + 2 * rand());
      const z = Math.pow(10, -2 + 5 * rand());
      const v = adiabaticPotential(m, bohr(z), atomicPolarizability(alpha), atomicField(B), bohr(rc));
      expectClose(v, transverseAverage(m, z, alpha, B, rc), { rel: 1e-12, inputs: { seed: 7, i, m, z, alpha, B, rc }, source: QUAD });
    }
  });
  it('is B·(αB)·w_m(z√B; r_c√B) (scaling, model.md §1) within 1e-15 and linear in α', () => {
    const B = 3e-5, rc = 2, z = 150;
    for (const m of [0, 3]) {
      const v = adiabaticPotential(m, bohr(z), atomicPolarizability(100), atomicField(B), bohr(rc));
      expectClose(v, B * 100 * B * scaledPotential(m, z * Math.sqrt(B), rc * Math.sqrt(B)), { rel: 1e-15, inputs: { m }, source: MODEL });
      expectClose(adiabaticPotential(m, bohr(z), atomicPolarizability(300), atomicField(B), bohr(rc)), 3 * v, { rel: 1e-15, inputs: { m }, source: 'linearity in α' });
    }
  });
  it('gives V_m(0) = −αB²/(8m(m−1)) at r_c = 0 for m ≥ 2 (model.md §1) within 1e-15', () => {
    expectClose(adiabaticPotential(2, bohr(0), atomicPolarizability(400), atomicField(1e-4), bohr(0)), -400e-8 / 16, { rel: 1e-15, source: MODEL });
  });
  it('throws DomainError for B ≤ 0, α < 0 or negative cutoff', () => {
    expect(() => adiabaticPotential(1, bohr(1), atomicPolarizability(1), atomicField(0), bohr(1))).toThrow(/fieldAu/);
    expect(() => adiabaticPotential(1, bohr(1), atomicPolarizability(-1), atomicField(1e-4), bohr(1))).toThrow(/alpha/);
    expect(() => adiabaticPotential(1, bohr(1), atomicPolarizability(1), atomicField(1e-4), bohr(-1))).toThrow(/cutoffBohr/);
  });
});

describe('potential integrals ∫V_m dz', () => {
  it('scaledPotentialIntegral equals quadrature of ∫w_m dζ over the line within 1e-12', () => {
    for (const m of [0, 1, 2, 6, 25, 64]) {
      for (const rhoC of [0.01, 0.3, 1, 4, 20]) {
        const w = makeScaledPotential(m, rhoC);
        const ring = Math.sqrt(2 * (m + 1));
        const q = 2 * integrateToInfinity(w, [0, rhoC / 4, rhoC, 4 * rhoC, ring / 2, ring, 2 * ring, 6 * ring], 1e-13);
        expectClose(scaledPotentialIntegral(m, rhoC), q, { rel: 1e-12, inputs: { m, rhoC }, source: QUAD });
      }
    }
  });
  it('tends to −πΓ(m−½)/(8√2 m!) as r_c → 0 for m ≥ 1 (model.md §1) within 1e-9 (m = 1: O(ρ_c) approach, ρ_c = 1e-10; m ≥ 2: O(ρ_c²), ρ_c = 1e-5)', () => {
    expectClose(scaledPotentialIntegralZeroCutoff(1), -Math.PI * Math.sqrt(Math.PI) / (8 * Math.SQRT2), { rel: 1e-15, source: MODEL });
    for (const m of [1, 2, 5, 64]) {
      const rhoC = m === 1 ? 1e-10 : 1e-5;
      expectClose(scaledPotentialIntegral(m, rhoC), scaledPotentialIntegralZeroCutoff(m), { rel: 1e-9, inputs: { m, rhoC }, source: MODEL });
      expectClose(scaledPotentialIntegral(m, 0), scaledPotentialIntegralZeroCutoff(m), { rel: 1e-15, inputs: { m, rhoC: 0 }, source: MODEL });
    }
  });
  it('m = 0 equals −π/(4ρ_c) + (π^(3/2)/(4√2)) e^s erfc(√s), s = ρ_c²/2 (model.md §1) within 1e-13', () => {
    for (const rhoC of [1e-6, 1e-3, 0.1, 1, 2]) {
      const s = (rhoC * rhoC) / 2;
      const closed = -Math.PI / (4 * rhoC) + (Math.PI ** 1.5 / (4 * Math.SQRT2)) * erfcx(Math.sqrt(s));
      expectClose(scaledPotentialIntegral(0, rhoC), closed, { rel: 1e-13, inputs: { rhoC }, source: MODEL });
    }
  });
  it('physical potentialIntegral = αB^(3/2)·scaledPotentialIntegral and matches quadrature of adiabaticPotential within 1e-12', () => {
    const alpha = 400, B = 1e-4, rc = 1.5;
    for (const m of [0, 1, 4]) {
      const I = potentialIntegral(m, atomicPolarizability(alpha), atomicField(B), bohr(rc));
      expectClose(I, alpha * B ** 1.5 * scaledPotentialIntegral(m, rc * Math.sqrt(B)), { rel: 1e-15, inputs: { m }, source: MODEL });
      const l = 1 / Math.sqrt(B);
      const f = (z: number): number => adiabaticPotential(m, bohr(z), atomicPolarizability(alpha), atomicField(B), bohr(rc));
      const q = 2 * integrateToInfinity(f, [0, rc / 4, rc, 4 * rc, l, 3 * l, 10 * l], 1e-13);
      expectClose(I, q, { rel: 1e-12, inputs: { m, alpha, B, rc }, source: QUAD });
    }
  });
});
