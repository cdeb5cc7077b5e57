import { scaleLinear, scaleLog, ticks as linearTicks, type ScaleContinuousNumeric } from 'd3';
import { formatScientific, powerOfTen } from './formatNumber';

export type AxisKind = 'log' | 'linear';

/** One tick of an axis: where (data value), its label ('' for an unlabelled minor tick). */
export interface AxisTick {
  value: number;
  label: string;
  major: boolean;
}

/** A d3 scale for one map axis: log or linear, domain in display units, range in pixels. */
export function makeAxisScale(kind: AxisKind, domain: [number, number], range: [number, number]): ScaleContinuousNumeric<number, number> {
  return kind === 'log' ? scaleLog().domain(domain).range(range) : scaleLinear().domain(domain).range(range);
}

const EPS = 1e-9;

/**
 * Ticks of an axis with labels a physicist expects.
 *
 * Log axes spanning at least two decades: labelled majors at powers of ten ("10⁻³", every k-th decade when
 * there are more than `count` of them) and unlabelled minors at 2…9 × 10ᵏ (up to six decades).
 * Shorter log axes: 1-2-5 labelled ticks in plain or scientific notation with the others as minors.
 * Linear axes: d3's round ticks, labelled with `formatScientific`.
 */
export function axisTicks(kind: AxisKind, domain: [number, number], count = 6): AxisTick[] {
  const lo = Math.min(domain[0], domain[1]);
  const hi = Math.max(domain[0], domain[1]);
  if (!(hi > lo)) return [];
  if (kind === 'linear') {
    return linearTicks(lo, hi, count).map((value) => ({ value, label: formatScientific(value, { digits: 4 }), major: true }));
  }
  const k0 = Math.floor(Math.log10(lo) + EPS);
  const k1 = Math.ceil(Math.log10(hi) - EPS);
  const decades = Math.log10(hi / lo);
  const inside = (v: number) => v >= lo * (1 - EPS) && v <= hi * (1 + EPS);
  const out: AxisTick[] = [];
  if (decades >= 2) {
    const step = Math.max(1, Math.ceil((k1 - k0) / Math.max(1, count)));
    for (let k = k0; k <= k1; k++) {
      const decade = 10 ** k;
      if (inside(decade)) {
        const labelled = (k - k0) % step === 0 || step === 1;
        out.push({ value: decade, label: labelled ? powerOfTen(k) : '', major: labelled });
      }
      if (decades <= 6) {
        for (let d = 2; d <= 9; d++) {
          const v = d * decade;
          if (inside(v)) out.push({ value: v, label: '', major: false });
        }
      }
    }
    return out;
  }
  if (decades < 0.5) {
    return linearTicks(lo, hi, count).map((value) => ({ value, label: formatScientific(value, { digits: 4 }), major: true }));
  }
  // One to two decades: every integer multiple of 10ᵏ, labelled on 1, 2, 5.
  const labelled = decades > 1.2 ? [1, 2, 5] : [1, 2, 3, 5, 7];
  for (let k = k0; k <= k1; k++) {
    for (let d = 1; d <= 9; d++) {
      const v = d * 10 ** k;
      if (!inside(v)) continue;
      const major = labelled.includes(d);
      out.push({ value: Number(v.toPrecision(12)), label: major ? formatScientific(v, { digits: 3 }) : '', major });
    }
  }
  return out;
}
