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
  /**
   * Excited levels: the nodes are solved on a mesh of accuracy meshTolNode (coarser than the
   * threshold mesh, meshTolExcited), relative to that mesh's own threshold.
   */
  meshTolNode: number;
  /** Lower end of the excited u-range: λ − λ_c ≥ nearThreshold·λ_c. */
  nearThreshold: number;
}

export const DEFAULT_BUILD: BuildSettings = {
  tolG: 4e-7, // prepareBindingMap sets 0.4·tolerance
  tolThreshold: 1e-12,
  meshTolGround: 1e-6,
  meshTolExcited: 1e-10,
  degU0: 12,
  degS0: 6,
  degMax: 96,
  degThresholdMax: 96,
  degThreshold0: 12,
  nearThreshold: 1e-4,
  meshTolNode: 1e-8,
};

interface Spec {
  nu: number;
  uA: number;
  shA: number;
  uB: number;
  shB: number;
  /** Threshold-relative: uLow = ln λ_c,ν(s) + uA, uHigh = ln λ_c,ν(s) + uB (shA, shB unused). */
  rel: boolean;
}

interface Row {
  s: number;
  solver: OrbitalRowSolver;
  /** λ_c,ν at this row for ν = 0…(index), NaN where not computed. */
  thr: number[];
  /**
   * Excited rows: the mesh the nodes are solved on (accuracy meshTolNode, made on first use) and
   * level ν's threshold on that mesh (thrNode[ν]). A node at λ = λ_c,node + e^u then refers to one
   * discretised potential throughout — its value G = ln ε̃ − 2u is the mesh's approximation of a
   * smooth function of the distance to the threshold, accurate to about the mesh's own tolerance
   * however close to the threshold — while the threshold curve (thr, the finer mesh of `solver`)
   * places the cells.
   */
  node?: OrbitalRowSolver;
  thrNode?: number[];
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
 * ln λ_c,ν at the new row k (odd) of a nested grid, interpolated from the old rows at the even
 * indices (Lobatto nodes of half the degree) by the barycentric formula (J.-P. Berrut,
 * L. N. Trefethen, SIAM Review 46, 501 (2004)); null when the old rows are not all there.
 */
function predictFromEvenRows(cur: Row[], k: number, nu: number): number | null {
  const n = cur.length - 1;
  if (n % 2 !== 0 || k % 2 !== 1) return null;
  const half = n / 2;
  const x = -Math.cos((Math.PI * k) / n);
  let num = 0;
  let den = 0;
  for (let j = 0; j <= half; j++) {
    const r = cur[2 * j];
    if (r === undefined || !(r.thr[nu] > 0)) return null;
    const xj = -Math.cos((Math.PI * j) / half);
    const w = (j % 2 === 0 ? 1 : -1) * (j === 0 || j === half ? 0.5 : 1) / (x - xj);
    num += w * Math.log(r.thr[nu]);
    den += w;
  }
  return num / den;
}

/**
 * Builds the interpolation model of orbital m over a map (model.md §2, "Whole maps fast"):
 *  1. ground state: G_0(ln α, ln B) on a tensor Chebyshev–Lobatto grid, degrees doubled (nested,
 *     every old node reused, or a predicted degree in u) until twice the last two coefficient
 *     planes of both directions add up to less than tolG;
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
  const work = { sweeps: 0 }; // Magnus sweeps of every solver of this build
  const newSolver = (s: number, lambdaRef: number, tol: number, refine = 1): OrbitalRowSolver =>
    new OrbitalRowSolver(m, rc * Math.exp(s / 2), lambdaRef, tol, refine, work);

  /** The mesh a node of level ν is solved on: the row's own (ground state) or its node mesh (excited). */
  const solverFor = (row: Row, nu: number): OrbitalRowSolver => {
    if (nu === 0) return row.solver;
    row.node ??= newSolver(row.s, row.solver.lambdaRef, settings.meshTolNode);
    return row.node;
  };
  /** λ_c,ν on the mesh the level's nodes are solved on (0 for the ground state). */
  const nodeThreshold = (row: Row, nu: number): number => {
    if (nu === 0) return 0;
    const sol = solverFor(row, nu);
    row.thrNode ??= [];
    row.thrNode[nu] ??= sol.threshold(nu, Math.log(row.thr[nu]), 1e-9, row.solver.lastThresholdSlope);
    return row.thrNode[nu];
  };

