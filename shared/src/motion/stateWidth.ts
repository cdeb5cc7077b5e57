/**
 * Width, Stark shift and validity bits of one field-induced state of a moving
 * ion, from the fast table with the recoil correction (allocation-free core).
 */
import { recoilStretch } from './recoilStretch.js';
import { tableEnergyRatio, tableLnWidth, tablePBracket } from './widthTable.js';

/** Bits returned by {@link stateWidthInto}. */
export const WIDTH_FLAG = {
  /** ε < 2(m + 1)Ω: the quasi-static treatment of F needs ε ≫ Ω (model.md §4). */
  NON_ADIABATIC: 1,
  /** m > 16 or p outside [2, 9] (or p unknown): evaluated at the table edge. */
  OUTSIDE_TABLE: 2,
  /** ξ_eff below the table (< 1) or no state at a bracketing node: the state is destroyed. */
  DESTROYED: 4,
  /** E⊥ ≤ ε_eff (or F = 0): no decay channel, Γ = 0 exactly. */
  CHANNEL_CLOSED: 8,
  /** No state (ε ≤ 0 or not finite). */
  NO_STATE: 16,
} as const;

/** Shape number used when none can be formed from the neighbours (r_c → 0 asymptote, flagged). */
export const DEFAULT_SHAPE_NUMBER = 3;

const bracket = new Float64Array(5);

/**
 * Γ and the Stark shift of a state of binding ε (hartree) in orbital m with local
 * shape number p, field B (a.u.), transverse energy E⊥ (hartree), ion mass M (mₑ).
 *
 *   F = B√(2E⊥/M), ξ = ε/(F l) = ε√B/F, E_r = e(m, p, ξ)·ε (shift = E_r + ε),
 *   ε_eff = −E_r − (m + ½)Ω, a = ε_eff/E⊥: a ≥ 1 → Γ = 0 exactly;
 *   otherwise Γ = ε exp y(m, p, ξ √(2φ(a)/a)).
 *
 * Writes out[0] = Γ (hartree; +Infinity when destroyed, NaN when no state),
 * out[1] = shift (hartree, ≤ 0; NaN when destroyed at ξ) and, if `out` has a
 * third slot, out[2] = ln(Γ/ε) (−Infinity when Γ = 0, +Infinity when
 * destroyed; free of the underflow of Γ itself). Returns WIDTH_FLAG bits.
 * p = NaN uses {@link DEFAULT_SHAPE_NUMBER} and sets OUTSIDE_TABLE.
 *
 * @example
 * const out = new Float64Array(3);
 * stateWidthInto(1e-7, 0, 9, 1e-4, 1e-9, 242444.17, out); // out[0] = Γ in hartree, out[2] = ln(Γ/ε)
 */
export function stateWidthInto(
  eps: number,
  m: number,
  p: number,
  fieldAu: number,
  transverseEnergy: number,
  ionMass: number,
  out: Float64Array,
): number {
  return stateWidthCore(
    eps,
    m,
    p,
    Math.sqrt(fieldAu),
    fieldAu * Math.sqrt((2 * transverseEnergy) / ionMass),
    transverseEnergy,
    fieldAu / ionMass,
    out,
  );
}

/**
 * {@link stateWidthInto} with the per-field quantities precomputed (for the
 * per-cell loop): √B, F = B√(2E⊥/M), E⊥ and Ω = B/M, all in atomic units.
 */
export function stateWidthCore(
  eps: number,
  m: number,
  p: number,
  sqrtB: number,
  F: number,
  transverseEnergy: number,
  omega: number,
  out: Float64Array,
): number {
  if (!(eps > 0) || eps === Infinity) {
    out[0] = NaN;
    out[1] = 0;
    out[2] = NaN;
    return WIDTH_FLAG.NO_STATE;
  }
  let flags = 0;
  if (eps < 2 * (m + 1) * omega) flags |= WIDTH_FLAG.NON_ADIABATIC;
  let pp = p;
  if (!(pp > 0)) {
    pp = DEFAULT_SHAPE_NUMBER;
    flags |= WIDTH_FLAG.OUTSIDE_TABLE;
  }
  if (!(F > 0)) {
    out[0] = 0;
    out[1] = 0;
    out[2] = -Infinity;
    return flags | WIDTH_FLAG.CHANNEL_CLOSED;
  }
  const xi = (eps * sqrtB) / F;
  tablePBracket(m, pp, bracket);
  if (bracket[4]! !== 0) flags |= WIDTH_FLAG.OUTSIDE_TABLE;
  const e = tableEnergyRatio(bracket, xi);
  let bindingShifted = eps;
  if (e === e) {
    bindingShifted = -e * eps;
    out[1] = eps - bindingShifted;
  } else {
    out[1] = NaN;
  }
  const a = (bindingShifted - (m + 0.5) * omega) / transverseEnergy;
  if (a >= 1) {
    out[0] = 0;
    out[2] = -Infinity;
    return flags | WIDTH_FLAG.CHANNEL_CLOSED;
  }
  const y = tableLnWidth(bracket, xi * recoilStretch(a));
  if (y !== y) {
    out[0] = Infinity;
    out[2] = Infinity;
    return flags | WIDTH_FLAG.DESTROYED;
  }
  out[0] = eps * Math.exp(y);
  out[2] = y;
  return flags;
}
