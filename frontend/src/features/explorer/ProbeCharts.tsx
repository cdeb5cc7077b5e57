import { memo, useMemo } from 'react';
import { line, scaleLinear, scaleLog } from 'd3';
import { adiabaticPotential, atomicField, atomicPolarizability, bohr } from '@fieldbound/shared';
import { palette } from '../../theme/palette';
import { axisTicks } from '../map-render/axisScale';
import { energyToDisplay } from '../map-render/displayUnits';
import { formatScientific } from '../map-render/formatNumber';

/** Width a chart is drawn at when its panel's width is not known yet (and the narrowest it gets). */
export const CHART_MIN_WIDTH = 300;
const H = 170;
const M = { top: 10, right: 12, bottom: 34, left: 58 };
const ph = H - M.top - M.bottom;

/** Plot width inside the margins for a chart `width` pixels wide. */
const plotWidth = (width: number) => Math.max(CHART_MIN_WIDTH, width) - M.left - M.right;
/** About one labelled tick per 80 px of axis (at least 3). */
const tickCount = (pw: number) => Math.max(3, Math.round(pw / 80));

function XTicks({ ticks, x, pw }: { ticks: { value: number; label: string; major: boolean }[]; x: (v: number) => number; pw: number }) {
  return (
    <g transform={`translate(0,${ph})`}>
      <line x1={0} x2={pw} stroke={palette.ink} strokeOpacity={0.6} />
      {ticks.map((t) => (
        <g key={t.value} transform={`translate(${x(t.value)},0)`}>
          <line y2={t.major ? 5 : 3} stroke={palette.ink} strokeOpacity={0.6} />
          {t.label && (
            <text y={16} textAnchor="middle" fontSize={10} fill={palette.ink}>
              {t.label}
            </text>
          )}
        </g>
      ))}
    </g>
  );
}

export interface PotentialChartProps {
  m: number;
  alphaAu: number;
  fieldAu: number;
  cutoffBohr: number;
  bindingHartree: number;
  energyUnit: 'ueV' | 'meV' | 'K' | 'GHz';
  energyUnitLabel: string;
  /** Drawn this wide (the panel's width or half of it); at least CHART_MIN_WIDTH. */
  width: number;
}

/**
 * V_m(z) along the field (z ≥ 0, log scale from the core to the level's tail) with the level at −ε. The curve
 * is clipped at −12 ε so the level stays readable when the core is much deeper.
 */
export const PotentialChart = memo(function PotentialChart({ m, alphaAu, fieldAu, cutoffBohr, bindingHartree, energyUnit, energyUnitLabel, width }: PotentialChartProps) {
  const data = useMemo(() => {
    const kappa = Math.sqrt(2 * bindingHartree);
    const l = 1 / Math.sqrt(fieldAu);
    const z0 = Math.max(1e-3, Math.min(cutoffBohr, l) / 10);
    const z1 = Math.max(10 * l, 4 / kappa, 10 * z0);
    const zs = Array.from({ length: 160 }, (_, k) => z0 * (z1 / z0) ** (k / 159));
    const points = zs.map((z) => [z, energyToDisplay(adiabaticPotential(m, bohr(z), atomicPolarizability(alphaAu), atomicField(fieldAu), bohr(cutoffBohr)), energyUnit)] as [number, number]);
    const eps = energyToDisplay(bindingHartree, energyUnit);
    const vmin = Math.min(...points.map((p) => p[1]));
    const bottom = Math.max(vmin, -12 * eps);
    return { points, eps, z0, z1, bottom, clipped: vmin < bottom };
  }, [m, alphaAu, fieldAu, cutoffBohr, bindingHartree, energyUnit]);
  const pw = plotWidth(width);
  const x = scaleLog().domain([data.z0, data.z1]).range([0, pw]);
  const y = scaleLinear().domain([data.bottom * 1.05, Math.abs(data.bottom) * 0.08]).range([ph, 0]);
  const path = line<[number, number]>().x((p) => x(p[0])).y((p) => y(Math.max(p[1], data.bottom * 1.05)))(data.points) ?? '';
  const yTicks = y.ticks(4);
  return (
    <figure style={{ margin: 0 }}>
      <figcaption style={{ fontSize: 12, marginBottom: 2 }}>
        Effective potential V<sub>{m}</sub>(z) along the field, and the level at −ε
      </figcaption>
      <svg width={pw + M.left + M.right} height={H} role="img" aria-label={`Effective potential of orbital ${m}`}>
        <g transform={`translate(${M.left},${M.top})`}>
          <line x1={0} x2={pw} y1={y(0)} y2={y(0)} stroke={palette.ink} strokeOpacity={0.3} />
          <path d={path} fill="none" stroke={palette.bound} strokeWidth={1.6} />
          <line x1={0} x2={pw} y1={y(-data.eps)} y2={y(-data.eps)} stroke={palette.pin} strokeWidth={1.4} strokeDasharray="6 3" />
          <text x={pw - 4} y={y(-data.eps) - 4} textAnchor="end" fontSize={10} fill={palette.pin}>
            −ε = −{formatScientific(data.eps, { digits: 3 })} {energyUnitLabel}
          </text>
          {data.clipped && (
            <text x={4} y={ph - 4} fontSize={10} fill={palette.ink} fillOpacity={0.7}>
              deeper core not shown
            </text>
          )}
          <XTicks ticks={axisTicks('log', [data.z0, data.z1], tickCount(pw))} x={x} pw={pw} />
          <g>
            <line y1={0} y2={ph} stroke={palette.ink} strokeOpacity={0.6} />
            {yTicks.map((v) => (
              <g key={v} transform={`translate(0,${y(v)})`}>
                <line x2={-4} stroke={palette.ink} strokeOpacity={0.6} />
                <text x={-6} dy="0.32em" textAnchor="end" fontSize={10} fill={palette.ink}>
                  {formatScientific(v, { digits: 2 })}
                </text>
              </g>
            ))}
          </g>
          <text x={pw / 2} y={ph + 30} textAnchor="middle" fontSize={11} fill={palette.ink}>
            z (a₀)
          </text>
          <text transform={`translate(-48,${ph / 2}) rotate(-90)`} textAnchor="middle" fontSize={11} fill={palette.ink}>
            V ({energyUnitLabel})
          </text>
        </g>
      </svg>
    </figure>
  );
});

