import { finite } from './finite.js';
import type {
  Angstrom, AngstromCubed, AtomicElectricField, AtomicField, AtomicPolarizability, AtomicTime, Bohr, Cm3E24,
  ElectronMasses, ElectronVolt, Gigahertz, Hartree, Kelvin, Second, Tesla, VoltPerMetre,
} from './brand.js';

/** Brand a finite number as tesla. @example tesla(20) // 20 (type Tesla) */
export const tesla = (v: number): Tesla => finite('tesla', v) as Tesla;
/** Brand a finite number as atomic units of magnetic field. */
export const atomicField = (v: number): AtomicField => finite('atomicField', v) as AtomicField;
/** Brand a finite number as hartree. */
export const hartree = (v: number): Hartree => finite('hartree', v) as Hartree;
/** Brand a finite number as electronvolt. */
export const electronVolt = (v: number): ElectronVolt => finite('electronVolt', v) as ElectronVolt;
/** Brand a finite number as kelvin. */
export const kelvin = (v: number): Kelvin => finite('kelvin', v) as Kelvin;
/** Brand a finite number as gigahertz. */
export const gigahertz = (v: number): Gigahertz => finite('gigahertz', v) as Gigahertz;
/** Brand a finite number as bohr. */
export const bohr = (v: number): Bohr => finite('bohr', v) as Bohr;
/** Brand a finite number as ångström. */
export const angstrom = (v: number): Angstrom => finite('angstrom', v) as Angstrom;
/** Brand a finite number as a polarizability in a₀³. */
export const atomicPolarizability = (v: number): AtomicPolarizability =>
  finite('atomicPolarizability', v) as AtomicPolarizability;
/** Brand a finite number as Å³. */
export const angstromCubed = (v: number): AngstromCubed => finite('angstromCubed', v) as AngstromCubed;
/** Brand a finite number as 10⁻²⁴ cm³. */
export const cm3e24 = (v: number): Cm3E24 => finite('cm3e24', v) as Cm3E24;
/** Brand a finite number as atomic units of electric field. */
export const atomicElectricField = (v: number): AtomicElectricField =>
  finite('atomicElectricField', v) as AtomicElectricField;
/** Brand a finite number as V/m. */
export const voltPerMetre = (v: number): VoltPerMetre => finite('voltPerMetre', v) as VoltPerMetre;
/** Brand a finite number as atomic units of time. */
export const atomicTime = (v: number): AtomicTime => finite('atomicTime', v) as AtomicTime;
/** Brand a finite number as seconds. */
export const second = (v: number): Second => finite('second', v) as Second;
/** Brand a finite number as electron masses. */
export const electronMasses = (v: number): ElectronMasses => finite('electronMasses', v) as ElectronMasses;
