import { EngineInputError } from '../errors.js';
import { parseSetup, type MapSetup } from '../setup/mapSetup.js';
import type { BindingMapOptions } from './bindingMapOptions.js';

/** Default relative accuracy of a map against direct solves. */
export const DEFAULT_MAP_TOLERANCE = 1e-6;

/**
 * Validates a map request before any work: the setup against the schema (throws
 * `SetupValidationError` listing every issue), the options (throws `EngineInputError` naming
 * `tolerance`, `onProgress` or `signal`). Returns the parsed setup and the tolerance.
 *
 * @example
 * validateMapInput({ ...setup, grid: { nAlpha: 2000, nField: 10 } }) // throws SetupValidationError: grid.nAlpha …
 */
export function validateMapInput(setup: MapSetup, options: BindingMapOptions): { setup: MapSetup; tolerance: number } {
  const parsed = parseSetup(setup);
  const tol = options.tolerance ?? DEFAULT_MAP_TOLERANCE;
  if (!(typeof tol === 'number' && Number.isFinite(tol) && tol >= 1e-9 && tol <= 1e-2)) {
    throw new EngineInputError('tolerance', `must be a number in 1e-9…1e-2, got ${String(tol)}`);
  }
  if (options.onProgress !== undefined && typeof options.onProgress !== 'function') {
    throw new EngineInputError('onProgress', 'must be a function');
  }
  if (options.signal !== undefined && (options.signal === null || typeof options.signal.aborted !== 'boolean')) {
    throw new EngineInputError('signal', 'must be an AbortSignal');
  }
  return { setup: parsed, tolerance: tol };
}
