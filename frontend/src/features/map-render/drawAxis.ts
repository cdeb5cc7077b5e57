import { axisBottom, axisLeft, select, type ScaleContinuousNumeric } from 'd3';
import { axisTicks, type AxisKind } from './axisScale';

/**
 * Draws one map axis into `g`: labelled major ticks (powers of ten on long log axes, written with superscripts)
 * and short unlabelled minor ticks. `orientation` bottom = α axis, left = field axis.
 */
export function drawAxis(g: SVGGElement, scale: ScaleContinuousNumeric<number, number>, kind: AxisKind, orientation: 'bottom' | 'left', pixelLength: number): void {
  const domain = scale.domain() as [number, number];
  const count = Math.max(2, Math.round(pixelLength / (orientation === 'bottom' ? 90 : 55)));
  const ticks = axisTicks(kind, domain, count);
  const labels = new Map(ticks.map((t) => [t.value, t.label]));
  const major = ticks.filter((t) => t.major).map((t) => t.value);
  const minor = ticks.filter((t) => !t.major).map((t) => t.value);
  const make = orientation === 'bottom' ? axisBottom : axisLeft;
  const root = select(g);
  const majorG = root.selectAll<SVGGElement, number>('g.axis-major').data([0]).join('g').attr('class', 'axis-major');
  const minorG = root.selectAll<SVGGElement, number>('g.axis-minor').data([0]).join('g').attr('class', 'axis-minor');
  majorG.call(
    make(scale)
      .tickValues(major)
      .tickFormat((v) => labels.get(v as number) ?? '')
      .tickSize(6)
      .tickSizeOuter(0),
  );
  minorG.call(make(scale).tickValues(minor).tickFormat(() => '').tickSize(3).tickSizeOuter(0));
  minorG.select('.domain').remove();
  root.selectAll('text').attr('font-family', 'inherit').attr('font-size', 12);
}
