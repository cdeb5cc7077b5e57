import { memo, useRef, useState, type PointerEvent as ReactPointerEvent } from 'react';
import { Button, Typography } from 'antd';
import { DownOutlined, UpOutlined } from '@ant-design/icons';
import { palette } from '../../theme/palette';
import { countFill } from '../map-render/projectGeometry';
import type { ShownQuantity } from '../map-render/regionField';

export interface MapLegendProps {
  shown: ShownQuantity;
  maxCount: number;
  energyUnitLabel: string;
  /** Ion motion is part of the classes shown (resonances possible). */
  motionApplied: boolean;
  hasSpecies: boolean;
  hasFieldBands: boolean;
  /** The map is narrow: the legend starts folded to its title (the reader can unfold it). */
  narrow?: boolean;
}

const HATCH = `repeating-linear-gradient(45deg, rgba(43,45,66,0.55) 0 1.2px, transparent 1.2px 6px), ${palette.resonance}`;

function Swatch({ background, border }: { background: string; border?: boolean }) {
  return <span aria-hidden style={{ display: 'inline-block', width: 22, height: 12, background, border: border ? '1px solid #c9c6bd' : undefined, verticalAlign: 'middle', marginRight: 8 }} />;
}

/** The map's key, floating over a corner; drag its title bar to move it out of the way. */
export const MapLegend = memo(function MapLegend({ shown, maxCount, energyUnitLabel, motionApplied, hasSpecies, hasFieldBands, narrow = false }: MapLegendProps) {
  const [pos, setPos] = useState({ right: 16, bottom: 60 });
  // Folded to its title while the map is narrow (e.g. beside the open probe) unless the reader unfolds it; once the
  // reader folds or unfolds it, that choice holds.
  const [foldedByReader, setFoldedByReader] = useState<boolean | null>(null);
  const folded = foldedByReader ?? narrow;
  const drag = useRef<{ x: number; y: number; right: number; bottom: number } | null>(null);
  const onDown = (e: ReactPointerEvent) => {
    drag.current = { x: e.clientX, y: e.clientY, ...pos };
    (e.target as Element).setPointerCapture?.(e.pointerId);
  };
  const onMove = (e: ReactPointerEvent) => {
    const d = drag.current;
    if (d) setPos({ right: Math.max(0, d.right - (e.clientX - d.x)), bottom: Math.max(0, d.bottom - (e.clientY - d.y)) });
  };
  const counts = maxCount <= 6 ? Array.from({ length: maxCount }, (_, k) => k + 1) : [1, Math.round(maxCount / 2), maxCount];
  return (
    <aside
      aria-label="Legend"
      className="map-legend"
      style={{
        position: 'absolute',
        right: pos.right,
        bottom: pos.bottom,
        background: 'rgba(255,255,255,0.95)',
        border: `1px solid ${palette.unbound}`,
        borderRadius: 6,
        boxShadow: '0 2px 8px rgba(43,45,66,0.12)',
        fontSize: 12,
        minWidth: folded ? undefined : 190,
        userSelect: 'none',
      }}
    >
      <div onPointerDown={onDown} onPointerMove={onMove} onPointerUp={() => (drag.current = null)} style={{ cursor: 'move', padding: '4px 4px 4px 10px', borderBottom: folded ? undefined : `1px solid ${palette.unbound}`, display: 'flex', alignItems: 'center', gap: 6 }}>
        <Typography.Text strong style={{ fontSize: 12, flex: 1 }}>
          {shown.kind === 'orbital' ? `Orbital m = ${shown.m}` : motionApplied ? 'Survivors: states that last the observation time' : 'Survivors: bound states'}
        </Typography.Text>
        <Button
          type="text"
          size="small"
          aria-label={folded ? 'Unfold the legend' : 'Fold the legend'}
          aria-expanded={!folded}
          icon={folded ? <UpOutlined /> : <DownOutlined />}
          onPointerDown={(e) => e.stopPropagation()}
          onClick={() => setFoldedByReader(!folded)}
        />
      </div>
      <div hidden={folded} style={{ padding: '6px 10px', lineHeight: '20px' }}>
        {shown.kind === 'orbital' ? (
          <>
            <div>
              <Swatch background={palette.bound} /> bound
            </div>
            {motionApplied && (
              <div>
                <Swatch background={HATCH} /> resonance (hatched)
              </div>
            )}
            <div>
              <Swatch background={palette.unbound} border /> unbound
            </div>
          </>
        ) : (
          <>
            <div>
              <Swatch background={palette.unbound} border /> none
            </div>
            {counts.map((k) => (
              <div key={k}>
                <Swatch background={countFill(k, maxCount)} /> {`≥ ${k}`}{k === maxCount && maxCount > 6 ? ' (most)' : ''}
              </div>
            ))}
          </>
        )}
        <div>
          <svg width={22} height={12} aria-hidden style={{ verticalAlign: 'middle', marginRight: 8 }}>
            <line x1={0} x2={22} y1={6} y2={6} stroke={palette.ink} strokeWidth={1.1} strokeDasharray="5 3" />
          </svg>
          binding energy ({energyUnitLabel})
        </div>
        {hasSpecies && (
          <>
            <div>
              <svg width={22} height={12} aria-hidden style={{ verticalAlign: 'middle', marginRight: 8 }}>
                <path d="M11,0 l5,6 l-5,6 l-5,-6 Z" fill={palette.speciesWithAnion} />
              </svg>
              atom with a field-free anion
            </div>
            <div>
              <svg width={22} height={12} aria-hidden style={{ verticalAlign: 'middle', marginRight: 8 }}>
                <circle cx={11} cy={6} r={4.5} fill="#fff" stroke={palette.speciesWithoutAnion} strokeWidth={1.5} />
              </svg>
              atom without one
            </div>
          </>
        )}
        {hasFieldBands && (
          <div>
            <Swatch background={`${palette.fieldBand}33`} /> field band
          </div>
        )}
      </div>
    </aside>
  );
});
