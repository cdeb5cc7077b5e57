/**
 * Jump detector of the width-table generator: finds p intervals of one orbital m where the two
 * neighbouring table columns follow different complex poles (the state continued from F → 0
 * switches between overlapping resonances of nearly degenerate orbitals). Linear interpolation in
 * 1/p across such an interval averages two different states.
 *
 * Measure, per interval (c, c+1) and ξ node where both columns and their neighbours are in the
 * laboratory regime (ln(Γ/ε) ≤ LAB_MAX_LN_WIDTH): the slope s_c = Δe/Δu of e = E_r/ε in u = 1/p
 * across the interval. Along one smooth pole the slope changes monotonically from interval to
 * interval, so s_c lies between the slopes of the two adjacent intervals (at the ends of the p
 * range: between 0 and twice the one adjacent slope). The score is how far s_c lies outside that
 * range times the interval's width |Δu|, i.e. the part of the step of e that the neighbours do not
 * explain. The same on y = ln(Γ/ε) (nodes with ln(Γ/ε) ≥ −45). An interval is flagged when the e
 * score exceeds E_JUMP or the y score exceeds Y_JUMP at some laboratory node.
 */
import { LAB_MAX_LN_WIDTH } from './tableGrid.js';

/** Thresholds of the detector (e = E_r/ε, y = ln(Γ/ε)). */
export const E_JUMP = 0.1;
export const Y_JUMP = 0.2;

export interface IntervalScore {
  /** Index of the lower column of the interval. */
  c: number;
  pLo: number;
  pHi: number;
  /** Largest e score and the ξ node where it occurs. */
  scoreE: number;
  xiE: number;
  /** Largest y score (nodes with ln(Γ/ε) ≥ −45 only). */
  scoreY: number;
  xiY: number;
  flagged: boolean;
}

/**
 * Scores of every p interval of one m. `ps` ascending; `y[c][i]`, `e[c][i]` the columns on the ξ
 * nodes `xi` (NaN where destroyed).
 */
export function scorePoleSwitches(ps: readonly number[], y: readonly (readonly number[])[], e: readonly (readonly number[])[], xi: readonly number[]): IntervalScore[] {
  const u = ps.map((p) => 1 / p);
  const lab = (c: number, i: number): boolean => c >= 0 && c < ps.length && y[c]![i]! <= LAB_MAX_LN_WIDTH; // false for NaN
  const res: IntervalScore[] = [];
  for (let c = 0; c + 1 < ps.length; c++) {
    const r: IntervalScore = { c, pLo: ps[c]!, pHi: ps[c + 1]!, scoreE: 0, xiE: NaN, scoreY: 0, xiY: NaN, flagged: false };
    const du = Math.abs(u[c + 1]! - u[c]!);
    for (let i = 0; i < xi.length; i++) {
      if (!lab(c, i) || !lab(c + 1, i)) continue;
      for (const [f, isY] of [
        [e, false],
        [y, true],
      ] as const) {
        if (isY && !(y[c]![i]! >= -45 && y[c + 1]![i]! >= -45)) continue;
        const step = f[c + 1]![i]! - f[c]![i]!;
        const sc = step / (u[c + 1]! - u[c]!);
        const adj: number[] = [];
        for (const k of [c - 1, c + 1]) {
          if (lab(k, i) && lab(k + 1, i)) adj.push((f[k + 1]![i]! - f[k]![i]!) / (u[k + 1]! - u[k]!));
        }
        if (adj.length === 0) continue;
        const lo = adj.length === 2 ? Math.min(adj[0]!, adj[1]!) : Math.min(0, 2 * adj[0]!);
        const hi = adj.length === 2 ? Math.max(adj[0]!, adj[1]!) : Math.max(0, 2 * adj[0]!);
        const score = (sc < lo ? lo - sc : sc > hi ? sc - hi : 0) * du;
        if (isY && score > r.scoreY) {
          r.scoreY = score;
          r.xiY = xi[i]!;
        } else if (!isY && score > r.scoreE) {
          r.scoreE = score;
          r.xiE = xi[i]!;
        }
      }
    }
    r.flagged = r.scoreE > E_JUMP || r.scoreY > Y_JUMP;
    res.push(r);
  }
  return res;
}
