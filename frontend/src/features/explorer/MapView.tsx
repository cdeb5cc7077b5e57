import { memo, useCallback, useEffect, useId, useLayoutEffect, useMemo, useRef, useState, type CSSProperties, type ReactNode } from 'react';
import { select, zoom, zoomIdentity, type ZoomBehavior, type ZoomTransform } from 'd3';
import type { BindingMapResult, MapSetup, PhaseMapResult } from '@fieldbound/shared';
import { palette } from '../../theme/palette';
import { makeAxisScale } from '../map-render/axisScale';
import {
  ALPHA_UNIT_LABEL, ENERGY_UNIT_LABEL, FIELD_UNIT_LABEL, alphaFromDisplay, alphaToDisplay, fieldAuToDisplay, fieldDisplayToTesla,
  fieldTeslaToDisplay, kelvinToDisplay,
} from '../map-render/displayUnits';
import { drawAxis } from '../map-render/drawAxis';
import { drawMapLayers } from '../map-render/drawMapLayers';
import { formatScientific } from '../map-render/formatNumber';
import type { GridAxis } from '../map-render/gridGeometry';
import type { MapGeometry } from '../map-render/mapGeometry';
import { projectGeometry, type ToScreen } from '../map-render/projectGeometry';
import type { MapOverlayContext } from '../map-render/mapOverlay';
import { SETUP_LIMITS, teslaToAtomic, type Tesla } from '@fieldbound/shared';
import { useElementSize } from './useElementSize';
import type { ProbePoint, ViewWindow } from './viewState';

/** One computed result to draw, with the setup whose grid it is and its contours (from the contour worker). */
export interface MapLayerInput {
  key: string;
  result: BindingMapResult;
  setup: MapSetup;
  geometry: MapGeometry;
  /** The moving-ion classes the geometry was drawn with (null: the atom held fixed). */
  phase?: PhaseMapResult | null;
}

/** An atom of the species overlay. */
export interface SpeciesMarker {
  name: string;
  alphaAu: number;
  alphaUncertaintyAu: number;
  hasFieldFreeAnion: boolean;
  /** Hover text: values and their published sources. */
  details: string;
}

export interface MapViewProps {
  setup: MapSetup;
  view: ViewWindow;
  onViewChange: (view: ViewWindow) => void;
  layers: readonly MapLayerInput[];
  /** Text of the quantity under the cursor (canonical α in a₀³, B in tesla), or null outside the computed grid. */
  readout: (alphaAu: number, tesla: number) => string | null;
  probe: ProbePoint | null;
  onProbe: (point: ProbePoint) => void;
  species: readonly SpeciesMarker[];
  /** Drawn over the plot area in data coordinates (pins); pointer events pass through to the map where it draws nothing. */
  overlay?: (ctx: MapOverlayContext) => ReactNode;
}

const MARGIN = { top: 14, right: 18, bottom: 46, left: 70 };

/**
 * The map's box takes its size from the page (flex), never from what it draws, so it is a containment boundary
 * (`contain: strict`): drawing a new picture lays out and paints the map alone, not the setup form and the rest of
 * the page around it.
 */
const MAP_VIEW_STYLE: CSSProperties = { position: 'relative', flex: 1, minHeight: 0, minWidth: 0, overflow: 'hidden', background: '#fff', contain: 'strict' };
/** Time after the last wheel or drag step before the window is recomputed at full resolution. */
export const ZOOM_SETTLE_MS = 350;

export function gridAxesOf(result: BindingMapResult, setup: MapSetup): { alpha: GridAxis; field: GridAxis } {
  return {
    alpha: { kind: setup.alphaAxis.scale, first: result.alphas[0], last: result.alphas[result.nAlpha - 1], n: result.nAlpha },
    field: { kind: setup.fieldAxis.scale, first: result.fieldsAu[0], last: result.fieldsAu[result.nField - 1], n: result.nField },
  };
}

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/**
 * The map: α horizontally, B vertically, in the chosen units and scales. Draws the computed layers, field bands,
 * species and the probe; d3-zoom pans and zooms (the picture follows at once, the new window is reported after
 * the gesture settles); a crosshair reads α, B and the quantity under the cursor; a click probes a point.
 */
