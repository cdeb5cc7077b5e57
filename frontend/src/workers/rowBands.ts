import type { MapSetup } from '@fieldbound/shared';

/** A band of map rows [start, end] inclusive (rows of constant field, 0 = lowest field). */
export interface RowBand {
  start: number;
  end: number;
}

/**
 * Splits nField rows into at most `parts` contiguous bands of nearly equal size, each at least `minRows` rows
 * (the setup schema's smallest grid side is 2, so a band is itself a valid map).
 * @example splitRows(10, 3) // [{start:0,end:3},{start:4,end:6},{start:7,end:9}]
 */
export function splitRows(nField: number, parts: number, minRows = 2): RowBand[] {
  const count = Math.max(1, Math.min(Math.floor(parts), Math.floor(nField / minRows)));
  const bands: RowBand[] = [];
  let start = 0;
  for (let k = 0; k < count; k++) {
    const size = Math.floor(nField / count) + (k < nField % count ? 1 : 0);
    bands.push({ start, end: start + size - 1 });
    start += size;
  }
  return bands;
}

/** Field (tesla) of row j of a setup: rows evenly spaced on the field axis' scale, ends inclusive. */
export function rowFieldTesla(setup: MapSetup, row: number): number {
  const { min, max, scale } = setup.fieldAxis;
  const n = setup.grid.nField;
  const t = n > 1 ? row / (n - 1) : 0;
  if (row === 0) return min;
  if (row === n - 1) return max;
  return scale === 'log' ? min * (max / min) ** t : min + t * (max - min);
}

/**
 * The setup of one band of rows: the same map restricted to the band's field range with the band's number of
 * rows, so its rows fall on the parent's rows (to rounding of the field values).
 */
export function bandSetup(setup: MapSetup, band: RowBand): MapSetup {
  return {
    ...setup,
    fieldAxis: { ...setup.fieldAxis, min: rowFieldTesla(setup, band.start), max: rowFieldTesla(setup, band.end) },
    grid: { ...setup.grid, nField: band.end - band.start + 1 },
  };
}

/** The same setup at a coarser grid (each side at most `side`): the quick first picture. */
export function coarseSetup(setup: MapSetup, side = 64): MapSetup {
  return { ...setup, grid: { nAlpha: Math.min(side, setup.grid.nAlpha), nField: Math.min(side, setup.grid.nField) } };
}
