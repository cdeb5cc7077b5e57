/**
 * Continuation of one zero-range state from F → 0 (ξ → ∞) down to the
 * requested ξ values, labelling it by continuity (the state that is orbital m
 * at zero field), with the complex pole where its width is resolvable.
 */
import { ZeroRangeSolver, type KappaFunction, type ZeroRangeOptions, type ZeroRangeState } from './zeroRangeSolver.js';

/** Options of {@link traceState}. */
export interface TraceOptions extends ZeroRangeOptions {
  /**
   * ln(Γ/ε) below which the width is reported as unresolved: double precision
   * loses the far-orbital amplitudes that carry it (measured: results stop
   * agreeing between basis sizes near ln(Γ/ε) ≈ −60). Default −55.
   */
  resolvableLnWidth?: number;
  /** Largest continuation step in ξ (default 0.25; 0.125 below ξ = 3). */
  step?: number;
  fineStep?: number;
  /** Minimum modulus overlap of consecutive eigenvectors (default 0.97). */
  minOverlap?: number;
  /**
   * Stop the continuation once ln(Γ/ε) ≥ this (default 1: Γ ≈ 2.7 ε); smaller ξ
   * are then reported destroyed. The class there is unbound either way (Γ ≥ ε),
   * and overlapping broad poles make the continuation expensive and ambiguous.
   */
  stopLnWidth?: number;
}

/** A traced state at one requested ξ. */
export interface TracedState extends ZeroRangeState {
  /** True when the width is below the resolvable level (Re E is still exact; the width is an estimate). */
  unresolved: boolean;
  /** True when the pole could not be continued to this ξ (state destroyed / lost). */
  destroyed: boolean;
}

/** Zero-field gap to the nearest neighbour orbital, in units of ε_m. */
function neighbourGap(m: number, kappa: KappaFunction): number {
  const k = kappa(m);
  const up = 1 - (kappa(m + 1) / k) ** 2;
  const down = m > 0 ? (kappa(m - 1) / k) ** 2 - 1 : Infinity;
  return Math.max(1e-3, Math.min(Math.abs(up), Math.abs(down)));
}

/**
 * Trace the state continuing from orbital m (κ̃ from `kappa`, scaled so that
 * κ̃_m = √2) and return it at each ξ of `xiList` (any order; ξ ≥ 0.5).
 *
 * Path: real first-order problem from ξ_far = max(60, 40√(m+1)/gap) down to 12.5
 * in geometric steps (labelling), then the complex pole (first-order route
 * while ln(Γ/ε) is below the resolvable level) in adaptive steps of at most
 * 0.25 (0.125 below ξ = 3), each step accepted only if the eigenvector overlap
 * with the previous step is ≥ `minOverlap` and the pole lands within
 * 0.02 ε + ½|predicted move| of the linear prediction;
 * otherwise the step is halved (down to 1e-3). If the pole cannot be continued
 * (or Γ/ε > 20, Re E ≥ 0), or once ln(Γ/ε) ≥ `stopLnWidth`, all smaller ξ are
 * reported destroyed.
 *
 * @example
 * const [s] = traceState(0, powerLawKappa(0, 9), [4]);
 * // s.energy ≈ −1.0243, s.width ≈ 1.39e−7 (Γ/ε), s.method = 'pole'
 */
