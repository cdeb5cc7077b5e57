/**
 * Moving-ion classification, recoil threshold, monotonicity and the thermal
 * ensemble, through the fast table (widthTable.test.ts checks the table itself).
 */
import { describe, expect, it } from 'vitest';
import { expectClose } from '../../test/expectClose.js';
import { EngineInputError } from '../errors.js';
import { STATE_CLASS } from '../map/mapTypes.js';
import { CODATA2018 } from '../units/codata2018.js';
import { allocateCellMotionOutput, classifyCells, type CellBindings } from './classifyCells.js';
import { classifyWidthCode } from './classifyWidth.js';
import { motionStates, type MotionStateInput, type MotionStatesInput } from './motionStates.js';
import { validateMotionSettings } from './motionSettings.js';
import { stateWidthInto, WIDTH_FLAG } from './stateWidth.js';
import { criticalTransverseEnergiesInto, criticalTransverseEnergy, thermalFractionsInto } from './thermalEnsemble.js';

const A = 40; // mass number
const M = A * CODATA2018.atomicMassUnitInElectronMasses;
const B = 1e-4; // 23.5 T
const OMEGA = B / M;

/** Orbital bindings on an exact power law ε_m = ε₀ (2m+1)^(−p) (so the local p is exactly p). */
function ladder(eps0: number, p: number, mMax: number, nu = 0): MotionStateInput[] {
  return Array.from({ length: mMax + 1 }, (_, m) => ({ m, nu, bindingHartree: eps0 * (2 * m + 1) ** -p }));
}

describe('classification rule (model.md §4)', () => {
  it('no state → NONE; Γ < ħ/τ (incl. 0) → bound; destroyed or Γ ≥ ε → unbound; else resonance (exact rule)', () => {
    const hbarOverTau = 2.4e-17;
    expect(classifyWidthCode(NaN, 0, hbarOverTau, WIDTH_FLAG.NO_STATE)).toBe(STATE_CLASS.NONE);
    expect(classifyWidthCode(0, 1e-7, hbarOverTau, WIDTH_FLAG.CHANNEL_CLOSED)).toBe(STATE_CLASS.BOUND);
    expect(classifyWidthCode(2.3e-17, 1e-7, hbarOverTau, 0)).toBe(STATE_CLASS.BOUND);
    expect(classifyWidthCode(2.4e-17, 1e-7, hbarOverTau, 0)).toBe(STATE_CLASS.RESONANCE);
    expect(classifyWidthCode(0.99e-7, 1e-7, hbarOverTau, 0)).toBe(STATE_CLASS.RESONANCE);
    expect(classifyWidthCode(1e-7, 1e-7, hbarOverTau, 0)).toBe(STATE_CLASS.UNBOUND);
    expect(classifyWidthCode(Infinity, 1e-7, hbarOverTau, WIDTH_FLAG.DESTROYED)).toBe(STATE_CLASS.UNBOUND);
  });
});

describe('recoil threshold', () => {
  it('Γ = 0 exactly for E⊥ ≤ ε_eff = (shifted binding) − (m + ½)Ω, Γ > 0 above (model.md §4)', () => {
    const out = new Float64Array(2);
    for (const m of [0, 2, 5]) {
      const eps = 40 * OMEGA;
      // shifted binding at E⊥ = ε_eff is found self-consistently: iterate the threshold
      let eEff = eps - (m + 0.5) * OMEGA;
      for (let k = 0; k < 30; k++) {
        stateWidthInto(eps, m, 3, B, eEff, M, out);
        eEff = eps - out[1]! - (m + 0.5) * OMEGA;
      }
      for (const f of [1e-3, 0.5, 0.99, 1 - 1e-9]) {
        const flags = stateWidthInto(eps, m, 3, B, f * eEff, M, out);
        expect(out[0], `m=${m}, E⊥ = ${f}·ε_eff: Γ must be exactly 0`).toBe(0);
        expect(flags & WIDTH_FLAG.CHANNEL_CLOSED, `m=${m} f=${f}`).toBeTruthy();
      }
      stateWidthInto(eps, m, 3, B, 2 * eEff, M, out);
      expect(out[0], `m=${m}, E⊥ = 2ε_eff`).toBeGreaterThan(0);
    }
  });
});

