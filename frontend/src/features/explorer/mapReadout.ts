import { MAP_FLAG, STATE_CLASS, stateIndex, type BindingMapResult, type DisplayEnergyUnit, type PhaseMapResult } from '@fieldbound/shared';
import { ENERGY_UNIT_LABEL, energyToDisplay } from '../map-render/displayUnits';
import { formatScientific } from '../map-render/formatNumber';
import { nearestNode, type GridAxis } from '../map-render/gridGeometry';
import type { ShownQuantity } from '../map-render/regionField';

/**
 * The quantity under the cursor at the nearest grid node of a result: for an orbital its deepest binding energy
 * (or "unbound") with validity warnings; for survivors the number of bound states. With the moving-ion classes
 * (`phase`, same grid) survivors are the states that survive the observation time and an orbital's line names its
 * class. Null outside the grid.
 */
export function readoutAt(
  result: BindingMapResult,
  alpha: GridAxis,
  field: GridAxis,
  alphaAu: number,
  fieldAu: number,
  shown: ShownQuantity,
  energyUnit: DisplayEnergyUnit,
  phase: PhaseMapResult | null = null,
): string | null {
  const i = nearestNode(alpha, alphaAu);
  const j = nearestNode(field, fieldAu);
  if (i < 0 || j < 0) return null;
  const cell = j * result.nAlpha + i;
  const { cellCount, levelsPerOrbital } = result;
  if (shown.kind === 'survivors') {
    if (phase) {
      const n = phase.survivors[cell];
      return `${n} state${n === 1 ? '' : 's'} survive (m = 0…${result.mMax}, ion motion)`;
    }
    let n = 0;
    for (let m = 0; m <= result.mMax; m++) n += result.counts[m * cellCount + cell];
    return `${n} bound state${n === 1 ? '' : 's'} (m = 0…${result.mMax})`;
  }
  const m = shown.m;
  if (m > result.mMax) return null;
  const count = result.counts[m * cellCount + cell];
  if (count === 0 || levelsPerOrbital === 0) return `m = ${m}: unbound`;
  const e = result.bindingHartree[stateIndex(m, 0, cell, levelsPerOrbital, cellCount)];
  const flags = result.flags[m * cellCount + cell];
  const notes = [flags & MAP_FLAG.CUTOFF_DOMINATED ? 'cutoff-dominated' : '', flags & MAP_FLAG.NON_ADIABATIC ? 'non-adiabatic' : ''].filter(Boolean);
  let cls = '';
  if (phase) {
    let best = 'unbound';
    for (let nu = 0; nu < count && nu < levelsPerOrbital; nu++) {
      const c = phase.stateClass[stateIndex(m, nu, cell, levelsPerOrbital, cellCount)];
      if (c === STATE_CLASS.BOUND) {
        best = 'bound';
        break;
      }
      if (c === STATE_CLASS.RESONANCE) best = 'resonance';
    }
    cls = ` · ${best} with ion motion`;
  }
  return `m = ${m}: ε = ${formatScientific(energyToDisplay(e, energyUnit), { digits: 3 })} ${ENERGY_UNIT_LABEL[energyUnit]}, ${count} level${count === 1 ? '' : 's'}${cls}${notes.length ? ` · ${notes.join(', ')}` : ''}`;
}
