import { afterEach, describe, expect, it, vi } from 'vitest';
import { act, cleanup, fireEvent, render, renderHook, screen } from '@testing-library/react';
import { zoomIdentity } from 'd3';
import type { PinGeometry } from '@fieldbound/shared';
import { bindingMapFromTable, phaseMapFromTable } from '../map-render/testGrids';
import { useClassNotices } from './classNotices';
import { PinsLayer, type LayerPin, type PinsLayerProps } from './PinsLayer';
import { regionUnderPin } from './pinGeometry';
import { testContext, testRegions } from './testContext';

afterEach(() => {
  cleanup();
  localStorage.clear();
});

const pins: LayerPin[] = [
  { id: 'p1', title: 'Edge of the m = 0 region', status: 'open', category: 'check', geometry: { kind: 'point', at: { alpha: 100, fieldTesla: 10 } } },
  { id: 'p2', title: 'Candidate band', status: 'resolved', category: null, geometry: { kind: 'rect', min: { alpha: 10, fieldTesla: 10 }, max: { alpha: 100, fieldTesla: 100 } } },
];

function renderLayer(props: Partial<PinsLayerProps> = {}) {
  const all: PinsLayerProps = { ctx: testContext(), pins, selectedId: null, onSelect: () => {}, regionsByPin: new Map(), notices: new Map(), ...props };
  const view = render(<div style={{ position: 'relative' }}><PinsLayer {...all} /></div>);
  // happy-dom lays nothing out: the overlay's box starts at the page's origin.
  view.container.querySelector('svg')!.getBoundingClientRect = () => ({ left: 0, top: 0, right: 400, bottom: 300, width: 400, height: 300, x: 0, y: 0, toJSON: () => ({}) });
  return { ...view, props: all };
}

const markerPosition = (id: string) => {
  const g = document.querySelector(`[data-pin-id="${id}"] g[transform]`)!;
  const m = /translate\(([-\d.]+),([-\d.]+)\)/.exec(g.getAttribute('transform')!)!;
  return [Number(m[1]), Number(m[2])];
};

