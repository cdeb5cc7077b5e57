/// <reference types="node" />
import { z } from 'zod';
import { motionSettingsFromSetup } from '../motion/phaseMap.js';
import type { MotionSettings } from '../motion/motionSettings.js';
import { mapSetupSchema, motionSchema, type IonMotion, type MapSetup } from '../setup/mapSetup.js';
import type { Hartree } from '../units/brand.js';
import { hartreeTo, toHartree } from '../units/convert.js';
import { CliUsageError } from './cliUsageError.js';

/** Units accepted by `--energy-unit` (the transverse kinetic energy of the ion). */
export const CLI_ENERGY_UNITS = ['hartree', 'K', 'eV'] as const;
export type CliEnergyUnit = (typeof CLI_ENERGY_UNITS)[number];

/** The ion-motion options of `fieldbound levels` as typed on the command line (strings, unparsed). */
export interface RawMotionOptions {
  massNumber?: string;
  kineticEnergy?: string;
  energyUnit?: string;
  ionLevel?: string;
  temperature?: string;
  tau?: string;
}

/** Ion motion of `fieldbound levels`, in the setup's own stored form plus what was typed. */
export interface CliMotion {
  /** The setup fields the server validates (kelvin for energies, seconds for τ). */
  setupPart: Pick<MapSetup, 'motion' | 'ion' | 'observationTimeSeconds'>;
  /** Validated engine settings (atomic units), from `motionSettingsFromSetup`. */
  settings: MotionSettings;
  /** The kinetic energy as typed, with its unit (mode 'kinetic-energy' only). */
  kineticEnergy: { value: number; unit: CliEnergyUnit } | null;
}

/** Which command-line option each setup field comes from (for the error message). */
const OPTION_OF_PATH: Record<string, string> = {
  'motion.energyKelvin': '--kinetic-energy',
  'motion.level': '--ion-level',
  'motion.kelvin': '--temperature',
  'ion.massNumber': '--mass-number',
  observationTimeSeconds: '--tau',
};

/** The same rules as the server's setup validation (mapSetupSchema), for just the ion-motion fields. */
const motionPartSchema = z.strictObject({
  motion: motionSchema,
  ion: mapSetupSchema.shape.ion,
  observationTimeSeconds: mapSetupSchema.shape.observationTimeSeconds,
});

function number(option: string, raw: string): number {
  const v = Number(raw);
  if (raw.trim() === '' || !Number.isFinite(v)) throw new CliUsageError(option, `must be a finite number, got '${raw}'`);
  return v;
}

/**
 * Turns the ion-motion options into validated motion settings, or null when none was given
 * (a fixed atom). The values are checked by the server's setup schema (mapSetupSchema: mass number a
 * whole number in 1…300, energies ≥ 0, temperature > 0, Landau level a whole number ≥ 0, τ in
 * 1e-15…1e9 s) and converted by the engine's own `motionSettingsFromSetup`.
 *
 * Bad input: CliUsageError naming the option — an unknown unit, conflicting modes (more than one of
 * --kinetic-energy, --ion-level, --temperature), --energy-unit without --kinetic-energy (or the
 * reverse), --mass-number or --tau without a mode, a mode without --mass-number, or a value the
 * schema refuses.
 *
 * @example
 * ionMotionFromArgs({ massNumber: '133', temperature: '0.5' })?.settings.mode // 'thermal'
 */
export function ionMotionFromArgs(o: RawMotionOptions): CliMotion | null {
  const modes = (
    [
      ['--kinetic-energy', o.kineticEnergy],
      ['--ion-level', o.ionLevel],
      ['--temperature', o.temperature],
    ] as const
  ).filter(([, v]) => v !== undefined);
  if (modes.length > 1) {
    throw new CliUsageError(modes[1]![0], `conflicts with ${modes[0]![0]}: give only one of --kinetic-energy, --ion-level, --temperature`);
  }
  if (o.energyUnit !== undefined && o.kineticEnergy === undefined) {
    throw new CliUsageError('--energy-unit', 'is only used with --kinetic-energy');
  }
  if (modes.length === 0) {
    if (o.massNumber !== undefined) throw new CliUsageError('--mass-number', 'needs an ion motion: one of --kinetic-energy, --ion-level, --temperature');
    if (o.tau !== undefined) throw new CliUsageError('--tau', 'needs an ion motion: one of --kinetic-energy, --ion-level, --temperature');
    return null;
  }
  if (o.massNumber === undefined) throw new CliUsageError('--mass-number', 'is required with an ion motion (the ion mass number A, 1…300)');
  const massNumber = number('--mass-number', o.massNumber);
  const tau = o.tau === undefined ? 1 : number('--tau', o.tau);
  let motion: IonMotion;
  let kineticEnergy: CliMotion['kineticEnergy'] = null;
  if (o.kineticEnergy !== undefined) {
    if (o.energyUnit === undefined) throw new CliUsageError('--energy-unit', `is required with --kinetic-energy (${CLI_ENERGY_UNITS.join(', ')})`);
    const unit = CLI_ENERGY_UNITS.find((u) => u === o.energyUnit);
    if (unit === undefined) throw new CliUsageError('--energy-unit', `must be one of ${CLI_ENERGY_UNITS.join(', ')}, got '${o.energyUnit}'`);
    const value = number('--kinetic-energy', o.kineticEnergy);
    const kelvin = unit === 'K' ? value : hartreeTo('K', toHartree(unit, value) as Hartree);
    motion = { kind: 'kinetic-energy', energyKelvin: kelvin };
    kineticEnergy = { value, unit };
  } else if (o.ionLevel !== undefined) {
    motion = { kind: 'ion-level', level: number('--ion-level', o.ionLevel) };
  } else {
    motion = { kind: 'temperature', kelvin: number('--temperature', o.temperature!) };
  }
  const parsed = motionPartSchema.safeParse({ motion, ion: { massNumber }, observationTimeSeconds: tau });
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    const path = issue.path.map(String).join('.');
    throw new CliUsageError(OPTION_OF_PATH[path] ?? path, issue.message);
  }
  const settings = motionSettingsFromSetup(parsed.data);
  if (!settings) throw new Error('ion motion expected');
  return { setupPart: parsed.data, settings, kineticEnergy };
}
