import { SETUP_LIMITS, stateIndex, teslaToAtomic, type PinGeometry, type PinPoint, type Tesla } from '@fieldbound/shared';
import { ENERGY_UNIT_LABEL, energyToDisplay } from '../map-render/displayUnits';
import { formatScientific } from '../map-render/formatNumber';
import { nearestNode, type GridAxis } from '../map-render/gridGeometry';
import type { MapOverlayContext } from '../map-render/mapOverlay';
import { regionField, regionName, type RegionName } from '../map-render/regionField';
import type { ExplorerRegions } from '../explorer/ExplorerPage';

// Pins are stored in physical units (α in a₀³, B in tesla). Everything here converts between those and the plot's
// pixels through the map's own mapping, so a pin stays on its physical region through zoom, range and unit changes.

export type Xy = [number, number];
type ToScreen = MapOverlayContext['toScreen'];
type ToData = MapOverlayContext['toData'];

export const toPinPoint = (p: { alpha: number; tesla: number }): PinPoint => ({ alpha: p.alpha, fieldTesla: p.tesla });

/** The pin's outline in plot pixels: one point, the rectangle's four corners, or the polygon's vertices. */
export function pinToScreen(geometry: PinGeometry, toScreen: ToScreen): Xy[] {
  switch (geometry.kind) {
    case 'point':
      return [toScreen(geometry.at.alpha, geometry.at.fieldTesla)];
    case 'rect': {
      const { min, max } = geometry;
      return [toScreen(min.alpha, min.fieldTesla), toScreen(max.alpha, min.fieldTesla), toScreen(max.alpha, max.fieldTesla), toScreen(min.alpha, max.fieldTesla)];
    }
    case 'polygon':
      return geometry.vertices.map((v) => toScreen(v.alpha, v.fieldTesla));
  }
}

/** Where the pin's marker and title sit, in pixels: the point, or the centre of the outline's bounding box. */
export function pinAnchor(geometry: PinGeometry, toScreen: ToScreen): Xy {
  const pts = pinToScreen(geometry, toScreen);
  if (pts.length === 1) return pts[0];
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]);
  return [(Math.min(...xs) + Math.max(...xs)) / 2, Math.min(...ys)];
}

/** A rectangle from two corners given in pixels (any order), in physical units. */
export function rectFromCorners(a: Xy, b: Xy, toData: ToData): PinGeometry {
  const p = toData(a[0], a[1]);
  const q = toData(b[0], b[1]);
  return {
    kind: 'rect',
    min: { alpha: Math.min(p.alpha, q.alpha), fieldTesla: Math.min(p.tesla, q.tesla) },
    max: { alpha: Math.max(p.alpha, q.alpha), fieldTesla: Math.max(p.tesla, q.tesla) },
  };
}

/** The geometry moved by (dx, dy) pixels: shifted on screen, so on a log axis it keeps its shape as drawn. */
export function moveGeometry(geometry: PinGeometry, dx: number, dy: number, toScreen: ToScreen, toData: ToData): PinGeometry {
  const shift = (p: PinPoint): PinPoint => {
    const [x, y] = toScreen(p.alpha, p.fieldTesla);
    return toPinPoint(toData(x + dx, y + dy));
  };
  switch (geometry.kind) {
    case 'point':
      return { kind: 'point', at: shift(geometry.at) };
    case 'rect': {
      const a = shift(geometry.min);
      const b = shift(geometry.max);
      return { kind: 'rect', min: { alpha: Math.min(a.alpha, b.alpha), fieldTesla: Math.min(a.fieldTesla, b.fieldTesla) }, max: { alpha: Math.max(a.alpha, b.alpha), fieldTesla: Math.max(a.fieldTesla, b.fieldTesla) } };
    }
    case 'polygon':
      return { kind: 'polygon', vertices: geometry.vertices.map(shift) };
  }
}

/**
 * Reshape: vertex `index` of the outline (as `pinToScreen` lists it) moved to pixel `to`. A rectangle's dragged corner
 * moves and the opposite corner stays; a polygon's vertex moves alone.
 */
export function reshapeGeometry(geometry: PinGeometry, index: number, to: Xy, toScreen: ToScreen, toData: ToData): PinGeometry {
  if (geometry.kind === 'point') return { kind: 'point', at: toPinPoint(toData(to[0], to[1])) };
  if (geometry.kind === 'rect') {
    const corners = pinToScreen(geometry, toScreen);
    return rectFromCorners(corners[(index + 2) % 4], to, toData);
  }
  return { kind: 'polygon', vertices: geometry.vertices.map((v, i) => (i === index ? toPinPoint(toData(to[0], to[1])) : v)) };
}

