/**
 * Branded number types: a plain `number` at run time, but the compiler refuses to pass
 * a value in one unit where another is expected (e.g. `Tesla` where `AtomicField` is).
 * Build them with the constructor helpers (`tesla(20)`) or the converters.
 */
export type Quantity<U extends string> = number & { readonly __unit: U };

/** Magnetic flux density in tesla. */
export type Tesla = Quantity<'T'>;
/** Magnetic flux density in atomic units B₀ = ħ/(e a₀²). */
export type AtomicField = Quantity<'B0'>;
/** Energy in hartree E_h (atomic units). */
export type Hartree = Quantity<'Eh'>;
/** Energy in electronvolt. */
export type ElectronVolt = Quantity<'eV'>;
/** Energy / k_B in kelvin. */
export type Kelvin = Quantity<'K'>;
/** Energy / h in gigahertz. */
export type Gigahertz = Quantity<'GHz'>;
/** Length in bohr a₀. */
export type Bohr = Quantity<'a0'>;
/** Length in ångström. */
export type Angstrom = Quantity<'A'>;
/** Static dipole polarizability in atomic units a₀³. */
export type AtomicPolarizability = Quantity<'a0^3'>;
/** Polarizability volume in Å³. */
export type AngstromCubed = Quantity<'A^3'>;
/** Polarizability volume in units of 10⁻²⁴ cm³ (numerically equal to Å³). */
export type Cm3E24 = Quantity<'1e-24cm^3'>;
/** Electric field in atomic units E_h/(e a₀). */
export type AtomicElectricField = Quantity<'Eh/(e a0)'>;
/** Electric field in V/m. */
export type VoltPerMetre = Quantity<'V/m'>;
/** Time in atomic units ħ/E_h. */
export type AtomicTime = Quantity<'hbar/Eh'>;
/** Time in seconds. */
export type Second = Quantity<'s'>;
/** Line integral of a potential, ∫V dz, in hartree·bohr. */
export type HartreeBohr = Quantity<'Eh a0'>;
/** Mass in electron masses mₑ (atomic units). */
export type ElectronMasses = Quantity<'me'>;

/** Energy units understood by `hartreeTo` / `toHartree`. */
export type EnergyUnit = 'hartree' | 'eV' | 'meV' | 'ueV' | 'K' | 'GHz';
/** Polarizability units understood by `polarizabilityTo` / `toAtomicPolarizability`. */
export type PolarizabilityUnit = 'a0^3' | 'A^3' | '1e-24cm^3';
/** Magnetic-field units understood by `fieldTo` / `toAtomicField`. */
export type MagneticFieldUnit = 'T' | 'au';

export const ENERGY_UNITS: readonly EnergyUnit[] = ['hartree', 'eV', 'meV', 'ueV', 'K', 'GHz'];
export const POLARIZABILITY_UNITS: readonly PolarizabilityUnit[] = ['a0^3', 'A^3', '1e-24cm^3'];
export const FIELD_UNITS: readonly MagneticFieldUnit[] = ['T', 'au'];
