import type { MapSetup } from '../setup/mapSetup.js';
import type { OrbitalModel } from './orbitalModel.js';

/**
 * Everything needed to fill any rows of a map (result of `prepareBindingMap`): the validated setup,
 * the axes and one interpolation model per orbital. Plain data (numbers, strings, typed arrays), so
 * it can be posted to workers, which then fill row blocks with `evaluateBindingMapRows`.
 */
export interface BindingMapModel {
  setup: MapSetup;
  tolerance: number;
  alphas: Float64Array;
  fieldsAu: Float64Array;
  floorHartree: number;
  levelsPerOrbital: number;
  orbitals: OrbitalModel[];
  /** Wall time of the preparation, ms. */
  elapsedMs: number;
}
