import { describe, expect, it } from 'vitest';
import { computeMapGeometry, countThresholds } from './mapGeometry';
import { projectGeometry } from './projectGeometry';
import { drawMapLayers } from './drawMapLayers';
import { mapFields, geometryFromFields } from './mapGeometry';
import { bindingMapFromTable, phaseMapFromTable } from './testGrids';
import { palette } from '../../theme/palette';
import type { GridAxis } from './gridGeometry';

// Binding energies (hartree) of a 4 × 4 map, rows of constant field, bottom row first.
// The two left columns bind nothing; the right two bind, deeper towards the right.
const E = [
  [0, 0, 1e-9, 1e-7],
  [0, 0, 1e-9, 1e-7],
  [0, 0, 1e-9, 1e-7],
  [0, 0, 1e-9, 1e-7],
];
const K = (kelvin: number) => kelvin; // treat the setup's levels as hartree in these tests
const alpha: GridAxis = { kind: 'log', first: 1, last: 1000, n: 4 };
const field: GridAxis = { kind: 'log', first: 1e-6, last: 1e-3, n: 4 };
// Screen: 100 px per decade on both axes, field upwards from y = 300.
const toScreen = (a: number, b: number): [number, number] => [100 * Math.log10(a), 300 - 100 * (Math.log10(b) + 6)];

describe('computeMapGeometry for one orbital', () => {
  it('classes the cells: without motion every existing state is bound (2), nothing bound is 0', () => {
    const f = mapFields(bindingMapFromTable(E), null, { kind: 'orbital', m: 0 }, [1e-8], K);
    expect(Array.from(f.region.slice(0, 4))).toEqual([0, 0, 2, 2]);
    expect(Array.from(f.energy.slice(0, 4))).toEqual([0, 0, 1e-9, 1e-7]);
  });
  it('finds a bound region over the two right columns, and the same outline for "resonance or better"', () => {
    const g = computeMapGeometry(bindingMapFromTable(E), null, { kind: 'orbital', m: 0 }, [1e-8], K);
    const bound = g.regions.find((r) => r.kind === 'bound')!;
    // Halfway between column 1 (x = 1½) and column 2 (x = 2½), over all four rows: a rectangle from x = 2 to 4.
    expect(bound.path).toBe('M4,3.5L4,2.5L4,1.5L4,0.5L3.5,0L2.5,0L2,0.5L2,1.5L2,2.5L2,3.5L2.5,4L3.5,4Z');
    expect(g.regions.find((r) => r.kind === 'resonance')!.path).toBe(bound.path);
    // The class outline is the line x = 2 only (the grid's own edge is not a boundary).
    expect(g.outlines[0]).toBe('M2,0.5L2,1.5L2,2.5L2,3.5');
  });
  it('draws the 10⁻⁸ iso-line midway (in log) between the 10⁻⁹ and 10⁻⁷ columns', () => {
    const g = computeMapGeometry(bindingMapFromTable(E), null, { kind: 'orbital', m: 0 }, [1e-8], K);
    expect(g.isoLines).toHaveLength(1);
    expect(g.isoLines[0].path).toBe('M3,0.5L3,1.5L3,2.5L3,3.5');
    expect(g.isoLines[0].levelKelvin).toBe(1e-8);
  });
  it('splits bound and resonance by the phase map: column 2 resonance, column 3 bound', () => {
    const phase = phaseMapFromTable(E.map(() => ['U', 'U', 'R', 'B']));
    const g = computeMapGeometry(bindingMapFromTable(E), phase, { kind: 'orbital', m: 0 }, [], K);
    const minX = (kind: string) => Math.min(...[...g.regions.find((r) => r.kind === kind)!.path.matchAll(/[ML]([\d.]+),/g)].map((m) => Number(m[1])));
    expect(minX('resonance')).toBe(2);
    expect(minX('bound')).toBe(3);
  });
});

describe('computeMapGeometry for survivors', () => {
  it('fills one region per count threshold', () => {
    const g = geometryFromFields(mapFields(bindingMapFromTable(E), null, { kind: 'survivors' }, [], K));
    expect(g.maxCount).toBe(1);
    expect(g.regions.map((r) => [r.kind, r.count])).toEqual([['count', 1]]);
  });
  it('uses every integer up to ten and round steps above', () => {
    expect(countThresholds(0)).toEqual([]);
    expect(countThresholds(3)).toEqual([1, 2, 3]);
    expect(countThresholds(40)).toEqual([1, 5, 10, 15, 20, 25, 30, 35, 40]);
  });
});

describe('projectGeometry and drawMapLayers', () => {
  const phase = phaseMapFromTable(E.map(() => ['U', 'U', 'R', 'B']));
  const geometry = computeMapGeometry(bindingMapFromTable(E), phase, { kind: 'orbital', m: 0 }, [1e-8], K);
  const layer = projectGeometry(geometry, alpha, field, toScreen, (k) => `${k} K`);

  it('clips to the nodes’ extent: α 1…1000 → x 0…300, B 10⁻⁶…10⁻³ → y 300…0', () => {
    expect(layer.clip).toEqual({ x: 0, y: 0, width: 300, height: 300 });
  });
  it('places grid space with one affine map: node i at i + ½ → 100·i px, row j → 300 − 100·j px', () => {
    const { sx, tx, sy, ty } = layer.transform;
    expect(sx * 0.5 + tx).toBeCloseTo(0, 10);
    expect(sx * 3.5 + tx).toBeCloseTo(300, 10);
    expect(sy * 0.5 + ty).toBeCloseTo(300, 10);
    expect(sy * 3.5 + ty).toBeCloseTo(0, 10);
  });
  it('draws unbound ground, a hatched resonance, a solid bound region and a labelled iso-line', () => {
    const root = document.createElementNS('http://www.w3.org/2000/svg', 'g');
    drawMapLayers(root, [layer], { prefix: 't' });
    expect(root.querySelectorAll('pattern#t-0-hatch')).toHaveLength(1);
    expect(root.querySelector('rect.region-unbound')!.getAttribute('fill')).toBe(palette.unbound);
    expect(root.querySelector('path.region-resonance:not(.region-hatch)')!.getAttribute('fill')).toBe(palette.resonance);
    expect(root.querySelector('path.region-resonance.region-hatch')!.getAttribute('fill')).toBe('url(#t-0-hatch)');
    expect(root.querySelector('path.region-bound')!.getAttribute('fill')).toBe(palette.bound);
    const iso = root.querySelectorAll('path.iso-line');
    expect(iso).toHaveLength(1);
    expect(iso[0].getAttribute('data-level-kelvin')).toBe('1e-8');
    expect(iso[0].getAttribute('d')).toBe('M3,0.5L3,1.5L3,2.5L3,3.5');
    // On the screen the line is vertical at grid x = 3 → α = 10^2.5 → x = 250 px, 300 px long: one label, at its middle.
    const labels = [...root.querySelectorAll('text.iso-label')];
    expect(labels.map((t) => t.textContent)).toEqual(['1e-8 K']);
    expect(labels[0].getAttribute('transform')).toBe('translate(250.0,150.0) rotate(-90.0)'); // vertical text reads upwards
  });
  it('redraws in place: drawing twice leaves one layer', () => {
    const root = document.createElementNS('http://www.w3.org/2000/svg', 'g');
    drawMapLayers(root, [layer], { prefix: 'a' });
    drawMapLayers(root, [layer], { prefix: 'a' });
    expect(root.querySelectorAll('g.map-layer')).toHaveLength(1);
    expect(root.querySelectorAll('path.iso-line')).toHaveLength(1);
  });
});
