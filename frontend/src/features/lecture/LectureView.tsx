import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { Typography } from 'antd';
import type { MapSetup, PinGeometry, PinStatus } from '@fieldbound/shared';
import { palette } from '../../theme/palette';
import { ExplorerPage, type ExplorerOverlayContext } from '../explorer/ExplorerPage';
import { speciesMarkers, type SpeciesMarkerSource } from '../explorer/speciesMarkers';
import { windowAround } from '../pins/pinGeometry';
import { usePinsOverlay } from '../pins/usePinsOverlay';
import './lecture.css';

export interface LecturePin {
  id: string;
  geometry: PinGeometry;
  title: string;
  body: string;
  status: PinStatus;
  category: string | null;
}

export interface LectureViewProps {
  title: string;
  description?: string;
  setup: MapSetup;
  pins: readonly LecturePin[];
  /** Species entries for the overlay's markers (those `setup.species` names are drawn), as the map page has them. */
  species?: readonly SpeciesMarkerSource[];
  /** Leaves the lecture view (Esc, or the browser leaving full screen). */
  onExit: () => void;
}

const NO_SPECIES: readonly SpeciesMarkerSource[] = [];

const CAUTION =
  'Model estimates: an electron bound to a fixed polarizable atom in the adiabatic single-orbital approximation (one Landau orbital m at a time); regions near their borders and flagged cells are uncertain. Not a measurement.';

/**
 * Full-screen presentation of a map for a lecture room: high contrast, large type, the legend and a caption with the
 * model caution; ← and → step through the pins (the map moves to each, its text in the caption), Esc leaves; a ring
 * follows the pointer so the audience sees what is pointed at.
 */
export function LectureView({ title, description, setup, pins, species = NO_SPECIES, onExit }: LectureViewProps) {
  const rootRef = useRef<HTMLDivElement>(null);
  const markers = useMemo(() => speciesMarkers(species), [species]);
  const [step, setStep] = useState(-1);
  const [pointer, setPointer] = useState<{ x: number; y: number } | null>(null);
  const layer = usePinsOverlay({ pins, large: true });
  const ctxRef = useRef<ExplorerOverlayContext | null>(null);

  const overlay = useCallback(
    (ctx: ExplorerOverlayContext): ReactNode => {
      ctxRef.current = ctx;
      return layer.overlay(ctx);
    },
    [layer.overlay], // eslint-disable-line react-hooks/exhaustive-deps
  );

  const go = useCallback(
    (next: number) => {
      const n = Math.max(-1, Math.min(pins.length - 1, next));
      setStep(n);
      const ctx = ctxRef.current;
      if (n < 0) {
        layer.select(null);
        ctx?.setView({ alpha: [setup.alphaAxis.min, setup.alphaAxis.max], field: [setup.fieldAxis.min, setup.fieldAxis.max] });
      } else {
        layer.select(pins[n].id);
        if (ctx) ctx.setView(windowAround(pins[n].geometry, ctx));
      }
    },
    [pins, setup, layer],
  );

  // Keys: ←/→ between pins (→ from the overview goes to the first), Esc leaves.
  const stepRef = useRef(step);
  stepRef.current = step;
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.target instanceof HTMLElement && e.target.closest('input, textarea, .ant-select')) return;
      if (e.key === 'ArrowRight' || e.key === 'PageDown') {
        e.preventDefault();
        go(stepRef.current + 1);
      } else if (e.key === 'ArrowLeft' || e.key === 'PageUp') {
        e.preventDefault();
        go(stepRef.current - 1);
      } else if (e.key === 'Escape') {
        e.preventDefault();
        onExit();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [go, onExit]);

  // Full screen when the browser allows it; leaving full screen (the browser's own Esc) leaves the lecture view.
  useEffect(() => {
    const el = rootRef.current;
    let entered = false;
    const onChange = () => {
      if (document.fullscreenElement) entered = true;
      else if (entered) onExit();
    };
    document.addEventListener('fullscreenchange', onChange);
    if (el?.requestFullscreen && !document.fullscreenElement) el.requestFullscreen().catch(() => undefined);
    return () => {
      document.removeEventListener('fullscreenchange', onChange);
      if (document.fullscreenElement) void document.exitFullscreen?.().catch(() => undefined);
    };
  }, [onExit]);

  const current = step >= 0 ? pins[step] : null;
  return (
    <div
      ref={rootRef}
      className="lecture-view"
      data-testid="lecture-view"
      role="region"
      aria-label={`Lecture view: ${title}`}
      onPointerMove={(e) => setPointer({ x: e.clientX, y: e.clientY })}
      onPointerLeave={() => setPointer(null)}
    >
      <header className="lecture-head">
        <h1>{title}</h1>
        {description && <p className="lecture-description">{description}</p>}
      </header>
      <div className="lecture-map">
        <ExplorerPage initialSetup={setup} readOnly speciesCatalogue={markers} overlay={overlay} style={{ height: '100%', minHeight: 0, flex: 1 }} />
      </div>
      <footer className="lecture-caption" aria-live="polite">
        {current ? (
          <div data-testid="lecture-current-pin">
            <div className="lecture-pin-title">
              <span className="lecture-step">
                Pin {step + 1} of {pins.length}
              </span>{' '}
              {current.title}
              {current.status === 'resolved' ? ' (resolved)' : ''}
            </div>
            {current.body && <div className="lecture-pin-body">{current.body}</div>}
          </div>
        ) : (
          <div className="lecture-pin-title" data-testid="lecture-overview">
            The whole map{pins.length ? ` · ${pins.length} pin${pins.length === 1 ? '' : 's'}` : ''}
          </div>
        )}
        <Typography.Paragraph className="lecture-caution">{CAUTION}</Typography.Paragraph>
        <div className="lecture-keys">{pins.length ? '← → step through the pins · ' : ''}Esc leaves</div>
      </footer>
      {pointer && <div className="lecture-pointer" aria-hidden style={{ left: pointer.x, top: pointer.y, borderColor: palette.pin }} />}
    </div>
  );
}
