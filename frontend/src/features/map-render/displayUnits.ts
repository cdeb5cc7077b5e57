import {
  fieldTo, hartreeTo, polarizabilityTo, toAtomicField, toAtomicPolarizability, toHartree, atomicToTesla, teslaToAtomic,
  type AlphaUnit, type AtomicField, type AtomicPolarizability, type DisplayEnergyUnit, type FieldUnit, type Hartree,
  type Tesla,
} from '@fieldbound/shared';

/**
 * The units the interface shows, and conversions to and from the setup's canonical units
 * (α in a₀³, B in tesla, energies in kelvin). Every factor comes from the engine's CODATA 2018 table.
 */

export const ALPHA_UNIT_LABEL: Record<AlphaUnit, string> = { 'a0^3': 'a₀³', 'A^3': 'Å³', '1e-24cm^3': '10⁻²⁴ cm³' };
export const FIELD_UNIT_LABEL: Record<FieldUnit, string> = { T: 'T', au: 'a.u.' };
export const ENERGY_UNIT_LABEL: Record<DisplayEnergyUnit, string> = { ueV: 'µeV', meV: 'meV', K: 'K', GHz: 'GHz' };

/** α: a₀³ → the display unit. */
export function alphaToDisplay(alphaAu: number, unit: AlphaUnit): number {
  return polarizabilityTo(unit, alphaAu as AtomicPolarizability);
}
/** α: the display unit → a₀³. */
export function alphaFromDisplay(value: number, unit: AlphaUnit): number {
  return toAtomicPolarizability(unit, value);
}
/** B: tesla → the display unit (T or atomic units). Tesla passes through untouched (a round trip through atomic units would turn 20 T into 19.999999999999996 T). */
export function fieldTeslaToDisplay(teslaValue: number, unit: FieldUnit): number {
  return unit === 'T' ? teslaValue : fieldTo(unit, teslaToAtomic(teslaValue as Tesla));
}
/** B: the display unit → tesla. */
export function fieldDisplayToTesla(value: number, unit: FieldUnit): number {
  return unit === 'T' ? value : atomicToTesla(toAtomicField(unit, value));
}
/** B: atomic units → the display unit. */
export function fieldAuToDisplay(fieldAu: number, unit: FieldUnit): number {
  return fieldTo(unit, fieldAu as AtomicField);
}
/** Energy: hartree → the display unit. */
export function energyToDisplay(energyHartree: number, unit: DisplayEnergyUnit): number {
  return hartreeTo(unit, energyHartree as Hartree);
}
/** Energy: kelvin (the setup's stored unit) → hartree. */
export function kelvinToHartree(kelvinValue: number): number {
  return toHartree('K', kelvinValue);
}
/** Energy: kelvin → the display unit. */
export function kelvinToDisplay(kelvinValue: number, unit: DisplayEnergyUnit): number {
  return unit === 'K' ? kelvinValue : hartreeTo(unit, toHartree('K', kelvinValue));
}
/** Energy: the display unit → kelvin. */
export function displayToKelvin(value: number, unit: DisplayEnergyUnit): number {
  return unit === 'K' ? value : hartreeTo('K', toHartree(unit, value));
}
