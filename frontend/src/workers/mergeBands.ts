import type { BindingMapResult } from '@fieldbound/shared';

/**
 * Joins the results of contiguous row bands (lowest field first) into one map. Bands may store different
 * numbers of levels per orbital; the joined map stores the largest and pads with 0 (= no such state).
 * Throws when the bands do not share columns and orbitals.
 */
export function mergeBands(bands: readonly BindingMapResult[]): BindingMapResult {
  if (bands.length === 0) throw new Error('mergeBands: no bands');
  if (bands.length === 1) return bands[0];
  const first = bands[0];
  const nAlpha = first.nAlpha;
  const mMax = first.mMax;
  for (const b of bands) {
    if (b.nAlpha !== nAlpha || b.mMax !== mMax) throw new Error('mergeBands: bands differ in columns or orbitals');
  }
  const nField = bands.reduce((s, b) => s + b.nField, 0);
  const cellCount = nAlpha * nField;
  const L = Math.max(...bands.map((b) => b.levelsPerOrbital));
  const orbitals = mMax + 1;
  const bindingHartree = new Float64Array(orbitals * L * cellCount);
  const counts = new Uint16Array(orbitals * cellCount);
  const flags = new Uint8Array(orbitals * cellCount);
  const fieldsAu = new Float64Array(nField);
  let rowOffset = 0;
  for (const b of bands) {
    const cellOffset = rowOffset * nAlpha;
    fieldsAu.set(b.fieldsAu, rowOffset);
    for (let m = 0; m < orbitals; m++) {
      counts.set(b.counts.subarray(m * b.cellCount, (m + 1) * b.cellCount), m * cellCount + cellOffset);
      flags.set(b.flags.subarray(m * b.cellCount, (m + 1) * b.cellCount), m * cellCount + cellOffset);
      for (let nu = 0; nu < b.levelsPerOrbital; nu++) {
        const src = (m * b.levelsPerOrbital + nu) * b.cellCount;
        bindingHartree.set(b.bindingHartree.subarray(src, src + b.cellCount), (m * L + nu) * cellCount + cellOffset);
      }
    }
    rowOffset += b.nField;
  }
  return {
    engineVersion: first.engineVersion,
    nAlpha,
    nField,
    cellCount,
    mMax,
    levelsPerOrbital: L,
    alphas: first.alphas,
    fieldsAu,
    bindingHartree,
    counts,
    flags,
    maxRelError: Math.max(...bands.map((b) => b.maxRelError)),
    elapsedMs: Math.max(...bands.map((b) => b.elapsedMs)),
  };
}
