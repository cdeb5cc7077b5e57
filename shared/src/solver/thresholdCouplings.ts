import { brentRoot } from './brentRoot.js';
import { buildMesh, validateSolverOptions } from './solveBoundStates.js';
import type { BoundStateOptions, EvenPotential } from './types.js';
import { zeroEnergyPhase } from './zeroEnergyPhase.js';

/**
 * Threshold couplings λ_c,ν of the family λ·w(x): level ν (ν = 0, 1, …,
 * parity ν mod 2) is bound for λ > λ_c,ν and absent below. λ_c,0 = 0 when
 * ∫w < 0 (1D weak coupling, B. Simon, Ann. Phys. 97, 279 (1976)). For
 * ν ≥ 1, level j = ⌊ν/2⌋ of its parity appears when the zero-energy phase
 * Ψ(λ) reaches (j + 1)π — with a 1/x⁴ tail (c4 given) this is tan φ = 0 for
 * the tail solution x·sin(k/x + φ), k = √(2λc4). Root search in ln λ by
 * Brent's method after a doubling bracket search.
 *
 * Units: λ dimensionless (w carries the energy unit). Bad input: throws
 * EngineInputError. `opts.coupling` is ignored.
 *
 * @example
 * // Pöschl–Teller shape w = −1/cosh²x: λ(λ'+1)/2 = coupling; level ν appears at λ' = ν,
 * // i.e. at coupling ν(ν+1)/2:
 * thresholdCouplings((x) => -1 / Math.cosh(x) ** 2, 3) // [0, 1, 3, 6] (to ~1e-10)
 */
export function thresholdCouplings(w: EvenPotential, nuMax: number, opts: BoundStateOptions = {}): number[] {
  validateSolverOptions(w, { ...opts, nuMax });
  const out: number[] = [0];
  let lamLo = 0;
  for (let nu = 1; nu <= nuMax; nu++) {
    const odd = nu % 2 === 1;
    const target = ((nu >> 1) + 1) * Math.PI;
    let hi = lamLo > 0 ? lamLo * 2 : 1;
    let lo = lamLo;
    let mesh = buildMesh(w, opts, 1, hi);
    let guard = 0;
    while (zeroEnergyPhase(mesh, hi, odd, opts.c4) < target && guard++ < 200) {
      lo = hi;
      hi *= 2;
      mesh = buildMesh(w, opts, 1, hi);
    }
    if (lo === 0) {
      // search downward for a lower bracket
      lo = hi / 2;
      while (zeroEnergyPhase(mesh, lo, odd, opts.c4) >= target && lo > 1e-300) lo /= 2;
    }
    const f = (s: number): number => zeroEnergyPhase(mesh, Math.exp(s), odd, opts.c4) - target;
    const sLo = Math.log(lo);
    const sHi = Math.log(hi);
    const r = brentRoot(f, sLo, sHi, f(sLo), f(sHi), 1e-14);
    const lam = Math.exp(r.x);
    out.push(lam);
    lamLo = lam;
  }
  return out;
}
