import type { MapSetup } from '@fieldbound/shared';
import type { ShownQuantity } from '../map-render/regionField';

/** The visible window of the map in canonical units: α in a₀³, B in tesla. */
export interface ViewWindow {
  alpha: [number, number];
  field: [number, number];
}

/** A shown quantity as text: `survivors`, or `m3` for orbital m = 3 (the URL's `show=`; also to compare by value). */
export function shownKey(shown: ShownQuantity): string {
  return shown.kind === 'survivors' ? 'survivors' : `m${shown.m}`;
}

/** A probe point in canonical units. */
export interface ProbePoint {
  alpha: number;
  tesla: number;
}

/** What the URL keeps of a view: the zoom window, the shown orbital, the probe point. */
export interface UrlViewState {
  view: ViewWindow | null;
  shown: ShownQuantity | null;
  probe: ProbePoint | null;
}

export function setupWindow(setup: MapSetup): ViewWindow {
  return { alpha: [setup.alphaAxis.min, setup.alphaAxis.max], field: [setup.fieldAxis.min, setup.fieldAxis.max] };
}

export function sameWindow(a: ViewWindow, b: ViewWindow, rel = 1e-9): boolean {
  const close = (x: number, y: number) => Math.abs(x - y) <= rel * Math.max(Math.abs(x), Math.abs(y));
  return close(a.alpha[0], b.alpha[0]) && close(a.alpha[1], b.alpha[1]) && close(a.field[0], b.field[0]) && close(a.field[1], b.field[1]);
}

/** The setup of the visible window: same physics and grid, axes cut to the window. */
export function windowSetup(setup: MapSetup, view: ViewWindow): MapSetup {
  return {
    ...setup,
    alphaAxis: { ...setup.alphaAxis, min: view.alpha[0], max: view.alpha[1] },
    fieldAxis: { ...setup.fieldAxis, min: view.field[0], max: view.field[1] },
  };
}

const num = (text: string | null | undefined) => (text === null || text === undefined || text.trim() === '' ? Number.NaN : Number(text));
const pair = (text: string | null): [number, number] | null => {
  if (!text) return null;
  const [a, b] = text.split(',').map(num);
  return Number.isFinite(a) && Number.isFinite(b) && a > 0 && b > a ? [a, b] : null;
};
/** Short, exact enough text for a URL: 6 significant figures. */
const fmt = (x: number) => Number(x.toPrecision(6)).toString();

/**
 * A probe point as the URL writes it (6 significant figures). The page probes exactly this point, so a link, a
 * reload and the panel all show the numbers of the same α and B.
 */
export function roundProbe(point: ProbePoint): ProbePoint {
  return { alpha: Number(fmt(point.alpha)), tesla: Number(fmt(point.tesla)) };
}

/**
 * Reads the view state from query parameters: `alpha=lo,hi` (a₀³), `field=lo,hi` (T), `show=m3` or
 * `show=survivors`, `probe=α,B` (a₀³, T). Anything malformed is ignored.
 */
export function parseViewParams(params: URLSearchParams): UrlViewState {
  const alpha = pair(params.get('alpha'));
  const field = pair(params.get('field'));
  const showText = params.get('show');
  let shown: ShownQuantity | null = null;
  if (showText === 'survivors') shown = { kind: 'survivors' };
  else if (showText && /^m\d{1,2}$/.test(showText)) shown = { kind: 'orbital', m: Number(showText.slice(1)) };
  let probe: ProbePoint | null = null;
  const probeText = params.get('probe');
  if (probeText) {
    const [a, b] = probeText.split(',').map(num);
    if (a > 0 && b > 0 && Number.isFinite(a) && Number.isFinite(b)) probe = { alpha: a, tesla: b };
  }
  return { view: alpha && field ? { alpha, field } : null, shown, probe };
}

/** Writes the view state into a copy of `params` (other parameters are kept). A null entry removes its parameter. */
export function writeViewParams(params: URLSearchParams, state: UrlViewState): URLSearchParams {
  const next = new URLSearchParams(params);
  if (state.view) {
    next.set('alpha', `${fmt(state.view.alpha[0])},${fmt(state.view.alpha[1])}`);
    next.set('field', `${fmt(state.view.field[0])},${fmt(state.view.field[1])}`);
  } else {
    next.delete('alpha');
    next.delete('field');
  }
  if (state.shown) next.set('show', shownKey(state.shown));
  else next.delete('show');
  if (state.probe) next.set('probe', `${fmt(state.probe.alpha)},${fmt(state.probe.tesla)}`);
  else next.delete('probe');
  return next;
}
