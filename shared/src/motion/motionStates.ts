/**
 * Per-state moving-ion results at one point (B, α, r_c fixed): width,
 * lifetime, Stark shift, class, flags and, for a temperature, the fractions.
 */
import { EngineInputError } from '../errors.js';
import { CODATA2018 } from '../units/codata2018.js';
import { classifyWidthCode, stateClassName, type MotionStateClass } from './classifyWidth.js';
import { localShapeNumber } from './localShapeNumber.js';
import { motionalField, transverseEnergyAt, validateMotionSettings, type MotionSettings, type MotionSettingsInput } from './motionSettings.js';
import { stateWidthInto, WIDTH_FLAG } from './stateWidth.js';
import { criticalTransverseEnergiesInto, thermalFractionsInto } from './thermalEnsemble.js';

/** One fixed-atom state (as returned by `levels`). */
export interface MotionStateInput {
  m: number;
  nu: number;
  /** Fixed-atom binding ε > 0 in hartree (0 = no state). */
  bindingHartree: number;
}

/** Input of {@link motionStates}. */
export interface MotionStatesInput {
  /** Magnetic field B in atomic units (B₀ = 2.350517567581e5 T), > 0. */
  fieldAu: number;
  /** The fixed-atom states at this point: ε_{m,ν} for m = 0…m_max (all ν). */
  states: readonly MotionStateInput[];
  /** Ion motion settings (validated here if not already). */
  motion: MotionSettingsInput | MotionSettings;
}

/** Validity flags of a moving-ion state. */
export type MotionFlag =
  /** ε < 2(m + 1)Ω: F is not quasi-static for this state; it survives only in the lowest ion Landau levels. */
  | 'non-adiabatic'
  /** m > 16, p outside [2, 9] or p not formable: evaluated at the table edge. */
  | 'outside-width-table'
  /** E⊥ ≤ ε_eff: the decay channel is closed by the recoil (Γ = 0 exactly). */
  | 'channel-closed'
  /** ξ below the table's small end: the state is destroyed by the motional field. */
  | 'destroyed';

/** Fractions of a thermal ensemble (sum to 1). */
export interface ThermalFractions {
  bound: number;
  resonance: number;
  unbound: number;
}

/** One moving-ion state. */
export interface MotionStateResult {
  m: number;
  nu: number;
  bindingHartree: number;
  /** Γ in hartree (0: no decay channel; +Infinity: destroyed). For a temperature: at E⊥ = kT. */
  widthHartree: number;
  /** ħ/Γ in seconds (+Infinity for Γ = 0, 0 when destroyed). */
  lifetimeSeconds: number;
  /** Stark shift E_r − (−ε) in hartree (≤ 0; NaN when destroyed). */
  shiftHartree: number;
  class: MotionStateClass;
  flags: MotionFlag[];
  /** Local shape number p used for the width. */
  shapeNumber: number;
  /** ξ = ε/(F l) (NaN for a temperature). */
  xi: number;
  /** With a temperature: the thermal fractions; also the critical energies E_b, E_u (hartree). */
  fractions?: ThermalFractions;
  criticalEnergiesHartree?: { bound: number; unbound: number };
}

function isValidated(m: MotionSettingsInput | MotionSettings): m is MotionSettings {
  return typeof (m as MotionSettings).ionMass === 'number' && typeof (m as MotionSettings).hbarOverTau === 'number';
}

function flagNames(bits: number): MotionFlag[] {
  const f: MotionFlag[] = [];
  if (bits & WIDTH_FLAG.NON_ADIABATIC) f.push('non-adiabatic');
  if (bits & WIDTH_FLAG.OUTSIDE_TABLE) f.push('outside-width-table');
  if (bits & WIDTH_FLAG.CHANNEL_CLOSED) f.push('channel-closed');
  if (bits & WIDTH_FLAG.DESTROYED) f.push('destroyed');
  return f;
}

