import type { MapSetup } from '../setup/mapSetup.js';
import { fnv1a64, setupFingerprint } from '../setup/fingerprint.js';

/**
 * Fingerprint of a map's results: results are a pure function of (setup, engine version), so this
 * names them. `short` (8 hex digits) is for showing in the app and on figures; `full` (16) for files.
 *
 * @example
 * resultFingerprint(defaultSetup(), '0.1.0') // { full: '…16 hex…', short: '…8 hex…', setup: '…', engineVersion: '0.1.0' }
 */
export function resultFingerprint(setup: MapSetup, engineVersion: string): { full: string; short: string; setup: string; engineVersion: string } {
  const s = setupFingerprint(setup);
  const full = fnv1a64(`${s}|${engineVersion}`);
  return { full, short: full.slice(0, 8), setup: s, engineVersion };
}
