import { interpolateRgb } from 'd3';
import { palette } from '../../theme/palette';
import { valueAtContourCoordinate, valueAtIndex, type GridAxis } from './gridGeometry';
import { placeLineLabels, type LineLabel } from './lineLabels';
import type { MapGeometry } from './mapGeometry';

/** Canonical (α in a₀³, B in atomic units) → screen pixels. */
export type ToScreen = (alphaAu: number, fieldAu: number) => [number, number];

/** Affine map grid space → screen: px = sx·gx + tx, py = sy·gy + ty. */
export interface GridTransform {
  sx: number;
  tx: number;
  sy: number;
  ty: number;
}

/**
 * The affine transform taking a result's grid space to the screen. Exact when each screen axis has the same
 * kind (log/linear) as the grid's axis — true for every layer the explorer draws — so zoom and pan only change
 * this transform, never the paths.
 */
export function gridToScreenTransform(alpha: GridAxis, field: GridAxis, toScreen: ToScreen): GridTransform {
  const at = (gx: number, gy: number) => toScreen(valueAtContourCoordinate(alpha, gx), valueAtContourCoordinate(field, gy));
  const [x0, y0] = at(0.5, 0.5);
  const [x1, y1] = at(1.5, 1.5);
  return { sx: x1 - x0, tx: x0 - 0.5 * (x1 - x0), sy: y1 - y0, ty: y0 - 0.5 * (y1 - y0) };
}

export interface ProjectedRegion {
  kind: 'resonance' | 'bound' | 'count';
  count: number;
  path: string;
  fill: string;
  /** Resonance regions carry diagonal hatching so they read without colour. */
  hatched: boolean;
}

export interface ProjectedIsoLine {
  levelKelvin: number;
  /** Text on the line, e.g. "10 µeV". */
  text: string;
  path: string;
  labels: LineLabel[];
}

/** One result on the screen: its grid-space paths, the transform that places them, the clip and the labels. */
export interface ProjectedLayer {
  transform: GridTransform;
  clip: { x: number; y: number; width: number; height: number };
  regions: ProjectedRegion[];
  outlines: string[];
  isoLines: ProjectedIsoLine[];
}

/** Fill of "at least k of maxCount states": a sequential ramp from the unbound paper grey to the bound teal. */
export function countFill(k: number, maxCount: number): string {
  const ramp = interpolateRgb(palette.unbound, palette.bound);
  return ramp(0.15 + (0.85 * Math.min(k, maxCount)) / Math.max(1, maxCount));
}

/**
 * Places a result's grid-space geometry on the screen. `alpha` and `field` describe the result's own grid
 * (field in atomic units), so a result drawn under another zoom window still lands in the right place.
 * Cheap: only the clip, the transform and the few label points are computed here.
 */
export function projectGeometry(
  geometry: MapGeometry,
  alpha: GridAxis,
  field: GridAxis,
  toScreen: ToScreen,
  isoLineText: (levelKelvin: number) => string,
): ProjectedLayer {
  const transform = gridToScreenTransform(alpha, field, toScreen);
  const [x0, y0] = toScreen(valueAtIndex(alpha, 0), valueAtIndex(field, 0));
  const [x1, y1] = toScreen(valueAtIndex(alpha, alpha.n - 1), valueAtIndex(field, field.n - 1));
  const { sx, tx, sy, ty } = transform;
  return {
    transform,
    clip: { x: Math.min(x0, x1), y: Math.min(y0, y1), width: Math.abs(x1 - x0), height: Math.abs(y1 - y0) },
    regions: geometry.regions.map((r) => ({
      kind: r.kind,
      count: r.count,
      path: r.path,
      fill: r.kind === 'bound' ? palette.bound : r.kind === 'resonance' ? palette.resonance : countFill(r.count, geometry.maxCount),
      hatched: r.kind === 'resonance',
    })),
    outlines: geometry.outlines,
    isoLines: geometry.isoLines.map((iso) => ({
      levelKelvin: iso.levelKelvin,
      text: isoLineText(iso.levelKelvin),
      path: iso.path,
      labels: placeLineLabels(iso.labelCandidates.map((line) => line.map(([gx, gy]) => [sx * gx + tx, sy * gy + ty] as [number, number]))),
    })),
  };
}
