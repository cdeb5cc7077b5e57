import { describe, expect, it } from 'vitest';
import { expectClose } from '../../test/expectClose.js';
import { EngineInputError } from '../errors.js';
import { CODATA2018 } from '../units/codata2018.js';
import { ionCyclotronEnergy, motionalField, motionalFieldVoltPerMetre, transverseEnergyAt, validateMotionSettings, type MotionSettingsInput } from './motionSettings.js';
import { recoilStretch } from './recoilStretch.js';

function parameterOf(input: MotionSettingsInput): string {
  try {
    validateMotionSettings(input);
  } catch (e) {
    expect(e).toBeInstanceOf(EngineInputError);
    expect((e as Error).name).toBe('EngineInputError');
    return (e as EngineInputError).parameter;
  }
  throw new Error(`no error for ${JSON.stringify(input)}`);
}

describe('validateMotionSettings', () => {
  it('names the offending parameter for each kind of bad input', () => {
    const cases: [MotionSettingsInput, string][] = [
      [{ massNumber: 0, temperatureKelvin: 1 }, 'massNumber'],
      [{ massNumber: 301, temperatureKelvin: 1 }, 'massNumber'],
      [{ massNumber: NaN, temperatureKelvin: 1 }, 'massNumber'],
      [{ temperatureKelvin: 1 }, 'massNumber'],
      [{ massNumber: 4, ionMassElectronMasses: 7000, temperatureKelvin: 1 }, 'massNumber'],
      [{ ionMassElectronMasses: -1, temperatureKelvin: 1 }, 'ionMassElectronMasses'],
      [{ massNumber: 4, transverseEnergyHartree: -1e-9 }, 'transverseEnergyHartree'],
      [{ massNumber: 4, transverseEnergyHartree: Infinity }, 'transverseEnergyHartree'],
      [{ massNumber: 4, ionLandauLevel: 1.5 }, 'ionLandauLevel'],
      [{ massNumber: 4, ionLandauLevel: -1 }, 'ionLandauLevel'],
      [{ massNumber: 4, temperatureKelvin: 0 }, 'temperatureKelvin'],
      [{ massNumber: 4, temperatureKelvin: -3 }, 'temperatureKelvin'],
      [{ massNumber: 4, temperatureKelvin: 1, observationTimeSeconds: 0 }, 'observationTimeSeconds'],
      [{ massNumber: 4, temperatureKelvin: 1, observationTimeSeconds: -1 }, 'observationTimeSeconds'],
      [{ massNumber: 4 }, 'motion'],
      [{ massNumber: 4, temperatureKelvin: 1, ionLandauLevel: 0 }, 'motion'],
    ];
    for (const [input, parameter] of cases) expect(parameterOf(input), JSON.stringify(input)).toBe(parameter);
  });

  it('derives M, kT, τ and ħ/τ in atomic units (CODATA 2018, exact identities)', () => {
    const s = validateMotionSettings({ massNumber: 133, temperatureKelvin: 2 });
    expectClose(s.ionMass, 133 * 1822.888486209, { rel: 1e-15, source: 'CODATA 2018 u/mₑ' });
    expectClose(s.kT, 2 / 3.1577502480407e5, { rel: 1e-15, source: 'CODATA 2018 E_h/k_B' });
    expectClose(s.observationTime, 1 / 2.4188843265857e-17, { rel: 1e-15, source: 'CODATA 2018 atomic unit of time; default τ = 1 s' });
    expectClose(s.hbarOverTau, 2.4188843265857e-17, { rel: 1e-15, source: 'exact identity ħ = 1' });
    expect(validateMotionSettings({ ionMassElectronMasses: 5000, ionLandauLevel: 3, observationTimeSeconds: 10 }).ionLandauLevel).toBe(3);
  });
});

describe('motional field', () => {
  it('F = B√(2E⊥/M) and, for level N, (B^{3/2}/M)√(2N + 1) (exact identities, model.md §4)', () => {
    const B = 2e-4;
    const M = 40 * CODATA2018.atomicMassUnitInElectronMasses;
    expectClose(motionalField(B, 3e-9, M), B * Math.sqrt(6e-9 / M), { rel: 1e-15, source: 'exact identity' });
    for (const N of [0, 1, 7]) {
      const s = validateMotionSettings({ ionMassElectronMasses: M, ionLandauLevel: N });
      const e = transverseEnergyAt(s, B);
      expectClose(e, (N + 0.5) * ionCyclotronEnergy(B, M), { rel: 1e-15, inputs: { N }, source: 'exact identity' });
      expectClose(motionalField(B, e, M), (B ** 1.5 / M) * Math.sqrt(2 * N + 1), { rel: 1e-14, inputs: { N }, source: 'exact identity' });
    }
  });

  it('converts to V/m with 5.14220674763e11 V/m per a.u. (CODATA 2018)', () => {
    expectClose(motionalFieldVoltPerMetre(1, 0.5, 1), 5.14220674763e11, { rel: 1e-15, source: 'CODATA 2018' });
  });

  it('returns NaN for negative inputs (documented edge)', () => {
    expect(motionalField(-1, 1, 1)).toBeNaN();
    expect(motionalField(1, -1, 1)).toBeNaN();
  });
});

describe('recoil stretch √(2φ(a)/a)', () => {
  it('is 1 at a = 0, closed form at a = 0.5, +∞ for a ≥ 1 (exact identities)', () => {
    expect(recoilStretch(0)).toBe(1);
    expectClose(recoilStretch(0.5), Math.sqrt((2 * (2 * Math.log(2) - 1)) / 0.5), { rel: 1e-15, source: 'exact identity φ(½) = 2 ln 2 − 1' });
    expect(recoilStretch(1)).toBe(Infinity);
    expect(recoilStretch(3)).toBe(Infinity);
    expect(recoilStretch(NaN)).toBeNaN();
  });

  it('series and closed form agree at the switch |a| = 1e-3 to 1e-12 (exact identity)', () => {
    for (const a of [1e-3, -1e-3]) {
      const closed = Math.sqrt((2 * (-Math.log1p(-a) / a - 1)) / a);
      expectClose(recoilStretch(a * (1 - 1e-12)), closed, { rel: 1e-9, inputs: { a }, source: 'exact identity (Taylor series of −ln(1−a))' });
    }
  });

  it('increases with a on (−1, 1) (common practice: monotone barrier stretch)', () => {
    let prev = 0;
    for (let a = -0.99; a < 0.999; a += 0.01) {
      const s = recoilStretch(a);
      expect(s, `a = ${a}`).toBeGreaterThan(prev);
      prev = s;
    }
  });
});
