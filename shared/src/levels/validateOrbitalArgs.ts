import { EngineInputError } from '../errors.js';

/** Checks m (integer 0…64), λ > 0 and ρ_c > 0 finite; throws EngineInputError naming the parameter. Internal. */
export function validateOrbitalArgs(m: number, lambda: number | undefined, rhoC: number): void {
  if (!Number.isInteger(m) || m < 0 || m > 64) throw new EngineInputError('m', `must be an integer in 0…64, got ${m}`);
  if (lambda !== undefined && !(lambda > 0 && Number.isFinite(lambda))) {
    throw new EngineInputError('lambda', `must be positive and finite, got ${lambda}`);
  }
  if (!(rhoC > 0 && Number.isFinite(rhoC))) throw new EngineInputError('rhoC', `must be positive and finite, got ${rhoC}`);
}
