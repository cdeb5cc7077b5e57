import { UnitError } from '../errors.js';
import { axisNodes } from '../map/mapAxes.js';
import { MAP_FLAG, STATE_CLASS, type BindingMapResult, type PhaseMapResult } from '../map/mapTypes.js';
import type { MapSetup } from '../setup/mapSetup.js';
import { canonicalJson, setupFingerprint } from '../setup/fingerprint.js';
import { ENERGY_UNITS, type EnergyUnit } from '../units/brand.js';
import { CODATA2018 } from '../units/codata2018.js';
import { hartreeTo } from '../units/convert.js';
import { checkExportSize, type ExportSizeCheck } from './exportLimits.js';
import { MODEL_CAVEAT } from './figureMetadata.js';

/** What a CSV export is made from. `date` comes from the caller: the engine has no clock. */
export interface MapCsvInput {
  setup: MapSetup;
  binding: BindingMapResult;
  phase?: PhaseMapResult | null;
  date: string;
}

export interface MapCsvOptions {
  /** Extra binding-energy columns besides hartree, in this order. Default ['K', 'ueV']. */
  energyUnits?: readonly EnergyUnit[];
  /** Approximate size of each yielded chunk in characters. Default 65 536. */
  chunkChars?: number;
}

const CLASS_NAME: Record<number, string> = {
  [STATE_CLASS.NONE]: 'none',
  [STATE_CLASS.BOUND]: 'bound',
  [STATE_CLASS.RESONANCE]: 'resonance',
  [STATE_CLASS.UNBOUND]: 'unbound',
};

const FLAG_NAMES: [number, string][] = [
  [MAP_FLAG.CUTOFF_DOMINATED, 'cutoff-dominated'],
  [MAP_FLAG.NON_ADIABATIC, 'non-adiabatic'],
  [MAP_FLAG.BELOW_FLOOR, 'below-floor'],
  [MAP_FLAG.DIRECT_SOLVE, 'direct-solve'],
];

/** MAP_FLAG bits as names joined by '|' ('' for none). @example flagNames(3) // 'cutoff-dominated|non-adiabatic' */
export function flagNames(bits: number): string {
  return FLAG_NAMES.filter(([b]) => bits & b)
    .map(([, n]) => n)
    .join('|');
}

function checkUnits(units: readonly EnergyUnit[]): void {
  for (const u of units) {
    if (!ENERGY_UNITS.includes(u)) {
      throw new UnitError('energyUnits', `unknown energy unit '${String(u)}' for the CSV export (expected one of ${ENERGY_UNITS.join(', ')})`);
    }
  }
  if (new Set(units).size !== units.length) throw new UnitError('energyUnits', 'an energy unit is listed twice');
}

/** Column names of a CSV export, with the unit in each name. */
export function mapCsvColumns(hasPhase: boolean, hasFractions: boolean, energyUnits: readonly EnergyUnit[] = ['K', 'ueV']): string[] {
  checkUnits(energyUnits);
  const cols = ['alpha_a0^3', 'field_T', 'field_au', 'm', 'nu', 'binding_hartree', ...energyUnits.filter((u) => u !== 'hartree').map((u) => `binding_${u}`)];
  cols.push('width_hartree', 'class', 'flags');
  if (hasPhase && hasFractions) cols.push('fraction_bound', 'fraction_resonance', 'fraction_unbound');
  return cols;
}

function checkShapes(input: MapCsvInput): void {
  const { setup, binding, phase } = input;
  if (binding.nAlpha !== setup.grid.nAlpha || binding.nField !== setup.grid.nField || binding.mMax !== setup.orbitals.mMax) {
    throw new RangeError('the binding map does not belong to this setup (grid or orbitals differ)');
  }
  const states = (binding.mMax + 1) * binding.levelsPerOrbital * binding.cellCount;
  if (binding.bindingHartree.length !== states) throw new RangeError(`binding map has ${binding.bindingHartree.length} states, expected ${states}`);
  if (phase && (phase.stateClass.length !== states || phase.widthHartree.length !== states)) {
    throw new RangeError('the phase map does not match the binding map (state counts differ)');
  }
}

