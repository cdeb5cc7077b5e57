import type { ZoomTransform } from 'd3';

/**
 * What a map overlay (pins, presentation pointer…) gets from the map so it can draw in data coordinates. The overlay
 * is laid over the plot area (origin at the plot's top-left corner, `width` × `height` pixels, outside the axes).
 */
export interface MapOverlayContext {
  /** Plot area size in pixels. */
  width: number;
  height: number;
  /** The plot area's offset inside the map element (for HTML tooltips that share the map's coordinates). */
  offset: { left: number; top: number };
  /** The d3-zoom transform of a gesture in progress (identity between gestures); already applied by `toScreen`. */
  transform: ZoomTransform;
  /** α (a₀³) and B (tesla) → plot pixels, with the map's d3 scales and the current gesture transform. */
  toScreen: (alphaAu: number, tesla: number) => [number, number];
  /** Plot pixels → α (a₀³) and B (tesla), the inverse of `toScreen`. */
  toData: (x: number, y: number) => { alpha: number; tesla: number };
  /** The committed window (α in a₀³, B in tesla) and a way to move it (jump to a place). */
  view: { alpha: [number, number]; field: [number, number] };
  setView: (view: { alpha: [number, number]; field: [number, number] }) => void;
  /** Axis kinds, so an overlay can widen a window around a place the way the axes do. */
  scales: { alpha: 'log' | 'linear'; field: 'log' | 'linear' };
}
