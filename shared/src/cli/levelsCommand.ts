/// <reference types="node" />
import { EngineInputError } from '../errors.js';
import { levels } from '../levels/levels.js';
import type { LevelState } from '../levels/types.js';
import { hartreeTo } from '../units/convert.js';
import type { Hartree } from '../units/brand.js';
import { ENGINE_VERSION } from '../version.js';
import { formatNumber } from './formatNumber.js';
import { CliUsageError, type LevelsArgs } from './parseLevelsArgs.js';
import { CODATA2018 } from '../units/codata2018.js';
import { motionStates, type MotionFlag, type MotionStateResult, type ThermalFractions } from '../motion/motionStates.js';
import { ionCyclotronEnergy, motionalField, transverseEnergyAt } from '../motion/motionSettings.js';
import type { CliMotion } from './ionMotionArgs.js';

/** The JSON document printed by `fieldbound levels --json` (one object, states sorted by m then ν). */
export interface LevelsJson {
  engine: string;
  input: {
    alphaBohr3: number;
    field: number;
    fieldUnit: 'tesla' | 'au';
    fieldAu: number;
    cutoffBohr: number;
    mMax: number;
    /** Present only with an ion motion. */
    motion?: MotionInputJson;
  };
  states: {
    m: number;
    nu: number;
    bindingHartree: number;
    bindingOverB: number;
    /** Half-step error estimate; null when the solver could not estimate it (unresolved level). */
    relError: number | null;
    flags: string[];
    // With an ion motion only (JSON has no infinity: null stands for an infinite value, see USAGE):
    /** Γ in hartree; 0 when the decay channel is closed; null when the state is destroyed (infinite width). For a temperature: at E⊥ = kT. */
    widthHartree?: number | null;
    /** ħ/Γ in seconds; null when Γ = 0 (infinite lifetime); 0 when destroyed. */
    lifetimeSeconds?: number | null;
    /** Stark shift E_r + ε in hartree (≤ 0); null when destroyed. */
    shiftHartree?: number | null;
    class?: 'bound' | 'resonance' | 'unbound';
    motionFlags?: MotionFlag[];
    /** With a temperature: thermal fractions of each class (sum to 1). */
    fractions?: ThermalFractions;
  }[];
}

/** The ion motion as given and the derived quantities at the point's field (JSON `input.motion`). */
export interface MotionInputJson {
  massNumber: number;
  mode: 'kinetic-energy' | 'ion-level' | 'temperature';
  kineticEnergy?: { value: number; unit: string; kelvin: number };
  ionLevel?: number;
  temperatureKelvin?: number;
  tauSeconds: number;
  ionMassElectronMasses: number;
  /** Ion cyclotron quantum Ω = B/M in hartree. */
  ionCyclotronHartree: number;
  /** E⊥ in hartree (kT for a temperature: the energy at which width and class are given). */
  transverseEnergyHartree: number;
  /** Motional field F = B√(2E⊥/M) at that E⊥, atomic units and V/m. */
  motionalFieldAu: number;
  motionalFieldVoltPerMetre: number;
  /** ħ/τ in hartree: the width below which a state counts as bound. */
  boundWidthHartree: number;
}

const CLI_NAME: Record<string, string> = {
  alpha: '--alpha',
  fieldAu: '--field',
  cutoffBohr: '--cutoff',
  mMax: '--m-max',
};

/**
 * Runs `levels` for the parsed arguments and returns the text to print (JSON or a table).
 * Engine input errors are turned into CliUsageError naming the command-line option.
 */