/** The `#` comment lines that open a CSV export (each ends in a newline). */
export function mapCsvHeader(input: MapCsvInput, options: MapCsvOptions = {}): string {
  const { setup, binding, phase } = input;
  const units = options.energyUnits ?? ['K', 'ueV'];
  checkUnits(units);
  const unitWords: Record<EnergyUnit, string> = {
    hartree: 'hartree E_h',
    eV: 'electronvolt',
    meV: 'millielectronvolt',
    ueV: 'microelectronvolt (µeV)',
    K: 'kelvin, E/k_B',
    GHz: 'gigahertz, E/h',
  };
  const motion = setup.motion;
  const lines = [
    'Fieldbound map export (CSV, comma-separated, UTF-8)',
    `engine version: ${binding.engineVersion}`,
    `setup fingerprint: ${setupFingerprint(setup)}`,
    `date: ${input.date}`,
    `caveat: ${MODEL_CAVEAT}`,
    'model: electron bound to a neutral atom of polarizability alpha in a uniform magnetic field B; regularized polarization potential -alpha/(2(r^2 + r_c^2)^2); lowest Landau level, one orbital m at a time; binding energies below the lowest-Landau-level threshold',
    `grid: ${binding.nAlpha} polarizabilities (${setup.alphaAxis.scale}, ${setup.alphaAxis.min} to ${setup.alphaAxis.max} a0^3) x ${binding.nField} fields (${setup.fieldAxis.scale}, ${setup.fieldAxis.min} to ${setup.fieldAxis.max} T), node-centred; orbitals m = 0 to ${binding.mMax}; cutoff radius r_c = ${setup.shortRange.cutoffBohr} bohr; energy floor ${setup.energyFloorKelvin} K`,
    'rows: one per cell, orbital m and bound level nu (nu = 0 the most deeply bound); a cell and orbital without rows has no bound level above the energy floor',
    'units: alpha_a0^3 static dipole polarizability in bohr^3; field_T magnetic flux density in tesla; field_au the same in atomic units B0 = hbar/(e a0^2); m orbital (the electron angular momentum is -m); nu level',
    `units: binding_hartree binding energy in hartree${units.filter((u) => u !== 'hartree').map((u) => `; binding_${u} the same in ${unitWords[u]}`).join('')}; width_hartree decay width Gamma in hartree`,
    `constants: CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)): B0 = ${CODATA2018.atomicFieldInTesla} T, E_h = ${CODATA2018.hartreeInEV} eV = ${CODATA2018.hartreeInKelvin} K k_B = ${CODATA2018.hartreeInHz} Hz h`,
    'flags (per orbital and cell): cutoff-dominated = m = 0 with alpha/r_c^2 >= 1 (depends on the cutoff); non-adiabatic = eps/B > 0.1 for the deepest level of the orbital; below-floor = some level of this orbital lies below the floor and is not listed; direct-solve = solved directly instead of interpolated',
    phase
      ? `class: bound (width below hbar/tau, tau = ${setup.observationTimeSeconds} s), resonance, or unbound (destroyed or width >= binding energy), for the moving ion (${motionWords(motion)}, mass number ${setup.ion.massNumber})${phase.fractions ? '; fraction_* thermal probabilities of each class' : ''}`
      : 'class: bound for every listed state (atom held fixed, no ion motion computed); width_hartree is empty',
    `setup: ${canonicalJson(setup)}`,
  ];
  return lines.map((l) => `# ${l}\n`).join('');
}

function motionWords(motion: MapSetup['motion']): string {
  switch (motion.kind) {
    case 'none':
      return 'no motion';
    case 'kinetic-energy':
      return `transverse kinetic energy ${motion.energyKelvin} K k_B`;
    case 'ion-level':
      return `ion Landau level N = ${motion.level}`;
    case 'temperature':
      return `thermal ensemble at T = ${motion.kelvin} K`;
  }
}

/**
 * CSV of a map, as a generator of text chunks (the header block first, then rows in chunks of about `chunkChars`) so that a 512 × 512 map with
 * eight orbitals never becomes one giant string: a `#` header block (engine version, setup fingerprint,
 * the caller's date, units, the model caveat, the setup itself), a column line, then one row per cell
 * (rows of constant field, α fastest), orbital m and bound level ν. Numbers are written in the shortest
 * form that reads back to the same double (ECMAScript Number::toString), so `binding_hartree` round-trips
 * bit for bit.
 *
 * Bad input: throws `UnitError` for an unknown energy unit and `RangeError` when the results do not
 * belong to the setup — before yielding anything.
 *
 * @example
 * [...mapCsvChunks({ setup, binding, date: '2026-12-02' })].join('') // '# Fieldbound map export …\nalpha_a0^3,field_T,…\n1,1,…'
 */
