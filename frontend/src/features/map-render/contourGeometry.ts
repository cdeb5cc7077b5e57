import { contours } from 'd3-contour';
import type { MultiPolygon } from 'geojson';

/** Position in d3-contour grid space (node i at i + ½, the grid spans [0, n]). */
export type GridPoint = [number, number];
/** An open polyline in grid space. */
export type GridLine = GridPoint[];

/** One filled contour band: every cell with value ≥ `threshold` (d3-contour's isoband semantics). */
export interface FilledContour {
  threshold: number;
  geometry: MultiPolygon;
}

/**
 * Filled contours of a row-major nx × ny field at each threshold (ascending order), smoothed by linear
 * interpolation between node values. Use for continuous fields (energies); for classes and counts use
 * `stepContours`, which puts every boundary halfway between nodes.
 */
export function filledContours(values: ArrayLike<number>, nx: number, ny: number, thresholds: readonly number[]): FilledContour[] {
  const gen = contours().size([nx, ny]).thresholds(thresholds as number[]);
  return gen(values as number[]).map((c) => ({ threshold: c.value, geometry: { type: 'MultiPolygon', coordinates: c.coordinates } }));
}

/** Binomial smoothing kernel (σ = 1 cell), applied along rows and then columns. */
const KERNEL = [1 / 16, 4 / 16, 6 / 16, 4 / 16, 1 / 16];
/** After smoothing, a node stays at least this far on its own side of ½, so no node changes class. */
export const SIDE_MARGIN = 0.1;

/**
 * The 0/1 indicator of a region made smooth for contouring at ½: blurred with a binomial kernel (σ = 1 cell; the grid
 * edge repeated), then every node clamped back to its own side (inside ≥ ½ + margin, outside ≤ ½ − margin). The
 * contour therefore separates exactly the same nodes as the raw indicator — no cell changes class, an isolated cell
 * stays a (small) island — while where it crosses between two nodes follows the smoothed field, so a boundary that
 * runs at a shallow angle to the grid is drawn as a sloped curve instead of a staircase. A straight boundary along the
 * grid stays halfway between the nodes (the kernel is symmetric). Writes into `out`; `tmp` is scratch space.
 */
export function smoothIndicator(indicator: ArrayLike<number>, nx: number, ny: number, out: Float64Array, tmp: Float64Array): Float64Array {
  const r = (KERNEL.length - 1) / 2;
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      let s = 0;
      for (let k = -r; k <= r; k++) s += KERNEL[k + r] * indicator[j * nx + Math.min(nx - 1, Math.max(0, i + k))];
      tmp[j * nx + i] = s;
    }
  }
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      let s = 0;
      for (let k = -r; k <= r; k++) s += KERNEL[k + r] * tmp[Math.min(ny - 1, Math.max(0, j + k)) * nx + i];
      const c = j * nx + i;
      out[c] = indicator[c] >= 0.5 ? Math.max(s, 0.5 + SIDE_MARGIN) : Math.min(s, 0.5 - SIDE_MARGIN);
    }
  }
  return out;
}

/**
 * Filled regions of a field of classes or counts: for each threshold t, the cells with value ≥ t. Each region is
 * contoured at ½ from its own 0/1 indicator, smoothed by `smoothIndicator`: every node keeps its class, a straight
 * boundary lies halfway between nodes, and boundaries at an angle to the grid are smooth rather than stepped. Nested
 * regions stay nested (smoothing keeps the order of the indicators) and share boundaries exactly where they coincide
 * — a direct bound/unbound step never shows a sliver of the class between.
 */
export function stepContours(values: ArrayLike<number>, nx: number, ny: number, thresholds: readonly number[]): FilledContour[] {
  const indicator = new Float64Array(nx * ny);
  const smooth = new Float64Array(nx * ny);
  const tmp = new Float64Array(nx * ny);
  const gen = contours().size([nx, ny]).thresholds([0.5]);
  return [...thresholds]
    .sort((a, b) => a - b)
    .map((threshold) => {
      for (let c = 0; c < indicator.length; c++) indicator[c] = values[c] >= threshold ? 1 : 0;
      smoothIndicator(indicator, nx, ny, smooth, tmp);
      const [c] = gen(smooth as unknown as number[]);
      return { threshold, geometry: { type: 'MultiPolygon', coordinates: c.coordinates } as MultiPolygon };
    });
}

const onBorder = (p: GridPoint, nx: number, ny: number) => p[0] <= 0 || p[0] >= nx || p[1] <= 0 || p[1] >= ny;

