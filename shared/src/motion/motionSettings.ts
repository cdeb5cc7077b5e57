/**
 * Ion motion settings: validation and the derived quantities every width
 * evaluation needs (atomic units: ħ = mₑ = e = 1).
 */
import { EngineInputError } from '../errors.js';
import { CODATA2018 } from '../units/codata2018.js';

/** Input of {@link validateMotionSettings}. Exactly one of the three motion modes must be given. */
export interface MotionSettingsInput {
  /** Mass number A of the ion, 1 … 300 (M = A · 1822.888486209 mₑ). */
  massNumber?: number;
  /** Ion mass in electron masses (instead of `massNumber`), > 0. */
  ionMassElectronMasses?: number;
  /** Transverse centre-of-mass kinetic energy E⊥ in hartree, ≥ 0. */
  transverseEnergyHartree?: number;
  /** Ion Landau level N (integer ≥ 0): E⊥ = (N + ½) Ω, Ω = B/M. */
  ionLandauLevel?: number;
  /** Temperature in kelvin, > 0: thermal (2D Maxwell–Boltzmann) ensemble of E⊥. */
  temperatureKelvin?: number;
  /** Observation time τ in seconds, > 0 (default 1 s): Γ < ħ/τ counts as bound. */
  observationTimeSeconds?: number;
}

/** Validated motion settings (atomic units). */
export interface MotionSettings {
  /** Ion mass M in electron masses. */
  ionMass: number;
  mode: 'energy' | 'level' | 'thermal';
  /** E⊥ in hartree (mode 'energy'). */
  transverseEnergy: number;
  /** N (mode 'level'). */
  ionLandauLevel: number;
  /** k_B T in hartree (mode 'thermal'). */
  kT: number;
  /** τ in atomic units of time. */
  observationTime: number;
  /** ħ/τ in hartree (the bound threshold on Γ). */
  hbarOverTau: number;
}

const MASS_NUMBER_MAX = 300;

/**
 * Validate ion-motion settings before any work.
 *
 * Domain: massNumber ∈ [1, 300] (or ionMassElectronMasses > 0, not both);
 * exactly one of transverseEnergyHartree ≥ 0, ionLandauLevel ∈ {0, 1, 2, …},
 * temperatureKelvin > 0; observationTimeSeconds > 0 (default 1).
 * Bad input: throws `EngineInputError` naming the offending parameter.
 *
 * @example
 * validateMotionSettings({ massNumber: 133, temperatureKelvin: 1 });
 * // { ionMass: 242444.1686657970, mode: 'thermal', kT: 3.1668115634556e-6, hbarOverTau: 2.4188843265857e-17, … }
 */
