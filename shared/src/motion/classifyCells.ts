/**
 * Vectorised moving-ion classification of a whole binding map (allocation-free
 * inner loop). Same grid and state layout as `BindingMapResult`:
 * state (m, ν) of cell c at `(m · levelsPerOrbital + ν) · cellCount + c`,
 * cell c = j · nAlpha + i in row j of field `fieldsAu[j]`.
 */
import { STATE_CLASS } from '../map/mapTypes.js';
import { classifyWidthCode } from './classifyWidth.js';
import { localShapeNumberStrided } from './localShapeNumber.js';
import { transverseEnergyAt, type MotionSettings } from './motionSettings.js';
import { stateWidthCore, WIDTH_FLAG } from './stateWidth.js';
import { criticalTransverseEnergiesInto, thermalFractionsInto } from './thermalEnsemble.js';
import { WIDTH_TABLE_INTERNALS } from './widthTable.js';

// module-local copies (the fused loop reads them per state; no import bindings in the hot path)
const SC_BOUND = STATE_CLASS.BOUND;
const SC_RESONANCE = STATE_CLASS.RESONANCE;
const SC_UNBOUND = STATE_CLASS.UNBOUND;
const F_NON_ADIABATIC = WIDTH_FLAG.NON_ADIABATIC;
const F_DESTROYED = WIDTH_FLAG.DESTROYED;
const F_CHANNEL_CLOSED = WIDTH_FLAG.CHANNEL_CLOSED;
const {
  G: T_G,
  EE: T_EE,
  BB: T_BB,
  M_START: T_M_START,
  INV_P: T_INV_P,
  P_NODES: T_P_NODES,
  SWITCH: T_SWITCH,
  XI: T_XI,
  P_LOOKUP: T_P_LOOKUP,
  NM: T_NM,
  NX: T_NX,
  NB: T_NB,
  BINS_PER_UNIT: T_BINS_PER_UNIT,
  P_MIN: T_P_MIN,
  P_MAX: T_P_MAX,
  XI_MIN: T_XI_MIN,
  XI_MAX: T_XI_MAX,
  XI_SPLIT: T_XI_SPLIT,
  FINE_STEP: T_FINE_STEP,
  COARSE_STEP: T_COARSE_STEP,
  FINE_COUNT: T_FINE_COUNT,
} = WIDTH_TABLE_INTERNALS;

/** widthTable.ts's ξ index (same arithmetic). */
function xiIndex(xi: number): number {
  let ix = xi <= T_XI_SPLIT ? Math.floor((xi - T_XI_MIN) / T_FINE_STEP) : T_FINE_COUNT - 1 + Math.floor((xi - T_XI_SPLIT) / T_COARSE_STEP);
  if (ix > T_NX - 2) ix = T_NX - 2;
  if (ix < 0) ix = 0;
  return ix;
}

/** Binding energies of a map (the fields of `BindingMapResult` this needs). */
export interface CellBindings {
  /** ε in hartree per state; 0 where the state does not exist. */
  bindingHartree: Float64Array;
  cellCount: number;
  nAlpha: number;
  mMax: number;
  levelsPerOrbital: number;
  /** B (a.u.) per row. */
  fieldsAu: Float64Array;
  /**
   * Optional: levels per orbital and cell (`m · cellCount + c`), as in BindingMapResult. With it the
   * loop reads only levels ν < count (every state with ε > 0 is among them: the levels are stored from
   * the deepest, and those below the floor are stored as 0 and not counted).
   */
  counts?: Uint16Array;
}

/** Output buffers of {@link classifyCells} (reusable across calls). */
export interface CellMotionOutput {
  /** STATE_CLASS code per state (NONE where there is no state). */
  stateClass: Uint8Array;
  /** Γ in hartree per state (0 = bound without decay channel; +Infinity = destroyed; NaN = no state). */
  widthHartree: Float64Array;
  /** WIDTH_FLAG bits per state. */
  flags: Uint8Array;
  /** Number of bound states per cell. */
  survivors: Uint16Array;
  /** With a temperature: fractions bound/resonance/unbound at 3·state + k; else null. */
  fractions: Float32Array | null;
}

/** Allocate output buffers for a map (fractions only for the thermal mode). */
export function allocateCellMotionOutput(map: CellBindings, settings: MotionSettings): CellMotionOutput {
  const n = map.bindingHartree.length;
  return {
    stateClass: new Uint8Array(n),
    widthHartree: new Float64Array(n),
    flags: new Uint8Array(n),
    survivors: new Uint16Array(map.cellCount),
    fractions: settings.mode === 'thermal' ? new Float32Array(3 * n) : null,
  };
}

const w = new Float64Array(3);
const pairOffA = new Int32Array(4);
const pairOffB = new Int32Array(4);
const pairInv = new Float64Array(4);
const crit = new Float64Array(2);

