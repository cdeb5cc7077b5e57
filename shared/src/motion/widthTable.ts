/**
 * Fast evaluation of the committed width table (generated offline by the exact
 * zero-range solver, shared/scripts/width-table/): y = ln(Γ/ε) and e = E_r/ε as
 * functions of the orbital m, the local shape number p and ξ = ε/(F l).
 *
 * Interpolation: g = y + ξ² bilinearly in ξ and 1/p (g is smooth where y falls
 * like −ξ²). The p nodes are per m: the base grid 2, 2.5, …, 9 plus refinement
 * nodes where the continued pole switches between neighbouring columns; across an
 * interval marked as a pole switch the nearer node is used, not a blend of two states. Beyond the large-ξ end ξ₁ = 11.5: y = y₁ − (ξ² − ξ₁²) + b ln(ξ/ξ₁)
 * (b the fitted slope of g against ln ξ), e + 1 ∝ ξ^(−2) (second-order Stark
 * shift). Below ξ = 1, or where a bracketing node has no state, the state is
 * destroyed. m > 16 or p outside [2, 9] are evaluated at the nearest table edge
 * and flagged outside (never silently clamped).
 *
 * Source: the project's exact solver (../exact/zeroRangeSolver.ts), generator
 * version in WIDTH_TABLE_GENERATOR.
 */
import {
  WIDTH_TABLE_B,
  WIDTH_TABLE_E,
  WIDTH_TABLE_G,
  WIDTH_TABLE_M_START,
  WIDTH_TABLE_P,
  WIDTH_TABLE_P_NODES,
  WIDTH_TABLE_SWITCH,
  WIDTH_TABLE_XI,
} from './table/widthTableData.js';

const NM = WIDTH_TABLE_M_START.length - 1;
const NX = WIDTH_TABLE_XI.length;
const G = Float64Array.from(WIDTH_TABLE_G);
const EE = Float64Array.from(WIDTH_TABLE_E);
// one padding entry: a switch interval at the last column reads BB[c + 1] with weight 0
const BB = Float64Array.from([...WIDTH_TABLE_B, 0]);
const M_START = Int32Array.from(WIDTH_TABLE_M_START);
const P_NODES = Float64Array.from(WIDTH_TABLE_P_NODES);
const INV_P = Float64Array.from(WIDTH_TABLE_P_NODES, (p) => 1 / p);
const SWITCH = Uint8Array.from(WIDTH_TABLE_SWITCH);
const XI = Float64Array.from(WIDTH_TABLE_XI);
const XI_MIN = XI[0]!;
const XI_MAX = XI[NX - 1]!;
const P_MIN = WIDTH_TABLE_P[0]!;
const P_MAX = WIDTH_TABLE_P[WIDTH_TABLE_P.length - 1]!;
/**
 * O(1) p bracket on the per-m (non-uniform) p nodes: bins of width 1/BINS_PER_UNIT over
 * [P_MIN, P_MAX]; P_LOOKUP[m·NB + k] is the last column of m whose node is ≤ the bin's lower
 * edge (at most the second-to-last column of m). The lookup then steps forward over the few
 * nodes inside the bin.
 */
const BINS_PER_UNIT = 64;
const NB = Math.ceil((P_MAX - P_MIN) * BINS_PER_UNIT) + 1;
const P_LOOKUP = new Int32Array(NM * NB);
for (let m = 0; m < NM; m++) {
  const last = M_START[m + 1]! - 2;
  let c = M_START[m]!;
  for (let k = 0; k < NB; k++) {
    const edge = P_MIN + k / BINS_PER_UNIT;
    while (c < last && P_NODES[c + 1]! <= edge) c++;
    P_LOOKUP[m * NB + k] = c;
  }
}
// ξ grid: uniform fine part then uniform coarse part
const FINE_STEP = XI[1]! - XI[0]!;
let fineCount = 1;
while (fineCount < NX && Math.abs(XI[fineCount]! - XI[fineCount - 1]! - FINE_STEP) < 1e-9) fineCount++;
const XI_SPLIT = XI[fineCount - 1]!;
const COARSE_STEP = XI[fineCount]! - XI[fineCount - 1]!;

/** Largest orbital in the table. */
export const WIDTH_TABLE_M_MAX = NM - 1;
/** Table range of the shape number p and of ξ. */
export const WIDTH_TABLE_RANGE = { pMin: P_MIN, pMax: P_MAX, xiMin: XI_MIN, xiMax: XI_MAX } as const;

/** Status bits returned by {@link widthTableInto}. */
export const TABLE_STATUS = {
  /** ξ below the table or a bracketing node without a state: destroyed. */
  DESTROYED: 1,
  /** m or p outside the table: evaluated at the nearest edge. */
  OUTSIDE: 2,
  /** ξ beyond the large-ξ end: asymptotic continuation. */
  CONTINUED: 4,
} as const;

