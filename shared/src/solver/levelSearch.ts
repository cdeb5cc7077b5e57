/**
 * Root search for one level on a given mesh: solve F(ε) = jπ for level j of
 * one parity, in s = ln ε, by a downward bracket search from an upper bound
 * followed by Brent's method. Internal to the solver.
 */
import { brentRoot } from './brentRoot.js';
import { pruferMismatch } from './pruferMismatch.js';
import type { SinhMesh } from './sinhMesh.js';

export interface LevelSearchResult {
  eps: number;
  resolved: boolean;
  evaluations: number;
}

/** Relative resolution of ε in the root search (absolute in ln ε). */
const S_TOL = 2e-15;

/**
 * @param sHi    ln ε with F(e^sHi) < jπ, i.e. above the level (raised if not)
 * @param sMin   ln of the smallest ε searched
 * @param sGuess optional ln ε near the level (warm start): the bracket is grown around it
 */
export function searchLevel(
  mesh: SinhMesh,
  lambda: number,
  odd: boolean,
  j: number,
  sHi: number,
  sMin: number,
  sGuess?: number,
): LevelSearchResult {
  let evaluations = 0;
  const target = j * Math.PI;
  const G = (s: number): number => {
    evaluations++;
    return pruferMismatch(mesh, lambda, Math.exp(s), odd) - target;
  };
  let lo = NaN;
  let gLo = NaN;
  let hi = NaN;
  let gHi = NaN;
  if (sGuess !== undefined && sGuess > sMin && sGuess < sHi) {
    const g0 = G(sGuess);
    let d = 0.02;
    if (g0 > 0) {
      lo = sGuess;
      gLo = g0;
      for (;;) {
        const s = lo + d;
        if (s >= sHi) break;
        const g = G(s);
        if (g <= 0) {
          hi = s;
          gHi = g;
          break;
        }
        lo = s;
        gLo = g;
        d *= 4;
      }
    } else {
      hi = sGuess;
      gHi = g0;
      for (;;) {
        const s = hi - d;
        if (s <= sMin) break;
        const g = G(s);
        if (g > 0) {
          lo = s;
          gLo = g;
          break;
        }
        hi = s;
        gHi = g;
        d *= 4;
      }
    }
  }
  if (Number.isNaN(hi)) {
    hi = sHi;
    gHi = G(hi);
    let guard = 0;
    while (gHi >= 0 && guard++ < 8) {
      hi += 1;
      gHi = G(hi);
    }
  }
  if (Number.isNaN(lo)) {
    let step = 1;
    lo = hi - step;
    for (;;) {
      if (lo <= sMin) {
        lo = sMin;
        gLo = G(lo);
        if (gLo <= 0) return { eps: Math.exp(sMin), resolved: false, evaluations };
        break;
      }
      gLo = G(lo);
      if (gLo > 0) break;
      hi = lo;
      gHi = gLo;
      step *= 2;
      lo = hi - step;
    }
  }
  const r = brentRoot(G, lo, hi, gLo, gHi, S_TOL);
  return { eps: Math.exp(r.x), resolved: true, evaluations };
}

/** Re-solve near a known root s0 (expanding a bracket s0 ± d). */
export function refineLevel(
  mesh: SinhMesh,
  lambda: number,
  odd: boolean,
  j: number,
  s0: number,
): LevelSearchResult {
  let evaluations = 0;
  const target = j * Math.PI;
  const G = (s: number): number => {
    evaluations++;
    return pruferMismatch(mesh, lambda, Math.exp(s), odd) - target;
  };
  let d = 1e-6;
  for (let i = 0; i < 12; i++) {
    const a = s0 - d;
    const b = s0 + d;
    const ga = G(a);
    const gb = G(b);
    if (ga > 0 && gb < 0) {
      const r = brentRoot(G, a, b, ga, gb, S_TOL);
      return { eps: Math.exp(r.x), resolved: true, evaluations };
    }
    d *= 10;
  }
  return { eps: Math.exp(s0), resolved: false, evaluations };
}
