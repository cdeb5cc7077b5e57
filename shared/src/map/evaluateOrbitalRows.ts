import { scaledPotential } from '../potential/scaledPotential.js';
import { clenshaw } from './chebyshev.js';
import { orbitalCellFlags } from './cellFlags.js';
import { CUTOFF_DOMINATED_RATIO, NON_ADIABATIC_RATIO } from '../levels/levelFlags.js';
import { MAP_FLAG } from './mapTypes.js';
import { directOrbital } from './directOrbital.js';
import type { OrbitalModel, SurfaceModel } from './orbitalModel.js';

/** Where the values of a block of rows go, and the map's constants. */
export interface RowBlockTarget {
  alphas: Float64Array;
  fieldsAu: Float64Array;
  cutoffBohr: number;
  floorHartree: number;
  /** Relative accuracy every stored value must reach. */
  tolerance: number;
  /** Levels per orbital of the layout (the map's `levelsPerOrbital`). */
  levelsPerOrbital: number;
  /** Map rows to fill, [rowStart, rowEnd). */
  rowStart: number;
  rowEnd: number;
  /** First map row and number of rows of the arrays below (a window of the map). */
  arrayRowStart: number;
  arrayRows: number;
  bindingHartree: Float64Array;
  counts: Uint16Array;
  flags: Uint8Array;
}

/** Smallest scaled binding the direct solver resolves without a floor: 1e-26 of the depth (solver default). */
const RESOLVE_FRACTION = 1e-26;
/** Accept an interpolated value when its estimated error is below this fraction of the tolerance. */
const SAFETY = 0.5;

function yOf(s: number, sA: number, sB: number): number {
  return sB === sA ? 0 : (2 * (s - sA)) / (sB - sA) - 1;
}

/** Row coefficient vector a_i(y) = Σ_k c[i][k] T_k(y) of a surface, i = 0…degU. */
function rowCoefficients(sf: SurfaceModel, y: number, out: Float64Array): void {
  const W = sf.degS + 1;
  for (let i = 0; i <= sf.degU; i++) out[i] = clenshaw(sf.coef, sf.degS, i * W, 1, y);
}

/** Flag bits as plain numbers (read once: the hot loop below should not touch module bindings). */
const FLAG_CUTOFF = MAP_FLAG.CUTOFF_DOMINATED;
const FLAG_NON_ADIABATIC = MAP_FLAG.NON_ADIABATIC;
const FLAG_BELOW_FLOOR = MAP_FLAG.BELOW_FLOOR;
const RATIO_CUTOFF = CUTOFF_DOMINATED_RATIO;
const RATIO_NON_ADIABATIC = NON_ADIABATIC_RATIO;

/** Per-column data of an orbital's ground surface over one α axis: ln α and T_p(ξ_i), p = 0…degU. */
interface ColumnTable {
  alphas: Float64Array;
  lnAlpha: Float64Array;
  tmat: Float64Array;
}
/** Column tables by model (a map is filled in chunks of rows: the table is made once per model and α axis). */
const COLUMN_TABLES = new WeakMap<OrbitalModel, ColumnTable>();

function columnTable(model: OrbitalModel, alphas: Float64Array): ColumnTable {
  const cached = COLUMN_TABLES.get(model);
  if (cached !== undefined && cached.alphas === alphas) return cached;
  const gs = model.ground.surfaces[0];
  const nA = alphas.length;
  const UG = gs.degU;
  const lnAlpha = new Float64Array(nA);
  for (let i = 0; i < nA; i++) lnAlpha[i] = Math.log(alphas[i]);
  const tmat = new Float64Array(nA * (UG + 1));
  for (let i = 0; i < nA; i++) {
    const xi = Math.min(1, Math.max(-1, (2 * (lnAlpha[i] - gs.uA)) / (gs.uB - gs.uA) - 1));
    let t0 = 1;
    let t1 = xi;
    tmat[i * (UG + 1)] = 1;
    if (UG >= 1) tmat[i * (UG + 1) + 1] = xi;
    for (let p = 2; p <= UG; p++) {
      const t2 = 2 * xi * t1 - t0;
      tmat[i * (UG + 1) + p] = t2;
      t0 = t1;
      t1 = t2;
    }
  }
  const table = { alphas, lnAlpha, tmat };
  COLUMN_TABLES.set(model, table);
  return table;
}

/**
 * Ground-state G of rows r…r+3 (coefficient vectors a0…a3, some may repeat) at every column: four
 * independent sums per column share each T_p(ξ_i) load (the products are the same as one row at a
 * time, term by term, so the result does not depend on the blocking).
 */
function groundRows4(
  tmat: Float64Array,
  W: number,
  nA: number,
  a0: Float64Array,
  a1: Float64Array,
  a2: Float64Array,
  a3: Float64Array,
  out: Float64Array,
  o0: number,
  o1: number,
  o2: number,
  o3: number,
): void {
  for (let i = 0; i < nA; i++) {
    const o = i * W;
    let g0 = 0;
    let g1 = 0;
    let g2 = 0;
    let g3 = 0;
    for (let p = 0; p < W; p++) {
      const tv = tmat[o + p];
      g0 += tv * a0[p];
      g1 += tv * a1[p];
      g2 += tv * a2[p];
      g3 += tv * a3[p];
    }
    out[o0 + i] = g0;
    out[o1 + i] = g1;
    out[o2 + i] = g2;
    out[o3 + i] = g3;
  }
}