/**
 * Classify every state of every cell for the given motion settings (model.md §4):
 * width from the fast table with recoil, class by Γ < ħ/τ → bound, destroyed or
 * Γ ≥ ε → unbound, else resonance; survivors = number of bound states per cell.
 * For a temperature, width and class are at E⊥ = kT and the fractions come from
 * the critical energies E_b, E_u of each state.
 *
 * Cost (measured, shared/bench/motion.bench.ts): see docs/physics/moving-ion.md.
 * One fused loop (table lookups, recoil and class inlined; same arithmetic step for step as
 * stateWidthCore + classifyWidthCode, checked bit for bit by classifyCells.test.ts against
 * {@link classifyCellsPerState}); states it does not cover take the per-state functions.
 * Binding energies are not recomputed: changing the motion settings or τ only
 * reruns this.
 *
 * @example
 * const out = allocateCellMotionOutput(map, settings);
 * classifyCells(map, settings, out); // out.stateClass, out.survivors, …
 */
export function classifyCells(map: CellBindings, settings: MotionSettings, out: CellMotionOutput): void {
  const { bindingHartree: eps, cellCount, nAlpha, mMax, levelsPerOrbital: L, fieldsAu } = map;
  const nField = fieldsAu.length;
  const M = settings.ionMass;
  const thermal = settings.mode === 'thermal';
  const hbarOverTau = settings.hbarOverTau;
  const stride = L * cellCount;
  const fr = out.fractions;
  out.survivors.fill(0);
  // defaults for every slot without a state (most slots of a real map: all levels of all orbitals
  // are stored), written in bulk; the loop below only touches the states that exist
  out.stateClass.fill(STATE_CLASS.NONE);
  out.widthHartree.fill(NaN);
  out.flags.fill(WIDTH_FLAG.NO_STATE);
  if (fr) {
    fr.fill(0);
    for (let k = 2; k < fr.length; k += 3) fr[k] = 1;
  }
  // per-row quantities
  const rowSqrtB = new Float64Array(nField);
  const rowF = new Float64Array(nField);
  const rowEPerp = new Float64Array(nField);
  for (let j = 0; j < nField; j++) {
    const B = fieldsAu[j]!;
    const ePerp = thermal ? settings.kT : transverseEnergyAt(settings, B);
    rowEPerp[j] = ePerp;
    rowSqrtB[j] = Math.sqrt(B);
    rowF[j] = B * Math.sqrt((2 * ePerp) / M);
  }
  const counts = map.counts && map.counts.length === (mMax + 1) * cellCount ? map.counts : null;
  const stateClass = out.stateClass;
  const widthOut = out.widthHartree;
  const flagsOut = out.flags;
  const survivors = out.survivors;
  for (let m = 0; m <= mMax; m++) {
    // the fused path needs the pair (m, m + 2) for p and m inside the table; other states take the per-state path
    const fastM = m < T_NM && m < 256;
    // localShapeNumberStrided's pairs in its order, (m, m + 2), (m − 1, m + 1), (m, m + 1), (m − 1, m),
    // those inside 0…mMax: offsets of both orbitals from the state and 1/ln((2k+1)/(2j+1))
    let nPairs = 0;
    for (const [jj, kk] of [[m, m + 2], [m - 1, m + 1], [m, m + 1], [m - 1, m]] as const) {
      if (jj < 0 || kk > mMax) continue;
      pairOffA[nPairs] = (jj - m) * stride;
      pairOffB[nPairs] = (kk - m) * stride;
      pairInv[nPairs] = kk - jj === 1 ? 1 / Math.log((2 * jj + 3) / (2 * jj + 1)) : 1 / Math.log((2 * jj + 5) / (2 * jj + 1));
      nPairs++;
    }
    const lookupBase = m * T_NB;
    const lastCol = fastM ? T_M_START[m + 1]! - 2 : 0;
    const adiabaticFactor = 2 * (m + 1);
    const mHalf = m + 0.5;
    const countBase = m * cellCount;
    for (let j = 0; j < nField; j++) {
      const B = fieldsAu[j]!;
      const omega = B / M;
      const sqrtB = rowSqrtB[j]!;
      const F = rowF[j]!;
      const ePerp = rowEPerp[j]!;
      const adiabaticLimit = adiabaticFactor * omega;
      const shiftOmega = mHalf * omega;
      const rowFast = fastM && F > 0;
      const c0 = j * nAlpha;
      const c1 = c0 + nAlpha;
      for (let c = c0; c < c1; c++) {
        const nMax = counts !== null ? Math.min(counts[countBase + c]!, L) : L;
        for (let nu = 0; nu < nMax; nu++) {
          const idx = (m * L + nu) * cellCount + c;
          const e = eps[idx]!;
          if (!(e > 0)) continue;
          // local shape number: the first usable pair, as localShapeNumberStrided picks it; p outside the table → per-state path
          let p = NaN;
          if (rowFast && e !== Infinity) {
            for (let t = 0; t < nPairs; t++) {
              const pa = eps[idx + pairOffA[t]!]!;
              const pb = eps[idx + pairOffB[t]!]!;
              if (pa > 0 && pb > 0) {
                const q = Math.log(pa / pb) * pairInv[t]!;
                if (q > 0) {
                  if (q >= T_P_MIN - 1e-9 && q <= T_P_MAX + 1e-9) p = q;
                  break;
                }
              }
            }
          }
          if (p !== p) {
            classifyStateSlow(eps, idx, nu * cellCount + c, stride, mMax, m, c, e, B, sqrtB, F, ePerp, omega, M, hbarOverTau, settings.kT, out);
            continue;
          }
          // stateWidthCore with tablePBracket / tableEnergyRatio / recoilStretch / tableLnWidth inlined, step for step
          let flags = e < adiabaticLimit ? F_NON_ADIABATIC : 0;
          const xi = (e * sqrtB) / F;
          let g: number;
          if (!(xi >= T_XI_MIN) && (e - shiftOmega) / ePerp <= 0) {
            // below the table with a ≤ 0 (no Stark shift there: E_r is NaN): the recoil stretch is ≤ 1, so
            // ξ_eff ≤ ξ is below the table too and the state is destroyed; the same result without the lookups
            g = Infinity;
            flags |= F_DESTROYED;
          } else {
            let k = ((p - T_P_MIN) * T_BINS_PER_UNIT) | 0;
            if (k < 0) k = 0;
            else if (k > T_NB - 1) k = T_NB - 1;
            let col = T_P_LOOKUP[lookupBase + k]!;
            while (col < lastCol && T_P_NODES[col + 1]! <= p) col++;
            let wp = (1 / p - T_INV_P[col]!) / (T_INV_P[col + 1]! - T_INV_P[col]!);
            let b0: number;
            let b1: number;
            if (T_SWITCH[col] === 1) {
              if (wp >= 0.5) col++;
              b0 = col * T_NX;
              b1 = b0;
              wp = 0;
            } else {
              if (wp < 0) wp = 0;
              b0 = col * T_NX;
              b1 = b0 + T_NX;
            }
            const wq = 1 - wp;
            let er: number;
            if (!(xi >= T_XI_MIN)) er = NaN;
            else if (xi > T_XI_MAX) {
              const e1 = wq * T_EE[b0 + T_NX - 1]! + wp * T_EE[b1 + T_NX - 1]!;
              const r = T_XI_MAX / xi;
              er = -1 + (e1 + 1) * r * r;
            } else {
              const ix = xiIndex(xi);
              const x0 = T_XI[ix]!;
              const wx = (xi - x0) / (T_XI[ix + 1]! - x0);
              er = wq * ((1 - wx) * T_EE[b0 + ix]! + wx * T_EE[b0 + ix + 1]!) + wp * ((1 - wx) * T_EE[b1 + ix]! + wx * T_EE[b1 + ix + 1]!);
            }
            const bindingShifted = er === er ? -er * e : e;
            const a = (bindingShifted - shiftOmega) / ePerp;
            if (a >= 1) {
              g = 0;
              flags |= F_CHANNEL_CLOSED;
            } else if (a < 1) {
              const ratio = Math.abs(a) < 1e-3 ? 1 + a * (2 / 3 + a * (0.5 + a * 0.4)) : (2 * (-Math.log1p(-a) / a - 1)) / a;
              const xe = xi * Math.sqrt(ratio);
              let y: number;
              if (!(xe >= T_XI_MIN)) y = NaN;
              else if (xe > T_XI_MAX) {
                const g1 = wq * T_G[b0 + T_NX - 1]! + wp * T_G[b1 + T_NX - 1]!;
                const bs = wq * T_BB[col]! + wp * T_BB[col + 1]!;
                y = g1 - xe * xe + bs * Math.log(xe / T_XI_MAX);
              } else {
                const ix = xiIndex(xe);
                const x0 = T_XI[ix]!;
                const wx = (xe - x0) / (T_XI[ix + 1]! - x0);
                y = wq * ((1 - wx) * T_G[b0 + ix]! + wx * T_G[b0 + ix + 1]!) + wp * ((1 - wx) * T_G[b1 + ix]! + wx * T_G[b1 + ix + 1]!) - xe * xe;
              }
              if (y !== y) {
                g = Infinity;
                flags |= F_DESTROYED;
              } else g = e * Math.exp(y);
            } else {
              classifyStateSlow(eps, idx, nu * cellCount + c, stride, mMax, m, c, e, B, sqrtB, F, ePerp, omega, M, hbarOverTau, settings.kT, out);
              continue;
            }
          }
          const code = g < hbarOverTau ? SC_BOUND : flags & F_DESTROYED || !(g < e) ? SC_UNBOUND : SC_RESONANCE;
          stateClass[idx] = code;
          widthOut[idx] = g;
          flagsOut[idx] = flags;
          if (code === SC_BOUND) survivors[c]++;
          if (fr) {
            criticalTransverseEnergiesInto(e, m, p, B, M, hbarOverTau, crit, 0);
            thermalFractionsInto(crit[0]!, crit[1]!, settings.kT, omega, fr, 3 * idx);
          }
        }
      }
    }
  }
}

