import type { BindingMapWindowResult } from '../map/evaluateBindingMapRows.js';
import type { BindingMapModel } from '../map/bindingMapModel.js';
import type { BindingMapResult, PhaseMapResult } from '../map/mapTypes.js';
import { ENGINE_VERSION } from '../version.js';

/** One row block of a map computed by a worker: the binding rows and their classification. */
export interface MapBlock {
  binding: BindingMapWindowResult;
  phase: PhaseMapResult;
}

/** Geometry of the whole map, known once the model is prepared. */
export interface MapShape {
  nAlpha: number;
  nField: number;
  mMax: number;
  levelsPerOrbital: number;
  alphas: Float64Array;
  fieldsAu: Float64Array;
}

/** The shape of the map a prepared model will fill. */
export function shapeOfModel(model: BindingMapModel): MapShape {
  return {
    nAlpha: model.alphas.length,
    nField: model.fieldsAu.length,
    mMax: model.orbitals.length - 1,
    levelsPerOrbital: model.levelsPerOrbital,
    alphas: model.alphas,
    fieldsAu: model.fieldsAu,
  };
}

/** Copies `groups` consecutive segments of `width · blockCells` values of a block into the whole array. */
function place(
  target: Float64Array | Float32Array | Uint16Array | Uint8Array,
  source: Float64Array | Float32Array | Uint16Array | Uint8Array,
  groups: number,
  blockCells: number,
  cellCount: number,
  firstCell: number,
  width = 1,
): void {
  const expected = groups * blockCells * width;
  if (source.length !== expected) throw new RangeError(`block array has ${source.length} values, expected ${expected}`);
  for (let k = 0; k < groups; k++) {
    target.set(source.subarray(k * blockCells * width, (k + 1) * blockCells * width), (k * cellCount + firstCell) * width);
  }
}

/**
 * Stitches row blocks (any split of the rows, each block covering rows [rowStart, rowEnd) exactly once)
 * into the whole binding map and phase map, in the layout of mapTypes.ts: state (m, ν) of cell c at
 * (m·L + ν)·cellCount + c, per-orbital arrays at m·cellCount + c, fractions at 3·state + k. Every
 * cell's numbers are computed independently of the split, so the result equals `bindingMap` and
 * `phaseMap` run on the whole map (except the elapsed times: the binding map's is the caller's
 * `elapsedMs`, the phase map's the sum of the blocks' classification times).
 *
 * Bad input: RangeError when the blocks do not tile the rows or do not match the shape.
 */
export function assembleBlocks(shape: MapShape, blocks: readonly MapBlock[], elapsedMs: number): { binding: BindingMapResult; phase: PhaseMapResult } {
  const { nAlpha, nField, mMax, levelsPerOrbital: L } = shape;
  const cellCount = nAlpha * nField;
  const K = mMax + 1;
  const states = K * L * cellCount;
  const sorted = [...blocks].sort((a, b) => a.binding.rowStart - b.binding.rowStart);
  let next = 0;
  for (const b of sorted) {
    if (b.binding.rowStart !== next) throw new RangeError(`row blocks do not tile the map: expected a block starting at row ${next}, got ${b.binding.rowStart}`);
    if (b.binding.levelsPerOrbital !== L || b.binding.mMax !== mMax || b.binding.nAlpha !== nAlpha) throw new RangeError('a row block does not match the map shape');
    next = b.binding.rowEnd;
  }
  if (next !== nField) throw new RangeError(`row blocks end at row ${next}, the map has ${nField}`);
  const thermal = sorted.length > 0 && sorted[0]!.phase.fractions !== null;
  const bindingHartree = new Float64Array(states);
  const counts = new Uint16Array(K * cellCount);
  const flags = new Uint8Array(K * cellCount);
  const stateClass = new Uint8Array(states);
  const widthHartree = new Float64Array(states);
  const widthFlags = new Uint8Array(states);
  const survivors = new Uint16Array(cellCount);
  const fractions = thermal ? new Float32Array(3 * states) : null;
  let maxRelError = 0;
  let directSolves = 0;
  let phaseMs = 0;
  for (const { binding: b, phase: p } of sorted) {
    const first = b.rowStart * nAlpha;
    const bc = b.cellCount;
    place(bindingHartree, b.bindingHartree, K * L, bc, cellCount, first);
    place(counts, b.counts, K, bc, cellCount, first);
    place(flags, b.flags, K, bc, cellCount, first);
    place(stateClass, p.stateClass, K * L, bc, cellCount, first);
    place(widthHartree, p.widthHartree, K * L, bc, cellCount, first);
    place(widthFlags, p.widthFlags, K * L, bc, cellCount, first);
    place(survivors, p.survivors, 1, bc, cellCount, first);
    if (fractions) {
      if (!p.fractions) throw new RangeError('a row block lacks the thermal fractions');
      place(fractions, p.fractions, K * L, bc, cellCount, first, 3);
    }
    maxRelError = Math.max(maxRelError, b.maxRelError);
    directSolves += b.directSolves ?? 0;
    phaseMs += p.elapsedMs;
  }
  return {
    binding: {
      engineVersion: sorted[0]?.binding.engineVersion ?? ENGINE_VERSION,
      nAlpha,
      nField,
      cellCount,
      mMax,
      levelsPerOrbital: L,
      alphas: shape.alphas,
      fieldsAu: shape.fieldsAu,
      bindingHartree,
      counts,
      flags,
      maxRelError,
      directSolves,
      elapsedMs,
    },
    phase: {
      engineVersion: sorted[0]?.phase.engineVersion ?? ENGINE_VERSION,
      stateClass,
      widthHartree,
      widthFlags,
      survivors,
      fractions,
      elapsedMs: phaseMs,
    },
  };
}

/**
 * Splits rows 0…nField−1 into blocks of about `nField / (4·threads)` rows (at least one), so that
 * faster workers take more blocks.
 *
 * @example rowBlocks(10, 2) // [[0, 2], [2, 4], [4, 6], [6, 8], [8, 10]]
 */
export function rowBlocks(nField: number, threads: number): [number, number][] {
  const size = Math.max(1, Math.ceil(nField / (4 * threads)));
  const out: [number, number][] = [];
  for (let r = 0; r < nField; r += size) out.push([r, Math.min(nField, r + size)]);
  return out;
}