export function* mapCsvChunks(input: MapCsvInput, options: MapCsvOptions = {}): Generator<string, void, undefined> {
  const units = (options.energyUnits ?? ['K', 'ueV']).filter((u) => u !== 'hartree');
  checkUnits(units);
  checkShapes(input);
  const { setup, binding } = input;
  const phase = input.phase ?? null;
  const chunkChars = options.chunkChars ?? 65536;
  const factors = units.map((u) => hartreeTo(u, 1 as Parameters<typeof hartreeTo>[1]));
  const alphaText = Array.from(binding.alphas, (a) => String(a));
  const teslaNodes = axisNodes(setup.fieldAxis.min, setup.fieldAxis.max, setup.fieldAxis.scale, setup.grid.nField);
  const fieldText = Array.from(binding.fieldsAu, (b, j) => `${teslaNodes[j]},${b}`);
  const { cellCount, levelsPerOrbital: L, mMax } = binding;
  const fractions = phase?.fractions ?? null;

  yield mapCsvHeader(input, options) + mapCsvColumns(phase !== null, fractions !== null, units).join(',') + '\n';
  let buf = '';
  for (let j = 0; j < binding.nField; j++) {
    for (let i = 0; i < binding.nAlpha; i++) {
      const cell = j * binding.nAlpha + i;
      const prefix = `${alphaText[i]},${fieldText[j]},`;
      for (let m = 0; m <= mMax; m++) {
        const n = binding.counts[m * cellCount + cell];
        if (n === 0) continue;
        const flags = flagNames(binding.flags[m * cellCount + cell]);
        for (let nu = 0; nu < n && nu < L; nu++) {
          const s = (m * L + nu) * cellCount + cell;
          const e = binding.bindingHartree[s];
          let row = `${prefix}${m},${nu},${e}`;
          for (const f of factors) row += `,${e * f}`;
          if (phase) {
            row += `,${phase.widthHartree[s]},${CLASS_NAME[phase.stateClass[s]] ?? 'none'},${flags}`;
            if (fractions) row += `,${fractions[3 * s]},${fractions[3 * s + 1]},${fractions[3 * s + 2]}`;
          } else row += `,,bound,${flags}`;
          buf += row + '\n';
        }
      }
      if (buf.length >= chunkChars) {
        yield buf;
        buf = '';
      }
    }
  }
  if (buf.length > 0) yield buf;
}

/** Number of data rows a CSV export of this map has (one per cell, orbital and bound level). */
export function mapCsvRowCount(binding: BindingMapResult): number {
  let rows = 0;
  const L = binding.levelsPerOrbital;
  for (let k = 0; k < binding.counts.length; k++) rows += Math.min(binding.counts[k], L);
  return rows;
}

/**
 * Estimated size in bytes of the CSV export (header + rows × the mean length of the rows of up to 256
 * cells spread evenly over the map, formatted exactly), with the size check against `EXPORT_LIMITS`. Costs one pass
 * over the counts, not a full format.
 */
export function estimateMapCsv(input: MapCsvInput, options: MapCsvOptions & { maxBytes?: number } = {}): ExportSizeCheck & { rows: number } {
  checkShapes(input);
  const rows = mapCsvRowCount(input.binding);
  const units = options.energyUnits ?? ['K', 'ueV'];
  const header = mapCsvHeader(input, options).length + mapCsvColumns(!!input.phase, !!input.phase?.fractions, units).join(',').length + 1;
  let sampleChars = 0;
  let sampleRows = 0;
  if (rows > 0) {
    const { binding } = input;
    // Format every row of up to 256 cells spread evenly over the map (the number lengths vary with α and B).
    const samples = Math.min(256, binding.cellCount);
    for (let k = 0; k < samples; k++) {
      // rows evenly spaced, columns by the golden-ratio sequence (so samples do not line up in one column)
      const j = Math.floor(((k + 0.5) * binding.nField) / samples);
      const i = Math.floor((((k * 0.6180339887498949) % 1) + 1e-9) * binding.nAlpha) % binding.nAlpha;
      const cell = j * binding.nAlpha + i;
      for (let m = 0; m <= binding.mMax; m++) {
        const n = Math.min(binding.counts[m * binding.cellCount + cell], binding.levelsPerOrbital);
        for (let nu = 0; nu < n; nu++) {
          sampleChars += sampleRowLength(input, units, i, j, m, nu);
          sampleRows++;
        }
      }
    }
  }
  const mean = sampleRows > 0 ? sampleChars / sampleRows : 0;
  const bytes = Math.ceil(header * 1.05 + rows * mean);
  return { ...checkExportSize('csv', bytes, 'this map', options.maxBytes), rows };
}

function sampleRowLength(input: MapCsvInput, units: readonly EnergyUnit[], i: number, j: number, m: number, nu: number): number {
  const { binding, phase } = input;
  const cell = j * binding.nAlpha + i;
  const s = (m * binding.levelsPerOrbital + nu) * binding.cellCount + cell;
  const e = binding.bindingHartree[s];
  let row = `${binding.alphas[i]},${binding.fieldsAu[j] * CODATA2018.atomicFieldInTesla},${binding.fieldsAu[j]},${m},${nu},${e}`;
  for (const u of units) if (u !== 'hartree') row += `,${hartreeTo(u, e as Parameters<typeof hartreeTo>[1])}`;
  row += `,${phase ? phase.widthHartree[s] : ''},${phase ? 'resonance' : 'bound'},${flagNames(binding.flags[m * binding.cellCount + cell])}`;
  if (phase?.fractions) row += `,${phase.fractions[3 * s]},${phase.fractions[3 * s + 1]},${phase.fractions[3 * s + 2]}`;
  return row.length + 1;
}