describe('monotonic growth of Γ with E⊥', () => {
  it('Γ(E⊥) is non-decreasing from the recoil threshold to destruction (m = 0…4, p = 3, 5, 8)', () => {
    const out = new Float64Array(2);
    for (const m of [0, 1, 2, 3, 4])
      for (const p of [3, 5, 8]) {
        const eps = 200 * OMEGA;
        let prev = 0;
        for (let k = 0; k <= 400; k++) {
          const ePerp = eps * 0.5 * 10 ** (k / 100); // 0.5 ε … 5000 ε
          const flags = stateWidthInto(eps, m, p, B, ePerp, M, out);
          const g = flags & WIDTH_FLAG.DESTROYED ? Infinity : out[0]!;
          expect(g, `m=${m} p=${p} E⊥/ε=${ePerp / eps}: Γ=${g} < previous ${prev}`).toBeGreaterThanOrEqual(prev);
          prev = g;
        }
        expect(prev, `m=${m} p=${p}: destroyed at the strongest field`).toBe(Infinity);
      }
  });
});

describe('critical energies against plain bisection of Γ(E⊥) (stateWidthInto)', () => {
  /** Smallest E⊥ with Γ ≥ target, by bisection on ln E⊥ over [1e-30, 1] hartree (independent of the solver's brackets). */
  function bisectCritical(eps: number, m: number, p: number, target: number): number {
    const out = new Float64Array(3);
    const reaches = (u: number): boolean => {
      const f = stateWidthInto(eps, m, p, B, Math.exp(u), M, out);
      return (f & WIDTH_FLAG.DESTROYED) !== 0 || out[0]! >= target;
    };
    let lo = Math.log(1e-30);
    let hi = 0;
    if (reaches(lo)) return 0;
    for (let k = 0; k < 200 && hi - lo > 1e-12; k++) {
      const mid = 0.5 * (lo + hi);
      if (reaches(mid)) hi = mid;
      else lo = mid;
    }
    return Math.exp(hi);
  }

  it('E_b and E_u of 300 seeded random states (m = 0…16, p = 2…9, ε = 1…3000 Ω) agree with bisection to 1e-7 relative, and with criticalTransverseEnergy', () => {
    let seed = 7;
    const rnd = (): number => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
    const crit = new Float64Array(2);
    const hbarOverTau = CODATA2018.atomicTimeInSecond;
    for (let k = 0; k < 300; k++) {
      const m = Math.floor(rnd() * 17);
      const p = 2 + 7 * rnd();
      const eps = OMEGA * 10 ** (3.5 * rnd());
      criticalTransverseEnergiesInto(eps, m, p, B, M, hbarOverTau, crit, 0);
      const eu = bisectCritical(eps, m, p, eps);
      const eb = Math.min(bisectCritical(eps, m, p, hbarOverTau), eu);
      const inputs = { m, p, epsOverOmega: eps / OMEGA };
      expectClose(crit[1]!, eu, { rel: 1e-7, inputs, source: 'bisection of Γ(E⊥) = ε' });
      expectClose(crit[0]!, eb, { rel: 1e-7, inputs, source: 'bisection of Γ(E⊥) = ħ/τ' });
      expectClose(criticalTransverseEnergy(eps, m, p, B, M, eps), crit[1]!, { rel: 1e-7, inputs, source: 'same solver, one energy at a time' });
    }
  });
});

