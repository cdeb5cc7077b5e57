import { ENGINE_VERSION, setupFingerprint, type BindingMapResult, type MapSetup, type PhaseMapResult, type PutResultSummaryRequest, type ResultCounts } from '@fieldbound/shared';
import { regionField, regionName } from '../map-render/regionField';

/**
 * Region classes counted over every (orbital m, cell) pair of a map: bound, resonance or unbound as the map draws
 * them for each orbital. Without a phase map (ion motion not computed) every existing state counts as bound.
 */
export function resultCounts(binding: BindingMapResult, phase: PhaseMapResult | null = null): ResultCounts {
  const counts: ResultCounts = { bound: 0, resonance: 0, unbound: 0 };
  if (!phase) {
    // The same classes as `regionField` without ion motion (a level: bound, none: unbound), in one pass and
    // without a field per orbital: a finished map is summed on the page's main thread.
    const pairs = (binding.mMax + 1) * binding.cellCount;
    for (let k = 0; k < pairs; k++) if (binding.counts[k] > 0) counts.bound++;
    counts.unbound = pairs - counts.bound;
    return counts;
  }
  for (let m = 0; m <= binding.mMax; m++) {
    const field = regionField(binding, phase, { kind: 'orbital', m });
    for (let c = 0; c < field.length; c++) counts[regionName(field[c])]++;
  }
  return counts;
}

/** The `PUT /maps/:id/summary` body for a finished computation of `setup`. */
export function summaryRequest(setup: MapSetup, binding: BindingMapResult, computationMs: number | null): PutResultSummaryRequest {
  return {
    engineVersion: binding.engineVersion || ENGINE_VERSION,
    setupFingerprint: setupFingerprint(setup),
    counts: resultCounts(binding),
    computationMs: Math.max(0, Math.round(computationMs ?? binding.elapsedMs)),
  };
}

export const THUMBNAIL_SIZE = { width: 120, height: 80 } as const;

const PAPER = [0xec, 0xea, 0xe4];
const TEAL = [0x1f, 0x6f, 0x78];

/**
 * RGBA pixels of a small picture of the map: the number of bound states over all orbitals on the ramp from paper grey
 * to deep teal (the survivors colours of the design), field upwards, nearest cell per pixel.
 */
export function thumbnailPixels(binding: BindingMapResult, width: number = THUMBNAIL_SIZE.width, height: number = THUMBNAIL_SIZE.height): Uint8ClampedArray {
  // Bound states summed over the orbitals (the survivors field without ion motion), read only at the sampled cells;
  // the largest sum over every cell sets the ramp. No field of the whole map is built on the page's main thread.
  const { cellCount, mMax, counts, nAlpha, nField } = binding;
  const survivorsAt = (c: number) => {
    let n = 0;
    for (let m = 0; m <= mMax; m++) n += counts[m * cellCount + c];
    return n;
  };
  let max = 0;
  for (let c = 0; c < cellCount; c++) {
    const n = survivorsAt(c);
    if (n > max) max = n;
  }
  const out = new Uint8ClampedArray(width * height * 4);
  for (let y = 0; y < height; y++) {
    const j = Math.min(nField - 1, Math.floor(((height - 1 - y) / height) * nField));
    for (let x = 0; x < width; x++) {
      const i = Math.min(nAlpha - 1, Math.floor((x / width) * nAlpha));
      const t = max > 0 ? survivorsAt(j * nAlpha + i) / max : 0;
      const o = (y * width + x) * 4;
      for (let k = 0; k < 3; k++) out[o + k] = Math.round(PAPER[k] + (TEAL[k] - PAPER[k]) * t);
      out[o + 3] = 255;
    }
  }
  return out;
}

/** The thumbnail as a PNG blob, or null where the browser has no canvas (tests). */
export async function thumbnailPng(binding: BindingMapResult): Promise<Blob | null> {
  if (typeof document === 'undefined') return null;
  const canvas = document.createElement('canvas');
  canvas.width = THUMBNAIL_SIZE.width;
  canvas.height = THUMBNAIL_SIZE.height;
  const ctx = canvas.getContext?.('2d');
  if (!ctx || typeof canvas.toBlob !== 'function') return null;
  const image = ctx.createImageData(THUMBNAIL_SIZE.width, THUMBNAIL_SIZE.height);
  image.data.set(thumbnailPixels(binding));
  ctx.putImageData(image, 0, 0);
  return new Promise((resolve) => canvas.toBlob((blob) => resolve(blob), 'image/png'));
}
