import { STATE_CLASS, stateIndex, type BindingMapResult, type PhaseMapResult } from '@fieldbound/shared';

/** What the filled regions show: the class of one orbital m, or the number of surviving states. */
export type ShownQuantity = { kind: 'orbital'; m: number } | { kind: 'survivors' };

/** Ordinal value per cell of an orbital's region: higher is "more bound", so nested contours fill correctly. */
export const REGION_VALUE = { unbound: 0, resonance: 1, bound: 2 } as const;
export type RegionName = keyof typeof REGION_VALUE;

/**
 * The per-cell scalar that the region contours are drawn from (row-major, `cell = j * nAlpha + i`).
 *
 * Orbital m: the best class of any of its levels — bound (2) if one survives the observation time, resonance (1)
 * if one is a resonance, else unbound (0). Without a phase map (no ion motion computed) every existing state is bound.
 * Survivors: the number of states that survive (phase map), or the number of bound states over all orbitals.
 */
export function regionField(binding: BindingMapResult, phase: PhaseMapResult | null, shown: ShownQuantity): Float64Array {
  const { cellCount, levelsPerOrbital, mMax } = binding;
  const out = new Float64Array(cellCount);
  if (shown.kind === 'survivors') {
    if (phase) {
      for (let c = 0; c < cellCount; c++) out[c] = phase.survivors[c];
    } else {
      for (let m = 0; m <= mMax; m++) for (let c = 0; c < cellCount; c++) out[c] += binding.counts[m * cellCount + c];
    }
    return out;
  }
  const m = shown.m;
  if (m > mMax) return out;
  for (let c = 0; c < cellCount; c++) {
    const count = binding.counts[m * cellCount + c];
    if (count === 0) continue;
    if (!phase) {
      out[c] = REGION_VALUE.bound;
      continue;
    }
    let best: number = REGION_VALUE.unbound;
    for (let nu = 0; nu < count && nu < levelsPerOrbital; nu++) {
      const cls = phase.stateClass[stateIndex(m, nu, c, levelsPerOrbital, cellCount)];
      if (cls === STATE_CLASS.BOUND) {
        best = REGION_VALUE.bound;
        break;
      }
      if (cls === STATE_CLASS.RESONANCE) best = REGION_VALUE.resonance;
    }
    out[c] = best;
  }
  return out;
}

/** Region name of a cell value of an orbital's region field. */
export function regionName(value: number): RegionName {
  return value >= REGION_VALUE.bound ? 'bound' : value >= REGION_VALUE.resonance ? 'resonance' : 'unbound';
}

/**
 * Binding energy (hartree) per cell that the iso-lines follow: the deepest level ν = 0 of orbital m, or, for the
 * survivors view, the deepest state of any orbital. 0 where nothing is bound.
 */
export function bindingField(binding: BindingMapResult, shown: ShownQuantity): Float64Array {
  const { cellCount, levelsPerOrbital, mMax } = binding;
  const out = new Float64Array(cellCount);
  const orbitals = shown.kind === 'orbital' ? [shown.m] : Array.from({ length: mMax + 1 }, (_, m) => m);
  for (const m of orbitals) {
    if (m > mMax || levelsPerOrbital === 0) continue;
    const base = stateIndex(m, 0, 0, levelsPerOrbital, cellCount);
    for (let c = 0; c < cellCount; c++) {
      const e = binding.bindingHartree[base + c];
      if (e > out[c]) out[c] = e;
    }
  }
  return out;
}