describe('thermal ensemble', () => {
  // a state whose bound → resonance → unbound transitions all lie within a few kT
  const m = 2;
  const p = 3;
  const eps = 300 * OMEGA;
  const hbarOverTau = CODATA2018.atomicTimeInSecond; // τ = 1 s
  const eb = criticalTransverseEnergy(eps, m, p, B, M, hbarOverTau);
  const eu = criticalTransverseEnergy(eps, m, p, B, M, eps);

  it('critical energies bracket the classes: bound just below E_b, resonance between, unbound above E_u', () => {
    const out = new Float64Array(2);
    const cls = (e: number) => {
      const flags = stateWidthInto(eps, m, p, B, e, M, out);
      return classifyWidthCode(out[0]!, eps, hbarOverTau, flags);
    };
    expect(eb).toBeLessThan(eu);
    expect(cls(eb * (1 - 1e-6))).toBe(STATE_CLASS.BOUND);
    expect(cls(eb * (1 + 1e-6))).toBe(STATE_CLASS.RESONANCE);
    expect(cls(eu * (1 - 1e-6))).toBe(STATE_CLASS.RESONANCE);
    expect(cls(eu * (1 + 1e-6))).toBe(STATE_CLASS.UNBOUND);
  });

  it('fractions sum to 1 (1e-15, exact identity) and match a direct average over the 2D Maxwell–Boltzmann velocity distribution (2e-3)', () => {
    // 2D Maxwell–Boltzmann: P(v) ∝ exp(−M v²/(2kT)); E⊥ = M v²/2 (F. Reif 1965, §7.10)
    for (const kT of [(eb + eu) / 3, eb, 3 * eu]) {
      const f = new Float64Array(3);
      thermalFractionsInto(eb, eu, kT, OMEGA, f, 0);
      expectClose(f[0]! + f[1]! + f[2]!, 1, { rel: 1e-15, inputs: { kT }, source: 'exact identity' });
      const out = new Float64Array(2);
      const counts = [0, 0, 0, 0];
      let total = 0;
      const n = 700;
      const h = 14 / n; // s = v/√(kT/M) ∈ [−7, 7]
      for (let i = 0; i < n; i++)
        for (let j = 0; j < n; j++) {
          const sx = -7 + (i + 0.5) * h;
          const sy = -7 + (j + 0.5) * h;
          const wgt = Math.exp(-0.5 * (sx * sx + sy * sy));
          const e = 0.5 * kT * (sx * sx + sy * sy);
          const flags = stateWidthInto(eps, m, p, B, e, M, out);
          const c = classifyWidthCode(out[0]!, eps, hbarOverTau, flags);
          counts[c] += wgt;
          total += wgt;
        }
      const direct = [counts[STATE_CLASS.BOUND]! / total, counts[STATE_CLASS.RESONANCE]! / total, counts[STATE_CLASS.UNBOUND]! / total];
      ['bound', 'resonance', 'unbound'].forEach((name, k) =>
        expectClose(f[k]!, direct[k]!, { rel: 0, abs: 2e-3, inputs: { class: name, kT, eb, eu }, source: 'direct 2D Maxwell–Boltzmann average (Reif 1965)' }),
      );
    }
  });

  it('for kT < Ω the quantized ion levels E⊥ = (N + ½)Ω give the fractions (1e-12 against the direct Boltzmann sum)', () => {
    const om = eb / 3.7; // levels N = 0…3 bound, then resonance
    const kT = 0.4 * om;
    const f = new Float64Array(3);
    thermalFractionsInto(eb, eu, kT, om, f, 0);
    const q = Math.exp(-om / kT);
    const direct = [0, 0, 0];
    for (let N = 0; N < 2000; N++) {
      const e = (N + 0.5) * om;
      const w = (1 - q) * q ** N;
      direct[e < eb ? 0 : e < eu ? 1 : 2] += w;
    }
    ['bound', 'resonance', 'unbound'].forEach((name, k) =>
      expectClose(f[k]!, direct[k]!, { rel: 1e-12, abs: 1e-15, inputs: { class: name, kT, om }, source: 'Boltzmann sum over ion Landau levels (Landau & Lifshitz QM §112)' }),
    );
  });
});

describe('motionStates (per-state API)', () => {
  const states = [...ladder(400 * OMEGA, 3.2, 6, 0), ...ladder(60 * OMEGA, 3.2, 3, 1)];

  it('returns width, lifetime ħ/Γ, shift, class and flags consistent with the core (exact identities)', () => {
    const res = motionStates({ fieldAu: B, states, motion: { massNumber: A, transverseEnergyHartree: 2000 * OMEGA } });
    expect(res).toHaveLength(states.length);
    for (const r of res) {
      if (r.widthHartree > 0 && Number.isFinite(r.widthHartree)) {
        expectClose(r.lifetimeSeconds, CODATA2018.atomicTimeInSecond / r.widthHartree, { rel: 1e-15, source: 'exact identity τ = ħ/Γ' });
      }
      expectClose(r.shapeNumber, 3.2, { rel: 1e-12, inputs: { m: r.m, nu: r.nu }, source: 'exact power law input' });
      expect(['bound', 'resonance', 'unbound']).toContain(r.class);
      expect(r.shiftHartree <= 0 || Number.isNaN(r.shiftHartree)).toBe(true);
    }
    expect(new Set(res.map((r) => r.class)).size, 'this setup spans several classes').toBeGreaterThan(1);
  });

  it('with a temperature returns fractions summing to 1 for every state', () => {
    const res = motionStates({ fieldAu: B, states, motion: { massNumber: A, temperatureKelvin: (500 * OMEGA) * CODATA2018.hartreeInKelvin } });
    for (const r of res) {
      const f = r.fractions!;
      expectClose(f.bound + f.resonance + f.unbound, 1, { rel: 1e-14, inputs: { m: r.m, nu: r.nu }, source: 'exact identity' });
    }
  });

  it('bad input throws EngineInputError naming the parameter', () => {
    const bad: [Partial<MotionStatesInput>, string][] = [
      [{ fieldAu: 0 }, 'fieldAu'],
      [{ fieldAu: NaN }, 'fieldAu'],
      [{ states: [{ m: -1, nu: 0, bindingHartree: 1e-7 }] }, 'states.m'],
      [{ states: [{ m: 0, nu: 0.5, bindingHartree: 1e-7 }] }, 'states.nu'],
      [{ states: [{ m: 0, nu: 0, bindingHartree: -1e-7 }] }, 'states.bindingHartree'],
      [{ motion: { massNumber: 400, temperatureKelvin: 1 } }, 'massNumber'],
      [{ motion: { massNumber: 4, transverseEnergyHartree: -1 } }, 'transverseEnergyHartree'],
      [{ motion: { massNumber: 4, temperatureKelvin: 1, observationTimeSeconds: 0 } }, 'observationTimeSeconds'],
    ];
    for (const [patch, parameter] of bad) {
      const input: MotionStatesInput = { fieldAu: B, states, motion: { massNumber: A, temperatureKelvin: 1 }, ...patch };
      let caught: unknown;
      try {
        motionStates(input);
      } catch (e) {
        caught = e;
      }
      expect(caught, JSON.stringify(patch)).toBeInstanceOf(EngineInputError);
      expect((caught as EngineInputError).parameter, JSON.stringify(patch)).toBe(parameter);
    }
  });
});

