import { throwIfAborted, type AbortSignalLike } from './abortError.js';
import { chebCoefficients, chebCoefficients2d, clenshaw, coefficientTails, cosTable, lobattoNodes } from './chebyshev.js';
import type { GroupModel, OrbitalModel, SurfaceModel, ThresholdModel } from './orbitalModel.js';
import { OrbitalRowSolver } from './orbitalRowSolver.js';

/** Geometry of the map the model must cover (atomic units; s = ln B). */
export interface MapGeometry {
  lnAlphaMin: number;
  lnAlphaMax: number;
  sMin: number;
  sMax: number;
  /** s = ln B of every map row (ascending or not; only the range and the rows matter). */
  rowS: Float64Array;
  cutoffBohr: number;
}

/** Tuning of the model build (internal; defaults in DEFAULT_BUILD). */
export interface BuildSettings {
  /** Target |ΔG| of the interpolants (≈ relative error of ε). */
  tolG: number;
  /** Target relative error of the threshold curves. */
  tolThreshold: number;
  /** Solver accuracy knob of the ground-state rows and of the excited rows. */
  meshTolGround: number;
  meshTolExcited: number;
  /** Starting and largest Chebyshev degrees. */
  degU0: number;
  degS0: number;
  degMax: number;
  degThresholdMax: number;
  /** Lower end of the excited u-range: λ − λ_c ≥ nearThreshold·λ_c. */
  nearThreshold: number;
  /** Ground state: 'sheared' interpolates in (ln α, ln B); 'panels' in (ln λ, ln B) split into groundPanels u-panels. */
  groundMode: 'sheared' | 'panels';
  groundPanels: number;
  /** Excited levels: split the u-range at ln(excitedSplit·λ_c) (0: no split). */
  excitedSplit: number;
}

export const DEFAULT_BUILD: BuildSettings = {
  tolG: 3e-7,
  tolThreshold: 1e-13,
  meshTolGround: 1e-8,
  meshTolExcited: 1e-10,
  degU0: 16,
  degS0: 8,
  degMax: 64,
  degThresholdMax: 128,
  nearThreshold: 1e-6,
  groundMode: 'sheared',
  groundPanels: 1,
  excitedSplit: 0,
};

interface Row {
  s: number;
  solver: OrbitalRowSolver;
  /** λ_c,ν at this row for ν = 0…(index), NaN where not computed. */
  thr: number[];
}

const LN_TINY = -1400; // far below any resolvable ln ε̃ (solver epsMin is ≥ 1e-26·depth)

function yOf(s: number, sA: number, sB: number): number {
  return sB === sA ? 0 : (2 * (s - sA)) / (sB - sA) - 1;
}

/** Nested row sets: rows at the Lobatto nodes of degree deg over [sA, sB], reusing old rows at even indices. */
function nestedRows(old: Row[] | null, deg: number, sA: number, sB: number, make: (s: number, k: number, rows: Row[]) => Row): Row[] {
  const x = lobattoNodes(deg);
  const rows: Row[] = new Array(deg + 1);
  for (let k = 0; k <= deg; k++) {
    if (old !== null && k % 2 === 0 && old.length === deg / 2 + 1) rows[k] = old[k / 2];
  }
  for (let k = 0; k <= deg; k++) {
    if (rows[k] === undefined) rows[k] = make(sA + ((x[k] + 1) / 2) * (sB - sA), k, rows);
  }
  return rows;
}

/**
 * Builds the interpolation model of orbital m over a map (model.md §2, "Whole maps fast"):
 *  1. ground state: G_0(ln α, ln B) on a tensor Chebyshev–Lobatto grid, degrees doubled (nested,
 *     every old node reused) until the last two coefficient planes in each direction are below tolG;
 *  2. where the first excited level exists somewhere in the map (from the Sturm counts at α_max):
 *     threshold curves λ_c,ν(ln B) on their own nested Chebyshev grid to tolThreshold, and one
 *     surface G_ν(ln(λ − λ_c,ν), ln B) per excited level, refined the same way;
 *  3. error estimates: coefficient tails plus the discretisation error of the node values, measured
 *     by re-solving a few nodes and thresholds with every solver step halved.
 * Node values come from OrbitalRowSolver (one mesh per row), started from the current interpolant's
 * prediction.
 */
