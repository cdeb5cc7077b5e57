/**
 * The naive baseline of the engine benchmark (issue 3, item 9): per cell and orbital, the scaled
 * problem −½ g'' + λ w_m(ζ; ρ_c) g = −ε̃ g discretised by second-order finite differences on a
 * uniform, cell-centred grid ζ_i = (i + ½)h, i = 0…N−1, on [0, Z] (g'(0) = 0 for even levels, g(0) = 0
 * for odd ones by reflection of the ghost value, g(Z) = 0), and the lowest eigenvalues of the
 * resulting symmetric tridiagonal matrix found by Sturm-sequence bisection (W. Barth, R. S. Martin,
 * J. H. Wilkinson, Numer. Math. 9, 386 (1967); the count of eigenvalues below x is the number of
 * negative pivots of the LDLᵀ factorisation of T − xI). Benchmark code only.
 */
import { makeScaledPotential } from '../src/potential/scaledPotential.js';

/** Number of eigenvalues of the tridiagonal (diag a, constant off-diagonal b) below x. */
function sturmCount(a: Float64Array, b2: number, x: number): number {
  let count = 0;
  let d = a[0] - x;
  if (d < 0) count++;
  const n = a.length;
  for (let i = 1; i < n; i++) {
    if (d === 0) d = 1e-300;
    d = a[i] - x - b2 / d;
    if (d < 0) count++;
  }
  return count;
}

/**
 * Scaled bindings ε̃ (largest first) of the `levels` deepest states of each parity, from a uniform
 * grid of N points on [0, Z]: returns the levels ν = 0…nLevels−1 (alternating parity).
 * Bisection to relative 1e-10 of each eigenvalue.
 */
export function naiveLevels(m: number, lambda: number, rhoC: number, nLevels: number, Z: number, N: number): Float64Array {
  const w = makeScaledPotential(m, rhoC);
  const h = Z / N;
  const off = -0.5 / (h * h);
  const b2 = off * off;
  const aEven = new Float64Array(N);
  let vMin = 0;
  for (let i = 0; i < N; i++) {
    const v = lambda * w((i + 0.5) * h);
    aEven[i] = 1 / (h * h) + v;
    if (v < vMin) vMin = v;
  }
  const aOdd = aEven.slice();
  aEven[0] += off; // ghost g₋₁ = g₀
  aOdd[0] -= off; // ghost g₋₁ = −g₀
  const out = new Float64Array(nLevels);
  for (let nu = 0; nu < nLevels; nu++) {
    const a = nu % 2 === 0 ? aEven : aOdd;
    const k = nu >> 1; // k-th eigenvalue (0-based) of that parity
    // E_k ∈ (lo, hi): bisection in ln|E| (the eigenvalues span many decades)
    let lo = vMin * 1.0001;
    let hi = vMin * 1e-40;
    for (let it = 0; it < 400; it++) {
      const mid = -Math.sqrt(lo * hi);
      if (sturmCount(a, b2, mid) > k) hi = mid; // more than k eigenvalues below mid: E_k < mid
      else lo = mid;
      if (Math.abs(hi - lo) <= 1e-10 * Math.abs(hi)) break;
    }
    out[nu] = -0.5 * (lo + hi);
  }
  return out;
}