/**
 * Moving-ion width, lifetime, Stark shift and class of each fixed-atom state
 * at one point (model.md §4): the fast table with recoil, classified by
 * Γ < ħ/τ → bound, destroyed or Γ ≥ ε → unbound, otherwise resonance; for a
 * temperature also f_bound/f_resonance/f_unbound from the critical energies.
 *
 * p for state (m, ν) is formed from the bindings of the same ν in orbitals
 * m and m + 2 (neighbours if those are missing; see localShapeNumber).
 *
 * Bad input (B ≤ 0, non-integer or negative m/ν, negative or non-finite ε,
 * invalid motion settings) throws `EngineInputError` naming the parameter.
 *
 * @example
 * motionStates({ fieldAu: 1e-4, states: levels(...), motion: { massNumber: 133, temperatureKelvin: 0.01 } });
 * // [{ m: 0, nu: 0, widthHartree: …, lifetimeSeconds: …, class: 'bound', fractions: { bound: 0.99…, … } }, …]
 */
export function motionStates(input: MotionStatesInput): MotionStateResult[] {
  const B = input.fieldAu;
  if (!(Number.isFinite(B) && B > 0)) throw new EngineInputError('fieldAu', `must be finite and > 0, got ${B}`);
  if (!Array.isArray(input.states)) throw new EngineInputError('states', 'must be an array of { m, nu, bindingHartree }');
  for (const s of input.states) {
    if (!(Number.isInteger(s.m) && s.m >= 0)) throw new EngineInputError('states.m', `must be an integer ≥ 0, got ${s.m}`);
    if (!(Number.isInteger(s.nu) && s.nu >= 0)) throw new EngineInputError('states.nu', `must be an integer ≥ 0, got ${s.nu}`);
    if (!(Number.isFinite(s.bindingHartree) && s.bindingHartree >= 0)) {
      throw new EngineInputError('states.bindingHartree', `must be finite and ≥ 0, got ${s.bindingHartree}`);
    }
  }
  const settings = isValidated(input.motion) ? input.motion : validateMotionSettings(input.motion);
  const M = settings.ionMass;
  const omega = B / M;
  // bindings per ν, indexed by m
  const mMax = input.states.reduce((a, s) => Math.max(a, s.m), 0);
  const byNu = new Map<number, Float64Array>();
  for (const s of input.states) {
    let row = byNu.get(s.nu);
    if (!row) byNu.set(s.nu, (row = new Float64Array(mMax + 1)));
    row[s.m] = s.bindingHartree;
  }
  const out = new Float64Array(3);
  const frac = new Float64Array(3);
  const thermal = settings.mode === 'thermal';
  return input.states.map((s) => {
    const eps = s.bindingHartree;
    const p = localShapeNumber(byNu.get(s.nu)!, s.m);
    const ePerp = thermal ? settings.kT : transverseEnergyAt(settings, B);
    const bits = stateWidthInto(eps, s.m, p, B, ePerp, M, out);
    const width = out[0]!;
    const code = classifyWidthCode(width, eps, settings.hbarOverTau, bits);
    const F = motionalField(B, ePerp, M);
    const res: MotionStateResult = {
      m: s.m,
      nu: s.nu,
      bindingHartree: eps,
      widthHartree: width,
      lifetimeSeconds: bits & WIDTH_FLAG.NO_STATE ? NaN : CODATA2018.atomicTimeInSecond / width,
      shiftHartree: out[1]!,
      class: stateClassName(code),
      flags: flagNames(bits),
      shapeNumber: p,
      xi: thermal ? NaN : (eps * Math.sqrt(B)) / F,
    };
    if (thermal) {
      if (bits & WIDTH_FLAG.NO_STATE) {
        res.fractions = { bound: 0, resonance: 0, unbound: 1 };
      } else {
        const crit = new Float64Array(2);
        criticalTransverseEnergiesInto(eps, s.m, p, B, M, settings.hbarOverTau, crit, 0);
        const eb = crit[0]!;
        const eu = crit[1]!;
        thermalFractionsInto(eb, eu, settings.kT, omega, frac, 0);
        res.fractions = { bound: frac[0]!, resonance: frac[1]!, unbound: frac[2]! };
        res.criticalEnergiesHartree = { bound: Math.min(eb, eu), unbound: eu };
      }
    }
    return res;
  });
}
