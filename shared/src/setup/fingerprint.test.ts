import { describe, expect, it } from 'vitest';
import { bindingInputsKey, canonicalJson, fnv1a64, setupFingerprint } from './fingerprint.js';
import { defaultSetup } from './presets.js';

describe('fnv1a64', () => {
  // Reference values: the FNV-1a 64-bit definition (G. Fowler, L. C. Noll, K.-P. Vo, "The FNV
  // Non-Cryptographic Hash Algorithm", IETF draft, 2019), computed independently with Python's
  // arbitrary-precision integers over the same code units.
  it.each([
    ['', 'cbf29ce484222325'],
    ['a', 'af63dc4c8601ec8c'],
    ['foobar', '85944171f73967e8'],
    ['Fieldbound α', '171b274c071df9ca'],
  ])('hashes %j to %s', (text, expected) => {
    expect(fnv1a64(text)).toBe(expected);
  });
});

describe('canonicalJson', () => {
  it('sorts keys at every depth so key order does not change the text', () => {
    expect(canonicalJson({ b: 1, a: { d: [2, { z: 0, y: 1 }], c: null } })).toBe('{"a":{"c":null,"d":[2,{"y":1,"z":0}]},"b":1}');
  });
});

describe('setupFingerprint', () => {
  it('ignores display choices, species and contour levels but changes with the physics', () => {
    const base = defaultSetup();
    const redisplayed = { ...base, display: { ...base.display, energyUnit: 'GHz' as const }, species: ['Cs'], contours: { levelsKelvin: [5] } };
    expect(setupFingerprint(redisplayed)).toBe(setupFingerprint(base));
    expect(setupFingerprint({ ...base, observationTimeSeconds: 2 })).not.toBe(setupFingerprint(base));
  });
});

describe('bindingInputsKey', () => {
  it('is unchanged by ion motion and observation time, which do not alter fixed-atom binding energies', () => {
    const base = defaultSetup();
    const moving = { ...base, motion: { kind: 'temperature' as const, kelvin: 4 }, observationTimeSeconds: 10 };
    expect(bindingInputsKey(moving)).toBe(bindingInputsKey(base));
    expect(bindingInputsKey({ ...base, shortRange: { ...base.shortRange, cutoffBohr: 3 } })).not.toBe(bindingInputsKey(base));
  });
});
