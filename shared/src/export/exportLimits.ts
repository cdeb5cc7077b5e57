/**
 * Largest files the exports will produce. A browser holds a download in memory until it is saved, and
 * `JSON.parse` needs the whole text as one string (V8 strings stop at 2²⁹ − 24 characters), so the JSON
 * limit sits well below that; CSV is written in chunks and may be larger.
 */
export const EXPORT_LIMITS = {
  csvMaxBytes: 1024 * 1024 * 1024,
  jsonMaxBytes: 256 * 1024 * 1024,
} as const;

export type ExportKind = 'csv' | 'json';

export type ExportSizeCheck = { ok: true; bytes: number } | { ok: false; bytes: number; message: string };

/** Human-readable byte size: "1.5 MB" (decimal megabytes as file browsers show them). */
export function formatBytes(bytes: number): string {
  if (bytes < 1000) return `${Math.round(bytes)} B`;
  const units = ['kB', 'MB', 'GB', 'TB'];
  let v = bytes / 1000;
  let k = 0;
  while (v >= 1000 && k < units.length - 1) {
    v /= 1000;
    k++;
  }
  return `${v >= 100 ? v.toFixed(0) : v.toFixed(1)} ${units[k]}`;
}

/**
 * Whether an export of the estimated size may be written (against `maxBytes`, default `EXPORT_LIMITS`), with a message naming the problem and the
 * ways out when it may not.
 *
 * @example
 * checkExportSize('json', 3e8) // { ok: false, bytes: 3e8, message: 'The JSON export of this map would be about 300 MB, above the limit of 268 MB …' }
 */
export function checkExportSize(kind: ExportKind, bytes: number, context = 'this map', maxBytes?: number): ExportSizeCheck {
  const limit = maxBytes ?? (kind === 'csv' ? EXPORT_LIMITS.csvMaxBytes : EXPORT_LIMITS.jsonMaxBytes);
  if (bytes <= limit) return { ok: true, bytes };
  const advice =
    kind === 'csv'
      ? 'Use a coarser grid, fewer orbitals, or a higher energy floor.'
      : 'Export the setup only (without results), use CSV, or use a coarser grid or fewer orbitals.';
  return {
    ok: false,
    bytes,
    message: `The ${kind.toUpperCase()} export of ${context} would be about ${formatBytes(bytes)}, above the limit of ${formatBytes(limit)}. ${advice}`,
  };
}