/**
 * Evaluate the table: writes out[0] = y = ln(Γ/ε), out[1] = e = E_r/ε and
 * returns TABLE_STATUS bits (0 = inside the table). Allocation-free.
 *
 * Domain: m integer ≥ 0, p > 0, ξ > 0 (NaN in → NaN out, DESTROYED).
 *
 * @example
 * const out = new Float64Array(2);
 * widthTableInto(0, 9, 4, out); // 0; out[0] ≈ ln(1.39e−7) = −15.79, out[1] ≈ −1.0243
 */
export function widthTableInto(m: number, p: number, xi: number, out: Float64Array): number {
  if (!(xi >= XI_MIN) || !(p > 0) || !(m >= 0)) {
    out[0] = NaN;
    out[1] = NaN;
    return TABLE_STATUS.DESTROYED;
  }
  const br = SCRATCH;
  tablePBracket(m, p, br);
  const status = br[4] === 1 ? TABLE_STATUS.OUTSIDE : 0;
  const y = tableLnWidth(br, xi);
  if (y !== y) {
    // a corner without a state (or ξ beyond the end of a column without a state): destroyed
    out[0] = NaN;
    out[1] = NaN;
    return status | TABLE_STATUS.DESTROYED;
  }
  out[0] = y;
  out[1] = tableEnergyRatio(br, xi);
  return xi > XI_MAX ? status | TABLE_STATUS.CONTINUED : status;
}

const SCRATCH = new Float64Array(5);

/**
 * Lower-level lookups for the per-cell loop: the p bracket is resolved once per
 * state ({@link tablePBracket}), then E_r/ε and ln(Γ/ε) are read separately.
 * `br` holds [base0, base1, wp, column index c (continuation slopes B[c], B[c + 1]), outside(0/1)].
 * Across a pole-switch interval (SWITCH[c] = 1) both bases are the nearer column and wp = 0.
 */
export function tablePBracket(m: number, p: number, br: Float64Array): void {
  let im = m;
  let outside = 0;
  if (im > NM - 1) {
    im = NM - 1;
    outside = 1;
  }
  let pp = p;
  if (pp < P_MIN - 1e-9) {
    pp = P_MIN;
    outside = 1;
  } else if (pp > P_MAX + 1e-9) {
    pp = P_MAX;
    outside = 1;
  }
  let k = ((pp - P_MIN) * BINS_PER_UNIT) | 0;
  if (k < 0) k = 0;
  else if (k > NB - 1) k = NB - 1;
  let c = P_LOOKUP[im * NB + k]!;
  const last = M_START[im + 1]! - 2;
  while (c < last && P_NODES[c + 1]! <= pp) c++;
  let wp = (1 / pp - INV_P[c]!) / (INV_P[c + 1]! - INV_P[c]!);
  if (SWITCH[c] === 1) {
    // the two columns follow different poles: take the nearer one, never a blend of the two
    if (wp >= 0.5) c++;
    br[0] = c * NX;
    br[1] = c * NX;
    br[2] = 0;
    br[3] = c;
    br[4] = outside;
    return;
  }
  if (wp < 0) wp = 0;
  br[0] = c * NX;
  br[1] = br[0] + NX;
  br[2] = wp;
  br[3] = c;
  br[4] = outside;
}

function xiIndex(xi: number): number {
  let ix = xi <= XI_SPLIT ? Math.floor((xi - XI_MIN) / FINE_STEP) : fineCount - 1 + Math.floor((xi - XI_SPLIT) / COARSE_STEP);
  if (ix > NX - 2) ix = NX - 2;
  if (ix < 0) ix = 0;
  return ix;
}

/** E_r/ε at ξ for a resolved p bracket; NaN where destroyed. Same values as {@link widthTableInto}. */
export function tableEnergyRatio(br: Float64Array, xi: number): number {
  if (!(xi >= XI_MIN)) return NaN;
  const b0 = br[0]!;
  const b1 = br[1]!;
  const wp = br[2]!;
  if (xi > XI_MAX) {
    const k = NX - 1;
    const e1 = (1 - wp) * EE[b0 + k]! + wp * EE[b1 + k]!;
    const r = XI_MAX / xi;
    return -1 + (e1 + 1) * r * r;
  }
  const ix = xiIndex(xi);
  const x0 = XI[ix]!;
  const wx = (xi - x0) / (XI[ix + 1]! - x0);
  return (1 - wp) * ((1 - wx) * EE[b0 + ix]! + wx * EE[b0 + ix + 1]!) + wp * ((1 - wx) * EE[b1 + ix]! + wx * EE[b1 + ix + 1]!);
}