  // ---------- ground state ----------
  const sA0 = geo.sMin;
  const sB0 = geo.sMax;
  const uA0 = geo.lnAlphaMin;
  const uB0 = geo.lnAlphaMax;
  const makeGroundRow = (s: number): Row => ({ s, solver: newSolver(s, lamMax(s) * (1 + 1e-9), settings.meshTolGround), thr: [0] });
  const groundSpecs: Spec[] = [{ nu: 0, uA: uA0, shA: 1, uB: uB0, shB: 1, rel: false }];
  const groundSurface = buildGroup(
    groundSpecs,
    sA0,
    sB0,
    makeGroundRow,
    null,
  );

  // ---------- excited levels ----------
  // Sturm counts at α_max on the ground rows: which levels exist somewhere in the map, and from
  // which row on (the count at α_max grows with B across the map; the largest is taken as K)
  const groundRows = groundSurface.rows;
  const countAt: number[] = groundRows.map((r) => r.solver.count(lamMax(r.s)));
  const K = Math.max(...countAt) - 1;
  let excited: GroupModel | null = null;
  const thresholds: ThresholdModel[] = [];
  const surfaces: SurfaceModel[] = [];
  const sB = geo.sMax;
  for (let nu = 1; nu <= K; nu++) {
    throwIfAborted(signal);
    const odd = (nu & 1) === 1;
    const target = ((nu >> 1) + 1) * Math.PI;
    // s_e,ν: where λ_c,ν(s) = α_max·B, between the last ground row without and the first with ν
    const first = countAt.findIndex((c) => c >= nu + 1);
    let sA = geo.sMin;
    if (first > 0) {
      const f = (s: number): number => newSolver(s, lamMax(s) * (1 + 1e-9), settings.meshTolGround).phase(lamMax(s), odd) - target;
      let a = groundRows[first - 1].s;
      let b = groundRows[first].s;
      let fa = f(a);
      let fb = f(b);
      // Illinois (modified regula falsi) to 1e-7 in ln B: Ψ is smooth in s, a few mesh builds
      let side = 0;
      for (let it = 0; it < 40 && b - a > 1e-7; it++) {
        const c = fa === fb ? 0.5 * (a + b) : Math.min(b - 1e-9, Math.max(a + 1e-9, b - (fb * (b - a)) / (fb - fa)));
        const fc = f(c);
        if (fc < 0) {
          a = c;
          fa = fc;
          if (side === -1) fb /= 2;
          side = -1;
        } else {
          b = c;
          fb = fc;
          if (side === 1) fa /= 2;
          side = 1;
        }
      }
      sA = a;
    }
    sA = Math.min(sA, sB - 1e-9);
    // rows of this level: own mesh (sized for λ ≤ λ_c,ν + λ_max(B)) and own threshold on it
    let thrSlope = NaN; // dΨ/d ln λ at the last threshold found (Newton hint for the next row)
    const makeRow = (s: number, k: number, cur: Row[]): Row => {
      const left = cur[k - 1];
      const right = k + 1 < cur.length ? cur[k + 1] : undefined;
      let guess: number;
      let spread: number;
      if (left !== undefined && right !== undefined) {
        // a new row of a nested grid: the interpolant of the old rows (every other one) predicts the
        // threshold to about the old curve's tail; the linear midpoint bounds the spread
        const mid = 0.5 * (Math.log(left.thr[nu]) + Math.log(right.thr[nu]));
        guess = predictFromEvenRows(cur, k, nu) ?? mid;
        spread = Math.min(0.5 * Math.abs(Math.log(right.thr[nu]) - Math.log(left.thr[nu])) + 1e-9, Math.abs(guess - mid) + 1e-7);
      } else if (left !== undefined) {
        guess = Math.log(left.thr[nu]) + (s - left.s) * 0.5;
        spread = 0.5 * (s - left.s) + 1e-3;
      } else {
        guess = Math.log(lamMax(s)); // at s_e,ν the threshold equals λ_max by construction
        spread = 1e-3;
      }
      let lamRef = (Math.exp(guess) + lamMax(s)) * 1.2;
      for (let attempt = 0; ; attempt++) {
        const solver = newSolver(s, lamRef, settings.meshTolExcited);
        const thr: number[] = [];
        thr[nu] = solver.threshold(nu, guess, spread, thrSlope);
        if (solver.lastThresholdSlope > 0) thrSlope = solver.lastThresholdSlope;
        const need = thr[nu] + lamMax(s);
        if (need <= lamRef || attempt >= 3 || !Number.isFinite(need)) return { s, solver, thr };
        lamRef = need * 1.1;
        guess = Math.log(thr[nu]);
        spread = 1e-9;
      }
    };
    // threshold-relative coordinate v = ln((λ − λ_c)/λ_c) = u − ln λ_c(s) from ln(nearThreshold) to
    // the largest ln(λ_max/λ_c) of the map's rows: the strong-coupling turn (v ≈ 0) then sits at the
    // same place in every row, so few rows are needed in s
    const probeLo = makeRow(sA, 0, []);
    const probeHi = makeRow(sB, 1, [probeLo]);
    let vTop = Math.log(lamMax(sB) / probeHi.thr[nu]);
    for (let k = 1; k <= 32; k++) {
      const sk = sA + ((sB - sA) * k) / 32;
      const lc = probeLo.thr[nu] * Math.pow(probeHi.thr[nu] / probeLo.thr[nu], (sk - sA) / (sB - sA));
      vTop = Math.max(vTop, Math.log(lamMax(sk) / lc));
    }
    vTop += 0.05; // margin for the interpolated threshold between the probes
    const spec: Spec = { nu, uA: Math.log(settings.nearThreshold), shA: 0, uB: vTop, shB: 0, rel: true };
    const g = buildGroup([spec], sA, sB, (s, k, cur) => (k === 0 ? probeLo : k === cur.length - 1 ? probeHi : makeRow(s, k, cur)), null);
    surfaces.push(...g.surfaces);
    // threshold curve ln λ_c,ν(s) on the level's rows, refined (nested) to tolThreshold
    let rows = g.rows;
    for (;;) {
      const R = rows.length - 1;
      const vals = new Float64Array(R + 1);
      for (let k = 0; k <= R; k++) vals[k] = Math.log(rows[k].thr[nu]);
      const coef = new Float64Array(R + 1);
      chebCoefficients(vals, R, 0, 1, coef, 0, 1, cosTable(R));
      const tail = Math.abs(coef[R]) + Math.abs(coef[R - 1]);
      if (tail <= settings.tolThreshold || 2 * R > settings.degThresholdMax || !vals.every(Number.isFinite)) {
        // discretisation: the threshold re-solved with halved steps at three rows
        let disc = 0;
        for (const k of [0, R >> 1, R]) {
          const r = rows[k];
          const fine = newSolver(r.s, r.solver.lambdaRef, settings.meshTolExcited, 2);
          const f = fine.threshold(nu, Math.log(r.thr[nu]), 1e-9, r.solver.lastThresholdSlope);
          disc = Math.max(disc, Math.abs(f - r.thr[nu]) / f);
        }
        thresholds.push({ nu, sA, sB, deg: R, coef, relErr: 2 * tail + disc });
        break;
      }
      rows = nestedRows(rows, 2 * R, sA, sB, makeRow);
    }
  }
  if (K >= 1) excited = { sA: Math.min(...surfaces.map((x) => x.sA)), sB, surfaces };
  const levels = 1 + K;