export function validateMotionSettings(input: MotionSettingsInput): MotionSettings {
  const { massNumber, ionMassElectronMasses } = input;
  let ionMass: number;
  if (massNumber !== undefined && ionMassElectronMasses !== undefined) {
    throw new EngineInputError('massNumber', 'give either massNumber or ionMassElectronMasses, not both');
  }
  if (massNumber !== undefined) {
    if (!(Number.isFinite(massNumber) && massNumber >= 1 && massNumber <= MASS_NUMBER_MAX)) {
      throw new EngineInputError('massNumber', `must be a number in 1…${MASS_NUMBER_MAX}, got ${massNumber}`);
    }
    ionMass = massNumber * CODATA2018.atomicMassUnitInElectronMasses;
  } else if (ionMassElectronMasses !== undefined) {
    if (!(Number.isFinite(ionMassElectronMasses) && ionMassElectronMasses > 0)) {
      throw new EngineInputError('ionMassElectronMasses', `must be finite and > 0, got ${ionMassElectronMasses}`);
    }
    ionMass = ionMassElectronMasses;
  } else {
    throw new EngineInputError('massNumber', 'the ion mass is required (massNumber or ionMassElectronMasses)');
  }
  const given = [
    input.transverseEnergyHartree !== undefined,
    input.ionLandauLevel !== undefined,
    input.temperatureKelvin !== undefined,
  ].filter(Boolean).length;
  if (given !== 1) {
    throw new EngineInputError(
      'motion',
      `give exactly one of transverseEnergyHartree, ionLandauLevel, temperatureKelvin (got ${given})`,
    );
  }
  const tauS = input.observationTimeSeconds ?? 1;
  if (!(Number.isFinite(tauS) && tauS > 0)) {
    throw new EngineInputError('observationTimeSeconds', `must be finite and > 0, got ${tauS}`);
  }
  const observationTime = tauS / CODATA2018.atomicTimeInSecond;
  const base = { ionMass, observationTime, hbarOverTau: 1 / observationTime, transverseEnergy: NaN, ionLandauLevel: NaN, kT: NaN };
  if (input.transverseEnergyHartree !== undefined) {
    const e = input.transverseEnergyHartree;
    if (!(Number.isFinite(e) && e >= 0)) {
      throw new EngineInputError('transverseEnergyHartree', `must be finite and ≥ 0, got ${e}`);
    }
    return { ...base, mode: 'energy', transverseEnergy: e };
  }
  if (input.ionLandauLevel !== undefined) {
    const n = input.ionLandauLevel;
    if (!(Number.isInteger(n) && n >= 0)) {
      throw new EngineInputError('ionLandauLevel', `must be an integer ≥ 0, got ${n}`);
    }
    return { ...base, mode: 'level', ionLandauLevel: n };
  }
  const t = input.temperatureKelvin!;
  if (!(Number.isFinite(t) && t > 0)) {
    throw new EngineInputError('temperatureKelvin', `must be finite and > 0, got ${t}`);
  }
  return { ...base, mode: 'thermal', kT: t / CODATA2018.hartreeInKelvin };
}

/**
 * The ion's cyclotron quantum Ω = B/M (hartree), B in atomic units, M in mₑ
 * (charge −1: |q| = e). Source: L. D. Landau and E. M. Lifshitz, QM §112.
 * @example ionCyclotronEnergy(1e-4, 1822.888486209) // 5.4857990906e-8
 */
export function ionCyclotronEnergy(fieldAu: number, ionMass: number): number {
  return fieldAu / ionMass;
}

/**
 * Transverse kinetic energy E⊥ (hartree) of the settings at field B: E⊥ itself,
 * or (N + ½)Ω for an ion Landau level. NaN for the thermal mode (an ensemble).
 */
export function transverseEnergyAt(settings: MotionSettings, fieldAu: number): number {
  if (settings.mode === 'energy') return settings.transverseEnergy;
  if (settings.mode === 'level') return (settings.ionLandauLevel + 0.5) * ionCyclotronEnergy(fieldAu, settings.ionMass);
  return NaN;
}

/**
 * Motional electric field in the ion's frame, F = B v⊥ = B √(2E⊥/M) (atomic
 * units; for level N: F = (B^{3/2}/M) √(2N + 1)). v⊥ is the kinetic (cyclotron)
 * velocity, not the pseudomomentum, which for a charged system only fixes where
 * the cyclotron orbit is centred (J. E. Avron, I. W. Herbst, B. Simon,
 * Ann. Phys. 114, 431 (1978); P. Schmelcher and L. S. Cederbaum, Phys. Rev. A 43,
 * 287 (1991)).
 *
 * Domain: B ≥ 0, E⊥ ≥ 0, M > 0. Returns NaN for negative inputs.
 * @example motionalField(1e-4, 1e-9, 242444.17) // 9.0824e-12 (a.u.) = 4.670 V/m
 */
export function motionalField(fieldAu: number, transverseEnergy: number, ionMass: number): number {
  if (!(fieldAu >= 0 && transverseEnergy >= 0 && ionMass > 0)) return NaN;
  return fieldAu * Math.sqrt((2 * transverseEnergy) / ionMass);
}

/** Motional field in V/m for display (1 a.u. = 5.14220674763e11 V/m, CODATA 2018). */
export function motionalFieldVoltPerMetre(fieldAu: number, transverseEnergy: number, ionMass: number): number {
  return motionalField(fieldAu, transverseEnergy, ionMass) * CODATA2018.atomicElectricFieldInVoltPerMetre;
}
