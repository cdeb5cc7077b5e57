import { describe, expect, it } from 'vitest';
import { zoomIdentity } from 'd3';
import { atomicToTesla, type AtomicField, type PinGeometry } from '@fieldbound/shared';
import { bindingMapFromTable, phaseMapFromTable } from '../map-render/testGrids';
import { describeRegion, moveGeometry, pinAnchor, pinToScreen, pointInPolygon, rectFromCorners, regionUnderPin, reshapeGeometry, windowAround } from './pinGeometry';
import { testContext, testRegions } from './testContext';

const tesla = (au: number) => atomicToTesla(au as AtomicField) as number;
const close = (a: number, b: number, rel = 1e-9) => expect(Math.abs(a - b)).toBeLessThanOrEqual(rel * Math.max(Math.abs(a), Math.abs(b)));

describe('pin geometry: physical units ↔ plot pixels', () => {
  // α 1…10⁴ a₀³ over 400 px and B 1…10⁴ T over 300 px, both logarithmic: one decade is 100 px across, 75 px up.
  const ctx = testContext();

  it('puts a point pin where the log scales put its α and B, and reads a pixel back to the same physical point', () => {
    const [x, y] = ctx.toScreen(100, 10);
    close(x, 200);
    close(y, 225);
    const back = ctx.toData(x, y);
    close(back.alpha, 100);
    close(back.tesla, 10);
  });

  it('follows the zoom transform of a gesture: the pin keeps its physical place while the pixels change', () => {
    const zoomed = testContext({ transform: zoomIdentity.translate(-200, -150).scale(2) });
    const pin: PinGeometry = { kind: 'point', at: { alpha: 100, fieldTesla: 10 } };
    const [x, y] = pinAnchor(pin, zoomed.toScreen);
    close(x, 2 * 200 - 200);
    close(y, 2 * 225 - 150);
    const back = zoomed.toData(x, y);
    close(back.alpha, 100);
    close(back.tesla, 10);
  });

  it('draws the same physical rectangle at new pixels after the range changes', () => {
    const rect: PinGeometry = { kind: 'rect', min: { alpha: 10, fieldTesla: 10 }, max: { alpha: 100, fieldTesla: 100 } };
    const before = pinToScreen(rect, ctx.toScreen);
    expect(before.map(([x, y]) => [Math.round(x), Math.round(y)])).toEqual([[100, 225], [200, 225], [200, 150], [100, 150]]);
    const wider = testContext({ alpha: [0.1, 1e5], field: [0.1, 1e5] }); // six decades over the same pixels
    const after = pinToScreen(rect, wider.toScreen);
    close(after[0][0], (400 / 6) * 2);
    close(after[1][0], (400 / 6) * 3);
    close(after[0][1], 300 - (300 / 6) * 2);
  });

  it('builds a rectangle from two corners in any order, in physical units', () => {
    const g = rectFromCorners([200, 150], [100, 225], ctx.toData);
    expect(g.kind).toBe('rect');
    if (g.kind !== 'rect') return;
    close(g.min.alpha, 10);
    close(g.max.alpha, 100);
    close(g.min.fieldTesla, 10);
    close(g.max.fieldTesla, 100);
  });

  it('moves a pin by pixels along log axes: a 100 px drag to the right multiplies α by ten and keeps B', () => {
    const g = moveGeometry({ kind: 'rect', min: { alpha: 10, fieldTesla: 10 }, max: { alpha: 100, fieldTesla: 100 } }, 100, 0, ctx.toScreen, ctx.toData);
    if (g.kind !== 'rect') throw new Error('kind changed');
    close(g.min.alpha, 100);
    close(g.max.alpha, 1000);
    close(g.min.fieldTesla, 10);
    close(g.max.fieldTesla, 100);
  });

  it('reshapes a rectangle by its corner (the opposite corner stays) and a polygon by one vertex', () => {
    const rect: PinGeometry = { kind: 'rect', min: { alpha: 10, fieldTesla: 10 }, max: { alpha: 100, fieldTesla: 100 } };
    // Corner 2 is (max α, max B) on screen; drag it to α = 1000, B = 1000.
    const g = reshapeGeometry(rect, 2, ctx.toScreen(1000, 1000), ctx.toScreen, ctx.toData);
    if (g.kind !== 'rect') throw new Error('kind changed');
    close(g.min.alpha, 10);
    close(g.max.alpha, 1000);
    close(g.max.fieldTesla, 1000);
    const poly: PinGeometry = { kind: 'polygon', vertices: [{ alpha: 1, fieldTesla: 1 }, { alpha: 10, fieldTesla: 1 }, { alpha: 10, fieldTesla: 10 }] };
    const p = reshapeGeometry(poly, 1, ctx.toScreen(100, 1), ctx.toScreen, ctx.toData);
    if (p.kind !== 'polygon') throw new Error('kind changed');
    close(p.vertices[1].alpha, 100);
    expect(p.vertices[0]).toEqual(poly.vertices[0]);
    expect(p.vertices[2]).toEqual(poly.vertices[2]);
  });

  it('tells inside from outside of a concave polygon', () => {
    const l: [number, number][] = [[0, 0], [4, 0], [4, 1], [1, 1], [1, 4], [0, 4]];
    expect(pointInPolygon([0.5, 3], l)).toBe(true);
    expect(pointInPolygon([3, 3], l)).toBe(false);
    expect(pointInPolygon([3, 0.5], l)).toBe(true);
  });

  it('frames a pin: a rectangle with a margin, a point with a tenth of the current span around it', () => {
    const w = windowAround({ kind: 'rect', min: { alpha: 10, fieldTesla: 10 }, max: { alpha: 100, fieldTesla: 100 } }, ctx);
    expect(w.alpha[0]).toBeLessThan(10);
    expect(w.alpha[1]).toBeGreaterThan(100);
    close(Math.log10(w.alpha[1] / w.alpha[0]), 1.6);
    const p = windowAround({ kind: 'point', at: { alpha: 100, fieldTesla: 100 } }, ctx);
    close(Math.sqrt(p.alpha[0] * p.alpha[1]), 100);
    close(Math.log10(p.alpha[1] / p.alpha[0]), 0.4);
  });
});

