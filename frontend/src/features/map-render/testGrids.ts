// Hand-made results for tests only (never imported by the app): small grids a reader can check by eye.
import { STATE_CLASS, type BindingMapResult, type PhaseMapResult } from '@fieldbound/shared';

/**
 * A binding map of one orbital (m = 0) with one level per cell, from a row-major table of binding energies
 * in hartree (0 = nothing bound). Axes: α = 1…10^(nx−1) a₀³ and B = 10⁻⁶…10^(ny−7) atomic units, one decade per node.
 */
export function bindingMapFromTable(rows: number[][]): BindingMapResult {
  const ny = rows.length;
  const nx = rows[0].length;
  const cellCount = nx * ny;
  const binding = new Float64Array(cellCount);
  const counts = new Uint16Array(cellCount);
  rows.forEach((row, j) =>
    row.forEach((e, i) => {
      binding[j * nx + i] = e;
      counts[j * nx + i] = e > 0 ? 1 : 0;
    }),
  );
  return {
    engineVersion: 'test',
    nAlpha: nx,
    nField: ny,
    cellCount,
    mMax: 0,
    levelsPerOrbital: 1,
    alphas: Float64Array.from({ length: nx }, (_, i) => 10 ** i),
    fieldsAu: Float64Array.from({ length: ny }, (_, j) => 10 ** (j - 6)),
    bindingHartree: binding,
    counts,
    flags: new Uint8Array(cellCount),
    maxRelError: 0,
    elapsedMs: 0,
  };
}

/** A phase map for `bindingMapFromTable`'s layout from a table of classes 'B', 'R', 'U' per cell. */
export function phaseMapFromTable(rows: string[][]): PhaseMapResult {
  const flat = rows.flat();
  const code = { B: STATE_CLASS.BOUND, R: STATE_CLASS.RESONANCE, U: STATE_CLASS.UNBOUND } as const;
  const stateClass = Uint8Array.from(flat, (c) => code[c as keyof typeof code]);
  return {
    engineVersion: 'test',
    stateClass,
    widthHartree: new Float64Array(flat.length),
    widthFlags: new Uint8Array(flat.length),
    survivors: Uint16Array.from(flat, (c) => (c === 'B' ? 1 : 0)),
    fractions: null,
    elapsedMs: 0,
  } as PhaseMapResult;
}
