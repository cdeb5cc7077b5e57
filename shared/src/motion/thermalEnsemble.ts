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
import { recoilStretch } from './recoilStretch.js';
import { DEFAULT_SHAPE_NUMBER } from './stateWidth.js';
import { tableEnergyRatio, tableLnWidth, tablePBracket, tableXiAtLnWidth, WIDTH_TABLE_RANGE } from './widthTable.js';

// The state being inverted (module scalars: the per-cell loop allocates nothing). `lnWidthAt` repeats
// stateWidthCore's arithmetic step for step (same F, ξ, Stark shift, recoil factor and table reads),
// with the table's p bracket resolved once per state instead of once per evaluation.
const br = new Float64Array(5);
let sEps = 0;
let sXi0 = 0; // ε√B / (B √(2/M)): ξ = sXi0 / √E⊥
let sThreshold = 0; // (m + ½)Ω

function prepareState(eps: number, m: number, p: number, fieldAu: number, ionMass: number): void {
  tablePBracket(m, p > 0 ? p : DEFAULT_SHAPE_NUMBER, br);
  sEps = eps;
  sXi0 = (eps * Math.sqrt(fieldAu)) / (fieldAu * Math.sqrt(2 / ionMass));
  sThreshold = (m + 0.5) * (fieldAu / ionMass);
}

/** ln(Γ(E⊥)/ε) at E⊥ = e^u for the prepared state: +Infinity when destroyed, −Infinity when Γ = 0 (channel closed). */
function lnWidthAt(u: number): number {
  const ePerp = Math.exp(u);
  const xi = sXi0 / Math.sqrt(ePerp);
  const e = tableEnergyRatio(br, xi);
  const bindingShifted = e === e ? -e * sEps : sEps;
  const a = (bindingShifted - sThreshold) / ePerp;
  if (a >= 1) return -Infinity;
  const y = tableLnWidth(br, xi * recoilStretch(a));
  return y === y ? y : Infinity;
}

/**
 * Smallest ln E⊥ in (lo, hi] at which ln(Γ/ε) ≥ lnT, given f(lo) < 0 ≤ f(hi) for f = lnWidthAt − lnT:
 * safeguarded regula falsi (Illinois variant), bisecting while an end is infinite (Γ = 0 or destroyed).
 * Relative accuracy of E⊥: 1e-8.
 */
function solveBracket(lo: number, flo: number, hi: number, fhi: number, lnT: number): number {
  let side = 0;
  for (let it = 0; it < 100 && hi - lo > 1e-8; it++) {
    let s: number;
    if (flo !== -Infinity && fhi !== Infinity) {
      s = (lo * fhi - hi * flo) / (fhi - flo);
      if (!(s > lo && s < hi)) s = 0.5 * (lo + hi);
    } else {
      s = 0.5 * (lo + hi);
    }
    const fs = lnWidthAt(s) - lnT;
    if (fs >= 0) {
      hi = s;
      fhi = fs;
      if (side === 1 && flo !== -Infinity) flo *= 0.5;
      side = 1;
    } else {
      lo = s;
      flo = fs;
      if (side === -1 && fhi !== Infinity) fhi *= 0.5;
      side = -1;
    }
  }
  return hi;
}

/**
 * Whether the prepared state has no closed channel and is destroyed at every E⊥: as E⊥ → 0 the
 * recoil-stretched ξ saturates at ξ_sat = ε √(M/(B |ε_eff|)) (a → −∞, 2φ(a)/a → 2E⊥/|ε_eff|), and
 * below the table the state is destroyed (deeply non-adiabatic).
 */
function destroyedAtEveryEnergy(fieldAu: number, ionMass: number): boolean {
  const closed = sEps - sThreshold;
  if (closed > 0) return false;
  const xiSat = sEps * Math.sqrt(ionMass / (fieldAu * Math.max(-closed, 1e-300)));
  return xiSat < WIDTH_TABLE_RANGE.xiMin;
}

/** ln ξ_eff(E⊥) at E⊥ = e^u for the prepared state (the table argument after the recoil stretch); +Infinity when the channel is closed. */
function lnXiEffAt(u: number): number {
  const ePerp = Math.exp(u);
  const xi = sXi0 / Math.sqrt(ePerp);
  const e = tableEnergyRatio(br, xi);
  const bindingShifted = e === e ? -e * sEps : sEps;
  const a = (bindingShifted - sThreshold) / ePerp;
  if (a >= 1) return Infinity;
  return Math.log(xi * recoilStretch(a));
}

/**
 * ln E⊥ of the prepared state's crossing of ln(Γ/ε) = lnT. Γ ≥ target exactly where the stretched
 * table argument ξ_eff(E⊥) ≤ ξ*, the table's own crossing (tableXiAtLnWidth), and ξ_eff falls
 * continuously as E⊥ grows; so the root of ln ξ* − ln ξ_eff(u) is found by the Illinois search from a
 * bracket around u₀ = 2 ln(ξ(1)/ξ*) (the crossing without recoil and shift), stepping 0.25, 0.5, 1, …
 * outwards. This avoids bisecting the jump at the edge of the destroyed region. Falls back to
 * {@link crossingWide} when no bracket is found. ±Infinity as there.
 */
