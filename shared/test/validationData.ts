/**
 * The committed oracle files as the validation cases' input, and an assertion that one case passes
 * (tests only; uses Node's fs). `fieldbound check` runs the same cases.
 */
import { readFileSync } from 'node:fs';
import { runValidationCase, VALIDATION_CASES, type Exact1dOracle, type ValidationData, type ValidationResult } from '../src/validation/validationCases.js';
import { loadSpecialOracle } from './oracle.js';

export const VALIDATION_DATA: ValidationData = {
  special: loadSpecialOracle(),
  exact1d: JSON.parse(readFileSync(new URL('./fixtures/exact-1d-oracle.json', import.meta.url), 'utf8')) as Exact1dOracle,
};

/** Runs the validation case `id` and throws with its worst point unless every point is within tolerance. */
export function expectValidationCase(id: string): ValidationResult {
  const c = VALIDATION_CASES.find((v) => v.id === id);
  if (!c) throw new Error(`no validation case '${id}'`);
  const r = runValidationCase(c, VALIDATION_DATA);
  if (!r.pass || r.points === 0) {
    throw new Error(
      `validation case ${id} failed (${r.source}): ${r.error ?? `worst at ${r.worst.inputs}: value ${r.worst.value}, reference ${r.worst.reference}, difference ${r.worst.difference}, tolerance ${JSON.stringify(r.tolerance)}`}`,
    );
  }
  return r;
}
