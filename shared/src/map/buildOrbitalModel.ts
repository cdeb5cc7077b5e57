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
  degThreshold0: number;
  /** Lower end of the excited u-range: λ − λ_c ≥ nearThreshold·λ_c. */
  nearThreshold: number;
}

export const DEFAULT_BUILD: BuildSettings = {
  tolG: 3e-7,
  tolThreshold: 1e-12,
  meshTolGround: 1e-7,
  meshTolExcited: 1e-10,
  degU0: 12,
  degS0: 6,
  degMax: 96,
  degThresholdMax: 96,
  degThreshold0: 12,
  nearThreshold: 1e-4,
};

interface Spec {
  nu: number;
  uA: number;
  shA: number;
  uB: number;
  shB: number;
}

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
  const groundSpecs: Spec[] = [{ nu: 0, uA: uA0, shA: 1, uB: uB0, shB: 1 }];
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
      // one surface per excited level, over the fields where it exists somewhere in the map
      const specs: Spec[] = [];
      const surfaces: SurfaceModel[] = [];
      for (let nu = 1; nu <= K; nu++) {
        const tm = thrCurves.models[nu - 1];
        const lcAt = (s: number): number => Math.exp(clenshaw(tm.coef, tm.deg, 0, 1, yOf(s, sE, sB)));
        // first map row where the level exists, and the crossing λ_c,ν(s) = λ_max(s) before it
        let jFirst = -1;
        for (let j = 0; j < geo.rowS.length; j++) {
          const s = geo.rowS[j];
          if (s >= sE && lamMax(s) > lcAt(s) && (jFirst < 0 || s < geo.rowS[jFirst])) jFirst = j;
        }
        if (jFirst < 0) break; // ν and above never appear in a map row
        let sLo = sE;
        let sHi = geo.rowS[jFirst];
        if (lamMax(sLo) > lcAt(sLo)) sHi = sLo;
        for (let it = 0; it < 80 && sHi - sLo > 1e-12; it++) {
          const c = 0.5 * (sLo + sHi);
          if (lamMax(c) > lcAt(c)) sHi = c;
          else sLo = c;
        }
        const sA = Math.min(sLo, sB - 1e-9);
        let lnLcMin = Infinity;
        for (let k = 0; k <= 64; k++) lnLcMin = Math.min(lnLcMin, Math.log(lcAt(sA + ((sB - sA) * k) / 64)));
        const uLo = Math.min(lnLcMin + Math.log(settings.nearThreshold), Math.log(lamMax(sA)) - 1);
        // rows from u = ln(nearThreshold·λ_c) up to u = ln λ_max(B) (≥ every map cell of the row)
        const spec: Spec = { nu, uA: uLo, shA: 0, uB: geo.lnAlphaMax, shB: 1 };
        specs.push(spec);
        const makeRow = (s: number): Row => {
          const lcPred = lcAt(s);
          const solver = newSolver(s, (lcPred + lamMax(s)) * 1.05, settings.meshTolExcited);
          const thr: number[] = [];
          thr[nu] = solver.threshold(nu, Math.log(lcPred), 1e-7);
          return { s, solver, thr };
        };
        const g = buildGroup([spec], sA, sB, makeRow, null);
        surfaces.push(...g.surfaces);
      }
      excited = { sA: sE, sB, surfaces };
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
    let deg = settings.degThreshold0;
    let rows: Row[] | null = null;
    for (;;) {
      throwIfAborted(signal);
      const prev: Row[] | null = rows;
      rows = nestedRows(prev, deg, sA, sB, (s, k, cur) => {
        // prediction: neighbour rows (already built at k − 1, or old rows at k ± 1)
        const left = cur[k - 1];
        const right = k + 1 < cur.length ? cur[k + 1] : undefined;
        // The row's mesh must serve λ up to max_ν λ_c,ν + λ_max(B) (the surfaces' largest λ):
        // start from the neighbours' thresholds and rebuild once if the row needs more.
        let need = 2 * lamMax(s);
        for (const nb of [left, right]) {
          if (nb === undefined) continue;
          for (let nu = 1; nu < nuTop; nu++) if (Number.isFinite(nb.thr[nu])) need = Math.max(need, 1.2 * nb.thr[nu] + lamMax(s));
        }
        let lamRefRow = Math.min(need, lamRef);
        for (let attempt = 0; ; attempt++) {
          const solver = newSolver(s, lamRefRow, settings.meshTolExcited);
          const thr: number[] = [0];
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
              guess = nu > 1 && Number.isFinite(thr[nu - 1]) ? Math.log(thr[nu - 1]) + 0.5 : Math.log(lamMax(s));
              spread = 0.5;
            }
            thr.push(solver.threshold(nu, guess, spread));
          }
          let needed = lamMax(s);
          for (let nu = 1; nu < nuTop; nu++) needed = Math.max(needed, thr[nu] + lamMax(s));
          if (needed <= lamRefRow * 1.0001 || attempt >= 4 || lamRefRow >= lamRef) return { s, solver, thr };
          lamRefRow = Math.min(lamRef, Number.isFinite(needed) ? needed * 1.1 : lamRefRow * 4);
        }
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
   * Surfaces G_ν for the given levels over [sA, sB]. Each level has its own degrees (degU, degS);
   * the group's rows are the Lobatto rows of the largest s-degree, either made by `makeRow` (nested
   * doubling) or taken from the threshold rows `thrRows` (a level of s-degree S uses every
   * (T/S)-th of them). Refinement: double degU while the u-tail exceeds tolG/2, double degS while
   * the s-tail does; new nodes are predicted from the current interpolant.
   */
  function buildGroup(
    specs: Spec[],
    sA: number,
    sB: number,
    makeRow: ((s: number) => Row) | null,
    thrRows: Row[] | null,
  ): { surfaces: SurfaceModel[]; rows: Row[] } {
    const sMaxDeg = thrRows !== null ? thrRows.length - 1 : settings.degMax;
    let groupRows: Row[] = thrRows ?? nestedRows(null, Math.min(settings.degS0, sMaxDeg), sA, sB, (s) => makeRow!(s));
    const rowsOf = (deg: number): Row[] => {
      let R = groupRows.length - 1;
      if (thrRows === null) {
        while (R < deg) {
          groupRows = nestedRows(groupRows, 2 * R, sA, sB, (s) => makeRow!(s));
          R *= 2;
        }
      }
      const step = R / deg;
      const out: Row[] = [];
      for (let k = 0; k <= deg; k++) out.push(groupRows[k * step]);
      return out;
    };
    const degU = specs.map(() => settings.degU0);
    const degS = specs.map(() => Math.min(settings.degS0, sMaxDeg));
    const values: Float64Array[] = specs.map((_, q) => new Float64Array((degU[q] + 1) * (degS[q] + 1)).fill(NaN));
    const coefs: Float64Array[] = specs.map(() => new Float64Array(0));
    const tails: { u: number; s: number }[] = specs.map(() => ({ u: Infinity, s: Infinity }));

    const uOf = (q: number, xi: number, s: number): number => {
      const sp = specs[q];
      const lo = sp.uA + sp.shA * s;
      return lo + ((xi + 1) / 2) * (sp.uB + sp.shB * s - lo);
    };
    const solveNode = (q: number, row: Row, xi: number, guessG: number, spread: number): number => {
      const nu = specs[q].nu;
      const u = uOf(q, xi, row.s);
      const lambda = (nu === 0 ? 0 : row.thr[nu]) + Math.exp(u);
      nodeSolves++;
      // the slope of the matching function at this row's previous root is a good Newton hint
      const lnEps = row.solver.lnLevel(lambda, nu, guessG + 2 * u, spread, LN_TINY, spread < 1e-3 ? row.solver.lastSlope : NaN);
      return lnEps - 2 * u;
    };
    // initial grid: row by row, node by node, each predicted from its neighbours
    const fillInitial = (q: number): void => {
      const U = degU[q];
      const S = degS[q];
      const rows = rowsOf(S);
      const xs = lobattoNodes(U);
      const v = values[q];
      const W = S + 1;
      for (let k = 0; k <= S; k++) {
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
            // cold start: a wide bracket around the depth scale
            guess = Math.log(rows[k].solver.depthPerLambda);
            spread = 4;
          }
          v[i * W + k] = solveNode(q, rows[k], xs[i], guess, spread);
        }
      }
    };
    const refreshCoefs = (q: number): void => {
      coefs[q] = chebCoefficients2d(values[q], degU[q], degS[q]);
      tails[q] = coefficientTails(coefs[q], degU[q], degS[q]);
    };
    /**
     * Raise the u-degree to n: nested (every old node reused) when n = 2U, otherwise a fresh grid
     * whose nodes are predicted from the current interpolant (accurate to about its tail).
     */
    const refineU = (q: number, n: number): void => {
      const U = degU[q];
      const S = degS[q];
      const rows = rowsOf(S);
      const W = S + 1;
      const old = values[q];
      const nested = n === 2 * U;
      const nv = new Float64Array((n + 1) * W);
      if (nested) for (let i = 0; i <= U; i++) for (let k = 0; k < W; k++) nv[2 * i * W + k] = old[i * W + k];
      const xs = lobattoNodes(n);
      const rowCoef = new Float64Array(U + 1);
      const ct = cosTable(U);
      const spread = Math.max(1e-9, Math.min(1, 4 * tails[q].u));
      for (let k = 0; k < W; k++) {
        throwIfAborted(signal);
        chebCoefficients(old, U, k, W, rowCoef, 0, 1, ct);
        for (let i = nested ? 1 : 0; i <= n; i += nested ? 2 : 1) nv[i * W + k] = solveNode(q, rows[k], xs[i], clenshaw(rowCoef, U, 0, 1, xs[i]), spread);
      }
      values[q] = nv;
      degU[q] = n;
    };
    /**
     * u-degree predicted to bring the tail below tolG/2: the decay rate of the largest coefficient per
     * u-degree over the upper half of the current spectrum, extrapolated (rounded up to a multiple
     * of 4, at least U + 4, at most 2U, and 2U — nested — when within 20 % of it).
     */
    const predictDegU = (q: number): number => {
      const U = degU[q];
      const W = degS[q] + 1;
      const c = coefs[q];
      let sx = 0, sy = 0, sxx = 0, sxy = 0, cnt = 0;
      for (let j = Math.floor(U / 2); j <= U; j++) {
        let a = 0;
        for (let k = 0; k < W; k++) a = Math.max(a, Math.abs(c[j * W + k]));
        const y = Math.log(Math.max(a, 1e-300));
        sx += j; sy += y; sxx += j * j; sxy += j * y; cnt++;
      }
      const beta = -(cnt * sxy - sx * sy) / (cnt * sxx - sx * sx);
      if (!(beta > 0.05)) return 2 * U;
      const alpha = (sy + beta * sx) / cnt;
      const target = Math.log(settings.tolG / 8 / W);
      let n = Math.ceil((alpha - target) / beta / 4) * 4;
      n = Math.max(n, U + 4);
      if (n >= 1.6 * U) return 2 * U;
      return n;
    };
    const refineS = (q: number): void => {
      const U = degU[q];
      const S = degS[q];
      const newRows = rowsOf(2 * S);
      const xs = lobattoNodes(U);
      const ys = lobattoNodes(2 * S);
      const old = values[q];
      const W = S + 1;
      const W2 = 2 * S + 1;
      const nv = new Float64Array((U + 1) * W2);
      const colCoef = new Float64Array(S + 1);
      const ct = cosTable(S);
      const spread = Math.max(1e-9, Math.min(1, 4 * tails[q].s));
      for (let i = 0; i <= U; i++) {
        throwIfAborted(signal);
        for (let k = 0; k <= S; k++) nv[i * W2 + 2 * k] = old[i * W + k];
        chebCoefficients(old, S, i * W, 1, colCoef, 0, 1, ct);
        for (let k = 1; k < 2 * S; k += 2) nv[i * W2 + k] = solveNode(q, newRows[k], xs[i], clenshaw(colCoef, S, 0, 1, ys[k]), spread);
      }
      values[q] = nv;
      degS[q] = 2 * S;
    };
    for (let q = 0; q < specs.length; q++) {
      fillInitial(q);
      refreshCoefs(q);
      for (;;) {
        const needU = tails[q].u > settings.tolG / 2 && 2 * degU[q] <= settings.degMax;
        const needS = tails[q].s > settings.tolG / 2 && 2 * degS[q] <= Math.min(sMaxDeg, settings.degMax);
        if (!needU && !needS) break;
        // refine the direction with the larger tail first
        if (needU && (!needS || tails[q].u >= tails[q].s)) refineU(q, predictDegU(q));
        else refineS(q);
        refreshCoefs(q);
      }
    }

    // discretisation error of the node values: three rows × three nodes re-solved with halved steps
    const surfaces: SurfaceModel[] = specs.map((sp, q) => {
      let disc = 0;
      const U = degU[q];
      const S = degS[q];
      const rows = rowsOf(S);
      const xs = lobattoNodes(U);
      const W = S + 1;
      for (const k of [0, S >> 1, S]) {
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
        sA,
        sB,
        uA: sp.uA,
        shA: sp.shA,
        uB: sp.uB,
        shB: sp.shB,
        degU: U,
        degS: S,
        coef: coefs[q],
        errG: bad ? Infinity : 2 * (t.u + t.s) + disc,
        tailU: t.u,
        tailS: t.s,
        disc,
      };
    });
    return { surfaces, rows: groupRows };
  }
}
