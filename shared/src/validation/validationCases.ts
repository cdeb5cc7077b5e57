/**
 * The engine's validation cases: each compares the engine with a value known independently (an exact
 * solution, an arbitrary-precision oracle, a published limit) and names its source. Used by the tests
 * (src/validation/validationCases.test.ts) and by `fieldbound check`, so both run the same checks.
 *
 * Node-free: the committed oracle files are read by the caller and passed in.
 */
import { orbitalWeakCoupling } from '../levels/orbitalWeakCoupling.js';
import { solveOrbital } from '../levels/solveOrbital.js';
import { weakCouplingCoefficients } from '../levels/weakCouplingCoefficients.js';
import { stateWidthInto, WIDTH_FLAG } from '../motion/stateWidth.js';
import { widthTableInto } from '../motion/widthTable.js';
import { solveBoundStates } from '../solver/solveBoundStates.js';
import { erfc, erfcx } from '../special/erfc.js';
import { expn, expnScaled } from '../special/expint.js';
import { gamma, lnGamma } from '../special/gamma.js';
import { tricomiU2 } from '../special/tricomiU2.js';
import { tricomiU32 } from '../special/tricomiU32.js';

/** Committed mpmath values of the special functions (shared/test/fixtures/special-oracle.json). */
export interface SpecialOracle {
  versions: { mpmath: string; python: string };
  gamma: [number, string][];
  lnGamma: [number, string][];
  erfc: [number, string][];
  erfcx: [number, string][];
  expnScaled: [number, number, string][];
  expn: [number, number, string][];
  tricomiU2: { 'rows [m, x, value]': [number, number, string][] };
  tricomiU32: { 'rows [m, s, value]': [number, number, string][] };
  scaledPotentialDirect: { 'rows [m, zeta, rhoC, value]': [number, number, number, string][] };
}

/** Committed mpmath energies of exactly solvable 1D wells (shared/test/fixtures/exact-1d-oracle.json). */
export interface Exact1dOracle {
  poschl_teller: { lambda: string; levels: { f64: number }[] };
  finite_square_well: { cases: { V0: string; a: string; levels: { f64: number }[] }[] };
}

export interface ValidationData {
  special: SpecialOracle;
  exact1d: Exact1dOracle;
}

/** Tolerance of a comparison: |value − reference| ≤ max(abs, rel·|reference|). */
export interface Tolerance {
  rel: number;
  abs: number;
}

/** The outcome of one case: over all its points, the worst one (largest difference relative to what is allowed). */
export interface ValidationResult {
  id: string;
  title: string;
  source: string;
  /** Number of points compared. */
  points: number;
  /** The worst point: its inputs, the engine's value, the reference value and their difference. */
  worst: { inputs: string; value: number; reference: number; difference: number };
  /** The tolerance at the worst point. */
  tolerance: Tolerance;
  pass: boolean;
  /** Set when the case itself could not run (an exception); the case then fails. */
  error?: string;
}

export interface ValidationPoint {
  inputs: string;
  value: number;
  reference: number;
  tolerance?: Tolerance;
}

export interface ValidationCase {
  id: string;
  title: string;
  source: string;
  tolerance: Tolerance;
  /** The points: engine value and reference value with a description of the inputs (and a tolerance of its own, if it differs). */
  points: (data: ValidationData) => ValidationPoint[];
}

const MPMATH = 'mpmath 1.3.0 (F. Johansson et al.), 50-digit values, shared/test/fixtures/special-oracle.json';
const DLMF = (s: string): string => `F. W. J. Olver et al., NIST Digital Library of Mathematical Functions, ${s} (2010–)`;

function allowed(reference: number, t: Tolerance): number {
  return Math.max(t.abs, t.rel * Math.abs(reference));
}

/** Pöschl–Teller well −λ(λ+1)/(2cosh²x). */
function poschlTeller(lambda: number): (x: number) => number {
  const c = (lambda * (lambda + 1)) / 2;
  return (x) => -c / (Math.cosh(x) * Math.cosh(x));
}

