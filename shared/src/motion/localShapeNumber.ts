/**
 * Local shape number of the orbital binding sequence,
 *   p = ln(ε_m/ε_{m+2}) / ln((2m+5)/(2m+1)),
 * the exponent of the local power law ε_j ∝ (2j+1)^(−p) that, with m and ξ,
 * fixes ln(Γ/ε) in the zero-range model (model.md §4). For the polarization
 * potential with r_c → 0, ε_m ∝ [Γ(m − ½)/m!]² so p → 3 at large m.
 *
 * When ε_{m+2} is missing (beyond m_max, or that state does not exist: ε ≤ 0)
 * the nearest available pair is used, in this order: (m−1, m+1), (m, m+1),
 * (m−1, m); the general pair formula is p = ln(ε_j/ε_k)/ln((2k+1)/(2j+1)).
 * Returns NaN if no pair is available or the sequence is not decreasing there.
 *
 * @example localShapeNumber([8, 1, 0.2], 0) // ln(40)/ln(5) = 2.292
 */
export function localShapeNumber(eps: ArrayLike<number>, m: number): number {
  const n = eps.length;
  const at = (j: number): number => (j >= 0 && j < n && eps[j]! > 0 ? eps[j]! : NaN);
  const pair = (j: number, k: number): number => {
    const a = at(j);
    const b = at(k);
    if (!(a > 0 && b > 0)) return NaN;
    const p = Math.log(a / b) / Math.log((2 * k + 1) / (2 * j + 1));
    return p > 0 ? p : NaN;
  };
  let p = pair(m, m + 2);
  if (Number.isNaN(p)) p = pair(m - 1, m + 1);
  if (Number.isNaN(p)) p = pair(m, m + 1);
  if (Number.isNaN(p)) p = pair(m - 1, m);
  return p;
}

// 1/ln((2k+1)/(2j+1)) for k − j = 1, 2 and j < 256 (built once; pure)
const INV_LOG_RATIO_1 = Float64Array.from({ length: 256 }, (_, j) => 1 / Math.log((2 * j + 3) / (2 * j + 1)));
const INV_LOG_RATIO_2 = Float64Array.from({ length: 256 }, (_, j) => 1 / Math.log((2 * j + 5) / (2 * j + 1)));

function stridedPair(eps: Float64Array, offset: number, stride: number, mMax: number, j: number, k: number): number {
  if (j < 0 || k > mMax) return NaN;
  const a = eps[offset + j * stride]!;
  const b = eps[offset + k * stride]!;
  if (!(a > 0 && b > 0)) return NaN;
  const inv = j < 256 ? (k - j === 1 ? INV_LOG_RATIO_1[j]! : INV_LOG_RATIO_2[j]!) : 1 / Math.log((2 * k + 1) / (2 * j + 1));
  const p = Math.log(a / b) * inv;
  return p > 0 ? p : NaN;
}

/**
 * Same as {@link localShapeNumber} on a strided array (allocation-free, for the
 * per-cell loop): orbital j of the state sits at `eps[offset + j·stride]`, j ≤ mMax.
 */
export function localShapeNumberStrided(eps: Float64Array, offset: number, stride: number, mMax: number, m: number): number {
  // fast path: the pair (m, m + 2) exists (almost every state of a map)
  if (m + 2 <= mMax && m < 256) {
    const a = eps[offset + m * stride]!;
    const b = eps[offset + (m + 2) * stride]!;
    if (a > 0 && b > 0) {
      const q = Math.log(a / b) * INV_LOG_RATIO_2[m]!;
      if (q > 0) return q;
    }
  }
  let p = stridedPair(eps, offset, stride, mMax, m, m + 2);
  if (p !== p) p = stridedPair(eps, offset, stride, mMax, m - 1, m + 1);
  if (p !== p) p = stridedPair(eps, offset, stride, mMax, m, m + 1);
  if (p !== p) p = stridedPair(eps, offset, stride, mMax, m - 1, m);
  return p;
}
