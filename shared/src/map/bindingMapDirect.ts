import type { MapSetup } from '../setup/mapSetup.js';
import { toHartree } from '../units/convert.js';
import { ENGINE_VERSION } from '../version.js';
import { throwIfAborted } from './abortError.js';
import type { BindingMapOptions } from './bindingMapOptions.js';
import { orbitalCellFlags } from './cellFlags.js';
import { directOrbital } from './directOrbital.js';
import { mapAxes } from './mapAxes.js';
import type { BindingMapResult } from './mapTypes.js';
import { validateMapInput } from './validateMapInput.js';

/**
 * Reference whole map: every orbital of every cell solved directly (`directOrbital`, the numbers of
 * `levels`). Same contract and layout as `bindingMap`; every (orbital, cell) carries
 * MAP_FLAG.DIRECT_SOLVE. About 1–3 ms per orbital and cell on one core, so meant for small grids,
 * tests and checking the fast map — not for interactive use.
 *
 * Bad input: throws SetupValidationError / EngineInputError before any work.
 *
 * @example
 * bindingMapDirect({ ...defaultSetup(), grid: { nAlpha: 8, nField: 8 } }).counts // Uint16Array(…)
 */
export function bindingMapDirect(setupIn: MapSetup, options: BindingMapOptions = {}): BindingMapResult {
  const t0 = Date.now();
  const { setup } = validateMapInput(setupIn, options);
  const { alphas, fieldsAu } = mapAxes(setup);
  const nA = alphas.length;
  const nB = fieldsAu.length;
  const cellCount = nA * nB;
  const mMax = setup.orbitals.mMax;
  const rc = setup.shortRange.cutoffBohr;
  const floor = toHartree('K', setup.energyFloorKelvin);
  interface OrbitalScratch {
    cellLevels: Float64Array[];
    cellErr: Float64Array[];
    n: Uint16Array;
    flags: Uint8Array;
  }
  const perOrbital: OrbitalScratch[] = [];
  let levelsPerOrbital = 1;
  const total = cellCount;
  for (let m = 0; m <= mMax; m++) {
    // scratch: up to 64 levels per cell kept until the layout is known
    const cellLevels: Float64Array[] = new Array(cellCount);
    const cellErr: Float64Array[] = new Array(cellCount);
    const n = new Uint16Array(cellCount);
    const flags = new Uint8Array(cellCount);
    let maxLevels = 0;
    for (let j = 0; j < nB; j++) {
      throwIfAborted(options.signal);
      const B = fieldsAu[j];
      for (let i = 0; i < nA; i++) {
        const cell = j * nA + i;
        const d = directOrbital(m, alphas[i], B, rc, floor);
        const kept: number[] = [];
        const errs: number[] = [];
        let dropped = false;
        for (let k = 0; k < d.epsilon.length; k++) {
          const e = B * d.epsilon[k];
          if (!d.resolved[k] || e < floor) dropped = true;
          else {
            kept.push(e);
            errs.push(d.relError[k]);
          }
        }
        maxLevels = Math.max(maxLevels, d.epsilon.length);
        cellLevels[cell] = Float64Array.from(kept);
        cellErr[cell] = Float64Array.from(errs);
        n[cell] = kept.length;
        flags[cell] = orbitalCellFlags(m, alphas[i], rc, kept.length > 0 ? kept[0] / B : 0, dropped, true);
      }
      options.onProgress?.({ done: Math.floor((cellCount * m + (j + 1) * nA) / (mMax + 1)), total });
    }
    perOrbital.push({ cellLevels, cellErr, n, flags });
    levelsPerOrbital = Math.max(levelsPerOrbital, maxLevels);
  }
  const bindingHartree = new Float64Array((mMax + 1) * levelsPerOrbital * cellCount);
  const counts = new Uint16Array((mMax + 1) * cellCount);
  const flags = new Uint8Array((mMax + 1) * cellCount);
  let maxRelError = 0;
  for (let m = 0; m <= mMax; m++) {
    const o = perOrbital[m];
    counts.set(o.n, m * cellCount);
    flags.set(o.flags, m * cellCount);
    for (let cell = 0; cell < cellCount; cell++) {
      const lv = o.cellLevels[cell];
      for (let k = 0; k < lv.length; k++) {
        bindingHartree[(m * levelsPerOrbital + k) * cellCount + cell] = lv[k];
        const e = o.cellErr[cell][k];
        if (e > maxRelError) maxRelError = e;
      }
    }
  }
  return {
    engineVersion: ENGINE_VERSION,
    nAlpha: nA,
    nField: nB,
    cellCount,
    mMax,
    levelsPerOrbital,
    alphas,
    fieldsAu,
    bindingHartree,
    counts,
    flags,
    maxRelError,
    elapsedMs: Date.now() - t0,
    directSolves: cellCount * (mMax + 1),
  };
}
