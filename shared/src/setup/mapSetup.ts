import { z } from 'zod';

/**
 * The full parameter set of one map, as stored on the server, exported to JSON and fed to the engine.
 *
 * Stored units are fixed so a setup means the same thing everywhere: polarizability in a₀³ (atomic units),
 * magnetic field in tesla, energies in kelvin (as k_B·T), times in seconds, lengths in bohr. The `display`
 * block only chooses the units the interface shows.
 */

export const SETUP_SCHEMA_VERSION = 1 as const;

/** Hard limits shared by the server's validation, the setup form and the engine. */
export const SETUP_LIMITS = {
  maxGridSide: 1024,
  minGridSide: 2,
  maxOrbital: 64,
  alpha: { min: 1e-3, max: 1e6 },
  fieldTesla: { min: 1e-3, max: 1e10 },
  cutoffBohr: { min: 1e-3, max: 100 },
  massNumber: { min: 1, max: 300 },
  maxIonLevel: 1_000_000,
  observationTimeSeconds: { min: 1e-15, max: 1e9 },
  maxContourLevels: 24,
  maxSpecies: 200,
  maxFieldBands: 20,
  maxLabelLength: 80,
  /**
   * Most bound levels one orbital may hold anywhere on the map. The count is bounded by the WKB
   * estimate of the strong-field limit, N ≈ (1/π)∫√(2|V|) dz = √α / r_c for V = −α/(2(z² + r_c²)²)
   * (atomic units); the transverse average only makes the well shallower. It keeps the cost of a map
   * bounded (measured: α = 1024 a₀³, r_c = 1 bohr, B = 10¹⁰ T gives exactly 32 levels in 0.3 s).
   */
  maxLevelsPerOrbital: 32,
} as const;

/** Upper estimate of the bound levels one orbital can hold for polarizability α (a₀³) and cutoff r_c (bohr). */
export function levelsPerOrbitalEstimate(alphaMax: number, cutoffBohr: number): number {
  return Math.sqrt(alphaMax) / cutoffBohr;
}

const finitePositive = (what: string) =>
  z
    .number({ error: (issue) => (issue.input === undefined ? `${what} is required` : `${what} must be a number`) })
    .refine(Number.isFinite, { message: `${what} must be a finite number` })
    .refine((v) => v > 0, { message: `${what} must be greater than zero` });

const within = (what: string, unit: string, limits: { min: number; max: number }) =>
  finitePositive(what)
    .refine((v) => v >= limits.min, { message: `${what} must be at least ${limits.min} ${unit}` })
    .refine((v) => v <= limits.max, { message: `${what} must be at most ${limits.max} ${unit}` });

const scale = z.enum(['log', 'linear'], { error: 'scale must be "log" or "linear"' });

const axis = (what: string, unit: string, limits: { min: number; max: number }) =>
  z
    .strictObject({
      min: within(`${what} minimum`, unit, limits),
      max: within(`${what} maximum`, unit, limits),
      scale,
    })
    .refine((a) => !(a.min >= a.max), { message: `${what} range is inverted or empty: minimum must be below maximum`, path: ['max'] });

const gridSide = (what: string) =>
  z
    .number({ error: `${what} must be a whole number` })
    .int({ error: `${what} must be a whole number` })
    .min(SETUP_LIMITS.minGridSide, { error: `${what} must be at least ${SETUP_LIMITS.minGridSide}` })
    .max(SETUP_LIMITS.maxGridSide, { error: `${what} must be at most ${SETUP_LIMITS.maxGridSide}` });

const nonNegativeKelvin = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .refine(Number.isFinite, { message: `${what} must be a finite number` })
    .refine((v) => v >= 0, { message: `${what} must not be negative` });

export const motionSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('none') }),
    z.strictObject({ kind: z.literal('kinetic-energy'), energyKelvin: nonNegativeKelvin('transverse kinetic energy') }),
    z.strictObject({
      kind: z.literal('ion-level'),
      level: z
        .number({ error: 'ion Landau level must be a whole number' })
        .int({ error: 'ion Landau level must be a whole number' })
        .min(0, { error: 'ion Landau level must not be negative' })
        .max(SETUP_LIMITS.maxIonLevel, { error: `ion Landau level must be at most ${SETUP_LIMITS.maxIonLevel}` }),
    }),
    z.strictObject({ kind: z.literal('temperature'), kelvin: finitePositive('temperature') }),
  ],
  { error: 'ion motion kind must be one of "none", "kinetic-energy", "ion-level", "temperature"' },
);

