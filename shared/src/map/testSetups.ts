import { defaultSetup } from '../setup/presets.js';
import type { MapSetup } from '../setup/mapSetup.js';
import { CODATA2018 } from '../units/codata2018.js';

/** Field in atomic units → tesla (for writing setups in a.u.). */
export const auToTesla = (b: number): number => b * CODATA2018.atomicFieldInTesla;

/** A setup for tests and the benchmark: the default setup with the given axes, grid, orbitals, cutoff and floor. */
export function mapTestSetup(p: {
  alpha: [number, number, 'log' | 'linear'];
  fieldTesla: [number, number, 'log' | 'linear'];
  grid: [number, number];
  mMax: number;
  cutoffBohr: number;
  floorKelvin: number;
}): MapSetup {
  return {
    ...defaultSetup(),
    alphaAxis: { min: p.alpha[0], max: p.alpha[1], scale: p.alpha[2] },
    fieldAxis: { min: p.fieldTesla[0], max: p.fieldTesla[1], scale: p.fieldTesla[2] },
    grid: { nAlpha: p.grid[0], nField: p.grid[1] },
    orbitals: { mMax: p.mMax },
    shortRange: { model: 'regularized-polarization', cutoffBohr: p.cutoffBohr },
    energyFloorKelvin: p.floorKelvin,
    contours: { levelsKelvin: [] },
    display: { ...defaultSetup().display, shown: { kind: 'orbital', m: 0 } },
  };
}

/** The benchmark's map (issue 3, item 9): α = 1…1000 a₀³, B = 1e-6…1e-1 a.u. (log), r_c = 2, m = 0…7, no floor. */
export function benchSetup(n = 512): MapSetup {
  return mapTestSetup({
    alpha: [1, 1000, 'log'],
    fieldTesla: [auToTesla(1e-6), auToTesla(1e-1), 'log'],
    grid: [n, n],
    mMax: 7,
    cutoffBohr: 2,
    floorKelvin: 0,
  });
}
