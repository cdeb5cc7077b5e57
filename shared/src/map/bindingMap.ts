import type { MapSetup } from '../setup/mapSetup.js';
import type { BindingMapOptions } from './bindingMapOptions.js';
import { bindingMapDirect } from './bindingMapDirect.js';
import type { BindingMapResult } from './mapTypes.js';

/**
 * Whole binding map (first version: every cell solved directly; the interpolated fast path follows).
 */
export function bindingMap(setup: MapSetup, options: BindingMapOptions = {}): BindingMapResult {
  return bindingMapDirect(setup, options);
}
