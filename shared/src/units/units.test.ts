import { describe, expect, it } from 'vitest';
import { DomainError, UnitError } from '../errors.js';
import { expectClose } from '../../test/expectClose.js';
import {
  CODATA2018, ENERGY_UNITS, atomicElectricField, POLARIZABILITY_UNITS, angstromCubedToAtomic, atomicElectricFieldToVoltPerMetre, atomicField,
  atomicPolarizability, atomicTime, atomicTimeToSecond, atomicToAngstromCubed, atomicToTesla, fieldTo, hartree, hartreeTo,
  ionMassFromMassNumber, polarizabilityTo, second, secondToAtomicTime, tesla, teslaToAtomic, toAtomicField,
  toAtomicPolarizability, toHartree, type AtomicField, type EnergyUnit, type PolarizabilityUnit,
} from './index.js';

const CODATA = 'E. Tiesinga, P. J. Mohr, D. B. Newell, B. N. Taylor, CODATA 2018, Rev. Mod. Phys. 93, 025010 (2021)';

describe('CODATA 2018 constants', () => {
  // Published CODATA 2018 values (the same paper), typed in independently of codata2018.ts.
  const published: [keyof typeof CODATA2018, number, number][] = [
    ['atomicFieldInTesla', 2.35051756758e5, 1e-11], // published to 12 digits; value from ħ/(e a₀²) agrees to 4e-13
    ['hartreeInEV', 27.211386245988, 1e-15],
    ['hartreeInKelvin', 3.1577502480407e5, 1e-15],
    ['hartreeInHz', 6.579683920502e15, 1e-15],
    ['bohrInMetre', 5.29177210903e-11, 1e-15],
    ['atomicElectricFieldInVoltPerMetre', 5.14220674763e11, 1e-15],
    ['atomicTimeInSecond', 2.4188843265857e-17, 1e-15],
    ['atomicMassUnitInElectronMasses', 1 / 5.48579909065e-4, 1e-12], // u/mₑ = 1/(mₑ in u), published 5.485 799 090 65(16)e-4
  ];
  for (const [key, value, tol] of published) {
    it(`${key} equals the CODATA 2018 value ${value} within ${tol.toExponential(0)}`, () => {
      expectClose(CODATA2018[key], value, { rel: tol, inputs: key, source: CODATA });
    });
  }
  it('a₀³ in Å³ equals 0.529177210903³ within 1e-15 (CODATA 2018 Bohr radius)', () => {
    expectClose(CODATA2018.bohrCubedInAngstromCubed, 0.529177210903 ** 3, { rel: 1e-15, inputs: 'a0^3', source: CODATA });
  });
  it('consistency: E_h/(e a₀) = (E_h in eV)/(a₀ in m) within 1e-11 (CODATA 2018 relations)', () => {
    expectClose(CODATA2018.hartreeInEV / CODATA2018.bohrInMetre, CODATA2018.atomicElectricFieldInVoltPerMetre, { rel: 1e-11, source: CODATA });
  });
});

describe('magnetic field conversions', () => {
  it('converts 1 a.u. to 2.350517567581e5 T and back (round trip within 1e-15)', () => {
    expect(atomicToTesla(atomicField(1))).toBe(2.350517567581e5);
    for (const b of [0.1, 1, 20, 50, 1e4]) {
      expectClose(atomicToTesla(teslaToAtomic(tesla(b))), b, { rel: 1e-15, inputs: { b }, source: 'round trip' });
      expectClose(toAtomicField('T', b), b / 2.350517567581e5, { rel: 1e-15, inputs: { b }, source: CODATA });
      expectClose(fieldTo('T', toAtomicField('T', b)), b, { rel: 1e-15, inputs: { b }, source: 'round trip' });
    }
    expect(toAtomicField('au', 3e-5)).toBe(3e-5);
  });
  it('rejects a Tesla value where atomic units are expected (compile-time check)', () => {
    const t = tesla(20);
    // @ts-expect-error Tesla is not assignable to AtomicField
    const wrong: AtomicField = t;
    expect(wrong).toBe(20);
  });
});

describe('energy conversions', () => {
  const oneHartree: Record<EnergyUnit, number> = {
    hartree: 1, eV: 27.211386245988, meV: 27211.386245988, ueV: 27211386.245988, K: 3.1577502480407e5, GHz: 6.579683920502e6,
  };
  for (const unit of ENERGY_UNITS) {
    it(`1 hartree = ${oneHartree[unit]} ${unit} and toHartree inverts hartreeTo within 1e-15 (CODATA 2018)`, () => {
      expectClose(hartreeTo(unit, hartree(1)), oneHartree[unit], { rel: 1e-15, inputs: { unit }, source: CODATA });
      for (const v of [1e-12, 3.7e-9, 0.5]) {
        expectClose(hartreeTo(unit, toHartree(unit, v)), v, { rel: 1e-15, inputs: { unit, v }, source: 'round trip' });
      }
    });
  }
  it('1 K·k_B in µeV is 86.17333262 (k_B = 8.617333262e-5 eV/K, exact in SI 2019) within 1e-10', () => {
    expectClose(hartreeTo('ueV', toHartree('K', 1)), 86.17333262145, { rel: 1e-10, source: CODATA });
  });
  it('throws UnitError (name "UnitError") for an unknown unit and DomainError for non-finite values', () => {
    expect(() => toHartree('erg' as EnergyUnit, 1)).toThrow(UnitError);
    expect(() => hartreeTo('toString' as EnergyUnit, hartree(1))).toThrow(UnitError);
    try {
      toHartree('cm-1' as EnergyUnit, 1);
    } catch (e) {
      expect((e as Error).name).toBe('UnitError');
    }
    expect(() => toHartree('eV', NaN)).toThrow(DomainError);
  });
});

describe('polarizability, electric field, time, mass', () => {
  it('1 a₀³ = 0.148184711472 Å³ = 0.148184711472e-24 cm³ and the converters invert each other within 1e-15', () => {
    for (const unit of POLARIZABILITY_UNITS) {
      expectClose(polarizabilityTo(unit, atomicPolarizability(1)), unit === 'a0^3' ? 1 : 0.148184711472162821, { rel: 1e-15, inputs: { unit }, source: CODATA });
      expectClose(polarizabilityTo(unit, toAtomicPolarizability(unit, 59.42)), 59.42, { rel: 1e-15, inputs: { unit }, source: 'round trip' });
    }
    expectClose(angstromCubedToAtomic(atomicToAngstromCubed(atomicPolarizability(401))), 401, { rel: 1e-15, source: 'round trip' });
    expect(() => toAtomicPolarizability('bohr^3' as PolarizabilityUnit, 1)).toThrow(UnitError);
  });
  it('electric field 1 a.u. = 5.14220674763e11 V/m; time 1 a.u. = 2.4188843265857e-17 s (CODATA 2018)', () => {
    expect(atomicElectricFieldToVoltPerMetre(atomicElectricField(1))).toBe(5.14220674763e11);
    expect(atomicTimeToSecond(atomicTime(1))).toBe(2.4188843265857e-17);
    expectClose(secondToAtomicTime(second(1)), 1 / 2.4188843265857e-17, { rel: 1e-15, source: CODATA });
  });
  it('ion mass of A = 133 is 133·1822.888486209 mₑ within 1e-15, and A ≤ 0 throws DomainError', () => {
    expectClose(ionMassFromMassNumber(133), 133 * 1822.888486209, { rel: 1e-15, source: CODATA });
    expect(() => ionMassFromMassNumber(0)).toThrow(DomainError);
    expect(() => ionMassFromMassNumber(NaN)).toThrow(DomainError);
  });
});
