/**
 * Physical constants and atomic-unit conversion factors, CODATA 2018.
 *
 * Source: E. Tiesinga, P. J. Mohr, D. B. Newell, B. N. Taylor, "CODATA recommended
 * values of the fundamental physical constants: 2018", Rev. Mod. Phys. 93, 025010 (2021).
 * One edition is pinned on purpose: editions differ by up to ~2e-9 relative.
 *
 * Values marked "derived" are computed from the exact SI constants (h, e, k_B) and the
 * CODATA 2018 Bohr radius / hartree energy; each agrees with the published CODATA 2018
 * value within its stated uncertainty.
 */
export const CODATA2018 = Object.freeze({
  /** Atomic unit of magnetic flux density ħ/(e a₀²) in tesla (derived; published 2.350 517 567 58(71) × 10⁵ T). */
  atomicFieldInTesla: 2.350517567581e5,
  /** Hartree energy in eV (published 27.211 386 245 988(53) eV). */
  hartreeInEV: 27.211386245988,
  /** Hartree energy / k_B in kelvin (published 3.157 750 248 0407(61) × 10⁵ K). */
  hartreeInKelvin: 3.1577502480407e5,
  /** Hartree energy / h in hertz (published 6.579 683 920 502(13) × 10¹⁵ Hz). */
  hartreeInHz: 6.579683920502e15,
  /** Bohr radius in metres (published 5.291 772 109 03(80) × 10⁻¹¹ m). */
  bohrInMetre: 5.29177210903e-11,
  /** Bohr radius in ångström. */
  bohrInAngstrom: 0.529177210903,
  /** a₀³ in Å³ = 0.529177210903³ (derived). Also a₀³ in units of 10⁻²⁴ cm³ (1 Å³ = 10⁻²⁴ cm³). */
  bohrCubedInAngstromCubed: 0.148184711472162821,
  /** Atomic unit of electric field E_h/(e a₀) in V/m (published 5.142 206 747 63(78) × 10¹¹ V/m). */
  atomicElectricFieldInVoltPerMetre: 5.14220674763e11,
  /** Atomic unit of time ħ/E_h in seconds (published 2.418 884 326 5857(47) × 10⁻¹⁷ s). */
  atomicTimeInSecond: 2.4188843265857e-17,
  /** Atomic mass constant over electron mass, u/mₑ = 1/(5.485 799 090 65(16) × 10⁻⁴) (derived). */
  atomicMassUnitInElectronMasses: 1822.888486209,
});