/**
 * Fills the rows [rowStart, rowEnd) of orbital m from its interpolation model (the target arrays
 * must be zero where nothing is written: unbound levels are left at 0): per level, the
 * interpolated G gives ε = B·exp(G + 2u); cells whose estimated error (surface error + threshold
 * uncertainty 2δλ_c/(λ − λ_c)) exceeds half the tolerance, or whose existence near a threshold is
 * uncertain, are solved directly (`directOrbital`, the numbers of `levels`) and flagged DIRECT_SOLVE.
 * Values below the floor (or below the direct solver's resolution when there is no floor) are stored
 * as 0 and flagged BELOW_FLOOR. Returns the largest estimated relative error stored and the number
 * of direct solves.
 */
export function evaluateOrbitalRows(model: OrbitalModel, t: RowBlockTarget): { maxRelError: number; directSolves: number } {
  const m = model.m;
  const nA = t.alphas.length;
  const L = t.levelsPerOrbital;
  const blockCells = t.arrayRows * nA;
  const tol = t.tolerance;
  const floor = t.floorHartree;
  let maxRelError = 0;
  let directSolves = 0;
  const ground = model.ground;
  const exc = model.excited;
  // Ground state: one surface in (ln α, ln B) — its u-coordinate ξ depends on the column only, so
  // T_p(ξ_i) is tabulated once and each row is a small matrix–vector product.
  if (ground.surfaces.length !== 1 || ground.surfaces[0].shA !== 1 || ground.surfaces[0].shB !== 1) {
    throw new Error('evaluateOrbitalRows: the ground state must be one surface in (ln α, ln B)');
  }
  const gs = ground.surfaces[0];
  const UG = gs.degU;
  const { lnAlpha, tmat } = columnTable(model, t.alphas);
  // G of the ground state for every row of the block, four rows at a time
  const nRows = t.rowEnd - t.rowStart;
  const rowCoef: Float64Array[] = [];
  for (let r = 0; r < nRows; r++) {
    const a = new Float64Array(UG + 1);
    rowCoefficients(gs, yOf(Math.log(t.fieldsAu[t.rowStart + r]), gs.sA, gs.sB), a);
    rowCoef.push(a);
  }
  const groundG = new Float64Array(nRows * nA);
  for (let r = 0; r < nRows; r += 4) {
    const q = (k: number): number => Math.min(r + k, nRows - 1);
    groundRows4(tmat, UG + 1, nA, rowCoef[q(0)], rowCoef[q(1)], rowCoef[q(2)], rowCoef[q(3)], groundG, q(0) * nA, q(1) * nA, q(2) * nA, q(3) * nA);
  }
  // flag bits that depend on the column only
  const cutoffFlag = new Uint8Array(nA);
  if (m === 0) for (let i = 0; i < nA; i++) if (t.alphas[i] / (t.cutoffBohr * t.cutoffBohr) >= RATIO_CUTOFF) cutoffFlag[i] = FLAG_CUTOFF;
  // Excited levels: one surface per ν (index ν − 1).
  const nLev = model.levels;
  const exSurf: SurfaceModel[] = [];
  if (exc !== null) for (const sf of exc.surfaces) exSurf[sf.nu - 1] = sf;
  const exCoef = exSurf.map((sf) => new Float64Array(sf.degU + 1));
  const exLo = new Float64Array(nLev);
  const exHi = new Float64Array(nLev);
  const exOn = new Uint8Array(nLev);
  const eps = new Float64Array(L); // scaled values of one cell
  const err = new Float64Array(L);
  const lambdaC = new Float64Array(L);
  const lcErr = new Float64Array(L);
  for (let j = t.rowStart; j < t.rowEnd; j++) {
    const B = t.fieldsAu[j];
    const s = Math.log(B);
    const rhoC = t.cutoffBohr * Math.sqrt(B);
    const depth0 = Math.abs(scaledPotential(m, 0, rhoC));
    const errG0 = gs.errG;
    let nExc = 0;
    if (exc !== null && s >= exc.sA) {
      nExc = nLev - 1;
      for (let nu = 1; nu <= nExc; nu++) {
        const tm = model.thresholds[nu - 1];
        // below the curve's range the level is absent from the whole row
        lambdaC[nu] = s < tm.sA ? Infinity : Math.exp(clenshaw(tm.coef, tm.deg, 0, 1, yOf(s, tm.sA, tm.sB)));
        lcErr[nu] = s < tm.sA ? 0 : tm.relErr * lambdaC[nu];
        const sf = exSurf[nu - 1];
        exOn[nu] = 0;
        if (sf !== undefined && s >= sf.sA - 1e-12) {
          rowCoefficients(sf, yOf(Math.max(s, sf.sA), sf.sA, sf.sB), exCoef[nu - 1]);
          const shift = sf.relThreshold ? Math.log(lambdaC[nu]) : 0;
          exLo[nu] = sf.relThreshold ? shift + sf.uA : sf.uA + sf.shA * s;
          exHi[nu] = sf.relThreshold ? shift + sf.uB : sf.uB + sf.shB * s;
          exOn[nu] = 1;
        }
      }
    }
    const gRow = (j - t.rowStart) * nA;
    for (let i = 0; i < nA; i++) {
      const alpha = t.alphas[i];
      const lambda = alpha * B;
      const cell = (j - t.arrayRowStart) * nA + i;
      let direct = false;
      // ground state
      const lnLam = lnAlpha[i] + s;
      const G0 = groundG[gRow + i];
      if (!(errG0 <= SAFETY * tol) || !Number.isFinite(G0)) direct = true;
      eps[0] = Math.exp(G0 + 2 * lnLam);
      err[0] = errG0;
      let n = 1;
      // excited levels
      for (let nu = 1; nu <= nExc && !direct; nu++) {
        const lc = lambdaC[nu];
        const d = lambda - lc;
        const dl = lcErr[nu];
        // uncertain existence, or a value too close to the threshold to be certified
        if (Math.abs(d) <= (4 * dl) / (SAFETY * tol)) {
          direct = true;
          break;
        }
        if (d <= 0) break;
        if (exOn[nu] === 0) {
          direct = true; // exists here but its surface does not reach this row (cannot happen for a single crossing)
          break;
        }
        const sf = exSurf[nu - 1];
        const c = exCoef[nu - 1];
        const lo = exLo[nu];
        const hi = exHi[nu];
        const u = Math.log(d);
        let G: number;
        let e: number;
        if (u > hi + 1e-9) {
          direct = true;
          break;
        }
        if (u >= lo) {
          G = clenshaw(c, sf.degU, 0, 1, (2 * (u - lo)) / (hi - lo) - 1);
          e = sf.errG + (2 * dl) / d;
        } else {
          // closer to the threshold than the surface reaches: G = G(lo) + G'(lo)(e^(u−lo) − 1), the
          // leading behaviour G∞ + b(λ − λ_c); the neglected term is of the size of the curvature
          // term at lo, |G''(lo) − G'(lo)|, which bounds the error estimate
          const g0 = clenshaw(c, sf.degU, 0, 1, -1);
          const h = 1e-3;
          const gp = clenshaw(c, sf.degU, 0, 1, -1 + (2 * h) / (hi - lo));
          const gpp = clenshaw(c, sf.degU, 0, 1, -1 + (4 * h) / (hi - lo));
          const d1 = (gp - g0) / h;
          const d2 = (gpp - 2 * gp + g0) / (h * h);
          const x = Math.exp(u - lo);
          G = g0 + d1 * (x - 1);
          e = sf.errG + (2 * dl) / d + Math.abs(d2 - d1) * (1 - x);
        }
        if (!(e <= SAFETY * tol) || !Number.isFinite(G)) {
          direct = true;
          break;
        }
        eps[nu] = Math.exp(G + 2 * u);
        err[nu] = e;
        n = nu + 1;
      }
      const base = m * blockCells + cell;
      if (direct) {
        directSolves++;
        const dv = directOrbital(m, alpha, B, t.cutoffBohr, floor);
        let kept = 0;
        let dropped = false;
        for (let k = 0; k < dv.epsilon.length; k++) {
          const e = B * dv.epsilon[k];
          if (!dv.resolved[k] || e < floor) {
            dropped = true;
            continue;
          }
          if (kept < L) {
            t.bindingHartree[(m * L + kept) * blockCells + cell] = e;
            if (dv.relError[k] > maxRelError) maxRelError = dv.relError[k];
          }
          kept++;
        }
        t.counts[base] = Math.min(kept, L);
        t.flags[base] = orbitalCellFlags(m, alpha, t.cutoffBohr, kept > 0 ? dv.epsilon[0] : 0, dropped, true);
        continue;
      }
      const epsMin = floor > 0 ? floor / B : RESOLVE_FRACTION * lambda * depth0;
      let kept = 0;
      let dropped = false;
      for (let k = 0; k < n; k++) {
        if (eps[k] < epsMin || B * eps[k] < floor) {
          dropped = true;
          continue;
        }
        t.bindingHartree[(m * L + k) * blockCells + cell] = B * eps[k];
        if (err[k] > maxRelError) maxRelError = err[k];
        kept = k + 1;
      }
      t.counts[base] = kept;
      // the bits of orbitalCellFlags (not direct), inline
      t.flags[base] = cutoffFlag[i] | (kept > 0 && eps[0] > RATIO_NON_ADIABATIC ? FLAG_NON_ADIABATIC : 0) | (dropped ? FLAG_BELOW_FLOOR : 0);
    }
  }
  return { maxRelError, directSolves };
}
