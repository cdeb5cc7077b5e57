// Test helper (never imported by the app): an overlay context like MapView's, from d3 log scales in a₀³ and tesla.
import { zoomIdentity, type ZoomTransform } from 'd3';
import { defaultSetup, type BindingMapResult, type PhaseMapResult } from '@fieldbound/shared';
import { makeAxisScale } from '../map-render/axisScale';
import type { ExplorerOverlayContext, ExplorerRegions } from '../explorer/ExplorerPage';

export function testContext({
  width = 400,
  height = 300,
  alpha = [1, 1e4] as [number, number],
  field = [1, 1e4] as [number, number],
  transform = zoomIdentity as ZoomTransform,
  regions = null as ExplorerRegions | null,
  setView = (_v: { alpha: [number, number]; field: [number, number] }) => {},
} = {}): ExplorerOverlayContext {
  const x = makeAxisScale('log', alpha, [0, width]);
  const y = makeAxisScale('log', field, [height, 0]);
  return {
    width,
    height,
    offset: { left: 0, top: 0 },
    transform,
    toScreen: (a, b) => [transform.applyX(x(a)), transform.applyY(y(b))],
    toData: (px, py) => ({ alpha: x.invert(transform.invertX(px)), tesla: y.invert(transform.invertY(py)) }),
    view: { alpha, field },
    setView,
    scales: { alpha: 'log', field: 'log' },
    regions,
  };
}

/** Regions of a hand-made binding map (and phase map) over log axes, as the explorer hands them to overlays. */
export function testRegions(binding: BindingMapResult, phase: PhaseMapResult | null): ExplorerRegions {
  return { binding, phase, setup: defaultSetup(), shown: { kind: 'orbital', m: 0 } };
}
