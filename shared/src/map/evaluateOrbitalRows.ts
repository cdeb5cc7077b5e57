import { scaledPotential } from '../potential/scaledPotential.js';
import { clenshaw } from './chebyshev.js';
import { orbitalCellFlags } from './cellFlags.js';
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
  /** First map row of the block and the block's cell count (rows × nAlpha). */
  rowStart: number;
  rowEnd: number;
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

/**
 * Fills the rows [rowStart, rowEnd) of orbital m from its interpolation model: per level, the
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
  const blockCells = (t.rowEnd - t.rowStart) * nA;
  const tol = t.tolerance;
  const floor = t.floorHartree;
  let maxRelError = 0;
  let directSolves = 0;
  const lnAlpha = new Float64Array(nA);
  for (let i = 0; i < nA; i++) lnAlpha[i] = Math.log(t.alphas[i]);
  const ground = model.ground;
  const exc = model.excited;
  const maxDeg = Math.max(...ground.surfaces.map((s) => s.degU), ...(exc?.surfaces.map((s) => s.degU) ?? [0]));
  const rowCoefs = [...ground.surfaces, ...(exc?.surfaces ?? [])].map(() => new Float64Array(maxDeg + 1));
  const eps = new Float64Array(L); // scaled values of one cell
  const err = new Float64Array(L);
  const lambdaC = new Float64Array(L);
  const lcErr = new Float64Array(L);
  for (let j = t.rowStart; j < t.rowEnd; j++) {
    const B = t.fieldsAu[j];
    const s = Math.log(B);
    const rhoC = t.cutoffBohr * Math.sqrt(B);
    const depth0 = Math.abs(scaledPotential(m, 0, rhoC));
    // row coefficient vectors
    const yG = yOf(s, ground.sA, ground.sB);
    ground.surfaces.forEach((sf, q) => rowCoefficients(sf, yG, rowCoefs[q]));
    const nG = ground.surfaces.length;
    let nExc = 0;
    if (exc !== null && s >= exc.sA) {
      const yE = yOf(s, exc.sA, exc.sB);
      exc.surfaces.forEach((sf, q) => rowCoefficients(sf, yE, rowCoefs[nG + q]));
      nExc = model.levels - 1;
      for (let nu = 1; nu <= nExc; nu++) {
        const tm = model.thresholds[nu - 1];
        lambdaC[nu] = Math.exp(clenshaw(tm.coef, tm.deg, 0, 1, yE));
        lcErr[nu] = tm.relErr * lambdaC[nu];
      }
    }
    for (let i = 0; i < nA; i++) {
      const alpha = t.alphas[i];
      const lambda = alpha * B;
      const cell = (j - t.rowStart) * nA + i;
      let n = 0;
      let direct = false;
      // ground state
      {
        const lnLam = lnAlpha[i] + s;
        let G = NaN;
        let e = Infinity;
        for (let q = 0; q < nG; q++) {
          const sf = ground.surfaces[q];
          const lo = sf.uA + sf.shA * s;
          const hi = sf.uB + sf.shB * s;
          if (lnLam < lo - 1e-9 || lnLam > hi + 1e-9) continue;
          G = clenshaw(rowCoefs[q], sf.degU, 0, 1, (2 * (lnLam - lo)) / (hi - lo) - 1);
          e = sf.errG;
          break;
        }
        if (!(e <= SAFETY * tol) || !Number.isFinite(G)) direct = true;
        eps[0] = Math.exp(G + 2 * lnLam);
        err[0] = e;
        n = 1;
      }
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
        const u = Math.log(d);
        let G = NaN;
        let e = Infinity;
        for (let q = 0; q < exc!.surfaces.length; q++) {
          const sf = exc!.surfaces[q];
          if (sf.nu !== nu) continue;
          const lo = sf.uA + sf.shA * s;
          const hi = sf.uB + sf.shB * s;
          if (u > hi + 1e-9) continue;
          const c = rowCoefs[nG + q];
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
          break;
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
        for (let k = Math.min(kept, L); k < L; k++) t.bindingHartree[(m * L + k) * blockCells + cell] = 0;
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
      for (let k = kept; k < L; k++) t.bindingHartree[(m * L + k) * blockCells + cell] = 0;
      t.counts[base] = kept;
      t.flags[base] = orbitalCellFlags(m, alpha, t.cutoffBohr, kept > 0 ? eps[0] : 0, dropped, false);
    }
  }
  return { maxRelError, directSolves };
}
