/**
 * Thermal ensemble of the ion's transverse motion (model.md §4).
 *
 * The transverse kinetic energy of an ion in thermal equilibrium is 2D
 * Maxwell–Boltzmann distributed, P(E⊥ > E) = e^(−E/kT) (quantized: E⊥ = (N + ½)Ω
 * with weights (1 − q) q^N, q = e^(−Ω/kT)). Γ grows monotonically with E⊥, so a
 * state is bound below E_b (Γ(E_b) = ħ/τ), a resonance between E_b and E_u, and
 * unbound above E_u (Γ(E_u) = ε, or destroyed):
 *   f_bound = 1 − e^(−E_b/kT),  f_resonance = e^(−E_b/kT) − e^(−E_u/kT),  f_unbound = e^(−E_u/kT).
 * For kT < Ω the quantized levels are used: with N(E) = #levels below E,
 *   f_bound = 1 − q^{N(E_b)},  f_unbound = q^{N(E_u)}.
 *
 * Source: 2D Maxwell–Boltzmann distribution of a transverse energy, e.g.
 * F. Reif, "Fundamentals of Statistical and Thermal Physics" (1965), §7.10;
 * Landau levels of the ion: L. D. Landau and E. M. Lifshitz, QM §112.
 */
import { stateWidthInto, WIDTH_FLAG } from './stateWidth.js';
import { WIDTH_TABLE_RANGE } from './widthTable.js';

const w = new Float64Array(3);

/** ln(Γ(E⊥)/ε) − ln(target/ε): +Infinity when destroyed, −Infinity when Γ = 0 (no underflow in between). */
function excess(eps: number, m: number, p: number, b: number, mass: number, ePerp: number, lnTarget: number): number {
  const f = stateWidthInto(eps, m, p, b, ePerp, mass, w);
  if (f & WIDTH_FLAG.DESTROYED) return Infinity;
  return w[2]! - lnTarget;
}

/**
 * Smallest E⊥ (hartree) at which Γ(E⊥) ≥ target, by safeguarded regula falsi
 * (Illinois variant) on ln E⊥, bisecting where Γ is 0 or the state destroyed.
 * Returns +Infinity if Γ stays below the target (only possible if the state is
 * never destroyed), and 0 if Γ ≥ target already as E⊥ → 0⁺ (not expected).
 * Relative accuracy of E⊥: 1e-8.
 */
export function criticalTransverseEnergy(
  eps: number,
  m: number,
  p: number,
  fieldAu: number,
  ionMass: number,
  target: number,
): number {
  const lnT = Math.log(target / eps);
  const omega = fieldAu / ionMass;
  // bracket: at ξ = 0.5 without recoil the state is destroyed
  let hi = Math.log((2 * eps * eps * ionMass) / fieldAu);
  let fhi = excess(eps, m, p, fieldAu, ionMass, Math.exp(hi), lnT);
  for (let k = 0; k < 40 && fhi < 0; k++) {
    hi += 1.5;
    fhi = excess(eps, m, p, fieldAu, ionMass, Math.exp(hi), lnT);
  }
  if (fhi < 0) return Infinity;
  const closed = eps - (m + 0.5) * omega;
  if (closed <= 0) {
    // no closed channel: as E⊥ → 0 the recoil-stretched ξ saturates at
    // ξ_sat = ε √(M/(B |ε_eff|)) (a → −∞, 2φ(a)/a → 2E⊥/|ε_eff|); below the table the
    // state is destroyed at every E⊥ (deeply non-adiabatic)
    const xiSat = eps * Math.sqrt(ionMass / (fieldAu * Math.max(-closed, 1e-300)));
    if (xiSat < WIDTH_TABLE_RANGE.xiMin) return 0;
  }
  let lo = Math.log(closed > 0 ? closed : eps * 1e-6);
  if (lo >= hi) lo = hi - 2;
  let flo = excess(eps, m, p, fieldAu, ionMass, Math.exp(lo), lnT);
  for (let k = 0; k < 30 && flo >= 0; k++) {
    hi = lo;
    fhi = flo;
    lo -= 4;
    flo = excess(eps, m, p, fieldAu, ionMass, Math.exp(lo), lnT);
  }
  if (flo >= 0) return 0;
  let side = 0;
  for (let it = 0; it < 100 && hi - lo > 1e-8; it++) {
    let s: number;
    if (Number.isFinite(flo) && Number.isFinite(fhi)) {
      s = (lo * fhi - hi * flo) / (fhi - flo);
      if (!(s > lo && s < hi)) s = 0.5 * (lo + hi);
    } else {
      s = 0.5 * (lo + hi);
    }
    const fs = excess(eps, m, p, fieldAu, ionMass, Math.exp(s), lnT);
    if (fs >= 0) {
      hi = s;
      fhi = fs;
      if (side === 1 && Number.isFinite(flo)) flo *= 0.5;
      side = 1;
    } else {
      lo = s;
      flo = fs;
      if (side === -1 && Number.isFinite(fhi)) fhi *= 0.5;
      side = -1;
    }
  }
  return Math.exp(hi);
}

/**
 * Fractions bound / resonance / unbound from the critical energies E_b ≤ E_u
 * (hartree), kT and Ω (hartree). Writes out[k0], out[k0+1], out[k0+2]; they sum
 * to 1 exactly up to rounding. Uses the quantized ion levels when kT < Ω.
 *
 * @example
 * const f = new Float64Array(3); thermalFractionsInto(1, 2, 1, 1e-9, f, 0);
 * // f = [1 − e^−1, e^−1 − e^−2, e^−2] = [0.632, 0.233, 0.135]
 */
export function thermalFractionsInto(eb: number, eu: number, kT: number, omega: number, out: Float64Array | Float32Array, k0: number): void {
  let pb: number; // P(E⊥ ≥ E_b)
  let pu: number; // P(E⊥ ≥ E_u)
  const e1 = Math.min(eb, eu);
  if (kT >= omega) {
    pb = Math.exp(-e1 / kT);
    pu = Math.exp(-eu / kT);
  } else {
    const nOf = (e: number): number => (e === Infinity ? Infinity : Math.max(0, Math.ceil(e / omega - 0.5)));
    const lnq = -omega / kT;
    pb = Math.exp(nOf(e1) * lnq);
    pu = Math.exp(nOf(eu) * lnq);
  }
  out[k0] = 1 - pb;
  out[k0 + 1] = pb - pu;
  out[k0 + 2] = pu;
}
