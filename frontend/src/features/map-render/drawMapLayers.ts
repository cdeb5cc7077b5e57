import { select } from 'd3';
import { palette } from '../../theme/palette';
import type { ProjectedLayer } from './projectGeometry';

/** Prefix of the SVG ids the drawing creates (unique per map on the page). */
export interface MapDrawIds {
  prefix: string;
}

/** Sets a (long) path only when it changed: re-setting an identical `d` still makes the browser re-parse it. */
function setPath(el: SVGPathElement & { __path?: string }, d: string): void {
  if (el.__path === d && el.getAttribute('d') !== null) return;
  el.setAttribute('d', d);
  el.__path = d;
}

/** Hatching spacing on the screen, px. */
const HATCH_SPACING = 6;

/**
 * Draws the projected layers into `root` (a <g> React owns). Per layer: the unbound ground; the filled regions
 * (resonance in ochre with fine diagonal hatching, bound in teal, or the survivors ramp); thin class outlines; the
 * binding-energy iso-lines (dashed ink) and their labels on the line. Region and line paths stay in grid space
 * under the layer's affine transform; strokes and hatching are kept at screen size. The same layers always give
 * the same DOM (a d3 join), so redrawing is idempotent.
 */
export function drawMapLayers(root: SVGGElement, layers: readonly ProjectedLayer[], ids: MapDrawIds): void {
  const keyed = layers.map((d, k) => ({ ...d, k, id: `${ids.prefix}-${k}` }));
  type Keyed = (typeof keyed)[number];
  const layer = select(root).selectAll<SVGGElement, Keyed>('g.map-layer').data(keyed).join('g').attr('class', 'map-layer');

  // Per-layer defs: the clip to the grid's extent and the hatch, counter-scaled so it looks the same at any zoom.
  const defs = layer.selectAll('defs').data((d) => [d]).join('defs');
  defs
    .selectAll('clipPath')
    .data((d) => [d])
    .join('clipPath')
    .attr('id', (d) => `${d.id}-clip`)
    .selectAll('rect')
    .data((d) => [d.clip])
    .join('rect')
    .attr('x', (c) => c.x)
    .attr('y', (c) => c.y)
    .attr('width', (c) => c.width)
    .attr('height', (c) => c.height);
  const pattern = defs
    .selectAll('pattern')
    .data((d) => [d])
    .join('pattern')
    .attr('id', (d) => `${d.id}-hatch`)
    .attr('patternUnits', 'userSpaceOnUse')
    .attr('width', HATCH_SPACING)
    .attr('height', HATCH_SPACING)
    .attr('patternTransform', (d) => `scale(${1 / d.transform.sx},${1 / d.transform.sy}) rotate(45)`);
  pattern
    .selectAll('line')
    .data([0])
    .join('line')
    .attr('x1', 0)
    .attr('y1', 0)
    .attr('x2', 0)
    .attr('y2', HATCH_SPACING)
    .attr('stroke', palette.ink)
    .attr('stroke-width', 1.2)
    .attr('stroke-opacity', 0.55);

  const body = layer
    .selectAll<SVGGElement, Keyed>('g.map-layer-body')
    .data((d) => [d])
    .join('g')
    .attr('class', 'map-layer-body')
    .attr('clip-path', (d) => `url(#${d.id}-clip)`);

  body
    .selectAll('rect.region-unbound')
    .data((d) => [d.clip])
    .join('rect')
    .attr('class', 'region-unbound')
    .attr('x', (c) => c.x)
    .attr('y', (c) => c.y)
    .attr('width', (c) => c.width)
    .attr('height', (c) => c.height)
    .attr('fill', palette.unbound);

  const grid = body
    .selectAll<SVGGElement, Keyed>('g.map-grid-space')
    .data((d) => [d])
    .join('g')
    .attr('class', 'map-grid-space')
    .attr('transform', (d) => `matrix(${d.transform.sx},0,0,${d.transform.sy},${d.transform.tx},${d.transform.ty})`);

  grid
    .selectAll('path.region')
    .data((d) => d.regions.flatMap((r) => (r.hatched ? [{ ...r, hatch: '', id: d.id }, { ...r, hatch: 'hatch', id: d.id }] : [{ ...r, hatch: '', id: d.id }])))
    .join('path')
    .attr('class', (r) => `region region-${r.kind}${r.hatch ? ' region-hatch' : ''}`)
    .attr('data-count', (r) => (r.kind === 'count' ? r.count : null))
    .each(function (r) {
      setPath(this as SVGPathElement, r.path);
    })
    .attr('fill', (r) => (r.hatch ? `url(#${r.id}-hatch)` : r.fill));

  grid
    .selectAll('path.region-outline')
    .data((d) => d.outlines)
    .join('path')
    .attr('class', 'region-outline')
    .each(function (d) {
      setPath(this as SVGPathElement, d);
    })
    .attr('fill', 'none')
    .attr('stroke', palette.ink)
    .attr('stroke-opacity', 0.6)
    .attr('stroke-width', 0.8)
    .attr('vector-effect', 'non-scaling-stroke');

  grid
    .selectAll('path.iso-line')
    .data((d) => d.isoLines)
    .join('path')
    .attr('class', 'iso-line')
    .attr('data-level-kelvin', (d) => d.levelKelvin)
    .each(function (d) {
      setPath(this as SVGPathElement, d.path);
    })
    .attr('fill', 'none')
    .attr('stroke', palette.ink)
    .attr('stroke-width', 1.1)
    .attr('stroke-dasharray', '5 3')
    .attr('vector-effect', 'non-scaling-stroke');

  body
    .selectAll('text.iso-label')
    .data((d) => d.isoLines.flatMap((iso) => iso.labels.map((l) => ({ ...l, text: iso.text }))))
    .join('text')
    .attr('class', 'iso-label')
    .attr('transform', (l) => `translate(${l.x.toFixed(1)},${l.y.toFixed(1)}) rotate(${l.angle.toFixed(1)})`)
    .attr('text-anchor', 'middle')
    .attr('dy', '0.35em')
    .attr('font-size', 11)
    .attr('fill', palette.ink)
    .attr('stroke', '#ffffff')
    .attr('stroke-width', 3)
    .attr('stroke-linejoin', 'round')
    .attr('paint-order', 'stroke')
    .text((l) => l.text);
}