export const alphaUnitSchema = z.enum(['a0^3', 'A^3', '1e-24cm^3'], { error: 'polarizability unit must be "a0^3", "A^3" or "1e-24cm^3"' });
export const fieldUnitSchema = z.enum(['T', 'au'], { error: 'field unit must be "T" or "au"' });
export const energyUnitSchema = z.enum(['ueV', 'meV', 'K', 'GHz'], { error: 'energy unit must be "ueV", "meV", "K" or "GHz"' });

const label = (what: string) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .min(1, { error: `${what} must not be empty` })
    .max(SETUP_LIMITS.maxLabelLength, { error: `${what} must be at most ${SETUP_LIMITS.maxLabelLength} characters` });

export const mapSetupSchema = z
  .strictObject({
    schemaVersion: z.literal(SETUP_SCHEMA_VERSION, { error: `schemaVersion must be ${SETUP_SCHEMA_VERSION}` }),
    alphaAxis: axis('polarizability', 'a0^3', SETUP_LIMITS.alpha),
    fieldAxis: axis('field', 'T', SETUP_LIMITS.fieldTesla),
    grid: z.strictObject({ nAlpha: gridSide('grid columns (polarizability)'), nField: gridSide('grid rows (field)') }),
    orbitals: z.strictObject({
      mMax: z
        .number({ error: 'highest Landau orbital must be a whole number' })
        .int({ error: 'highest Landau orbital must be a whole number' })
        .min(0, { error: 'highest Landau orbital must not be negative' })
        .max(SETUP_LIMITS.maxOrbital, { error: `highest Landau orbital must be at most ${SETUP_LIMITS.maxOrbital}` }),
    }),
    shortRange: z.strictObject({
      model: z.literal('regularized-polarization', { error: 'short-range model must be "regularized-polarization"' }),
      cutoffBohr: within('cutoff radius', 'bohr', SETUP_LIMITS.cutoffBohr),
    }),
    energyFloorKelvin: nonNegativeKelvin('energy floor'),
    motion: motionSchema,
    ion: z.strictObject({
      massNumber: z
        .number({ error: 'mass number must be a whole number' })
        .int({ error: 'mass number must be a whole number' })
        .min(SETUP_LIMITS.massNumber.min, { error: `mass number must be at least ${SETUP_LIMITS.massNumber.min}` })
        .max(SETUP_LIMITS.massNumber.max, { error: `mass number must be at most ${SETUP_LIMITS.massNumber.max}` }),
    }),
    observationTimeSeconds: within('observation time', 's', SETUP_LIMITS.observationTimeSeconds),
    contours: z.strictObject({
      levelsKelvin: z
        .array(finitePositive('contour level'), { error: 'contour levels must be a list of numbers' })
        .max(SETUP_LIMITS.maxContourLevels, { error: `at most ${SETUP_LIMITS.maxContourLevels} contour levels` }),
    }),
    display: z.strictObject({
      alphaUnit: alphaUnitSchema,
      fieldUnit: fieldUnitSchema,
      energyUnit: energyUnitSchema,
      shown: z.discriminatedUnion(
        'kind',
        [
          z.strictObject({ kind: z.literal('orbital'), m: z.number().int().min(0).max(SETUP_LIMITS.maxOrbital) }),
          z.strictObject({ kind: z.literal('survivors') }),
        ],
        { error: 'shown must be an orbital or "survivors"' },
      ),
    }),
    species: z
      .array(label('species name'), { error: 'species must be a list of names' })
      .max(SETUP_LIMITS.maxSpecies, { error: `at most ${SETUP_LIMITS.maxSpecies} species in the overlay` }),
    fieldBands: z
      .array(
        z
          .strictObject({ label: label('field band label'), minTesla: within('field band minimum', 'T', SETUP_LIMITS.fieldTesla), maxTesla: within('field band maximum', 'T', SETUP_LIMITS.fieldTesla) })
          .refine((b) => !(b.minTesla >= b.maxTesla), { message: 'field band is inverted or empty: minimum must be below maximum', path: ['maxTesla'] }),
        { error: 'field bands must be a list' },
      )
      .max(SETUP_LIMITS.maxFieldBands, { error: `at most ${SETUP_LIMITS.maxFieldBands} field bands` }),
  })
  .superRefine((setup, ctx) => {
    if (setup.display.shown.kind === 'orbital' && setup.display.shown.m > setup.orbitals.mMax) {
      ctx.addIssue({ code: 'custom', path: ['display', 'shown', 'm'], message: `shown orbital m = ${setup.display.shown.m} is above the highest orbital computed (${setup.orbitals.mMax})` });
    }
    const estimate = levelsPerOrbitalEstimate(setup.alphaAxis.max, setup.shortRange.cutoffBohr);
    if (estimate > SETUP_LIMITS.maxLevelsPerOrbital) {
      const needed = Math.sqrt(setup.alphaAxis.max) / SETUP_LIMITS.maxLevelsPerOrbital;
      ctx.addIssue({
        code: 'custom',
        path: ['shortRange', 'cutoffBohr'],
        message: `with polarizability up to ${setup.alphaAxis.max} a0^3 and a cutoff of ${setup.shortRange.cutoffBohr} bohr an orbital can hold about ${Math.round(estimate)} bound levels (√α/r_c); at most ${SETUP_LIMITS.maxLevelsPerOrbital} are computed: raise the cutoff to at least ${Number(needed.toPrecision(3))} bohr or lower the polarizability maximum`,
      });
    }
    const levels = setup.contours.levelsKelvin;
    if (new Set(levels).size !== levels.length) {
      ctx.addIssue({ code: 'custom', path: ['contours', 'levelsKelvin'], message: 'contour levels must not repeat' });
    }
  });

