import { EngineInputError } from '../errors.js';
import type { LevelsInput } from './types.js';

/**
 * Checks a LevelsInput before any work: α, B, r_c positive and finite; mMax an
 * integer in 0…64; energyFloorHartree finite and ≥ 0 if given; tol positive and
 * finite if given. Throws EngineInputError naming the offending parameter.
 */
export function validateLevelsInput(input: LevelsInput): void {
  if (input === null || typeof input !== 'object') throw new EngineInputError('input', 'must be an object');
  const positive = (name: 'alpha' | 'fieldAu' | 'cutoffBohr', v: unknown): void => {
    if (!(typeof v === 'number' && v > 0 && Number.isFinite(v))) {
      throw new EngineInputError(name, `must be a positive finite number, got ${String(v)}`);
    }
  };
  positive('alpha', input.alpha);
  positive('fieldAu', input.fieldAu);
  positive('cutoffBohr', input.cutoffBohr);
  const m = input.mMax;
  if (!(typeof m === 'number' && Number.isInteger(m) && m >= 0 && m <= 64)) {
    throw new EngineInputError('mMax', `must be an integer in 0…64, got ${String(m)}`);
  }
  const f = input.energyFloorHartree;
  if (f !== undefined && !(typeof f === 'number' && f >= 0 && Number.isFinite(f))) {
    throw new EngineInputError('energyFloorHartree', `must be a finite number ≥ 0, got ${String(f)}`);
  }
  const t = input.tol;
  if (t !== undefined && !(typeof t === 'number' && t > 0 && Number.isFinite(t))) {
    throw new EngineInputError('tol', `must be a positive finite number, got ${String(t)}`);
  }
  const a = input.hasFieldFreeAnion;
  if (a !== undefined && typeof a !== 'boolean') {
    throw new EngineInputError('hasFieldFreeAnion', `must be a boolean, got ${String(a)}`);
  }
}
