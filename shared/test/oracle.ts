/**
 * Loader for the committed mpmath reference values
 * (shared/test/fixtures/special-oracle.json, written by
 * shared/scripts/oracle/make_special_oracle.py with mpmath 1.3.0 at 50 digits).
 * Tests only (uses Node's fs).
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export const ORACLE_SOURCE = 'mpmath 1.3.0 (F. Johansson et al.), 50-digit evaluation, fixture special-oracle.json';

// The oracle's shape is defined once, next to the validation cases that read it.
import type { SpecialOracle } from '../src/validation/validationCases.js';
export type { SpecialOracle };

let cache: SpecialOracle | undefined;

export function loadSpecialOracle(): SpecialOracle {
  if (!cache) {
    const path = fileURLToPath(new URL('./fixtures/special-oracle.json', import.meta.url));
    cache = JSON.parse(readFileSync(path, 'utf8')) as SpecialOracle;
  }
  return cache;
}