export type MapSetup = z.infer<typeof mapSetupSchema>;
export type IonMotion = z.infer<typeof motionSchema>;
export type AlphaUnit = z.infer<typeof alphaUnitSchema>;
export type FieldUnit = z.infer<typeof fieldUnitSchema>;
export type DisplayEnergyUnit = z.infer<typeof energyUnitSchema>;

/** One problem with a setup: where (a dotted path such as `alphaAxis.min`) and what is wrong. */
export interface SetupIssue {
  path: string;
  message: string;
}

export type SetupValidation = { ok: true; setup: MapSetup } | { ok: false; issues: SetupIssue[] };

/**
 * Validates anything (parsed JSON, a request body, form values) against the setup schema.
 * Unknown fields are errors, so a typo never silently falls back to a default.
 */
export function validateSetup(input: unknown): SetupValidation {
  const result = mapSetupSchema.safeParse(input);
  if (result.success) return { ok: true, setup: result.data };
  const issues: SetupIssue[] = [];
  for (const issue of result.error.issues) {
    const at = issue.path.map(String);
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        // An odd key (empty, spaces, dots, very long) is quoted and shortened, so the path is never empty or ambiguous.
        const shown = key.length > 40 ? `${key.slice(0, 40)}…` : key;
        const segment = key.length <= 40 && /^[\w$-]+$/.test(key) ? key : JSON.stringify(shown);
        issues.push({ path: [...at, segment].join('.'), message: `unknown field "${shown}"` });
      }
    } else {
      issues.push({ path: at.join('.') || '(setup)', message: issue.message });
    }
  }
  return { ok: false, issues };
}

/** Thrown by `parseSetup` with every issue listed. */
export class SetupValidationError extends Error {
  override readonly name = 'SetupValidationError';
  constructor(public readonly issues: SetupIssue[]) {
    super(`invalid setup: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
  }
}

/** Like `validateSetup`, but returns the setup or throws a `SetupValidationError`. */
export function parseSetup(input: unknown): MapSetup {
  const result = validateSetup(input);
  if (!result.ok) throw new SetupValidationError(result.issues);
  return result.setup;
}