const rel = (r: number, a = 0): Tolerance => ({ rel: r, abs: a });

/** Every case `fieldbound check` and the tests run, in the order printed. */
export const VALIDATION_CASES: readonly ValidationCase[] = [
  {
    id: 'gamma',
    title: 'Gamma function Γ(x), −64.5 ≤ x ≤ 171.5, against mpmath',
    source: `${MPMATH}; ${DLMF('§5')}`,
    tolerance: rel(1e-14),
    points: (d) => d.special.gamma.map(([x, v]) => ({ inputs: `x=${x}`, value: gamma(x), reference: Number(v) })),
  },
  {
    id: 'ln-gamma',
    title: 'ln|Γ(x)| against mpmath (absolute where |ln Γ| < 1)',
    source: `${MPMATH}; ${DLMF('§5')}`,
    tolerance: rel(1e-14, 1e-14),
    points: (d) => d.special.lnGamma.map(([x, v]) => ({ inputs: `x=${x}`, value: lnGamma(x), reference: Number(v) })),
  },
  {
    id: 'erfc',
    title: 'Complementary error function erfc(x), −6 ≤ x ≤ 26.5, against mpmath',
    source: `${MPMATH}; ${DLMF('§7')}`,
    tolerance: rel(1e-14),
    points: (d) => d.special.erfc.map(([x, v]) => ({ inputs: `x=${x}`, value: erfc(x), reference: Number(v) })),
  },
  {
    id: 'erfcx',
    title: 'Scaled complementary error function e^(x²) erfc(x) against mpmath',
    source: `${MPMATH}; ${DLMF('§7')}`,
    tolerance: rel(1e-14),
    points: (d) => d.special.erfcx.map(([x, v]) => ({ inputs: `x=${x}`, value: erfcx(x), reference: Number(v) })),
  },
  {
    id: 'expn-scaled',
    title: 'Scaled exponential integral e^x E_n(x), n = 0…65, 1e-30 ≤ x ≤ 1e30, against mpmath',
    source: `${MPMATH}; ${DLMF('§8.19')}`,
    tolerance: rel(1e-14),
    points: (d) => d.special.expnScaled.map(([n, x, v]) => ({ inputs: `n=${n} x=${x}`, value: expnScaled(n, x), reference: Number(v) })),
  },
  {
    id: 'expn',
    title: 'Exponential integral E_n(x), 1e-10 ≤ x ≤ 700, against mpmath',
    source: `${MPMATH}; ${DLMF('§8.19')}`,
    tolerance: rel(1e-14),
    points: (d) => d.special.expn.map(([n, x, v]) => ({ inputs: `n=${n} x=${x}`, value: expn(n, x), reference: Number(v) })),
  },
  {
    id: 'tricomi-u2',
    title: 'Tricomi U(2, 2−m, x), m = 0…64, 1e-30 ≤ x ≤ 1e30 (the orbital average of the tail), against mpmath hyperu',
    source: `${MPMATH}; ${DLMF('§13')}`,
    tolerance: rel(1e-14),
    points: (d) => d.special.tricomiU2['rows [m, x, value]'].map(([m, x, v]) => ({ inputs: `m=${m} x=${x}`, value: tricomiU2(m, x), reference: Number(v) })),
  },
  {
    id: 'tricomi-u32',
    title: 'Tricomi U(3/2, 3/2−m, s), m = 0…64, 1e-30 ≤ s ≤ 1e30 (the weak-coupling integral), against mpmath hyperu',
    source: `${MPMATH}; ${DLMF('§13')}`,
    tolerance: rel(1e-14),
    points: (d) => d.special.tricomiU32['rows [m, s, value]'].map(([m, s, v]) => ({ inputs: `m=${m} s=${s}`, value: tricomiU32(m, s), reference: Number(v) })),
  },
  {
    id: 'poschl-teller',
    title: 'Bound states of the Pöschl–Teller well −λ(λ+1)/(2cosh²x): ε_n = (λ−n)²/2 (λ = 0.3…12.9 and the mpmath levels at λ = 2.5)',
    source: 'G. Pöschl, E. Teller, Z. Phys. 83, 143 (1933); L. D. Landau, E. M. Lifshitz, Quantum Mechanics §23; exact-1d-oracle.json (mpmath 1.3.0)',
    tolerance: rel(1e-10),
    points: (d) => {
      const out: { inputs: string; value: number; reference: number }[] = [];
      const pt = d.exact1d.poschl_teller;
      const lam = Number(pt.lambda);
      const r = solveBoundStates(poschlTeller(lam), { scale: 0.5 });
      pt.levels.forEach((lv, n) => out.push({ inputs: `λ=${lam} n=${n} (mpmath)`, value: r.states[n]?.epsilon ?? NaN, reference: -lv.f64 }));
      for (const lambda of [0.3, 1.7, 4.2, 7.5, 12.9]) {
        const s = solveBoundStates(poschlTeller(lambda), { scale: 0.5 });
        for (let n = 0; n < Math.ceil(lambda); n++) out.push({ inputs: `λ=${lambda} n=${n}`, value: s.states[n]?.epsilon ?? NaN, reference: (lambda - n) ** 2 / 2 });
      }
      return out;
    },
  },
  {
    id: 'square-well',
    title: 'Bound states of the finite square well −V0 on |x| < a against the mpmath roots of the textbook equations',
    source: 'L. D. Landau, E. M. Lifshitz, Quantum Mechanics §22 (k tan ka = κ, −k cot ka = κ); exact-1d-oracle.json (mpmath 1.3.0)',
    tolerance: rel(1e-10),
    points: (d) =>
      d.exact1d.finite_square_well.cases.flatMap((c) => {
        const V0 = Number(c.V0);
        const a = Number(c.a);
        const r = solveBoundStates((x) => (Math.abs(x) < a ? -V0 : 0), { scale: a / 2, breakpoints: [a] });
        return c.levels.map((lv, n) => ({ inputs: `V0=${V0} a=${a} n=${n}`, value: r.states[n]?.epsilon ?? NaN, reference: -lv.f64 }));
      }),
  },
  {
    id: 'weak-coupling-coefficients',
    title: 'Weak-coupling coefficients of w = −sech²x by quadrature: W1 = −2, D2 = 4, M2 = −π²/6 (closed forms)',
    source: 'B. Simon, Ann. Phys. 97, 279 (1976) (weak-coupling series); closed forms from the Pöschl–Teller spectrum (Landau & Lifshitz QM §23)',
    tolerance: rel(1e-12),
    points: () => {
      const c = weakCouplingCoefficients((x) => -1 / Math.cosh(x) ** 2, 0.5);
      return [
        { inputs: 'W1', value: c.W1, reference: -2 },
        { inputs: 'D2', value: c.D2, reference: 4 },
        { inputs: 'M2', value: c.M2, reference: -(Math.PI ** 2) / 6 },
      ];
    },
  },
  {
    id: 'weak-coupling-limit',
    title: 'Weak-coupling limit of the field-induced states: κ = √(2ε) of the solver against the 2nd-order series (λ = αB = 1e-4)',
    source: 'B. Simon, Ann. Phys. 97, 279 (1976); J. E. Avron, I. W. Herbst, B. Simon, Commun. Math. Phys. 79, 529 (1981)',
    tolerance: rel(1e-6),
    points: () =>
      (
        [
          [0, 0.1],
          [1, 0.1],
          [3, 0.5],
        ] as const
      ).map(([m, rhoC]) => {
        const lambda = 1e-4;
        const eps = solveOrbital(m, lambda, rhoC, { nuMax: 0 }).levels[0]!.epsilon;
        return { inputs: `m=${m} ρ_c=${rhoC} λ=${lambda}`, value: Math.sqrt(2 * eps), reference: orbitalWeakCoupling(m, lambda, rhoC, 2).kappa };
      }),
  },
  {
    id: 'golden-rule-width',
    title: 'Width of an m = 0 state of a moving ion at large ξ: ln Γ against the golden rule 2√2 ε_s e^(−ξ_s²) at the Stark-shifted energy (|Δ ln Γ| ≤ 1/ξ²)',
    source: 'Yu. N. Demkov, V. N. Ostrovskii, Zero-Range Potentials and Their Applications in Atomic Physics (Plenum, 1988); model.md §4',
    tolerance: { rel: 0, abs: 1 / 25 },
    points: () => {
      const out = new Float64Array(2);
      return [5.1, 6.3, 8.7, 10.2].map((xi) => {
        widthTableInto(0, 9, xi, out);
        const es = -out[1]!;
        const xs = es * xi;
        const asym = Math.log(2 * Math.SQRT2 * es) - xs * xs;
        return { inputs: `m=0 p=9 ξ=${xi}`, value: out[0]!, reference: asym, tolerance: { rel: 0, abs: 1 / (xi * xi) } };
      });
    },
  },
  {
    id: 'recoil-threshold',
    title: 'Moving ion below the recoil threshold (E⊥ < ε_eff): the decay channel is closed, Γ = 0 exactly',
    source: 'J. E. Avron, I. W. Herbst, B. Simon, Ann. Phys. 114, 431 (1978) (charged system in a magnetic field: the transverse channel opens only above threshold); model.md §4',
    tolerance: rel(0, 0),
    points: () => {
      const out = new Float64Array(3);
      const B = 1e-4;
      const M = 133 * 1822.888486209;
      return [0.1, 0.5, 0.9, 0.99].map((f) => {
        const eps = 1e-7;
        const bits = stateWidthInto(eps, 0, 5, B, f * (eps - 0.5 * (B / M)), M, out);
        return { inputs: `E⊥ = ${f}·(ε − Ω/2), ε = 1e-7, B = 1e-4 a.u., A = 133${bits & WIDTH_FLAG.CHANNEL_CLOSED ? '' : ' (channel not closed!)'}`, value: out[0]!, reference: 0 };
      });
    },
  },
];