describe('region class under a pin', () => {
  // α = 1, 10, 100 a₀³ (columns), B = 10⁻⁶, 10⁻⁵, 10⁻⁴ a.u. (rows); one level per cell.
  const binding = bindingMapFromTable([
    [1e-6, 1e-6, 0],
    [1e-6, 1e-6, 1e-6],
    [1e-6, 1e-6, 1e-6],
  ]);
  const phase = phaseMapFromTable([
    ['B', 'R', 'U'],
    ['B', 'B', 'R'],
    ['R', 'R', 'R'],
  ]);

  it('reads a point pin at its nearest grid node, with and without ion motion', () => {
    const at = { kind: 'point' as const, at: { alpha: 10, fieldTesla: tesla(1e-5) } };
    expect(regionUnderPin(at, testRegions(binding, phase))?.dominant).toBe('bound');
    const corner = { kind: 'point' as const, at: { alpha: 100, fieldTesla: tesla(1e-6) } };
    expect(regionUnderPin(corner, testRegions(binding, null))?.dominant).toBe('unbound'); // no level there
    expect(regionUnderPin({ kind: 'point', at: { alpha: 1e5, fieldTesla: 1 } }, testRegions(binding, phase))).toBeNull();
    // The deepest binding energy at the node, in the setup's energy unit (µeV): 10⁻⁶ hartree = 27.2 µeV (CODATA 2018
    // hartree energy 27.211 386 eV).
    expect(describeRegion(regionUnderPin(at, testRegions(binding, phase)))).toBe('bound, ε = 27.2 µeV');
  });

  it('counts the classes of every node inside a rectangle and names the dominant one', () => {
    // Columns α = 10…100, rows B = 10⁻⁵…10⁻⁴ a.u.: B R / R R.
    const rect: PinGeometry = { kind: 'rect', min: { alpha: 9, fieldTesla: tesla(0.9e-5) }, max: { alpha: 110, fieldTesla: tesla(1.1e-4) } };
    const r = regionUnderPin(rect, testRegions(binding, phase));
    expect(r?.counts).toEqual({ bound: 1, resonance: 3, unbound: 0 });
    expect(r?.dominant).toBe('resonance');
    expect(describeRegion(r)).toBe('mostly resonance (75 %), also bound');
  });

  it('counts only the nodes inside a polygon (a triangle over three of the four nodes of a square)', () => {
    const tri: PinGeometry = {
      kind: 'polygon',
      vertices: [
        { alpha: 0.5, fieldTesla: tesla(0.5e-6) },
        { alpha: 40, fieldTesla: tesla(0.5e-6) },
        { alpha: 0.5, fieldTesla: tesla(4e-5) },
      ],
    };
    // Inside: (α 1, B 10⁻⁶) B, (α 10, B 10⁻⁶) R, (α 1, B 10⁻⁵) B; (α 10, B 10⁻⁵) lies beyond the hypotenuse.
    expect(regionUnderPin(tri, testRegions(binding, phase))?.counts).toEqual({ bound: 2, resonance: 1, unbound: 0 });
  });
});