function crossingNear(lnT: number, fieldAu: number, ionMass: number, hiStart: number): number {
  if (destroyedAtEveryEnergy(fieldAu, ionMass)) return -Infinity;
  const closed = sEps - sThreshold;
  if (closed <= 0) {
    // no closed channel: ξ_eff falls to ξ_sat as E⊥ → 0; at or below ξ* there, Γ ≥ target at every E⊥
    const xiSat = sEps * Math.sqrt(ionMass / (fieldAu * -closed));
    const ySat = tableLnWidth(br, xiSat);
    if (!(ySat < lnT)) return -Infinity;
  }
  const lnXiStar = Math.log(tableXiAtLnWidth(br, lnT));
  const h = (u: number): number => lnXiStar - lnXiEffAt(u);
  const u0 = 2 * (Math.log(sXi0) - lnXiStar);
  const f0 = h(u0);
  let step = 0.25;
  let lo: number;
  let flo: number;
  let hi: number;
  let fhi: number;
  if (f0 >= 0) {
    hi = u0;
    fhi = f0;
    for (;;) {
      lo = hi - step;
      flo = h(lo);
      if (flo < 0) break;
      hi = lo;
      fhi = flo;
      step *= 2;
      if (step > 1e3) return crossingWide(lnT, fieldAu, ionMass, hiStart, false);
    }
  } else {
    lo = u0;
    flo = f0;
    for (;;) {
      hi = lo + step;
      fhi = h(hi);
      if (fhi >= 0) break;
      lo = hi;
      flo = fhi;
      step *= 2;
      if (step > 1e3) return crossingWide(lnT, fieldAu, ionMass, hiStart, false);
    }
  }
  // Illinois on h (continuous; −Infinity only where the channel is closed)
  let side = 0;
  for (let it = 0; it < 200 && hi - lo > 1e-10; it++) {
    let s: number;
    if (flo !== -Infinity) {
      s = (lo * fhi - hi * flo) / (fhi - flo);
      if (!(s > lo && s < hi)) s = 0.5 * (lo + hi);
    } else s = 0.5 * (lo + hi);
    const fs = h(s);
    if (fs >= 0) {
      hi = s;
      fhi = fs;
      if (side === 1 && flo !== -Infinity) flo *= 0.5;
      side = 1;
    } else {
      lo = s;
      flo = fs;
      if (side === -1) fhi *= 0.5;
      side = -1;
    }
  }
  return hi;
}

/**
 * ln E⊥ of the prepared state's crossing of ln(Γ/ε) = lnT, searching (lo0, hi0] where f(hi0) ≥ 0 is
 * known when `hiKnown` (else the upper end is found by stepping up). Returns +Infinity if Γ never
 * reaches the target, −Infinity if it already does as E⊥ → 0⁺.
 */
function crossingWide(lnT: number, fieldAu: number, ionMass: number, hiStart: number, hiKnown: boolean): number {
  let hi = hiStart;
  let fhi = hiKnown ? 0 : lnWidthAt(hi) - lnT;
  for (let k = 0; k < 40 && fhi < 0; k++) {
    hi += 1.5;
    fhi = lnWidthAt(hi) - lnT;
  }
  if (fhi < 0) return Infinity;
  if (hiKnown) fhi = lnWidthAt(hi) - lnT;
  if (destroyedAtEveryEnergy(fieldAu, ionMass)) return -Infinity;
  const closed = sEps - sThreshold;
  let lo = Math.log(closed > 0 ? closed : sEps * 1e-6);
  if (lo >= hi) lo = hi - 2;
  let flo = lnWidthAt(lo) - lnT;
  for (let k = 0; k < 30 && flo >= 0; k++) {
    hi = lo;
    fhi = flo;
    lo -= 4;
    flo = lnWidthAt(lo) - lnT;
  }
  if (flo >= 0) return -Infinity;
  return solveBracket(lo, flo, hi, fhi, lnT);
}

/**
 * Smallest E⊥ (hartree) at which Γ(E⊥) ≥ target, by safeguarded regula falsi
 * (Illinois variant) on ln E⊥, bisecting where Γ is 0 or the state destroyed, from a bracket
 * around the table's estimate of the crossing (a wide bracket search if that fails).
 * Returns +Infinity if Γ stays below the target (only possible if the state is
 * never destroyed), and 0 if Γ ≥ target already as E⊥ → 0⁺ (not expected).
 * Relative accuracy of E⊥: 1e-8. p ≤ 0 or NaN uses DEFAULT_SHAPE_NUMBER (as stateWidthInto).
 */
export function criticalTransverseEnergy(
  eps: number,
  m: number,
  p: number,
  fieldAu: number,
  ionMass: number,
  target: number,
): number {
  prepareState(eps, m, p, fieldAu, ionMass);
  // bracket: at ξ = 0.5 without recoil the state is destroyed
  const u = crossingNear(Math.log(target / eps), fieldAu, ionMass, Math.log((2 * eps * eps * ionMass) / fieldAu));
  return Math.exp(u);
}

/**
 * Both critical energies of a state at once: out[k0] = E_b (Γ = ħ/τ, the bound threshold) and
 * out[k0 + 1] = E_u (Γ = ε or destruction), hartree, with E_b ≤ E_u; the table's p bracket is
 * resolved once for both. Same values as two calls of {@link criticalTransverseEnergy}.
 */
export function criticalTransverseEnergiesInto(
  eps: number,
  m: number,
  p: number,
  fieldAu: number,
  ionMass: number,
  hbarOverTau: number,
  out: Float64Array,
  k0: number,
): void {
  prepareState(eps, m, p, fieldAu, ionMass);
  const start = Math.log((2 * eps * eps * ionMass) / fieldAu);
  const uu = crossingNear(0, fieldAu, ionMass, start);
  let ub: number;
  if (!(hbarOverTau < eps)) ub = uu;
  else if (uu === -Infinity) ub = -Infinity;
  else ub = crossingNear(Math.log(hbarOverTau / eps), fieldAu, ionMass, start);
  out[k0] = Math.exp(Math.min(ub, uu));
  out[k0 + 1] = Math.exp(uu);
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