/** Even–odd rule. */
export function pointInPolygon(p: Xy, polygon: readonly Xy[]): boolean {
  let inside = false;
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i++) {
    const [xi, yi] = polygon[i];
    const [xj, yj] = polygon[j];
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** The window to show for a pin: its extent (or, for a point, a tenth of the current span) with a margin around it. */
export function windowAround(geometry: PinGeometry, ctx: Pick<MapOverlayContext, 'view' | 'scales'>): { alpha: [number, number]; field: [number, number] } {
  const pts = geometry.kind === 'point' ? [geometry.at] : geometry.kind === 'rect' ? [geometry.min, geometry.max] : geometry.vertices;
  const span = (kind: 'log' | 'linear', values: number[], current: [number, number], lo: number, hi: number): [number, number] => {
    const f = kind === 'log' ? Math.log10 : (v: number) => v;
    const g = kind === 'log' ? (v: number) => 10 ** v : (v: number) => v;
    let a = Math.min(...values.map(f));
    let b = Math.max(...values.map(f));
    const width = b - a > 0 ? (b - a) * 1.6 : (f(current[1]) - f(current[0])) / 10;
    const mid = (a + b) / 2;
    a = mid - width / 2;
    b = mid + width / 2;
    const out: [number, number] = [Math.max(lo, g(a)), Math.min(hi, g(b))];
    return out[1] > out[0] ? out : current;
  };
  return {
    alpha: span(ctx.scales.alpha, pts.map((p) => p.alpha), ctx.view.alpha, SETUP_LIMITS.alpha.min, SETUP_LIMITS.alpha.max),
    field: span(ctx.scales.field, pts.map((p) => p.fieldTesla), ctx.view.field, SETUP_LIMITS.fieldTesla.min, SETUP_LIMITS.fieldTesla.max),
  };
}

/** What lies under a pin now: the class that covers most of it, and how many grid nodes of each class it covers. */
export interface PinRegion {
  dominant: RegionName;
  counts: Record<RegionName, number>;
  /** Point pins: the deepest binding energy at the node in the setup's energy unit, e.g. "ε = 3.2 µeV". */
  energy?: string;
}

const classCache = new WeakMap<ExplorerRegions, Uint8Array>();
const CLASS_NAMES: readonly RegionName[] = ['unbound', 'resonance', 'bound'];

/** Region class per grid cell (0 unbound, 1 resonance, 2 bound): the shown orbital's, or the best of any orbital. */
function cellClasses(regions: ExplorerRegions): Uint8Array {
  const cached = classCache.get(regions);
  if (cached) return cached;
  const { binding, phase, shown } = regions;
  const out = new Uint8Array(binding.cellCount);
  const orbitals = shown.kind === 'orbital' ? [shown.m] : Array.from({ length: binding.mMax + 1 }, (_, m) => m);
  for (const m of orbitals) {
    const field = regionField(binding, phase, { kind: 'orbital', m });
    for (let c = 0; c < out.length; c++) if (field[c] > out[c]) out[c] = field[c];
  }
  classCache.set(regions, out);
  return out;
}

function axesOf(regions: ExplorerRegions): { alpha: GridAxis; field: GridAxis } {
  const { binding, setup } = regions;
  return {
    alpha: { kind: setup.alphaAxis.scale, first: binding.alphas[0], last: binding.alphas[binding.nAlpha - 1], n: binding.nAlpha },
    field: { kind: setup.fieldAxis.scale, first: binding.fieldsAu[0], last: binding.fieldsAu[binding.nField - 1], n: binding.nField },
  };
}

/** Deepest binding energy (hartree) at a cell: of the shown orbital, or of any orbital for the survivors view. */
function deepestBinding(regions: ExplorerRegions, cell: number): number {
  const { binding, shown } = regions;
  const orbitals = shown.kind === 'orbital' ? [shown.m] : Array.from({ length: binding.mMax + 1 }, (_, m) => m);
  let best = 0;
  for (const m of orbitals) {
    if (m > binding.mMax || binding.levelsPerOrbital === 0 || binding.counts[m * binding.cellCount + cell] === 0) continue;
    best = Math.max(best, binding.bindingHartree[stateIndex(m, 0, cell, binding.levelsPerOrbital, binding.cellCount)]);
  }
  return best;
}

const fieldAu = (tesla: number) => teslaToAtomic(tesla as Tesla) as number;

/**
 * The region class under a pin from the finished computation: at a point pin its nearest grid node; over a rectangle
 * or polygon every node inside (compared on the axes' own scales, as the outline is drawn), or its centre node if it
 * is smaller than one cell. Null where the pin lies outside the computed grid.
 */
export function regionUnderPin(geometry: PinGeometry, regions: ExplorerRegions): PinRegion | null {
  const classes = cellClasses(regions);
  const axes = axesOf(regions);
  const nA = regions.binding.nAlpha;
  const counts: Record<RegionName, number> = { unbound: 0, resonance: 0, bound: 0 };
  const at = (alpha: number, tesla: number) => {
    const i = nearestNode(axes.alpha, alpha);
    const j = nearestNode(axes.field, fieldAu(tesla));
    return i < 0 || j < 0 ? -1 : classes[j * nA + i];
  };
  const verdict = (): PinRegion | null => {
    const total = counts.unbound + counts.resonance + counts.bound;
    if (total === 0) return null;
    const dominant = CLASS_NAMES.reduce((best, name) => (counts[name] > counts[best] ? name : best), 'unbound' as RegionName);
    return { dominant, counts };
  };
  if (geometry.kind === 'point') {
    const c = at(geometry.at.alpha, geometry.at.fieldTesla);
    if (c < 0) return null;
    counts[regionName(c)]++;
    const i = nearestNode(axes.alpha, geometry.at.alpha);
    const j = nearestNode(axes.field, fieldAu(geometry.at.fieldTesla));
    const e = deepestBinding(regions, j * nA + i);
    const unit = regions.setup.display.energyUnit;
    const found = verdict()!;
    return e > 0 ? { ...found, energy: `ε = ${formatScientific(energyToDisplay(e, unit), { digits: 3 })} ${ENERGY_UNIT_LABEL[unit]}` } : found;
  }
  const fa = axes.alpha.kind === 'log' ? Math.log10 : (v: number) => v;
  const ff = axes.field.kind === 'log' ? Math.log10 : (v: number) => v;
  const vertices = geometry.kind === 'rect' ? [geometry.min, { alpha: geometry.max.alpha, fieldTesla: geometry.min.fieldTesla }, geometry.max, { alpha: geometry.min.alpha, fieldTesla: geometry.max.fieldTesla }] : geometry.vertices;
  const polygon: Xy[] = vertices.map((v) => [fa(v.alpha), ff(fieldAu(v.fieldTesla))]);
  const xs = polygon.map((p) => p[0]);
  const ys = polygon.map((p) => p[1]);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const { alphas, fieldsAu, nField } = regions.binding;
  for (let j = 0; j < nField; j++) {
    const y = ff(fieldsAu[j]);
    if (y < y0 || y > y1) continue;
    for (let i = 0; i < nA; i++) {
      const x = fa(alphas[i]);
      if (x < x0 || x > x1) continue;
      if (geometry.kind === 'rect' || pointInPolygon([x, y], polygon)) counts[regionName(classes[j * nA + i])]++;
    }
  }
  if (counts.unbound + counts.resonance + counts.bound === 0) {
    const inv = (v: number, kind: 'log' | 'linear') => (kind === 'log' ? 10 ** v : v);
    const j = nearestNode(axes.field, inv((y0 + y1) / 2, axes.field.kind));
    const i = nearestNode(axes.alpha, inv((x0 + x1) / 2, axes.alpha.kind));
    if (i < 0 || j < 0) return null;
    counts[regionName(classes[j * nA + i])]++;
  }
  return verdict();
}

/** "bound", or "mostly bound (62 %), also resonance" for an area that covers several classes. */
export function describeRegion(region: PinRegion | null): string {
  if (!region) return 'outside the computed map';
  if (region.energy) return `${region.dominant}, ${region.energy}`;
  const total = region.counts.unbound + region.counts.resonance + region.counts.bound;
  const others = CLASS_NAMES.filter((n) => n !== region.dominant && region.counts[n] > 0);
  if (others.length === 0) return region.dominant;
  return `mostly ${region.dominant} (${Math.round((100 * region.counts[region.dominant]) / total)} %), also ${others.join(', ')}`;
}
