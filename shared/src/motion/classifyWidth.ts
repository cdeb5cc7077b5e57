/**
 * Classification of a state of a moving ion (model.md §4):
 *   no state → NONE (reported as unbound);
 *   Γ < ħ/τ (including Γ = 0) → bound (survives the observation time τ);
 *   destroyed or Γ ≥ ε → unbound (the width exceeds the binding);
 *   otherwise → resonance.
 */
import { STATE_CLASS, type StateClassCode } from '../map/mapTypes.js';
import { WIDTH_FLAG } from './stateWidth.js';

/** Class of a state, as reported per state. */
export type MotionStateClass = 'bound' | 'resonance' | 'unbound';

/**
 * STATE_CLASS code from the width Γ (hartree), binding ε (hartree), ħ/τ
 * (hartree) and the WIDTH_FLAG bits of {@link stateWidthInto}.
 *
 * @example classifyWidthCode(1e-20, 1e-7, 2.4e-17, 0) // STATE_CLASS.BOUND (1)
 * @example classifyWidthCode(1e-9, 1e-7, 2.4e-17, 0)  // STATE_CLASS.RESONANCE (2)
 */
export function classifyWidthCode(width: number, eps: number, hbarOverTau: number, flags: number): StateClassCode {
  if (flags & WIDTH_FLAG.NO_STATE) return STATE_CLASS.NONE;
  if (width < hbarOverTau) return STATE_CLASS.BOUND;
  if (flags & WIDTH_FLAG.DESTROYED || !(width < eps)) return STATE_CLASS.UNBOUND;
  return STATE_CLASS.RESONANCE;
}

/** Name of a STATE_CLASS code (NONE, i.e. no state, reads as 'unbound'). */
export function stateClassName(code: StateClassCode): MotionStateClass {
  return code === STATE_CLASS.BOUND ? 'bound' : code === STATE_CLASS.RESONANCE ? 'resonance' : 'unbound';
}
