import type { MapSetup } from '../setup/mapSetup.js';
import { toHartree } from '../units/convert.js';
import { throwIfAborted } from './abortError.js';
import type { BindingMapOptions } from './bindingMapOptions.js';
import type { BindingMapModel } from './bindingMapModel.js';
import { buildOrbitalModel, DEFAULT_BUILD, type MapGeometry } from './buildOrbitalModel.js';
import { mapAxes } from './mapAxes.js';
import { validateMapInput } from './validateMapInput.js';

/**
 * First half of a fast binding map: validates the request (before any work) and builds the
 * interpolation model of every orbital m = 0…mMax (buildOrbitalModel). Progress is reported in
 * cells scaled to the share `progressShare` of the whole computation (1 when called alone).
 *
 * Bad input: SetupValidationError (setup) or EngineInputError (options). Aborted: Error named
 * 'AbortError'.
 *
 * @example
 * const model = prepareBindingMap(setup);
 * const rows = evaluateBindingMapRows(model, 0, 16); // the first 16 rows
 */
export function prepareBindingMap(setupIn: MapSetup, options: BindingMapOptions = {}, progressShare = 1): BindingMapModel {
  const t0 = Date.now();
  const { setup, tolerance } = validateMapInput(setupIn, options);
  throwIfAborted(options.signal);
  const { alphas, fieldsAu } = mapAxes(setup);
  const cellCount = alphas.length * fieldsAu.length;
  const rowS = new Float64Array(fieldsAu.length);
  for (let j = 0; j < rowS.length; j++) rowS[j] = Math.log(fieldsAu[j]);
  const geo: MapGeometry = {
    lnAlphaMin: Math.log(alphas[0]),
    lnAlphaMax: Math.log(alphas[alphas.length - 1]),
    sMin: rowS[0],
    sMax: rowS[rowS.length - 1],
    rowS,
    cutoffBohr: setup.shortRange.cutoffBohr,
  };
  const settings = { ...DEFAULT_BUILD, tolG: tolerance * 0.4 };
  const mMax = setup.orbitals.mMax;
  const orbitals = [];
  let levelsPerOrbital = 1;
  for (let m = 0; m <= mMax; m++) {
    throwIfAborted(options.signal);
    const om = buildOrbitalModel(m, geo, settings, options.signal);
    orbitals.push(om);
    levelsPerOrbital = Math.max(levelsPerOrbital, om.levels);
    options.onProgress?.({ done: Math.floor((cellCount * progressShare * (m + 1)) / (mMax + 1)), total: cellCount });
  }
  return {
    setup,
    tolerance,
    alphas,
    fieldsAu,
    floorHartree: toHartree('K', setup.energyFloorKelvin),
    levelsPerOrbital,
    orbitals,
    elapsedMs: Date.now() - t0,
  };
}
