import { SETUP_SCHEMA_VERSION, type MapSetup } from './mapSetup.js';

/** A named regime that fills the axis ranges (and a sensible display) of a setup. */
export interface SetupPreset {
  id: 'laboratory' | 'pulsed' | 'white-dwarf' | 'neutron-star';
  title: string;
  description: string;
  alphaAxis: MapSetup['alphaAxis'];
  fieldAxis: MapSetup['fieldAxis'];
  fieldUnit: MapSetup['display']['fieldUnit'];
  energyUnit: MapSetup['display']['energyUnit'];
}

// Field ranges: superconducting and resistive/hybrid laboratory magnets reach ~45 T continuous; pulsed-field
// facilities ~100 T non-destructively; magnetised white dwarfs ~10²–10⁵ T; neutron-star surfaces ~10⁷–10⁹ T
// (common practice of the field, order of magnitude only).
export const SETUP_PRESETS: readonly SetupPreset[] = [
  {
    id: 'laboratory',
    title: 'Laboratory magnets',
    description: 'Continuous fields of 1–45 T; polarizabilities of real atoms (1–1000 a₀³).',
    alphaAxis: { min: 1, max: 1000, scale: 'log' },
    fieldAxis: { min: 1, max: 45, scale: 'log' },
    fieldUnit: 'T',
    energyUnit: 'ueV',
  },
  {
    id: 'pulsed',
    title: 'Pulsed-field facilities',
    description: 'Pulsed fields of 10–100 T, millisecond duration.',
    alphaAxis: { min: 1, max: 1000, scale: 'log' },
    fieldAxis: { min: 10, max: 100, scale: 'log' },
    fieldUnit: 'T',
    energyUnit: 'ueV',
  },
  {
    id: 'white-dwarf',
    title: 'Magnetised white dwarfs',
    description: 'Surface fields of 10²–10⁵ T.',
    alphaAxis: { min: 1, max: 1000, scale: 'log' },
    fieldAxis: { min: 100, max: 1e5, scale: 'log' },
    fieldUnit: 'T',
    energyUnit: 'meV',
  },
  {
    id: 'neutron-star',
    title: 'Neutron-star surfaces',
    description: 'Surface fields of 10⁷–10⁹ T, where the field approaches and passes the atomic unit (2.35 × 10⁵ T).',
    alphaAxis: { min: 1, max: 1000, scale: 'log' },
    fieldAxis: { min: 1e7, max: 1e9, scale: 'log' },
    fieldUnit: 'au',
    energyUnit: 'meV',
  },
];

/** A complete, valid setup for the laboratory regime: the starting point of a new map. */
export function defaultSetup(): MapSetup {
  return {
    schemaVersion: SETUP_SCHEMA_VERSION,
    alphaAxis: { min: 1, max: 1000, scale: 'log' },
    fieldAxis: { min: 1, max: 45, scale: 'log' },
    grid: { nAlpha: 256, nField: 256 },
    orbitals: { mMax: 7 },
    shortRange: { model: 'regularized-polarization', cutoffBohr: 2 },
    energyFloorKelvin: 1e-3,
    motion: { kind: 'none' },
    ion: { massNumber: 40 },
    observationTimeSeconds: 1,
    contours: { levelsKelvin: [1e-3, 1e-2, 1e-1, 1, 10] },
    display: { alphaUnit: 'a0^3', fieldUnit: 'T', energyUnit: 'ueV', shown: { kind: 'orbital', m: 0 } },
    species: [],
    fieldBands: [],
  };
}

/** A copy of `setup` with the ranges and display units of `preset`. */
export function applyPreset(setup: MapSetup, preset: SetupPreset): MapSetup {
  return {
    ...setup,
    alphaAxis: { ...preset.alphaAxis },
    fieldAxis: { ...preset.fieldAxis },
    display: { ...setup.display, fieldUnit: preset.fieldUnit, energyUnit: preset.energyUnit },
  };
}