/** One state the fused loop does not cover (p from another pair or missing, m beyond the table, F = 0, …): the per-state functions. */
function classifyStateSlow(
  eps: Float64Array,
  idx: number,
  offset: number,
  stride: number,
  mMax: number,
  m: number,
  c: number,
  e: number,
  B: number,
  sqrtB: number,
  F: number,
  ePerp: number,
  omega: number,
  M: number,
  hbarOverTau: number,
  kT: number,
  out: CellMotionOutput,
): void {
  const p = localShapeNumberStrided(eps, offset, stride, mMax, m);
  const bits = stateWidthCore(e, m, p, sqrtB, F, ePerp, omega, w);
  const g = w[0]!;
  const code = classifyWidthCode(g, e, hbarOverTau, bits);
  out.stateClass[idx] = code;
  out.widthHartree[idx] = g;
  out.flags[idx] = bits;
  if (code === SC_BOUND) out.survivors[c]!++;
  if (out.fractions) {
    criticalTransverseEnergiesInto(e, m, p, B, M, hbarOverTau, crit, 0);
    thermalFractionsInto(crit[0]!, crit[1]!, kT, omega, out.fractions, 3 * idx);
  }
}

/** The per-state reference of {@link classifyCells} (one function call chain per state; for tests). */
export function classifyCellsPerState(map: CellBindings, settings: MotionSettings, out: CellMotionOutput): void {
  const { bindingHartree: eps, cellCount, nAlpha, mMax, levelsPerOrbital: L, fieldsAu } = map;
  const nField = fieldsAu.length;
  const M = settings.ionMass;
  const thermal = settings.mode === 'thermal';
  const hbarOverTau = settings.hbarOverTau;
  const stride = L * cellCount;
  const fr = out.fractions;
  out.survivors.fill(0);
  out.stateClass.fill(STATE_CLASS.NONE);
  out.widthHartree.fill(NaN);
  out.flags.fill(WIDTH_FLAG.NO_STATE);
  if (fr) {
    fr.fill(0);
    for (let k = 2; k < fr.length; k += 3) fr[k] = 1;
  }
  const rowSqrtB = new Float64Array(nField);
  const rowF = new Float64Array(nField);
  const rowEPerp = new Float64Array(nField);
  for (let j = 0; j < nField; j++) {
    const B = fieldsAu[j]!;
    const ePerp = thermal ? settings.kT : transverseEnergyAt(settings, B);
    rowEPerp[j] = ePerp;
    rowSqrtB[j] = Math.sqrt(B);
    rowF[j] = B * Math.sqrt((2 * ePerp) / M);
  }
  const counts = map.counts && map.counts.length === (mMax + 1) * cellCount ? map.counts : null;
  for (let m = 0; m <= mMax; m++) {
    for (let j = 0; j < nField; j++) {
      const B = fieldsAu[j]!;
      const omega = B / M;
      const sqrtB = rowSqrtB[j]!;
      const F = rowF[j]!;
      const ePerp = rowEPerp[j]!;
      const c0 = j * nAlpha;
      const c1 = c0 + nAlpha;
      for (let c = c0; c < c1; c++) {
        const nMax = counts ? Math.min(counts[m * cellCount + c]!, L) : L;
        for (let nu = 0; nu < nMax; nu++) {
          const idx = (m * L + nu) * cellCount + c;
          const e = eps[idx]!;
          if (!(e > 0)) continue;
          const p = localShapeNumberStrided(eps, nu * cellCount + c, stride, mMax, m);
          const bits = stateWidthCore(e, m, p, sqrtB, F, ePerp, omega, w);
          const g = w[0]!;
          const code = classifyWidthCode(g, e, hbarOverTau, bits);
          out.stateClass[idx] = code;
          out.widthHartree[idx] = g;
          out.flags[idx] = bits;
          if (code === STATE_CLASS.BOUND) out.survivors[c]++;
          if (fr) {
            criticalTransverseEnergiesInto(e, m, p, B, M, hbarOverTau, crit, 0);
            thermalFractionsInto(crit[0]!, crit[1]!, settings.kT, omega, fr, 3 * idx);
          }
        }
      }
    }
  }
}