/**
 * Runs one case and reports its worst point. Never throws: an exception inside the case is a failure
 * with `error` set.
 */
export function runValidationCase(c: ValidationCase, data: ValidationData): ValidationResult {
  const base = { id: c.id, title: c.title, source: c.source, tolerance: c.tolerance };
  try {
    const pts = c.points(data);
    let worst = { inputs: '(no points)', value: NaN, reference: NaN, difference: NaN };
    let worstTol = c.tolerance;
    let worstRatio = -1;
    let pass = pts.length > 0;
    for (const p of pts) {
      const tol = p.tolerance ?? c.tolerance;
      const difference = Math.abs(p.value - p.reference);
      const lim = allowed(p.reference, tol);
      const ok = p.value === p.reference || difference <= lim;
      if (!ok) pass = false;
      const ratio = p.value === p.reference ? 0 : Number.isNaN(difference) ? Infinity : lim > 0 ? difference / lim : Infinity;
      if (ratio > worstRatio) {
        worstRatio = ratio;
        worst = { inputs: p.inputs, value: p.value, reference: p.reference, difference };
        worstTol = tol;
      }
    }
    return { ...base, points: pts.length, worst, tolerance: worstTol, pass };
  } catch (e) {
    return { ...base, points: 0, worst: { inputs: '(not run)', value: NaN, reference: NaN, difference: NaN }, pass: false, error: (e as Error).message };
  }
}

/** Runs every case in order. */
export function runValidation(data: ValidationData): ValidationResult[] {
  return VALIDATION_CASES.map((c) => runValidationCase(c, data));
}
