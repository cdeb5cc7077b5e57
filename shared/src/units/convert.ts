import { DomainError, UnitError } from '../errors.js';
import type {
  AngstromCubed, AtomicElectricField, AtomicField, AtomicPolarizability, AtomicTime, ElectronMasses,
  EnergyUnit, MagneticFieldUnit, Hartree, PolarizabilityUnit, Second, Tesla, VoltPerMetre,
} from './brand.js';
import { CODATA2018 as C } from './codata2018.js';
import { finite } from './finite.js';

/*
 * Conversions between the engine's atomic units and the units the product shows.
 * Every factor comes from CODATA 2018 (E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)),
 * see `codata2018.ts`. Every converter throws `DomainError` for a non-finite value and
 * `UnitError` for an unknown unit name.
 */

/** Size of one unit in hartree. */
const HARTREE_PER: Record<EnergyUnit, number> = {
  hartree: 1,
  eV: 1 / C.hartreeInEV,
  meV: 1e-3 / C.hartreeInEV,
  ueV: 1e-6 / C.hartreeInEV,
  K: 1 / C.hartreeInKelvin,
  GHz: 1e9 / C.hartreeInHz,
};
/** Value of one hartree in each unit (exact reciprocal factors avoid a division per call). */
const PER_HARTREE: Record<EnergyUnit, number> = {
  hartree: 1,
  eV: C.hartreeInEV,
  meV: C.hartreeInEV * 1e3,
  ueV: C.hartreeInEV * 1e6,
  K: C.hartreeInKelvin,
  GHz: C.hartreeInHz * 1e-9,
};
const A0CUBED_PER: Record<PolarizabilityUnit, number> = {
  'a0^3': 1,
  'A^3': 1 / C.bohrCubedInAngstromCubed,
  '1e-24cm^3': 1 / C.bohrCubedInAngstromCubed,
};
const AU_FIELD_PER: Record<MagneticFieldUnit, number> = { au: 1, T: 1 / C.atomicFieldInTesla };

function lookup<U extends string>(table: Record<U, number>, kind: string, unit: U): number {
  const f = Object.prototype.hasOwnProperty.call(table, unit) ? table[unit] : undefined;
  if (f === undefined) {
    throw new UnitError('unit', `unknown ${kind} unit '${String(unit)}' (expected one of ${Object.keys(table).join(', ')})`);
  }
  return f;
}

/**
 * Magnetic field: tesla → atomic units, B/B₀ with B₀ = 2.350517567581e5 T.
 * @example teslaToAtomic(tesla(235051.7567581)) // 1
 */
export function teslaToAtomic(b: Tesla): AtomicField {
  return (finite('b', b) / C.atomicFieldInTesla) as AtomicField;
}

/**
 * Magnetic field: atomic units → tesla, B·B₀.
 * @example atomicToTesla(atomicField(1e-4)) // 23.50517567581
 */
export function atomicToTesla(b: AtomicField): Tesla {
  return (finite('b', b) * C.atomicFieldInTesla) as Tesla;
}

/** Magnetic field in `unit` ('T' | 'au') → atomic units. @example toAtomicField('T', 10) // 4.254381…e-5 */
export function toAtomicField(unit: MagneticFieldUnit, value: number): AtomicField {
  return (finite('value', value) * lookup(AU_FIELD_PER, 'field', unit)) as AtomicField;
}

/** Magnetic field in atomic units → `unit` ('T' | 'au'). */
export function fieldTo(unit: MagneticFieldUnit, value: AtomicField): number {
  return finite('value', value) / lookup(AU_FIELD_PER, 'field', unit);
}

/**
 * Energy: hartree → `unit` ('hartree' | 'eV' | 'meV' | 'ueV' | 'K' (E/k_B) | 'GHz' (E/h)).
 * @example hartreeTo('eV', hartree(1)) // 27.211386245988
 */
export function hartreeTo(unit: EnergyUnit, value: Hartree): number {
  return finite('value', value) * lookup(PER_HARTREE, 'energy', unit);
}

/**
 * Energy: `unit` → hartree. @example toHartree('K', 315775.02480407) // 1 (to rounding)
 */
export function toHartree(unit: EnergyUnit, value: number): Hartree {
  return (finite('value', value) * lookup(HARTREE_PER, 'energy', unit)) as Hartree;
}

/**
 * Polarizability: `unit` ('a0^3' | 'A^3' | '1e-24cm^3') → a₀³.
 * @example toAtomicPolarizability('A^3', 24.33) // 164.19… (Cs, CRC value)
 */
export function toAtomicPolarizability(unit: PolarizabilityUnit, value: number): AtomicPolarizability {
  return (finite('value', value) * lookup(A0CUBED_PER, 'polarizability', unit)) as AtomicPolarizability;
}

/** Polarizability: a₀³ → `unit`. @example polarizabilityTo('A^3', atomicPolarizability(1)) // 0.14818471147216282 */
export function polarizabilityTo(unit: PolarizabilityUnit, value: AtomicPolarizability): number {
  return finite('value', value) / lookup(A0CUBED_PER, 'polarizability', unit);
}

/** Polarizability a₀³ → Å³ (typed). */
export function atomicToAngstromCubed(value: AtomicPolarizability): AngstromCubed {
  return (finite('value', value) * C.bohrCubedInAngstromCubed) as AngstromCubed;
}

/** Polarizability Å³ → a₀³ (typed). */
export function angstromCubedToAtomic(value: AngstromCubed): AtomicPolarizability {
  return (finite('value', value) / C.bohrCubedInAngstromCubed) as AtomicPolarizability;
}

/** Electric field: atomic units → V/m (× 5.14220674763e11). */
export function atomicElectricFieldToVoltPerMetre(f: AtomicElectricField): VoltPerMetre {
  return (finite('f', f) * C.atomicElectricFieldInVoltPerMetre) as VoltPerMetre;
}

/** Electric field: V/m → atomic units. */
export function voltPerMetreToAtomicElectricField(f: VoltPerMetre): AtomicElectricField {
  return (finite('f', f) / C.atomicElectricFieldInVoltPerMetre) as AtomicElectricField;
}

/** Time: atomic units → seconds (× 2.4188843265857e-17). */
export function atomicTimeToSecond(t: AtomicTime): Second {
  return (finite('t', t) * C.atomicTimeInSecond) as Second;
}

/** Time: seconds → atomic units. @example secondToAtomicTime(second(1)) // 4.134137333518212e16 */
export function secondToAtomicTime(t: Second): AtomicTime {
  return (finite('t', t) / C.atomicTimeInSecond) as AtomicTime;
}

/**
 * Ion mass from the mass number, in electron masses: M = A · (u/mₑ), u/mₑ = 1822.888486209
 * (the binding energy and the extra electron are neglected, as in the model).
 * Throws `DomainError` unless A is finite and > 0.
 * @example ionMassFromMassNumber(133) // 242444.16866579702
 */
export function ionMassFromMassNumber(massNumber: number): ElectronMasses {
  if (!(massNumber > 0) || !Number.isFinite(massNumber)) {
    throw new DomainError('massNumber', `must be finite and > 0, got ${massNumber}`);
  }
  return (massNumber * C.atomicMassUnitInElectronMasses) as ElectronMasses;
}