/**
 * The iso-lines of a filled contour: its rings with the pieces that run along the edge of the grid removed
 * (d3-contour closes every region along the border; those edges are not level lines). Returns open polylines.
 */
export function isoLinesOf(geometry: MultiPolygon, nx: number, ny: number): GridLine[] {
  const lines: GridLine[] = [];
  for (const polygon of geometry.coordinates) {
    for (const ring of polygon) {
      const pts = ring as GridPoint[];
      const n = pts.length - 1; // closed ring: last point repeats the first
      if (n < 2) continue;
      // A segment lies on the border when both its ends do.
      const segOnBorder = (k: number) => onBorder(pts[k], nx, ny) && onBorder(pts[(k + 1) % n], nx, ny);
      let start = -1;
      for (let k = 0; k < n; k++) {
        if (segOnBorder(k)) {
          start = k;
          break;
        }
      }
      if (start < 0) {
        lines.push(pts.slice()); // an interior closed loop
        continue;
      }
      // Walk once around the ring starting after a border segment, cutting at every border segment.
      let current: GridLine = [];
      for (let s = 1; s <= n; s++) {
        const k = (start + s) % n;
        if (segOnBorder(k)) {
          if (current.length >= 2) lines.push(current);
          current = [];
        } else {
          if (current.length === 0) current.push(pts[k]);
          current.push(pts[(k + 1) % n]);
        }
      }
      if (current.length >= 2) lines.push(current);
    }
  }
  // d3-contour cuts the corners of the padded border in the half cell outside the nodes: clip to the nodes' extent.
  return lines.flatMap((line) => clipLine(line, 0.5, 0.5, nx - 0.5, ny - 0.5));
}

/** Parts of a polyline inside the rectangle [x0, x1] × [y0, y1] (Liang–Barsky per segment). */
export function clipLine(line: GridLine, x0: number, y0: number, x1: number, y1: number): GridLine[] {
  const out: GridLine[] = [];
  let current: GridLine = [];
  const flush = () => {
    if (current.length >= 2) out.push(current);
    current = [];
  };
  for (let k = 0; k + 1 < line.length; k++) {
    const [ax, ay] = line[k];
    const [bx, by] = line[k + 1];
    const dx = bx - ax;
    const dy = by - ay;
    let t0 = 0;
    let t1 = 1;
    let inside = true;
    for (const [p, q] of [[-dx, ax - x0], [dx, x1 - ax], [-dy, ay - y0], [dy, y1 - ay]] as const) {
      if (p === 0) {
        if (q < 0) inside = false;
      } else {
        const r = q / p;
        if (p < 0) t0 = Math.max(t0, r);
        else t1 = Math.min(t1, r);
      }
    }
    if (!inside || t0 > t1) {
      flush();
      continue;
    }
    if (t1 - t0 < 1e-12) continue; // touches the rectangle at one point only
    const start: GridPoint = [ax + t0 * dx, ay + t0 * dy];
    const end: GridPoint = [ax + t1 * dx, ay + t1 * dy];
    if (current.length === 0 || t0 > 0) {
      flush();
      current.push(start);
    }
    const last = current[current.length - 1];
    if (last[0] !== end[0] || last[1] !== end[1]) current.push(end);
    if (t1 < 1) flush();
  }
  flush();
  return out.filter((l) => l.some((p, i) => i > 0 && (p[0] !== l[0][0] || p[1] !== l[0][1])));
}

/** Sentinel for log₁₀ of an absent binding energy: far below any threshold, finite for d3-contour. */
export const ABSENT_LOG = -400;

/**
 * Iso-lines of a positive field (binding energies) at the given levels, contoured in log₁₀ so lines spaced by
 * decades are placed evenly. Cells ≤ 0 count as absent.
 */
export function logIsoLines(values: ArrayLike<number>, nx: number, ny: number, levels: readonly number[]): { level: number; lines: GridLine[] }[] {
  const logs = new Float64Array(nx * ny);
  for (let c = 0; c < logs.length; c++) logs[c] = values[c] > 0 ? Math.log10(values[c]) : ABSENT_LOG;
  // d3-contour sorts thresholds ascending: sort here too so results line up with their levels.
  const positive = [...new Set(levels.filter((l) => l > 0))].sort((a, b) => a - b);
  const filled = filledContours(logs, nx, ny, positive.map(Math.log10));
  return filled.map((f, k) => ({ level: positive[k], lines: isoLinesOf(f.geometry, nx, ny) }));
}
