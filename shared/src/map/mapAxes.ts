import { toAtomicField } from '../units/convert.js';
import type { MapSetup } from '../setup/mapSetup.js';

/**
 * Node positions of one map axis: n points evenly spaced on the axis scale from `min` to `max`
 * inclusive (node-centred grid, see mapTypes.ts). Log axes are even in ln x, linear axes in x; the
 * end points are exactly `min` and `max`.
 *
 * Domain: 0 < min < max finite, integer n ≥ 2 (the setup schema guarantees this; not re-checked).
 *
 * @example
 * axisNodes(1, 100, 'log', 3) // Float64Array [1, 10, 100] (10 to rounding)
 */
export function axisNodes(min: number, max: number, scale: 'log' | 'linear', n: number): Float64Array {
  const out = new Float64Array(n);
  if (scale === 'log') {
    const a = Math.log(min);
    const d = (Math.log(max) - a) / (n - 1);
    for (let i = 0; i < n; i++) out[i] = Math.exp(a + d * i);
  } else {
    const d = (max - min) / (n - 1);
    for (let i = 0; i < n; i++) out[i] = min + d * i;
  }
  out[0] = min;
  out[n - 1] = max;
  return out;
}

/**
 * The two axes of a map: polarizability per column (a₀³) and field per row in atomic units
 * (the setup's field axis is in tesla; B[a.u.] = B[T] / 2.350517567581e5, CODATA 2018).
 * Spacing in tesla and in atomic units is the same up to the constant factor.
 *
 * @example
 * mapAxes(setup).fieldsAu[0] // setup.fieldAxis.min / 2.350517567581e5
 */
export function mapAxes(setup: MapSetup): { alphas: Float64Array; fieldsAu: Float64Array } {
  const alphas = axisNodes(setup.alphaAxis.min, setup.alphaAxis.max, setup.alphaAxis.scale, setup.grid.nAlpha);
  const tesla = axisNodes(setup.fieldAxis.min, setup.fieldAxis.max, setup.fieldAxis.scale, setup.grid.nField);
  const fieldsAu = new Float64Array(tesla.length);
  for (let j = 0; j < tesla.length; j++) fieldsAu[j] = toAtomicField('T', tesla[j]);
  return { alphas, fieldsAu };
}