describe('classifyCells against direct per-point evaluation', () => {
  // 5 × 4 map, m = 0…5, two levels per orbital (ν = 1 missing in some cells)
  const nAlpha = 5;
  const nField = 4;
  const mMax = 5;
  const L = 2;
  const cellCount = nAlpha * nField;
  const fieldsAu = Float64Array.from({ length: nField }, (_, j) => 3e-5 * 3 ** j);
  const bindingHartree = new Float64Array((mMax + 1) * L * cellCount);
  for (let j = 0; j < nField; j++)
    for (let i = 0; i < nAlpha; i++) {
      const c = j * nAlpha + i;
      const b = fieldsAu[j]!;
      for (let m = 0; m <= mMax; m++) {
        const e0 = 1e-3 * b * (1 + i) ** 2 * (2 * m + 1) ** -(2.6 + 0.3 * i);
        bindingHartree[(m * L + 0) * cellCount + c] = e0;
        bindingHartree[(m * L + 1) * cellCount + c] = m <= i - 1 ? e0 / 9 : 0;
      }
    }
  const map: CellBindings = { bindingHartree, cellCount, nAlpha, mMax, levelsPerOrbital: L, fieldsAu };

  for (const motion of [
    { massNumber: 7, transverseEnergyHartree: 1e-8 },
    { massNumber: 7, ionLandauLevel: 40 },
    { massNumber: 7, temperatureKelvin: 0.01 },
  ]) {
    it(`every cell equals motionStates at that point (${Object.keys(motion)[1]}; exact identity)`, () => {
      const settings = validateMotionSettings(motion);
      const out = allocateCellMotionOutput(map, settings);
      classifyCells(map, settings, out);
      for (let c = 0; c < cellCount; c++) {
        const j = Math.floor(c / nAlpha);
        const states: MotionStateInput[] = [];
        for (let m = 0; m <= mMax; m++) for (let nu = 0; nu < L; nu++) states.push({ m, nu, bindingHartree: bindingHartree[(m * L + nu) * cellCount + c]! });
        const direct = motionStates({ fieldAu: fieldsAu[j]!, states, motion: settings });
        let survivors = 0;
        for (const d of direct) {
          const idx = (d.m * L + d.nu) * cellCount + c;
          const code = out.stateClass[idx]!;
          if (d.bindingHartree === 0) {
            expect(code).toBe(STATE_CLASS.NONE);
            continue;
          }
          const name = code === STATE_CLASS.BOUND ? 'bound' : code === STATE_CLASS.RESONANCE ? 'resonance' : 'unbound';
          expect(name, `cell ${c} m=${d.m} ν=${d.nu}`).toBe(d.class);
          expect(out.widthHartree[idx], `cell ${c} m=${d.m} ν=${d.nu}`).toBe(d.widthHartree);
          if (d.class === 'bound') survivors++;
          if (out.fractions) {
            expectClose(out.fractions[3 * idx]!, d.fractions!.bound, { rel: 1e-6, abs: 1e-7, inputs: { c, m: d.m, nu: d.nu }, source: 'exact identity (float32 storage)' });
            expectClose(out.fractions[3 * idx + 2]!, d.fractions!.unbound, { rel: 1e-6, abs: 1e-7, inputs: { c, m: d.m, nu: d.nu }, source: 'exact identity (float32 storage)' });
          }
        }
        expect(out.survivors[c], `cell ${c}`).toBe(survivors);
      }
    });
  }
});