export interface RingChartProps {
  mMax: number;
  selectedM: number;
  fieldAu: number;
  alphaAu: number;
  cutoffBohr: number;
  /** Drawn this wide (the panel's width or half of it); at least CHART_MIN_WIDTH. */
  width: number;
}

/** Ring radius l√(2(m + 1)) of each orbital against the atom's size: α^(1/3) and the cutoff radius r_c. */
export const RingChart = memo(function RingChart({ mMax, selectedM, fieldAu, alphaAu, cutoffBohr, width }: RingChartProps) {
  const l = 1 / Math.sqrt(fieldAu);
  const rings = Array.from({ length: mMax + 1 }, (_, m) => ({ m, r: l * Math.sqrt(2 * (m + 1)) }));
  const atom = Math.cbrt(alphaAu);
  const values = [...rings.map((r) => r.r), atom, cutoffBohr];
  const lo = Math.min(...values) / 2;
  const hi = Math.max(...values) * 2;
  const pw = plotWidth(width);
  const x = scaleLog().domain([lo, hi]).range([0, pw]);
  const rowH = Math.min(14, (ph - 20) / rings.length);
  return (
    <figure style={{ margin: 0 }}>
      <figcaption style={{ fontSize: 12, marginBottom: 2 }}>Orbital ring radius l√(2(m+1)) and the atom’s size</figcaption>
      <svg width={pw + M.left + M.right} height={H} role="img" aria-label="Orbital ring radii compared with the atom's size">
        <g transform={`translate(${M.left},${M.top})`}>
          {[
            { v: atom, label: 'α^⅓', colour: palette.speciesWithAnion },
            { v: cutoffBohr, label: 'r_c', colour: palette.ink },
          ].map((ref) => (
            <g key={ref.label}>
              <line x1={x(ref.v)} x2={x(ref.v)} y1={0} y2={ph} stroke={ref.colour} strokeDasharray="4 3" strokeWidth={1.2} />
              <text x={x(ref.v) + 3} y={ph - 4} fontSize={10} fill={ref.colour}>
                {ref.label}
              </text>
            </g>
          ))}
          {rings.map((r) => (
            <g key={r.m} transform={`translate(0,${8 + r.m * rowH})`}>
              <line x1={0} x2={x(r.r)} stroke={r.m === selectedM ? palette.pin : palette.bound} strokeOpacity={r.m === selectedM ? 1 : 0.5} strokeWidth={r.m === selectedM ? 2 : 1} />
              <circle cx={x(r.r)} cy={0} r={3} fill={r.m === selectedM ? palette.pin : palette.bound} />
              <text x={-6} dy="0.32em" textAnchor="end" fontSize={10} fill={palette.ink}>
                m = {r.m}
              </text>
            </g>
          ))}
          <XTicks ticks={axisTicks('log', [lo, hi], tickCount(pw))} x={x} pw={pw} />
          <text x={pw / 2} y={ph + 30} textAnchor="middle" fontSize={11} fill={palette.ink}>
            radius (a₀)
          </text>
        </g>
      </svg>
    </figure>
  );
});
