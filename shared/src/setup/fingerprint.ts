import type { MapSetup } from './mapSetup.js';

/** JSON with object keys sorted at every level, so equal setups give equal text. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

/**
 * 64-bit FNV-1a of a string's UTF-16 code units, as 16 hex digits. Not cryptographic: it names
 * results (same setup and engine version ⇒ same fingerprint), it does not protect them.
 */
export function fnv1a64(text: string): string {
  let hi = 0xcbf29ce4;
  let lo = 0x84222325;
  for (let i = 0; i < text.length; i++) {
    lo = (lo ^ text.charCodeAt(i)) >>> 0;
    // Multiply the 64-bit state by the FNV prime 2^40 + 0x1b3, in 32-bit halves.
    const loMul = lo * 0x1b3;
    const carry = Math.floor(loMul / 0x100000000);
    const newLo = loMul >>> 0;
    const newHi = (hi * 0x1b3 + ((lo << 8) >>> 0) + carry) >>> 0;
    lo = newLo;
    hi = newHi;
  }
  return hi.toString(16).padStart(8, '0') + lo.toString(16).padStart(8, '0');
}

/** Fingerprint of everything that determines a map's numbers (display choices excluded). */
export function setupFingerprint(setup: MapSetup): string {
  const { display: _display, species: _species, fieldBands: _bands, contours: _contours, ...physics } = setup;
  return fnv1a64(canonicalJson(physics));
}

/**
 * Key of the inputs that determine the fixed-atom binding energies. Two setups with the same key share
 * their binding map, so changing motion, observation time or display never recomputes it.
 */
export function bindingInputsKey(setup: MapSetup): string {
  return canonicalJson({
    alphaAxis: setup.alphaAxis,
    fieldAxis: setup.fieldAxis,
    grid: setup.grid,
    mMax: setup.orbitals.mMax,
    shortRange: setup.shortRange,
  });
}