  return {
    m,
    ground: { sA: sA0, sB: sB0, surfaces: groundSurface.surfaces },
    excited,
    thresholds,
    levels,
    nodeSolves,
    sweeps: work.sweeps,
  };

  // ---------------------------------------------------------------------------------------------

  /**
   * Surfaces G_ν for the given levels over [sA, sB]. Each level has its own degrees (degU, degS);
   * the group's rows are the Lobatto rows of the largest s-degree, either made by `makeRow` (nested
   * doubling) or taken from the threshold rows `thrRows` (a level of s-degree S uses every
   * (T/S)-th of them). Refinement: while 2(tail_u + tail_s) > tolG, raise the degree of the
   * direction with the larger tail (u: predicted degree or doubling; s: doubling, nested); new nodes
   * are predicted from the current interpolant.
   */
  function buildGroup(
    specs: Spec[],
    sA: number,
    sB: number,
    makeRow: ((s: number, k: number, cur: Row[]) => Row) | null,
    thrRows: Row[] | null,
  ): { surfaces: SurfaceModel[]; rows: Row[] } {
    const sMaxDeg = thrRows !== null ? thrRows.length - 1 : settings.degMax;
    let groupRows: Row[] = thrRows ?? nestedRows(null, Math.min(settings.degS0, sMaxDeg), sA, sB, makeRow!);
    const rowsOf = (deg: number): Row[] => {
      let R = groupRows.length - 1;
      if (thrRows === null) {
        while (R < deg) {
          groupRows = nestedRows(groupRows, 2 * R, sA, sB, makeRow!);
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

    const uOf = (q: number, xi: number, row: Row): number => {
      const sp = specs[q];
      const shift = sp.rel ? Math.log(row.thr[sp.nu]) : 0;
      const lo = sp.rel ? shift + sp.uA : sp.uA + sp.shA * row.s;
      const hi = sp.rel ? shift + sp.uB : sp.uB + sp.shB * row.s;
      return lo + ((xi + 1) / 2) * (hi - lo);
    };
    const solveNode = (q: number, row: Row, xi: number, guessG: number, spread: number): number => {
      const nu = specs[q].nu;
      const u = uOf(q, xi, row);
      const lambda = nodeThreshold(row, nu) + Math.exp(u);
      nodeSolves++;
      const solver = solverFor(row, nu);
      // the slope of the matching function at this row's previous root is a good Newton hint
      const lnEps = solver.lnLevel(lambda, nu, guessG + 2 * u, spread, LN_TINY, spread <= 0.5 ? solver.lastSlope : NaN);
      return lnEps - 2 * u;
    };
    // initial grid: row by row, node by node, each predicted from its neighbours
    const fillInitial = (q: number): void => {
      const U = degU[q];
      const S = degS[q];
      const rows = rowsOf(S);
      const xs = lobattoNodes(U);
      const ys = lobattoNodes(S);
      const v = values[q];
      const W = S + 1;
      /** v at (i, k) extrapolated in s from the rows before k (Lagrange on the rows' true positions). */
      const fromRows = (i: number, k: number): number => {
        const o = i * W;
        if (k === 1) return v[o];
        const y = ys[k];
        const y1 = ys[k - 1];
        const y2 = ys[k - 2];
        if (k === 2) return v[o + 1] + ((y - y1) * (v[o + 1] - v[o])) / (y1 - y2);
        const y3 = ys[k - 3];
        return (
          (v[o + k - 1] * (y - y2) * (y - y3)) / ((y1 - y2) * (y1 - y3)) +
          (v[o + k - 2] * (y - y1) * (y - y3)) / ((y2 - y1) * (y2 - y3)) +
          (v[o + k - 3] * (y - y1) * (y - y2)) / ((y3 - y1) * (y3 - y2))
        );
      };
      for (let k = 0; k <= S; k++) {
        throwIfAborted(signal);
        for (let i = 0; i <= U; i++) {
          let guess: number;
          let spread: number;
          if (k >= 1 && i >= 1) {
            // the s-extrapolation corrected by its error at the neighbouring u-node of this row
            const corr = v[(i - 1) * W + k] - fromRows(i - 1, k);
            guess = fromRows(i, k) + corr;
            spread = Math.min(0.5, 0.5 * Math.abs(corr) + 1e-6);
          } else if (k >= 2) {
            guess = fromRows(i, k);
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
     * u-degree predicted to bring the u-tail below tolG/16: the decay rate of the largest coefficient per
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
      const target = Math.log(settings.tolG / 16 / W);
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
      // refine until the error estimate 2(tail_u + tail_s) is below tolG (disc, ~1e-9, comes on top)
      for (;;) {
        if (2 * (tails[q].u + tails[q].s) <= settings.tolG) break;
        const needU = tails[q].u > settings.tolG / 8 && 2 * degU[q] <= settings.degMax;
        const needS = tails[q].s > settings.tolG / 8 && 2 * degS[q] <= Math.min(sMaxDeg, settings.degMax);
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
        const nu = sp.nu;
        // the node's mesh refined (every step halved); excited levels relative to the refined mesh's
        // own threshold, as the nodes are to theirs (the threshold curve's own discretisation error
        // is accounted for per cell)
        const sol = solverFor(r, nu);
        const fine = newSolver(r.s, sol.lambdaRef, nu === 0 ? settings.meshTolGround : settings.meshTolNode, 2);
        const thrFine = nu === 0 ? 0 : fine.threshold(nu, Math.log(nodeThreshold(r, nu)), 1e-9, sol.lastThresholdSlope);
        for (const i of [0, U >> 1, U]) {
          const u = uOf(q, xs[i], r);
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
        relThreshold: sp.rel,
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
