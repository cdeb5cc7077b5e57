import type { AxisKind } from './axisScale';

/**
 * Geometry of a node-centred map grid (see `BindingMapResult`): nodes evenly spaced on the axis scale from the
 * first to the last value inclusive. d3-contour puts the value of node i at coordinate i + ½ and returns
 * polygons in [0, n]; these helpers convert between that contour space, axis values and node indices.
 */
export interface GridAxis {
  kind: AxisKind;
  /** Value of the first node (canonical units). */
  first: number;
  /** Value of the last node. */
  last: number;
  /** Number of nodes (≥ 2). */
  n: number;
}

/** Axis value at a fractional node index (0 = first node, n − 1 = last), on the axis' own scale. */
export function valueAtIndex(axis: GridAxis, index: number): number {
  const t = axis.n > 1 ? index / (axis.n - 1) : 0;
  return axis.kind === 'log' ? axis.first * (axis.last / axis.first) ** t : axis.first + t * (axis.last - axis.first);
}

/** Fractional node index of an axis value (may lie outside 0…n − 1). */
export function indexAtValue(axis: GridAxis, value: number): number {
  const t = axis.kind === 'log' ? Math.log(value / axis.first) / Math.log(axis.last / axis.first) : (value - axis.first) / (axis.last - axis.first);
  return t * (axis.n - 1);
}

/** Axis value at a d3-contour coordinate (node i sits at i + ½). */
export function valueAtContourCoordinate(axis: GridAxis, coordinate: number): number {
  return valueAtIndex(axis, coordinate - 0.5);
}

/** Nearest node index of an axis value, or −1 when the value lies more than half a cell outside the grid. */
export function nearestNode(axis: GridAxis, value: number): number {
  const f = indexAtValue(axis, value);
  if (!Number.isFinite(f) || f < -0.5 || f > axis.n - 0.5) return -1;
  return Math.min(axis.n - 1, Math.max(0, Math.round(f)));
}
