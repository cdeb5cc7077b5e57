import { describe, expect, it } from 'vitest';
import { defaultSetup, setupFingerprint, type BindingMapResult } from '@fieldbound/shared';
import { resultCounts, summaryRequest, thumbnailPixels } from './resultSummary';

/** A 2 × 2 map with orbitals m = 0, 1: bound-level counts per orbital and cell given by hand. */
function tinyMap(counts: number[]): BindingMapResult {
  return {
    engineVersion: '9.9.9',
    nAlpha: 2,
    nField: 2,
    cellCount: 4,
    mMax: 1,
    levelsPerOrbital: 2,
    alphas: new Float64Array([1, 10]),
    fieldsAu: new Float64Array([1e-5, 1e-4]),
    bindingHartree: new Float64Array(16),
    counts: new Uint16Array(counts),
    flags: new Uint8Array(8),
    maxRelError: 0,
    elapsedMs: 321.4,
  };
}

describe('resultCounts', () => {
  it('counts each (orbital, cell) pair once: bound where the orbital has a level, unbound elsewhere, no resonance without ion motion', () => {
    // m = 0: cells 0,1,2 bound; m = 1: only cell 3 bound (2 levels still count once).
    expect(resultCounts(tinyMap([1, 2, 1, 0, 0, 0, 0, 2]))).toEqual({ bound: 4, resonance: 0, unbound: 4 });
  });
});

describe('summaryRequest', () => {
  it('carries the engine version of the result, the fingerprint of the computed setup and whole milliseconds', () => {
    const setup = defaultSetup();
    const body = summaryRequest(setup, tinyMap([0, 0, 0, 0, 0, 0, 0, 0]), 1234.6);
    expect(body).toEqual({ engineVersion: '9.9.9', setupFingerprint: setupFingerprint(setup), counts: { bound: 0, resonance: 0, unbound: 8 }, computationMs: 1235 });
  });
});

describe('thumbnailPixels', () => {
  it('paints cells with no bound state paper grey and the cell with most states deep teal, field upwards', () => {
    // Survivors per cell: m0 + m1 = [0, 0, 0, 3] → only the top-right cell (high α, high B) is teal.
    const px = thumbnailPixels(tinyMap([0, 0, 0, 1, 0, 0, 0, 2]), 2, 2);
    const at = (x: number, y: number) => Array.from(px.slice((y * 2 + x) * 4, (y * 2 + x) * 4 + 4));
    expect(at(1, 0)).toEqual([0x1f, 0x6f, 0x78, 255]);
    expect(at(0, 0)).toEqual([0xec, 0xea, 0xe4, 255]);
    expect(at(1, 1)).toEqual([0xec, 0xea, 0xe4, 255]);
  });
});