export function levelsCommand(a: LevelsArgs): string {
  const fieldAu = a.fieldUnit === 'au' ? a.field : a.field / CODATA2018.atomicFieldInTesla;
  let states: LevelState[];
  try {
    states = levels({ alpha: a.alpha, fieldAu, cutoffBohr: a.cutoff, mMax: a.mMax });
  } catch (e) {
    if (e instanceof EngineInputError) throw new CliUsageError(CLI_NAME[e.parameter] ?? e.parameter, e.message);
    throw e;
  }
  states = [...states].sort((p, q) => p.m - q.m || p.nu - q.nu);
  const moving = a.motion ? motionStates({ fieldAu, states, motion: a.motion.settings }) : null;
  const motionInput = a.motion ? motionInputJson(a.motion, fieldAu) : null;
  if (a.json) {
    const doc: LevelsJson = {
      engine: ENGINE_VERSION,
      input: { alphaBohr3: a.alpha, field: a.field, fieldUnit: a.fieldUnit, fieldAu, cutoffBohr: a.cutoff, mMax: a.mMax },
      states: states.map((s, k) => ({
        m: s.m,
        nu: s.nu,
        bindingHartree: s.bindingHartree,
        bindingOverB: s.bindingOverB,
        relError: Number.isFinite(s.relError) ? s.relError : null,
        flags: [...s.flags],
        ...(moving ? motionJson(moving[k]!) : {}),
      })),
    };
    if (motionInput) doc.input.motion = motionInput;
    return JSON.stringify(doc);
  }
  const head = [
    `Fieldbound engine ${ENGINE_VERSION} — field-induced bound states of a fixed polarizable atom`,
    `alpha = ${formatNumber(a.alpha)} a0^3, B = ${formatNumber(a.field)} ${a.fieldUnit === 'au' ? 'a.u.' : 'T'}` +
      ` (${formatNumber(fieldAu)} a.u. = ${formatNumber(fieldAu * CODATA2018.atomicFieldInTesla)} T), r_c = ${formatNumber(a.cutoff)} a0, m = 0…${a.mMax}`,
    'binding energies below the lowest-Landau-level threshold',
    ...(motionInput ? motionHead(motionInput) : []),
    '',
  ];
  const cols = ['m', 'nu', 'parity', 'binding (hartree)', 'binding (ueV)', 'binding (K)', 'eps/B', 'rel. error', 'flags'];
  if (moving) {
    cols.push('width (hartree)', 'lifetime (s)', 'shift (hartree)', 'class', 'motion flags');
    if (a.motion!.settings.mode === 'thermal') cols.push('f bound', 'f resonance', 'f unbound');
  }
  const rows = states.map((s, k) => {
    const row = [
      String(s.m),
      String(s.nu),
      s.parity,
      formatNumber(s.bindingHartree),
      formatNumber(hartreeTo('ueV', s.bindingHartree as Hartree)),
      formatNumber(hartreeTo('K', s.bindingHartree as Hartree)),
      formatNumber(s.bindingOverB),
      Number.isFinite(s.relError) ? s.relError.toExponential(1) : 'n/a',
      s.flags.join(', ') || '-',
    ];
    const r = moving?.[k];
    if (r) {
      row.push(readable(r.widthHartree), readable(r.lifetimeSeconds), readable(r.shiftHartree), r.class, r.flags.join(', ') || '-');
      if (r.fractions) row.push(formatNumber(r.fractions.bound, 4), formatNumber(r.fractions.resonance, 4), formatNumber(r.fractions.unbound, 4));
    }
    return row;
  });
  const width = cols.map((c, k) => Math.max(c.length, ...rows.map((r) => r[k].length)));
  const line = (r: string[]): string => r.map((c, k) => (k < 3 ? c.padStart(width[k]) : c.padEnd(width[k]))).join('  ').trimEnd();
  const foot = [`${states.length} states`];
  if (moving) {
    const n = (c: string): number => moving.filter((r) => r.class === c).length;
    foot[0] += `: ${n('bound')} bound, ${n('resonance')} resonances, ${n('unbound')} unbound`;
    foot.push(
      'class: bound if the width is below hbar/tau (or the decay channel is closed), unbound if destroyed or width >= binding, else a resonance.',
      'Model estimate (lowest Landau level, zero-range width table with recoil); radiative decay and collisions are not included.',
    );
  }
  return [...head, line(cols), line(width.map((w) => '-'.repeat(w))), ...rows.map(line), '', ...foot].join('\n');
}

/** A number for JSON: non-finite values (infinite width or lifetime, no shift) become null. */
function jsonNumber(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

/** A number for the table: 'inf' for +Infinity, '-' for NaN. */
function readable(x: number): string {
  if (x === Infinity) return 'inf';
  if (Number.isNaN(x)) return '-';
  return formatNumber(x);
}

function motionJson(r: MotionStateResult): Partial<LevelsJson['states'][number]> {
  const o: Partial<LevelsJson['states'][number]> = {
    widthHartree: jsonNumber(r.widthHartree),
    lifetimeSeconds: jsonNumber(r.lifetimeSeconds),
    shiftHartree: jsonNumber(r.shiftHartree),
    class: r.class,
    motionFlags: [...r.flags],
  };
  if (r.fractions) o.fractions = { ...r.fractions };
  return o;
}

function motionInputJson(motion: CliMotion, fieldAu: number): MotionInputJson {
  const { settings, setupPart } = motion;
  const m = setupPart.motion;
  const ePerp = settings.mode === 'thermal' ? settings.kT : transverseEnergyAt(settings, fieldAu);
  const F = motionalField(fieldAu, ePerp, settings.ionMass);
  const out: MotionInputJson = {
    massNumber: setupPart.ion.massNumber,
    mode: m.kind === 'none' ? 'kinetic-energy' : m.kind,
    tauSeconds: setupPart.observationTimeSeconds,
    ionMassElectronMasses: settings.ionMass,
    ionCyclotronHartree: ionCyclotronEnergy(fieldAu, settings.ionMass),
    transverseEnergyHartree: ePerp,
    motionalFieldAu: F,
    motionalFieldVoltPerMetre: F * CODATA2018.atomicElectricFieldInVoltPerMetre,
    boundWidthHartree: settings.hbarOverTau,
  };
  if (m.kind === 'kinetic-energy' && motion.kineticEnergy) out.kineticEnergy = { ...motion.kineticEnergy, kelvin: m.energyKelvin };
  if (m.kind === 'ion-level') out.ionLevel = m.level;
  if (m.kind === 'temperature') out.temperatureKelvin = m.kelvin;
  return out;
}

function motionHead(mi: MotionInputJson): string[] {
  const what =
    mi.mode === 'kinetic-energy'
      ? `transverse kinetic energy ${formatNumber(mi.kineticEnergy!.value)} ${mi.kineticEnergy!.unit} (${formatNumber(mi.kineticEnergy!.kelvin)} K)`
      : mi.mode === 'ion-level'
        ? `ion Landau level N = ${mi.ionLevel}, E_perp = (N + 1/2) Omega = ${formatNumber(mi.transverseEnergyHartree)} hartree`
        : `thermal ensemble at T = ${formatNumber(mi.temperatureKelvin!)} K (width, lifetime, shift and class at E_perp = kT; fractions over the ensemble)`;
  return [
    `moving ion: mass number ${mi.massNumber}, ${what}, tau = ${formatNumber(mi.tauSeconds)} s`,
    `Omega = B/M = ${formatNumber(mi.ionCyclotronHartree)} hartree, motional field F = ${formatNumber(mi.motionalFieldAu)} a.u. = ${formatNumber(mi.motionalFieldVoltPerMetre)} V/m, hbar/tau = ${formatNumber(mi.boundWidthHartree)} hartree`,
  ];
}
