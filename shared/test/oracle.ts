/**
 * Loader for the committed mpmath reference values
 * (shared/test/fixtures/special-oracle.json, written by
 * shared/scripts/oracle/make_special_oracle.py with mpmath 1.3.0 at 50 digits).
 * Tests only (uses Node's fs).
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export const ORACLE_SOURCE = 'mpmath 1.3.0 (F. Johansson et al.), 50-digit evaluation, fixture special-oracle.json';

export interface SpecialOracle {
  versions: { mpmath: string; python: string };
  gamma: [number, string][];
  lnGamma: [number, string][];
  erfc: [number, string][];
  erfcx: [number, string][];
  expnScaled: [number, number, string][];
  expn: [number, number, string][];
  tricomiU2: { 'rows [m, x, value]': [number, number, string][] };
  tricomiU32: { 'rows [m, s, value]': [number, number, string][] };
  scaledPotentialDirect: { 'rows [m, zeta, rhoC, value]': [number, number, number, string][] };
}

let cache: SpecialOracle | undefined;

export function loadSpecialOracle(): SpecialOracle {
  if (!cache) {
    const path = fileURLToPath(new URL('./fixtures/special-oracle.json', import.meta.url));
    cache = JSON.parse(readFileSync(path, 'utf8')) as SpecialOracle;
  }
  return cache;
}
