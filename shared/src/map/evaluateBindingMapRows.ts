import { EngineInputError } from '../errors.js';
import { ENGINE_VERSION } from '../version.js';
import { throwIfAborted } from './abortError.js';
import type { BindingMapModel } from './bindingMapModel.js';
import type { BindingMapOptions } from './bindingMapOptions.js';
import { evaluateOrbitalRows } from './evaluateOrbitalRows.js';
import type { BindingMapResult } from './mapTypes.js';

/** A block of rows of a map: a BindingMapResult over rows [rowStart, rowEnd) of the full grid. */
export interface BindingMapWindowResult extends BindingMapResult {
  /** First row of the block in the full map, and one past its last. */
  rowStart: number;
  rowEnd: number;
}

/** Rows filled between progress reports and abort checks. */
const ROW_CHUNK = 8;

/**
 * Second half of a fast binding map: fills rows [rowStart, rowEnd) of every orbital from a model
 * made by `prepareBindingMap`. The numbers are identical to those rows of the full map (same model,
 * same arithmetic, cell by cell). Progress: cells of this block, offset by `progressBase` and scaled
 * to `total` (used by bindingMap to continue the preparation's count).
 *
 * Bad input: EngineInputError when the rows are not integers with 0 ≤ rowStart < rowEnd ≤ nField.
 *
 * @example
 * const w = evaluateBindingMapRows(prepareBindingMap(setup), 10, 20); // w.nField = 10, w.cellCount = 10·nAlpha
 */
export function evaluateBindingMapRows(
  model: BindingMapModel,
  rowStart: number,
  rowEnd: number,
  options: BindingMapOptions = {},
  progress: { base: number; share: number; total: number } | null = null,
): BindingMapWindowResult {
  const t0 = Date.now();
  const nField = model.fieldsAu.length;
  if (!(Number.isInteger(rowStart) && rowStart >= 0 && rowStart < nField)) {
    throw new EngineInputError('rowStart', `must be an integer in 0…${nField - 1}, got ${String(rowStart)}`);
  }
  if (!(Number.isInteger(rowEnd) && rowEnd > rowStart && rowEnd <= nField)) {
    throw new EngineInputError('rowEnd', `must be an integer in ${rowStart + 1}…${nField}, got ${String(rowEnd)}`);
  }
  throwIfAborted(options.signal);
  const nA = model.alphas.length;
  const rows = rowEnd - rowStart;
  const cellCount = rows * nA;
  const L = model.levelsPerOrbital;
  const mCount = model.orbitals.length;
  const bindingHartree = new Float64Array(mCount * L * cellCount);
  const counts = new Uint16Array(mCount * cellCount);
  const flags = new Uint8Array(mCount * cellCount);
  let maxRelError = 0;
  let directSolves = 0;
  const total = progress?.total ?? cellCount;
  for (let r0 = rowStart; r0 < rowEnd; r0 += ROW_CHUNK) {
    throwIfAborted(options.signal);
    const r1 = Math.min(rowEnd, r0 + ROW_CHUNK);
    // every cell's arithmetic is independent of the chunking, so any split of the rows (windows,
    // workers) gives the same numbers
    for (const om of model.orbitals) {
      const r = evaluateOrbitalRows(om, {
        alphas: model.alphas,
        fieldsAu: model.fieldsAu,
        cutoffBohr: model.setup.shortRange.cutoffBohr,
        floorHartree: model.floorHartree,
        tolerance: model.tolerance,
        levelsPerOrbital: L,
        rowStart: r0,
        rowEnd: r1,
        arrayRowStart: rowStart,
        arrayRows: rows,
        bindingHartree,
        counts,
        flags,
      });
      maxRelError = Math.max(maxRelError, r.maxRelError);
      directSolves += r.directSolves;
    }
    if (options.onProgress) {
      const doneHere = (r1 - rowStart) * nA;
      const done = progress ? Math.floor(progress.base + (doneHere / cellCount) * progress.share * total) : doneHere;
      options.onProgress({ done: Math.min(done, total), total });
    }
  }
  return {
    engineVersion: ENGINE_VERSION,
    nAlpha: nA,
    nField: rows,
    cellCount,
    mMax: mCount - 1,
    levelsPerOrbital: L,
    alphas: model.alphas,
    fieldsAu: model.fieldsAu.slice(rowStart, rowEnd),
    bindingHartree,
    counts,
    flags,
    maxRelError,
    elapsedMs: Date.now() - t0,
    directSolves,
    rowStart,
    rowEnd,
  };
}