export const MapView = memo(function MapView({ setup, view, onViewChange, layers, readout, probe, onProbe, species, overlay }: MapViewProps) {
  const containerRef = useRef<HTMLDivElement>(null);
  const { width, height } = useElementSize(containerRef);
  const svgRef = useRef<SVGSVGElement>(null);
  const contentRef = useRef<SVGGElement>(null);
  const layersRef = useRef<SVGGElement>(null);
  const xAxisRef = useRef<SVGGElement>(null);
  const yAxisRef = useRef<SVGGElement>(null);
  const overlayRef = useRef<SVGRectElement>(null);
  const zoomRef = useRef<ZoomBehavior<SVGRectElement, unknown> | null>(null);
  const uid = useId().replace(/[^a-zA-Z0-9]/g, '');
  const [cursor, setCursor] = useState<{ x: number; y: number } | null>(null);
  const [gesture, setGesture] = useState<ZoomTransform>(zoomIdentity);

  const pw = Math.max(10, width - MARGIN.left - MARGIN.right);
  const ph = Math.max(10, height - MARGIN.top - MARGIN.bottom);
  const { alphaUnit, fieldUnit, energyUnit } = setup.display;
  const xKind = setup.alphaAxis.scale;
  const yKind = setup.fieldAxis.scale;

  const xScale = useMemo(() => makeAxisScale(xKind, [alphaToDisplay(view.alpha[0], alphaUnit), alphaToDisplay(view.alpha[1], alphaUnit)], [0, pw]), [xKind, view.alpha, alphaUnit, pw]);
  const yScale = useMemo(() => makeAxisScale(yKind, [fieldTeslaToDisplay(view.field[0], fieldUnit), fieldTeslaToDisplay(view.field[1], fieldUnit)], [ph, 0]), [yKind, view.field, fieldUnit, ph]);
  const toScreen = useCallback<ToScreen>((a, b) => [xScale(alphaToDisplay(a, alphaUnit)), yScale(fieldAuToDisplay(b, fieldUnit))], [xScale, yScale, alphaUnit, fieldUnit]);

  const projected = useMemo(
    () =>
      layers
        .filter((l) => l.setup.alphaAxis.scale === xKind && l.setup.fieldAxis.scale === yKind)
        .map((l) => {
          const axes = gridAxesOf(l.result, l.setup);
          return projectGeometry(l.geometry, axes.alpha, axes.field, toScreen, (k) => `${formatScientific(kelvinToDisplay(k, energyUnit), { digits: 2 })} ${ENERGY_UNIT_LABEL[energyUnit]}`);
        }),
    [layers, xKind, yKind, toScreen, energyUnit],
  );

  // Draw the layers and axes for the committed view; clear any gesture transform in the same frame.
  useLayoutEffect(() => {
    if (!layersRef.current) return;
    const t0 = performance.now();
    drawMapLayers(layersRef.current, projected, { prefix: `m${uid}` });
    contentRef.current?.removeAttribute('transform');
    if (overlayRef.current) select(overlayRef.current).property('__zoom', zoomIdentity);
    setGesture(zoomIdentity);
    const ms = performance.now() - t0;
    if (import.meta.env.DEV && ms > 50) console.warn(`map drawing took ${ms.toFixed(0)} ms`);
  }, [projected, uid]);

  const drawAxes = useCallback(
    (t: ZoomTransform) => {
      if (xAxisRef.current) drawAxis(xAxisRef.current, t.rescaleX(xScale), xKind, 'bottom', pw);
      if (yAxisRef.current) drawAxis(yAxisRef.current, t.rescaleY(yScale), yKind, 'left', ph);
    },
    [xScale, yScale, xKind, yKind, pw, ph],
  );
  useLayoutEffect(() => drawAxes(zoomIdentity), [drawAxes]);

  // Zoom and pan: transform the drawn content at once, report the new window once the gesture settles.
  const viewRef = useRef({ xScale, yScale, onViewChange, alphaUnit, fieldUnit, hasOverlay: !!overlay });
  viewRef.current = { xScale, yScale, onViewChange, alphaUnit, fieldUnit, hasOverlay: !!overlay };
  useEffect(() => {
    const overlay = overlayRef.current;
    if (!overlay) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const behavior = zoom<SVGRectElement, unknown>()
      .scaleExtent([1 / 64, 4096])
      .filter((event: Event) => (event.type === 'wheel' || !(event as MouseEvent).button) && !(event as MouseEvent).ctrlKey)
      .on('zoom', (event: { transform: ZoomTransform }) => {
        const t = event.transform;
        contentRef.current?.setAttribute('transform', t.toString());
        drawAxes(t);
        if (viewRef.current.hasOverlay) setGesture(t);
        clearTimeout(timer);
        timer = setTimeout(() => {
          const { xScale: xs, yScale: ys, onViewChange: report, alphaUnit: au, fieldUnit: fu } = viewRef.current;
          const [a0, a1] = t.rescaleX(xs).domain();
          const [b0, b1] = t.rescaleY(ys).domain();
          const alpha: [number, number] = [clamp(alphaFromDisplay(Math.min(a0, a1), au), SETUP_LIMITS.alpha.min, SETUP_LIMITS.alpha.max), clamp(alphaFromDisplay(Math.max(a0, a1), au), SETUP_LIMITS.alpha.min, SETUP_LIMITS.alpha.max)];
          const field: [number, number] = [clamp(fieldDisplayToTesla(Math.min(b0, b1), fu), SETUP_LIMITS.fieldTesla.min, SETUP_LIMITS.fieldTesla.max), clamp(fieldDisplayToTesla(Math.max(b0, b1), fu), SETUP_LIMITS.fieldTesla.min, SETUP_LIMITS.fieldTesla.max)];
          if (alpha[1] > alpha[0] && field[1] > field[0] && !(t.k === 1 && t.x === 0 && t.y === 0)) report({ alpha, field });
        }, ZOOM_SETTLE_MS);
      });
    zoomRef.current = behavior;
    select(overlay).call(behavior).on('dblclick.zoom', null);
    return () => {
      clearTimeout(timer);
      select(overlay).on('.zoom', null);
    };
  }, [drawAxes]);

  const toCanonical = useCallback(
    (x: number, y: number): ProbePoint => ({ alpha: alphaFromDisplay(xScale.invert(x), alphaUnit), tesla: fieldDisplayToTesla(yScale.invert(y), fieldUnit) }),
    [xScale, yScale, alphaUnit, fieldUnit],
  );

  const pointer = (event: { clientX: number; clientY: number }) => {
    const rect = overlayRef.current!.getBoundingClientRect();
    return { x: event.clientX - rect.left, y: event.clientY - rect.top };
  };

  const fieldBands = setup.fieldBands
    .filter((b) => b.maxTesla > view.field[0] && b.minTesla < view.field[1])
    .map((b) => {
      const y0 = yScale(fieldTeslaToDisplay(Math.max(b.minTesla, view.field[0]), fieldUnit));
      const y1 = yScale(fieldTeslaToDisplay(Math.min(b.maxTesla, view.field[1]), fieldUnit));
      return { label: b.label, y: Math.min(y0, y1), h: Math.abs(y0 - y1) };
    });

  const overlayNode = useMemo(() => {
    if (!overlay) return null;
    const toData = (x: number, y: number) => toCanonical(gesture.invertX(x), gesture.invertY(y));
    const toScreenT = (a: number, b: number): [number, number] => [gesture.applyX(xScale(alphaToDisplay(a, alphaUnit))), gesture.applyY(yScale(fieldTeslaToDisplay(b, fieldUnit)))];
    return overlay({ width: pw, height: ph, offset: { left: MARGIN.left, top: MARGIN.top }, transform: gesture, toScreen: toScreenT, toData, view, setView: onViewChange, scales: { alpha: xKind, field: yKind } });
  }, [overlay, gesture, toCanonical, xScale, yScale, alphaUnit, fieldUnit, pw, ph, view, onViewChange, xKind, yKind]);

  const probeXY = probe ? [xScale(alphaToDisplay(probe.alpha, alphaUnit)), yScale(fieldTeslaToDisplay(probe.tesla, fieldUnit))] : null;
  const cursorPoint = cursor ? toCanonical(cursor.x, cursor.y) : null;
  const cursorText = cursorPoint ? readout(cursorPoint.alpha, cursorPoint.tesla) : null;

  return (
    <div ref={containerRef} className="map-view" style={MAP_VIEW_STYLE}>
      {width > 0 && (
        // The figure: one self-contained <svg> (layers, bands, species, probe, axes) that exports can serialise as is.
        <svg ref={svgRef} width={width} height={height} role="img" aria-label="Map of polarizability against magnetic field" style={{ position: 'absolute', left: 0, top: 0, display: 'block', fontFamily: 'inherit' }}>
          <defs>
            <clipPath id={`plot-${uid}`}>
              <rect width={pw} height={ph} />
            </clipPath>
          </defs>
          <g transform={`translate(${MARGIN.left},${MARGIN.top})`}>
            <rect width={pw} height={ph} fill="#f6f5f1" />
            <g clipPath={`url(#plot-${uid})`}>
              <g ref={contentRef}>
                <g ref={layersRef} />
                <g className="field-bands">
                  {fieldBands.map((b) => (
                    <g key={b.label + b.y}>
                      <rect x={0} y={b.y} width={pw} height={b.h} fill={palette.fieldBand} fillOpacity={0.08} stroke={palette.fieldBand} strokeOpacity={0.8} strokeDasharray="3 2" />
                      <text x={6} y={b.y + 13} fontSize={11} fill="#2c3f99" stroke="#fff" strokeWidth={3} paintOrder="stroke">
                        {b.label}
                      </text>
                    </g>
                  ))}
                </g>
                <g className="species">
                  {species.map((s) => {
                    const x = xScale(alphaToDisplay(s.alphaAu, alphaUnit));
                    const xl = xScale(alphaToDisplay(Math.max(1e-9, s.alphaAu - s.alphaUncertaintyAu), alphaUnit));
                    const xr = xScale(alphaToDisplay(s.alphaAu + s.alphaUncertaintyAu, alphaUnit));
                    const colour = s.hasFieldFreeAnion ? palette.speciesWithAnion : palette.speciesWithoutAnion;
                    return (
                      <g key={s.name} className="species-marker" data-anion={s.hasFieldFreeAnion}>
                        <title>{s.details}</title>
                        <rect x={Math.min(xl, xr)} y={0} width={Math.max(1, Math.abs(xr - xl))} height={ph} fill={colour} fillOpacity={0.12} />
                        <line x1={x} x2={x} y1={0} y2={ph} stroke={colour} strokeWidth={1} strokeDasharray={s.hasFieldFreeAnion ? undefined : '3 3'} />
                        {s.hasFieldFreeAnion ? <path d={`M${x},4 l5,6 l-5,6 l-5,-6 Z`} fill={colour} /> : <circle cx={x} cy={10} r={4.5} fill="#fff" stroke={colour} strokeWidth={1.5} />}
                        <text x={x + 7} y={14} fontSize={11} fill={colour} stroke="#fff" strokeWidth={3} paintOrder="stroke">
                          {s.name}
                        </text>
                      </g>
                    );
                  })}
                </g>
                {probeXY && (
                  <g className="probe-marker" transform={`translate(${probeXY[0]},${probeXY[1]})`} pointerEvents="none">
                    <circle r={7} fill="none" stroke={palette.pin} strokeWidth={2} />
                    <path d="M-11,0H-4M4,0H11M0,-11V-4M0,4V11" stroke={palette.pin} strokeWidth={2} />
                  </g>
                )}
              </g>
            </g>
            <rect width={pw} height={ph} fill="none" stroke={palette.ink} strokeOpacity={0.5} pointerEvents="none" />
            <g ref={xAxisRef} transform={`translate(0,${ph})`} />
            <g ref={yAxisRef} />
            <text x={pw / 2} y={ph + 38} textAnchor="middle" fontSize={13} fill={palette.ink}>
              Polarizability α ({ALPHA_UNIT_LABEL[alphaUnit]})
            </text>
            <text transform={`translate(${-54},${ph / 2}) rotate(-90)`} textAnchor="middle" fontSize={13} fill={palette.ink}>
              Magnetic field B ({FIELD_UNIT_LABEL[fieldUnit]})
            </text>
          </g>
        </svg>
      )}
      {width > 0 && (
        // Crosshair and pointer input on a separate <svg> above the figure: moving the crosshair never repaints the map.
        <svg width={width} height={height} aria-hidden style={{ position: 'absolute', left: 0, top: 0, display: 'block' }}>
          <g transform={`translate(${MARGIN.left},${MARGIN.top})`}>
            {cursor && (
                <g pointerEvents="none" className="crosshair">
                  <line x1={cursor.x} x2={cursor.x} y1={0} y2={ph} stroke={palette.ink} strokeOpacity={0.45} strokeWidth={0.8} />
                  <line x1={0} x2={pw} y1={cursor.y} y2={cursor.y} stroke={palette.ink} strokeOpacity={0.45} strokeWidth={0.8} />
                </g>
              )}
            <rect
              ref={overlayRef}
              className="map-overlay"
              width={pw}
              height={ph}
              fill="transparent"
              style={{ cursor: 'crosshair' }}
              onPointerMove={(e) => setCursor(pointer(e))}
              onPointerLeave={() => setCursor(null)}
              onClick={(e) => onProbe(toCanonical(pointer(e).x, pointer(e).y))}
            />
          </g>
        </svg>
      )}
      {width > 0 && overlayNode && (
        <div className="map-overlay-slot" style={{ position: 'absolute', left: MARGIN.left, top: MARGIN.top, width: pw, height: ph, pointerEvents: 'none' }}>
          {overlayNode}
        </div>
      )}
      {cursor && cursorPoint && (
        <div
          className="map-readout"
          role="status"
          style={{
            position: 'absolute',
            left: Math.min(MARGIN.left + cursor.x + 14, Math.max(0, width - 260)),
            top: Math.max(0, MARGIN.top + cursor.y - 58),
            pointerEvents: 'none',
            background: 'rgba(255,255,255,0.94)',
            border: `1px solid ${palette.unbound}`,
            borderRadius: 4,
            padding: '4px 8px',
            fontSize: 12,
            lineHeight: 1.5,
            color: palette.ink,
            boxShadow: '0 1px 4px rgba(43,45,66,0.15)',
            whiteSpace: 'nowrap',
          }}
        >
          <div>
            α = {formatScientific(alphaToDisplay(cursorPoint.alpha, alphaUnit), { digits: 4 })} {ALPHA_UNIT_LABEL[alphaUnit]}
            {'   '}B = {formatScientific(fieldTeslaToDisplay(cursorPoint.tesla, fieldUnit), { digits: 4 })} {FIELD_UNIT_LABEL[fieldUnit]}
          </div>
          <div>{cursorText ?? 'not computed here'}</div>
        </div>
      )}
    </div>
  );
});

/** B in tesla → atomic units (re-exported for the page's readout). */
export const teslaToAu = (t: number) => teslaToAtomic(t as Tesla) as number;
