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
const crit = new Float64Array(2);

/**
 * Classify every state of every cell for the given motion settings (model.md §4):
 * width from the fast table with recoil, class by Γ < ħ/τ → bound, destroyed or
 * Γ ≥ ε → unbound, else resonance; survivors = number of bound states per cell.
 * For a temperature, width and class are at E⊥ = kT and the fractions come from
 * the critical energies E_b, E_u of each state.
 *
 * Cost (measured, shared/bench/motion.bench.ts): see docs/physics/moving-ion.md.
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
