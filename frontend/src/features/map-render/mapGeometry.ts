import type { BindingMapResult, PhaseMapResult } from '@fieldbound/shared';
import { ticks } from 'd3';
import type { MultiPolygon } from 'geojson';
import { isoLinesOf, logIsoLines, stepContours, type GridLine } from './contourGeometry';
import { bindingField, regionField, REGION_VALUE, type ShownQuantity } from './regionField';

/**
 * The two per-cell fields a map is drawn from, taken out of a result on the main thread (cheap: one pass over
 * the cells) so that only they, not the whole result, travel to the contour worker.
 */
export interface MapFields {
  nx: number;
  ny: number;
  shownKind: ShownQuantity['kind'];
  /** Region class (0 unbound, 1 resonance, 2 bound) or survivors count per cell. */
  region: Float64Array;
  /** Binding energy (hartree) the iso-lines follow, 0 where nothing is bound. */
  energy: Float64Array;
  /** Iso-line levels: the setup's levels in kelvin and the same in hartree. */
  levelsKelvin: number[];
  levelsHartree: number[];
}

export function mapFields(
  binding: BindingMapResult,
  phase: PhaseMapResult | null,
  shown: ShownQuantity,
  levelsKelvin: readonly number[],
  kelvinToHartree: (k: number) => number,
): MapFields {
  const sorted = [...new Set(levelsKelvin.filter((k) => k > 0))].sort((a, b) => a - b);
  return {
    nx: binding.nAlpha,
    ny: binding.nField,
    shownKind: shown.kind,
    region: regionField(binding, phase, shown),
    energy: bindingField(binding, shown),
    levelsKelvin: sorted,
    levelsHartree: sorted.map(kelvinToHartree),
  };
}

/** A filled region as an SVG path in grid space (node i at i + ½; see `gridToScreenTransform`). */
export interface RegionGeometry {
  /** 'resonance' = resonance or bound; 'bound' = bound; 'count' = at least `count` surviving states. */
  kind: 'resonance' | 'bound' | 'count';
  count: number;
  path: string;
}

export interface IsoLineGeometry {
  levelKelvin: number;
  levelHartree: number;
  path: string;
  /** The longest few pieces of the line, for labels placed on the screen. */
  labelCandidates: GridLine[];
}

/** Everything drawn from one result, in d3-contour grid space: independent of zoom and pixel size. */
export interface MapGeometry {
  nx: number;
  ny: number;
  regions: RegionGeometry[];
  /** Boundaries between classes (thin lines, so regions read without colour), one path per region. */
  outlines: string[];
  isoLines: IsoLineGeometry[];
  /** Largest value of the region field (survivors: most states in any cell). */
  maxCount: number;
}

/** Count thresholds of the survivors view: every integer up to 10, otherwise about ten round steps. */
export function countThresholds(maxCount: number): number[] {
  if (maxCount < 1) return [];
  if (maxCount <= 10) return Array.from({ length: maxCount }, (_, k) => k + 1);
  const steps = ticks(1, maxCount, 8).filter((v) => Number.isInteger(v) && v >= 1);
  return steps[0] === 1 ? steps : [1, ...steps];
}

const r3 = (v: number) => Math.round(v * 1000) / 1000;

/** SVG path of a MultiPolygon (rings closed, holes by winding: fill-rule nonzero or evenodd both work). */
export function polygonPath(geometry: MultiPolygon): string {
  let d = '';
  for (const polygon of geometry.coordinates) {
    for (const ring of polygon) {
      for (let k = 0; k < ring.length - 1; k++) d += `${k === 0 ? 'M' : 'L'}${r3(ring[k][0])},${r3(ring[k][1])}`;
      d += 'Z';
    }
  }
  return d;
}

/** SVG path of open polylines. */
export function linesPath(lines: readonly GridLine[]): string {
  let d = '';
  for (const line of lines) for (let k = 0; k < line.length; k++) d += `${k === 0 ? 'M' : 'L'}${r3(line[k][0])},${r3(line[k][1])}`;
  return d;
}

function lineLength(line: GridLine): number {
  let s = 0;
  for (let k = 1; k < line.length; k++) s += Math.hypot(line[k][0] - line[k - 1][0], line[k][1] - line[k - 1][1]);
  return s;
}

/**
 * Regions and iso-lines from the fields (pure, grid space). Several d3-contour passes over the grid:
 * ~100–200 ms for 256 × 256, so the app runs it in the contour worker, never on the main thread.
 */
export function geometryFromFields(fields: MapFields): MapGeometry {
  const { nx, ny, region } = fields;
  let maxCount = 0;
  for (let c = 0; c < region.length; c++) if (region[c] > maxCount) maxCount = region[c];
  const filled =
    fields.shownKind === 'orbital'
      ? stepContours(region, nx, ny, [REGION_VALUE.resonance, REGION_VALUE.bound]).map((f, k) => ({ kind: k === 0 ? ('resonance' as const) : ('bound' as const), count: 0, f }))
      : stepContours(region, nx, ny, countThresholds(maxCount)).map((f) => ({ kind: 'count' as const, count: f.threshold, f }));
  const regions = filled.filter((r) => r.f.geometry.coordinates.length > 0);
  const iso = logIsoLines(fields.energy, nx, ny, fields.levelsHartree);
  return {
    nx,
    ny,
    maxCount,
    regions: regions.map((r) => ({ kind: r.kind, count: r.count, path: polygonPath(r.f.geometry) })),
    outlines: regions.map((r) => linesPath(isoLinesOf(r.f.geometry, nx, ny))).filter(Boolean),
    isoLines: iso
      .map((r) => ({
        levelHartree: r.level,
        levelKelvin: fields.levelsKelvin[fields.levelsHartree.indexOf(r.level)],
        path: linesPath(r.lines),
        labelCandidates: [...r.lines].sort((a, b) => lineLength(b) - lineLength(a)).slice(0, 3),
      }))
      .filter((l) => l.path.length > 0),
  };
}

/** Convenience for tests and small maps: fields and geometry in one call. */
export function computeMapGeometry(
  binding: BindingMapResult,
  phase: PhaseMapResult | null,
  shown: ShownQuantity,
  levelsKelvin: readonly number[],
  kelvinToHartree: (k: number) => number,
): MapGeometry {
  return geometryFromFields(mapFields(binding, phase, shown, levelsKelvin, kelvinToHartree));
}