describe('PinsLayer', () => {
  it('draws a point pin at the pixel of its α and B, and a rectangle through its four corners', () => {
    renderLayer();
    expect(markerPosition('p1')).toEqual([200, 225]);
    const path = document.querySelector('[data-pin-id="p2"] path')!.getAttribute('d');
    expect(path).toBe('M100.0,225.0L200.0,225.0L200.0,150.0L100.0,150.0Z');
    expect(screen.getByRole('button', { name: 'Candidate band' }).getAttribute('data-status')).toBe('resolved');
    // The inside of an area pin lets clicks through to the map (probe, pan); its edge and title catch the pointer.
    expect(document.querySelector('[data-pin-id="p2"] path')!.getAttribute('pointer-events')).toBe('none');
    expect(document.querySelector('[data-pin-id="p2"] path.pin-edge')!.getAttribute('pointer-events')).toBe('stroke');
  }, 30_000);

  it('redraws the same physical place after a zoom: the marker moves with the transform', () => {
    const { rerender, props } = renderLayer();
    rerender(<div><PinsLayer {...props} ctx={testContext({ transform: zoomIdentity.translate(-200, -150).scale(2) })} /></div>);
    expect(markerPosition('p1')).toEqual([200, 300]);
  }, 30_000);

  it('shows the title and the class under the pin on hover, and selects the pin on click', () => {
    const onSelect = vi.fn();
    renderLayer({ onSelect, regionsByPin: new Map([['p1', { dominant: 'bound', counts: { bound: 1, resonance: 0, unbound: 0 } }]]), notices: new Map([['p1', 'class changed: resonance → bound']]) });
    const pin = screen.getByRole('button', { name: 'Edge of the m = 0 region' });
    fireEvent.pointerEnter(pin);
    const tip = screen.getByRole('tooltip');
    expect(tip.textContent).toContain('Edge of the m = 0 region');
    expect(tip.textContent).toContain('Under it now: bound');
    expect(tip.textContent).toContain('class changed: resonance → bound');
    fireEvent.pointerDown(pin, { button: 0, clientX: 200, clientY: 225 });
    fireEvent.pointerUp(pin, { button: 0, clientX: 200, clientY: 225 });
    expect(onSelect).toHaveBeenCalledWith('p1');
  }, 30_000);

  it('gives viewers no tools and nothing to drag', () => {
    renderLayer({ selectedId: 'p2' });
    expect(screen.queryByRole('toolbar', { name: 'Pin tools' })).toBeNull();
    expect(document.querySelectorAll('[data-testid="pin-handle"]')).toHaveLength(0);
    expect((screen.getByRole('button', { name: 'Candidate band' }) as unknown as SVGElement).style.cursor).toBe('pointer');
  }, 30_000);

  it('lets an editor drop a point pin where the map is clicked (in physical units)', () => {
    const onCreate = vi.fn();
    const onTool = vi.fn();
    renderLayer({ edit: { tool: 'point', onTool, onCreate, onChangeGeometry: vi.fn() } });
    const surface = screen.getByTestId('pin-draw-surface');
    fireEvent.pointerDown(surface, { button: 0, clientX: 300, clientY: 75 });
    fireEvent.pointerUp(surface, { button: 0, clientX: 300, clientY: 75 });
    const g = onCreate.mock.calls[0][0] as PinGeometry;
    expect(g.kind).toBe('point');
    if (g.kind !== 'point') return;
    expect(g.at.alpha).toBeCloseTo(1000, 6);
    expect(g.at.fieldTesla).toBeCloseTo(1000, 6);
    expect(onTool).toHaveBeenCalledWith('none');
  }, 30_000);

  it('lets an editor draw a polygon by clicking corners and closing with Enter; Esc cancels a drawing', () => {
    const onCreate = vi.fn();
    const onTool = vi.fn();
    renderLayer({ edit: { tool: 'polygon', onTool, onCreate, onChangeGeometry: vi.fn() } });
    const surface = screen.getByTestId('pin-draw-surface');
    for (const [x, y] of [[0, 300], [100, 300], [0, 225]]) {
      fireEvent.pointerDown(surface, { button: 0, clientX: x, clientY: y });
      fireEvent.pointerUp(surface, { button: 0, clientX: x, clientY: y });
    }
    fireEvent.keyDown(window, { key: 'Enter' });
    const g = onCreate.mock.calls[0][0] as PinGeometry;
    if (g.kind !== 'polygon') throw new Error(`expected a polygon, got ${g.kind}`);
    expect(g.vertices.map((v) => [Math.round(v.alpha), Math.round(v.fieldTesla)])).toEqual([[1, 1], [10, 1], [1, 10]]);
    fireEvent.keyDown(window, { key: 'Escape' });
    expect(onTool).toHaveBeenLastCalledWith('none');
  }, 30_000);

  it('moves a pin by drag for an editor and reports the new physical place once', () => {
    const onChangeGeometry = vi.fn();
    renderLayer({ edit: { tool: 'none', onTool: vi.fn(), onCreate: vi.fn(), onChangeGeometry } });
    const pin = screen.getByRole('button', { name: 'Edge of the m = 0 region' });
    fireEvent.pointerDown(pin, { button: 0, clientX: 200, clientY: 225 });
    fireEvent.pointerMove(pin, { clientX: 300, clientY: 225 });
    expect(markerPosition('p1')).toEqual([300, 225]); // follows the pointer while dragging
    fireEvent.pointerUp(pin, { button: 0, clientX: 300, clientY: 225 });
    expect(onChangeGeometry).toHaveBeenCalledTimes(1);
    const [id, g] = onChangeGeometry.mock.calls[0] as [string, PinGeometry];
    expect(id).toBe('p1');
    if (g.kind !== 'point') throw new Error('kind changed');
    expect(g.at.alpha).toBeCloseTo(1000, 6);
    expect(g.at.fieldTesla).toBeCloseTo(10, 6);
  }, 30_000);
});

describe('class-change notices', () => {
  // One pin at α = 10 a₀³, B = 10⁻⁵ a.u.; the middle node of a 3 × 3 grid.
  const binding = bindingMapFromTable([
    [1e-6, 1e-6, 1e-6],
    [1e-6, 1e-6, 1e-6],
    [1e-6, 1e-6, 1e-6],
  ]);
  const pin: PinGeometry = { kind: 'point', at: { alpha: 10, fieldTesla: 2.35051757e5 * 1e-5 } };
  const regionsWith = (middle: 'B' | 'R') => {
    const r = testRegions(binding, phaseMapFromTable([['B', 'B', 'B'], ['B', middle, 'B'], ['B', 'B', 'B']]));
    return { byPin: new Map([['p1', regionUnderPin(pin, r)]]), shownKey: 'm0' };
  };

  it('says "class changed: bound → resonance" after a recomputation changes the class, until it is noted', () => {
    const { result, rerender } = renderHook(({ regions }) => useClassNotices(regions), { initialProps: { regions: regionsWith('B') } });
    expect(result.current.notices.size).toBe(0);
    rerender({ regions: regionsWith('R') });
    expect(result.current.notices.get('p1')).toBe('class changed: bound → resonance');
    act(() => result.current.acknowledge('p1'));
    expect(result.current.notices.size).toBe(0);
    rerender({ regions: regionsWith('B') });
    expect(result.current.notices.get('p1')).toBe('class changed: resonance → bound');
  }, 30_000);
});
