import { describe, expect, it } from 'vitest';
import { parseSetup, SetupValidationError, validateSetup, type MapSetup } from './mapSetup.js';
import { applyPreset, defaultSetup, SETUP_PRESETS } from './presets.js';

function issuesOf(input: unknown) {
  const result = validateSetup(input);
  if (result.ok) throw new Error('expected the setup to be rejected');
  return result.issues;
}

describe('validateSetup', () => {
  it('accepts the default setup and every preset applied to it', () => {
    expect(validateSetup(defaultSetup()).ok).toBe(true);
    for (const preset of SETUP_PRESETS) expect(validateSetup(applyPreset(defaultSetup(), preset))).toMatchObject({ ok: true });
  });

  it('names the field of a non-positive polarizability', () => {
    const setup = defaultSetup();
    setup.alphaAxis.min = -5;
    expect(issuesOf(setup)).toContainEqual({ path: 'alphaAxis.min', message: 'polarizability minimum must be greater than zero' });
  });

  it('rejects NaN and Infinity as non-finite', () => {
    const setup = defaultSetup();
    setup.fieldAxis.max = Number.POSITIVE_INFINITY;
    setup.shortRange.cutoffBohr = Number.NaN;
    const paths = issuesOf(setup).map((i) => i.path);
    expect(paths).toContain('fieldAxis.max');
    expect(paths).toContain('shortRange.cutoffBohr');
  });

  it('reports an inverted range on the maximum', () => {
    const setup = defaultSetup();
    setup.fieldAxis = { min: 30, max: 3, scale: 'log' };
    expect(issuesOf(setup)).toContainEqual({ path: 'fieldAxis.max', message: 'field range is inverted or empty: minimum must be below maximum' });
  });

  it('rejects a grid over 1024 per side and a fractional grid size', () => {
    const setup = defaultSetup();
    setup.grid = { nAlpha: 2048, nField: 10.5 };
    const issues = issuesOf(setup);
    expect(issues).toContainEqual({ path: 'grid.nAlpha', message: 'grid columns (polarizability) must be at most 1024' });
    expect(issues.map((i) => i.path)).toContain('grid.nField');
  });

  it('rejects m_max above 64', () => {
    const setup = defaultSetup();
    setup.orbitals.mMax = 65;
    expect(issuesOf(setup)).toContainEqual({ path: 'orbitals.mMax', message: 'highest Landau orbital must be at most 64' });
  });

  it('lists every unknown field with its full path instead of ignoring it', () => {
    const setup = { ...defaultSetup(), colour: 'red', grid: { nAlpha: 8, nField: 8, depth: 3 } };
    const issues = issuesOf(setup);
    expect(issues).toContainEqual({ path: 'colour', message: 'unknown field "colour"' });
    expect(issues).toContainEqual({ path: 'grid.depth', message: 'unknown field "depth"' });
  });

  it('rejects wrong types with the field named', () => {
    const setup = { ...defaultSetup(), observationTimeSeconds: '1 s' };
    expect(issuesOf(setup).map((i) => i.path)).toEqual(['observationTimeSeconds']);
  });

  it('checks each ion-motion kind on its own fields', () => {
    const negative: unknown = { ...defaultSetup(), motion: { kind: 'temperature', kelvin: -4 } };
    expect(issuesOf(negative)).toContainEqual({ path: 'motion.kelvin', message: 'temperature must be greater than zero' });
    const unknownKind: unknown = { ...defaultSetup(), motion: { kind: 'drift' } };
    expect(issuesOf(unknownKind).map((i) => i.path)).toEqual(['motion.kind']);
  });

  it('refuses to show an orbital that is not computed', () => {
    const setup: MapSetup = { ...defaultSetup(), orbitals: { mMax: 2 }, display: { ...defaultSetup().display, shown: { kind: 'orbital', m: 5 } } };
    expect(issuesOf(setup).map((i) => i.path)).toEqual(['display.shown.m']);
  });

  it('rejects mass numbers outside 1…300 and repeated contour levels', () => {
    const setup = defaultSetup();
    setup.ion.massNumber = 301;
    setup.contours.levelsKelvin = [1, 1];
    const paths = issuesOf(setup).map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['ion.massNumber', 'contours.levelsKelvin']));
  });

  it('rejects a non-object input as a whole', () => {
    expect(issuesOf('not a setup')[0].path).toBe('(setup)');
    expect(issuesOf(null)[0].path).toBe('(setup)');
  });
});

describe('validateSetup: bounded levels per orbital', () => {
  it('refuses a cutoff so small that an orbital could hold more than 32 levels (√α_max / r_c), naming the cutoff and the way out', () => {
    const setup = defaultSetup();
    setup.alphaAxis.max = 1000;
    setup.shortRange.cutoffBohr = 1e-3;
    const issues = issuesOf(setup);
    expect(issues.map((i) => i.path)).toEqual(['shortRange.cutoffBohr']);
    expect(issues[0].message).toContain('about 31623 bound levels');
    expect(issues[0].message).toContain('raise the cutoff to at least 0.988 bohr');
  });

  it('accepts the edge case √α_max / r_c = 32 exactly', () => {
    const setup = defaultSetup();
    setup.alphaAxis.max = 1024;
    setup.shortRange.cutoffBohr = 1;
    expect(validateSetup(setup).ok).toBe(true);
  });
});

describe('parseSetup', () => {
  it('throws a SetupValidationError that carries every issue', () => {
    const setup = defaultSetup();
    setup.alphaAxis.min = 0;
    setup.ion.massNumber = 0;
    try {
      parseSetup(setup);
      expect.unreachable('parseSetup should have thrown');
    } catch (error) {
      expect(error).toBeInstanceOf(SetupValidationError);
      expect((error as SetupValidationError).name).toBe('SetupValidationError');
      expect((error as SetupValidationError).issues.map((i) => i.path)).toEqual(expect.arrayContaining(['alphaAxis.min', 'ion.massNumber']));
    }
  });
});