export function buildOrbitalModel(
  m: number,
  geo: MapGeometry,
  settings: BuildSettings = DEFAULT_BUILD,
  signal?: AbortSignalLike,
): OrbitalModel {
  const rc = geo.cutoffBohr;
  const alphaMax = Math.exp(geo.lnAlphaMax);
  const lamMax = (s: number): number => alphaMax * Math.exp(s);
  let nodeSolves = 0;
  let sweeps = 0;
  const solvers: OrbitalRowSolver[] = [];
  const newSolver = (s: number, lambdaRef: number, tol: number, refine = 1): OrbitalRowSolver => {
    const r = new OrbitalRowSolver(m, rc * Math.exp(s / 2), lambdaRef, tol, refine);
    solvers.push(r);
    return r;
  };

  // ---------- ground state ----------
  const sA0 = geo.sMin;
  const sB0 = geo.sMax;
  const uA0 = geo.lnAlphaMin;
  const uB0 = geo.lnAlphaMax;
  const makeGroundRow = (s: number): Row => ({ s, solver: newSolver(s, lamMax(s) * (1 + 1e-9), settings.meshTolGround), thr: [0] });
  const groundSpecs: { nu: number; shear: 0 | 1; uA: number; uB: number }[] = [];
  if (settings.groundMode === 'sheared') groundSpecs.push({ nu: 0, shear: 1, uA: uA0, uB: uB0 });
  else {
    const lo = uA0 + sA0;
    const hi = uB0 + sB0;
    const P = settings.groundPanels;
    for (let p = 0; p < P; p++) groundSpecs.push({ nu: 0, shear: 0, uA: lo + ((hi - lo) * p) / P, uB: lo + ((hi - lo) * (p + 1)) / P });
  }
  const groundSurface = buildGroup(
    groundSpecs,
    sA0,
    sB0,
    makeGroundRow,
    null,
  );

  // ---------- excited levels ----------
  // Sturm counts at α_max on the ground rows: where does ν = 1 exist in the map?
  const groundRows = groundSurface.rows;
  let firstWith = -1;
  let maxCount = 1;
  for (let k = 0; k < groundRows.length; k++) {
    const r = groundRows[k];
    const c = r.solver.count(lamMax(r.s));
    if (c > maxCount) maxCount = c;
    if (c >= 2 && firstWith < 0) firstWith = k;
  }
  let excited: GroupModel | null = null;
  const thresholds: ThresholdModel[] = [];
  let levels = 1;
  if (firstWith >= 0) {
    // s_e: where λ_c,1(s) = α_max·B, between the last row without and the first row with ν = 1
    let sE = geo.sMin;
    if (firstWith > 0) {
      const f = (s: number): number => {
        const sol = newSolver(s, lamMax(s) * (1 + 1e-9), settings.meshTolGround);
        return sol.phase(lamMax(s), true) - Math.PI;
      };
      let a = groundRows[firstWith - 1].s;
      let b = groundRows[firstWith].s;
      let fa = f(a);
      let fb = f(b);
      // bisection to 1e-10 in s (robust; ~35 small mesh builds)
      for (let it = 0; it < 60 && b - a > 1e-10 * (1 + Math.abs(b)); it++) {
        const c = 0.5 * (a + b);
        const fc = f(c);
        if (fc < 0) {
          a = c;
          fa = fc;
        } else {
          b = c;
          fb = fc;
        }
      }
      void fa;
      void fb;
      sE = a;
    }
    const sB = geo.sMax;
    let K = Math.max(1, maxCount - 1); // excited levels present somewhere (grown below if needed)
    const lamRefExc = 2 * lamMax(sB);
    for (let attempt = 0; attempt < 8; attempt++) {
      throwIfAborted(signal);
      const thrCurves = buildThresholds(sE, sB, K + 1, lamRefExc);
      // does level K + 1 appear in some map row?
      let grow = false;
      for (let j = 0; j < geo.rowS.length; j++) {
        const s = geo.rowS[j];
        if (s < sE) continue;
        const lc = Math.exp(clenshaw(thrCurves.models[K].coef, thrCurves.models[K].deg, 0, 1, yOf(s, sE, sB)));
        if (lc < lamMax(s)) {
          grow = true;
          break;
        }
      }
      if (grow) {
        K++;
        continue;
      }
      // u-ranges of the excited surfaces
      const specs: { nu: number; shear: 0 | 1; uA: number; uB: number }[] = [];
      for (let nu = 1; nu <= K; nu++) {
        const tm = thrCurves.models[nu - 1];
        let uHi = -Infinity;
        let lnLcMin = Infinity;
        for (let j = 0; j < geo.rowS.length; j++) {
          const s = geo.rowS[j];
          if (s < sE) continue;
          const lc = Math.exp(clenshaw(tm.coef, tm.deg, 0, 1, yOf(s, sE, sB)));
          lnLcMin = Math.min(lnLcMin, Math.log(lc));
          if (lamMax(s) > lc) uHi = Math.max(uHi, Math.log(lamMax(s) - lc));
        }
        for (const r of thrCurves.rows) lnLcMin = Math.min(lnLcMin, Math.log(r.thr[nu]));
        if (uHi === -Infinity) break; // ν and above never appear in a map row
        const uLo = lnLcMin + Math.log(settings.nearThreshold);
        const lo = Math.min(uLo, uHi - 1);
        const split = lnLcMin + Math.log(settings.excitedSplit);
        if (settings.excitedSplit > 0 && split > lo + 1 && split < uHi - 1) {
          specs.push({ nu, shear: 0, uA: lo, uB: split }, { nu, shear: 0, uA: split, uB: uHi });
        } else specs.push({ nu, shear: 0, uA: lo, uB: uHi });
      }
      const group = buildGroup(specs, sE, sB, null, thrCurves.rows);
      excited = { sA: sE, sB, surfaces: group.surfaces };
      const nExcited = new Set(specs.map((sp) => sp.nu)).size;
      thresholds.push(...thrCurves.models.slice(0, nExcited + 1));
      levels = 1 + nExcited;
      break;
    }
  }

  for (const s of solvers) sweeps += s.sweeps;
  return {
    m,
    ground: { sA: sA0, sB: sB0, surfaces: groundSurface.surfaces },
    excited,
    thresholds,
    levels,
    nodeSolves,
    sweeps,
  };

  // ---------------------------------------------------------------------------------------------

  /** Threshold curves ν = 1…nuTop over [sA, sB] on nested Lobatto rows, refined to tolThreshold. */
  function buildThresholds(sA: number, sB: number, nuTop: number, lamRef: number): { rows: Row[]; models: ThresholdModel[] } {
    let deg = 16;
    let rows: Row[] | null = null;
    for (;;) {
      throwIfAborted(signal);
      const prev: Row[] | null = rows;
      rows = nestedRows(prev, deg, sA, sB, (s, k, cur) => {
        const solver = newSolver(s, lamRef, settings.meshTolExcited);
        const thr: number[] = [0];
        // prediction: neighbour rows (already built at k − 1, or old rows at k ± 1)
        const left = cur[k - 1];
        const right = k + 1 < cur.length ? cur[k + 1] : undefined;
        for (let nu = 1; nu <= nuTop; nu++) {
          let guess: number;
          let spread: number;
          const lv = left?.thr[nu];
          const rv = right?.thr[nu];
          if (lv !== undefined && rv !== undefined && Number.isFinite(lv) && Number.isFinite(rv)) {
            guess = 0.5 * (Math.log(lv) + Math.log(rv));
            spread = Math.abs(Math.log(rv) - Math.log(lv)) * 0.5 + 1e-9;
          } else if (lv !== undefined && Number.isFinite(lv)) {
            guess = Math.log(lv);
            spread = 0.05;
          } else {
            guess = nu > 1 && Number.isFinite(thr[nu - 1]) ? Math.log(thr[nu - 1]) + 0.5 : Math.log(lamRef / 2);
            spread = 0.5;
          }
          thr.push(solver.threshold(nu, guess, spread));
        }
        return { s, solver, thr };
      });
      // interpolants of ln λ_c; finite everywhere?
      const models: ThresholdModel[] = [];
      let worst = 0;
      const ct = cosTable(deg);
      for (let nu = 1; nu <= nuTop; nu++) {
        const vals = new Float64Array(deg + 1);
        let finite = true;
        for (let k = 0; k <= deg; k++) {
          const v = rows[k].thr[nu];
          if (!(v > 0 && Number.isFinite(v))) finite = false;
          vals[k] = Math.log(v);
        }
        const coef = new Float64Array(deg + 1);
        if (finite) chebCoefficients(vals, deg, 0, 1, coef, 0, 1, ct);
        else coef.fill(Math.log(4 * lamRef)); // beyond reach: never below any map λ
        const tail = finite ? Math.abs(coef[deg]) + Math.abs(coef[deg - 1]) : 0;
        if (nu < nuTop) worst = Math.max(worst, tail);
        models.push({ nu, deg, coef, relErr: tail });
      }
      if (worst <= settings.tolThreshold || deg >= settings.degThresholdMax) {
        // discretisation error of the thresholds: re-solve at three rows with halved steps
        const disc = thresholdDiscretisation(rows, nuTop, lamRef);
        for (const tm of models) tm.relErr = 2 * tm.relErr + disc[tm.nu];
        return { rows, models };
      }
      deg *= 2;
    }
  }

  function thresholdDiscretisation(rows: Row[], nuTop: number, lamRef: number): number[] {
    const out = new Array<number>(nuTop + 1).fill(0);
    for (const k of [0, rows.length >> 1, rows.length - 1]) {
      const r = rows[k];
      const fine = newSolver(r.s, lamRef, settings.meshTolExcited, 2);
      for (let nu = 1; nu <= nuTop; nu++) {
        const v = r.thr[nu];
        if (!Number.isFinite(v)) continue;
        const f = fine.threshold(nu, Math.log(v), 1e-9);
        out[nu] = Math.max(out[nu], Math.abs(f - v) / f);
      }
    }
    return out;
  }

  /**
   * Surfaces G_ν for the given levels over [sA, sB]. Rows come either from `makeRow` (nested Lobatto
   * rows of the surface degree) or from `thrRows` (the threshold rows, of which the surface uses
   * every (T/degS)-th).
   */
  function buildGroup(
    specs: { nu: number; shear: 0 | 1; uA: number; uB: number }[],
    sA: number,
    sB: number,
    makeRow: ((s: number) => Row) | null,
    thrRows: Row[] | null,
  ): { surfaces: SurfaceModel[]; rows: Row[] } {
    let degS = settings.degS0;
    if (thrRows !== null) degS = Math.min(degS, thrRows.length - 1);
    let rows: Row[] = [];
    const rowsFor = (deg: number, old: Row[] | null): Row[] => {
      if (thrRows !== null) {
        const T = thrRows.length - 1;
        const step = T / deg;
        const out: Row[] = [];
        for (let k = 0; k <= deg; k++) out.push(thrRows[k * step]);
        return out;
      }
      return nestedRows(old, deg, sA, sB, (s) => makeRow!(s));
    };
    rows = rowsFor(degS, null);
    const degU = specs.map(() => settings.degU0);
    const values: Float64Array[] = specs.map((_, q) => new Float64Array((degU[q] + 1) * (degS + 1)).fill(NaN));
    const coefs: Float64Array[] = specs.map(() => new Float64Array(0));
    const tails: { u: number; s: number }[] = specs.map(() => ({ u: Infinity, s: Infinity }));

    const uOf = (q: number, xi: number, s: number): number => {
      const sp = specs[q];
      return sp.uA + sp.shear * s + ((xi + 1) / 2) * (sp.uB - sp.uA);
    };
    const solveNode = (q: number, row: Row, xi: number, guessG: number, spread: number): number => {
      const nu = specs[q].nu;
      const u = uOf(q, xi, row.s);
      const lambda = (nu === 0 ? 0 : row.thr[nu]) + Math.exp(u);
      nodeSolves++;
      const lnEps = row.solver.lnLevel(lambda, nu, guessG + 2 * u, spread, LN_TINY);
      return lnEps - 2 * u;
    };
    // initial grid: row by row, node by node, each predicted from its neighbours
    const fillInitial = (q: number): void => {
      const U = degU[q];
      const xs = lobattoNodes(U);
      const v = values[q];
      const W = degS + 1;
      for (let k = 0; k <= degS; k++) {
        throwIfAborted(signal);
        for (let i = 0; i <= U; i++) {
          let guess: number;
          let spread: number;
          if (k >= 2) {
            guess = 2 * v[i * W + k - 1] - v[i * W + k - 2];
            spread = Math.abs(v[i * W + k - 1] - v[i * W + k - 2]) + 1e-6;
          } else if (k === 1) {
            guess = v[i * W];
            spread = 0.5;
          } else if (i >= 2) {
            guess = 2 * v[(i - 1) * W] - v[(i - 2) * W];
            spread = Math.abs(v[(i - 1) * W] - v[(i - 2) * W]) + 0.01;
          } else if (i === 1) {
            guess = v[0];
            spread = 1;
          } else {
            // cold start: weak coupling, ε̃ ≈ (λ ∫w)²/2 ~ λ²·(depth scale); a wide bracket
            guess = Math.log(rows[k].solver.depthPerLambda);
            spread = 4;
          }
          v[i * W + k] = solveNode(q, rows[k], xs[i], guess, spread);
        }
      }
    };
    specs.forEach((_, q) => fillInitial(q));

    const refreshCoefs = (q: number): void => {
      coefs[q] = chebCoefficients2d(values[q], degU[q], degS);
      tails[q] = coefficientTails(coefs[q], degU[q], degS);
    };
    for (;;) {
      throwIfAborted(signal);
      // refine each level in u
      for (let q = 0; q < specs.length; q++) {
        refreshCoefs(q);
        while (tails[q].u > settings.tolG / 2 && degU[q] < settings.degMax) {
          throwIfAborted(signal);
          const U = degU[q];
          const W = degS + 1;
          const old = values[q];
          const nv = new Float64Array((2 * U + 1) * W);
          for (let i = 0; i <= U; i++) for (let k = 0; k < W; k++) nv[2 * i * W + k] = old[i * W + k];
          const xs = lobattoNodes(2 * U);
          const rowCoef = new Float64Array(U + 1);
          const ct = cosTable(U);
          const spread = Math.max(1e-9, Math.min(1, 4 * tails[q].u));
          for (let k = 0; k < W; k++) {
            chebCoefficients(old, U, k, W, rowCoef, 0, 1, ct);
            for (let i = 1; i < 2 * U; i += 2) {
              const guess = clenshaw(rowCoef, U, 0, 1, xs[i]);
              nv[i * W + k] = solveNode(q, rows[k], xs[i], guess, spread);
            }
          }
          values[q] = nv;
          degU[q] = 2 * U;
          refreshCoefs(q);
        }
      }
      // refine all levels in s together (rows are shared)
      const needS = tails.some((t) => t.s > settings.tolG / 2);
      const canS = thrRows !== null ? 2 * degS <= thrRows.length - 1 && 2 * degS <= settings.degMax : 2 * degS <= settings.degMax;
      if (!needS || !canS) break;
      const S = degS;
      const newRows = rowsFor(2 * S, rows);
      const ys = lobattoNodes(2 * S);
      for (let q = 0; q < specs.length; q++) {
        const U = degU[q];
        const xs = lobattoNodes(U);
        const old = values[q];
        const W = S + 1;
        const W2 = 2 * S + 1;
        const nv = new Float64Array((U + 1) * W2);
        const colCoef = new Float64Array(S + 1);
        const ct = cosTable(S);
        const spread = Math.max(1e-9, Math.min(1, 4 * tails[q].s));
        for (let i = 0; i <= U; i++) {
          for (let k = 0; k <= S; k++) nv[i * W2 + 2 * k] = old[i * W + k];
          chebCoefficients(old, S, i * W, 1, colCoef, 0, 1, ct);
          for (let k = 1; k < 2 * S; k += 2) {
            const guess = clenshaw(colCoef, S, 0, 1, ys[k]);
            nv[i * W2 + k] = solveNode(q, newRows[k], xs[i], guess, spread);
          }
        }
        values[q] = nv;
      }
      rows = newRows;
      degS = 2 * S;
      for (let q = 0; q < specs.length; q++) refreshCoefs(q);
      throwIfAborted(signal);
    }

    // discretisation error of the node values: three rows × three nodes re-solved with halved steps
    const surfaces: SurfaceModel[] = specs.map((sp, q) => {
      let disc = 0;
      const U = degU[q];
      const xs = lobattoNodes(U);
      const W = degS + 1;
      for (const k of [0, degS >> 1, degS]) {
        const r = rows[k];
        const fine = newSolver(r.s, r.solver.lambdaRef, thrRows !== null ? settings.meshTolExcited : settings.meshTolGround, 2);
        // excited levels: relative to the fine mesh's own threshold (the threshold's discretisation
        // error is accounted for separately, per cell)
        const nu = sp.nu;
        const thrFine = nu === 0 ? 0 : fine.threshold(nu, Math.log(r.thr[nu]), 1e-9);
        for (const i of [0, U >> 1, U]) {
          const u = uOf(q, xs[i], r.s);
          const lambda = thrFine + Math.exp(u);
          const g = values[q][i * W + k];
          const lnEps = fine.lnLevel(lambda, nu, g + 2 * u, 1e-8, LN_TINY);
          disc = Math.max(disc, Math.abs(lnEps - 2 * u - g));
        }
      }
      const t = tails[q];
      let bad = false;
      for (const v of values[q]) if (!Number.isFinite(v)) bad = true;
      return {
        nu: sp.nu,
        shear: sp.shear,
        uA: sp.uA,
        uB: sp.uB,
        degU: U,
        degS,
        coef: coefs[q],
        errG: bad ? Infinity : 2 * (t.u + t.s) + disc,
        tailU: t.u,
        tailS: t.s,
        disc,
      };
    });
    return { surfaces, rows };
  }
}
