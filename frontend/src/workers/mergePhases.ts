import type { BindingMapResult, PhaseMapResult } from '@fieldbound/shared';
import type { MapRowsResult } from './engineContract';
import { mergeBands } from './mergeBands';

/**
 * Joins the moving-ion classes of contiguous row bands (lowest field first) into the layout of the joined map.
 * `bandCells[k]` is the number of cells of band k; every band stores `levelsPerOrbital` levels of `orbitals` orbitals.
 */
export function mergePhases(bands: readonly PhaseMapResult[], bandCells: readonly number[], orbitals: number, levelsPerOrbital: number): PhaseMapResult {
  if (bands.length === 0) throw new Error('mergePhases: no bands');
  if (bands.length === 1) return bands[0];
  const cellCount = bandCells.reduce((s, c) => s + c, 0);
  const states = orbitals * levelsPerOrbital;
  const n = states * cellCount;
  const thermal = bands[0].fractions !== null;
  const stateClass = new Uint8Array(n);
  const widthHartree = new Float64Array(n);
  const widthFlags = new Uint8Array(n);
  const survivors = new Uint16Array(cellCount);
  const fractions = thermal ? new Float32Array(3 * n) : null;
  let offset = 0;
  bands.forEach((b, k) => {
    const cells = bandCells[k];
    if (b.stateClass.length !== states * cells) throw new Error('mergePhases: a band does not match its cell count');
    survivors.set(b.survivors, offset);
    for (let s = 0; s < states; s++) {
      const src = s * cells;
      const dst = s * cellCount + offset;
      stateClass.set(b.stateClass.subarray(src, src + cells), dst);
      widthHartree.set(b.widthHartree.subarray(src, src + cells), dst);
      widthFlags.set(b.widthFlags.subarray(src, src + cells), dst);
      if (fractions && b.fractions) fractions.set(b.fractions.subarray(3 * src, 3 * (src + cells)), 3 * dst);
    }
    offset += cells;
  });
  return {
    engineVersion: bands[0].engineVersion,
    stateClass,
    widthHartree,
    widthFlags,
    survivors,
    fractions,
    elapsedMs: Math.max(...bands.map((b) => b.elapsedMs)),
  };
}

/**
 * Joins the results of contiguous row bands (lowest field first): binding energies by `mergeBands`, and the
 * moving-ion classes by `mergePhases` when every band has them (otherwise none).
 */
export function joinRowResults(parts: readonly MapRowsResult[]): MapRowsResult {
  const binding = mergeBands(parts.map((p) => p.binding));
  const phases = parts.map((p) => p.phase);
  const phase = phases.every((p): p is PhaseMapResult => p !== null)
    ? mergePhases(phases, parts.map((p) => p.binding.cellCount), binding.mMax + 1, binding.levelsPerOrbital)
    : null;
  return { binding, phase };
}

/** Rows [start, end] (inclusive) of a binding map as a map of their own (copies; the source is left intact). */
export function sliceRows(map: BindingMapResult, start: number, end: number): BindingMapResult {
  const nField = end - start + 1;
  const cells = nField * map.nAlpha;
  const first = start * map.nAlpha;
  const orbitals = map.mMax + 1;
  const L = map.levelsPerOrbital;
  const bindingHartree = new Float64Array(orbitals * L * cells);
  for (let s = 0; s < orbitals * L; s++) bindingHartree.set(map.bindingHartree.subarray(s * map.cellCount + first, s * map.cellCount + first + cells), s * cells);
  const counts = new Uint16Array(orbitals * cells);
  const flags = new Uint8Array(orbitals * cells);
  for (let m = 0; m < orbitals; m++) {
    counts.set(map.counts.subarray(m * map.cellCount + first, m * map.cellCount + first + cells), m * cells);
    flags.set(map.flags.subarray(m * map.cellCount + first, m * map.cellCount + first + cells), m * cells);
  }
  return {
    ...map,
    nField,
    cellCount: cells,
    fieldsAu: map.fieldsAu.slice(start, end + 1),
    alphas: map.alphas.slice(),
    bindingHartree,
    counts,
    flags,
  };
}