export function traceState(m: number, kappa: KappaFunction, xiList: readonly number[], options: TraceOptions = {}): TracedState[] {
  const floor = options.resolvableLnWidth ?? -55;
  const step = options.step ?? 0.25;
  const fine = options.fineStep ?? 0.125;
  const stopLn = options.stopLnWidth ?? 1;
  const minOverlap = options.minOverlap ?? 0.97;
  const solver = new ZeroRangeSolver(m, kappa, options);
  const wanted = [...new Set(xiList)].sort((a, b) => b - a);
  const out = new Map<number, TracedState>();
  // 1. labelling: real problem from far away
  let Er = -1;
  const xiFar = Math.max(60, (40 * Math.sqrt(m + 1)) / neighbourGap(m, kappa));
  const top = Math.max(12.5, wanted[0] ?? 12.5);
  for (let xi = xiFar; xi > top; xi *= 0.93) Er = solver.solveFirstOrder(xi, Er, 40, false).energy;
  // 2. stations: a regular ladder plus the requested points
  const stations = new Set<number>(wanted);
  for (let x = top; x >= 3 - 1e-9; x -= step) stations.add(Math.round(x * 1e9) / 1e9);
  for (let x = 3; x >= 0.5 - 1e-9; x -= fine) stations.add(Math.round(x * 1e9) / 1e9);
  const lowest = Math.max(0.5, wanted[wanted.length - 1] ?? 1);
  const ladder = [...stations].filter((x) => x <= top && x >= lowest).sort((a, b) => b - a);

  let Ei = 0; // 0 while the width is unresolved
  let xCur = NaN;
  let prev: { x: number; er: number; ei: number } | undefined;
  let destroyed = false;
  let last: TracedState | undefined;

  const attempt = (x: number): TracedState | undefined => {
    const saved = solver.eigenvector();
    if (Ei === 0) {
      const fo = solver.solveFirstOrder(x, Er);
      if (fo.converged && !(Math.log(fo.width) >= floor - 5)) {
        if (Math.abs(fo.energy - Er) > 0.05 || solver.overlap(saved) < minOverlap) {
          solver.setVector(saved);
          return undefined;
        }
        return { ...fo, unresolved: true, destroyed: false };
      }
      solver.setVector(saved);
    }
    // predictor: linear extrapolation of the complex pole along ξ
    let gr = Er;
    let gi = Ei;
    if (prev && Ei !== 0 && prev.ei !== 0 && Number.isFinite(xCur) && prev.x !== xCur) {
      const s = (x - xCur) / (xCur - prev.x);
      gr = Er + s * (Er - prev.er);
      gi = Math.min(Ei + s * (Ei - prev.ei), Ei * 0.5);
    }
    if (Ei === 0) {
      const fo = solver.solveFirstOrder(x, Er);
      gr = fo.energy;
      gi = -Math.max(fo.width, 1e-300) / 2;
      solver.setVector(saved);
    }
    const q = solver.solvePole(x, gr, gi);
    const ok =
      q.width < 20 &&
      q.energy < 0 &&
      (q.converged || Math.log(q.width) < -30) &&
      Math.abs(q.energy - gr) <= 0.02 + 0.5 * Math.abs(gr - Er) &&
      solver.overlap(saved) >= minOverlap;
    if (!ok) {
      solver.setVector(saved);
      return undefined;
    }
    return { ...q, unresolved: !q.converged || Math.log(q.width) < floor, destroyed: false };
  };

  let stopped = false;
  for (const x of ladder) {
    if (stopped && x < xCur) destroyed = true;
    if (!destroyed) {
      if (!Number.isFinite(xCur)) xCur = top + 1e-9;
      // adaptive sub-steps from xCur down to x
      let h = xCur - x;
      while (xCur > x) {
        const target = Math.max(x, xCur - h);
        const st = attempt(target);
        if (!st) {
          h /= 2;
          if (h < 1e-3) {
            destroyed = true;
            break;
          }
          continue;
        }
        prev = { x: xCur, er: Er, ei: Ei };
        xCur = target;
        Er = st.energy;
        Ei = st.unresolved ? 0 : -st.width / 2;
        last = st;
        if (!st.unresolved && Math.log(st.width) >= stopLn) {
          stopped = true;
          break;
        }
        h = Math.min(2 * h, xCur - x);
        if (h <= 0) break;
      }
    }
    if (wanted.includes(x)) {
      out.set(
        x,
        destroyed || !last
          ? { xi: x, energy: NaN, width: NaN, method: 'pole', orbitals: 0, nodes: 0, iterations: 0, converged: false, unresolved: false, destroyed: true }
          : { ...last, xi: x },
      );
    }
  }
  return xiList.map((x) => out.get(x)!);
}