/** ln(Γ/ε) at ξ for a resolved p bracket; NaN where destroyed. Same values as {@link widthTableInto}. */
export function tableLnWidth(br: Float64Array, xi: number): number {
  if (!(xi >= XI_MIN)) return NaN;
  const b0 = br[0]!;
  const b1 = br[1]!;
  const wp = br[2]!;
  if (xi > XI_MAX) {
    const k = NX - 1;
    const g1 = (1 - wp) * G[b0 + k]! + wp * G[b1 + k]!;
    const jb = br[3]!;
    const b = (1 - wp) * BB[jb]! + wp * BB[jb + 1]!;
    return g1 - xi * xi + b * Math.log(xi / XI_MAX);
  }
  const ix = xiIndex(xi);
  const x0 = XI[ix]!;
  const wx = (xi - x0) / (XI[ix + 1]! - x0);
  const g = (1 - wp) * ((1 - wx) * G[b0 + ix]! + wx * G[b0 + ix + 1]!) + wp * ((1 - wx) * G[b1 + ix]! + wx * G[b1 + ix + 1]!);
  return g - xi * xi;
}

/**
 * The ξ at which the interpolated table (for a resolved p bracket) crosses ln(Γ/ε) = lnT: the largest
 * ξ* such that ln(Γ/ε) < lnT for every ξ > ξ* (where the column is non-increasing, as the generator's
 * monotone envelope makes it, ln(Γ/ε) ≥ lnT or destroyed for ξ ≤ ξ*). Inside a segment y = g − ξ²
 * with g linear, so the crossing is the root of a quadratic; beyond the large-ξ end the continuation
 * is solved by Newton steps; where a segment has a node without a state, ξ* is its upper node (the
 * start of the destroyed region); XI_MIN when the whole column lies below lnT.
 *
 * @example
 * const br = new Float64Array(5); tablePBracket(0, 9, br);
 * tableXiAtLnWidth(br, tableLnWidth(br, 4.3)) // 4.3 (to rounding)
 */
export function tableXiAtLnWidth(br: Float64Array, lnT: number): number {
  const b0 = br[0]!;
  const b1 = br[1]!;
  const wp = br[2]!;
  const gAt = (k: number): number => (1 - wp) * G[b0 + k]! + wp * G[b1 + k]!;
  const k1 = NX - 1;
  const g1 = gAt(k1);
  if (g1 === g1 && g1 - XI_MAX * XI_MAX >= lnT) {
    // beyond the end: y = g1 − ξ² + b ln(ξ/ξ1), decreasing; Newton from the estimate without the log
    const b = (1 - wp) * BB[br[3]!]! + wp * BB[br[3]! + 1]!;
    let x = Math.sqrt(XI_MAX * XI_MAX + g1 - lnT);
    for (let it = 0; it < 30; it++) {
      const f = g1 - x * x + b * Math.log(x / XI_MAX) - lnT;
      const dx = f / (2 * x - b / x);
      x += dx;
      if (Math.abs(dx) <= 1e-13 * x) break;
    }
    return x;
  }
  let gNext = g1;
  for (let k = k1 - 1; k >= 0; k--) {
    const x0 = XI[k]!;
    const x1 = XI[k + 1]!;
    const g0 = gAt(k);
    if (g0 !== g0 || gNext !== gNext) return x1; // destroyed below x1 (a corner without a state)
    if (g0 - x0 * x0 >= lnT) {
      // g0 + s(ξ − x0) − ξ² = lnT on [x0, x1]: the larger root
      const sl = (gNext - g0) / (x1 - x0);
      const c = g0 - sl * x0 - lnT;
      const disc = sl * sl + 4 * c;
      const r = 0.5 * (sl + Math.sqrt(Math.max(0, disc)));
      return r < x0 ? x0 : r > x1 ? x1 : r;
    }
    gNext = g0;
  }
  return XI_MIN;
}

/**
 * The evaluator's typed arrays and grid constants, for a fused per-state loop that repeats
 * {@link tablePBracket}, {@link tableEnergyRatio} and {@link tableLnWidth} step for step
 * (classifyCells.ts; its test checks the two give the same bits). Read-only.
 */
export const WIDTH_TABLE_INTERNALS = {
  G,
  EE,
  BB,
  M_START,
  INV_P,
  P_NODES,
  SWITCH,
  XI,
  P_LOOKUP,
  NM,
  NX,
  NB,
  BINS_PER_UNIT,
  P_MIN,
  P_MAX,
  XI_MIN,
  XI_MAX,
  XI_SPLIT,
  FINE_STEP,
  COARSE_STEP,
  FINE_COUNT: fineCount,
} as const;
