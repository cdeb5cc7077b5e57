import { useEffect, useMemo, useRef, useState, type PointerEvent as ReactPointerEvent } from 'react';
import { Button, Tooltip } from 'antd';
import { AimOutlined, BorderOutlined, CloseOutlined, EnvironmentOutlined, StarOutlined } from '@ant-design/icons';
import type { PinGeometry, PinStatus } from '@fieldbound/shared';
import { palette } from '../../theme/palette';
import type { ExplorerOverlayContext } from '../explorer/ExplorerPage';
import { describeRegion, moveGeometry, pinAnchor, pinToScreen, rectFromCorners, reshapeGeometry, toPinPoint, windowAround, type PinRegion, type Xy } from './pinGeometry';

/** What the layer needs of a pin (a member's `PinView` or a link holder's `SharedPin`). */
export interface LayerPin {
  id: string;
  geometry: PinGeometry;
  title: string;
  status: PinStatus;
  category: string | null;
}

export type PinTool = 'none' | 'point' | 'rect' | 'polygon';

export interface PinsLayerProps {
  ctx: ExplorerOverlayContext;
  pins: readonly LayerPin[];
  selectedId: string | null;
  onSelect: (pinId: string) => void;
  /** Region under each pin now, by pin id (computed by the owner from `ctx.regions`). */
  regionsByPin: ReadonlyMap<string, PinRegion | null>;
  /** "class changed: bound → resonance", by pin id. */
  notices: ReadonlyMap<string, string>;
  /** Editors only: drawing tools and dragging. Absent for viewers and link holders (nothing is draggable). */
  edit?: {
    tool: PinTool;
    onTool: (tool: PinTool) => void;
    onCreate: (geometry: PinGeometry) => void;
    onChangeGeometry: (pinId: string, geometry: PinGeometry) => void;
  };
  /** Moves the map to a pin each time `n` changes. */
  jump?: { pinId: string; n: number } | null;
  /** Larger markers and type (lecture view). */
  large?: boolean;
}

const shortTitle = (t: string, max = 28) => (t.length > max ? `${t.slice(0, max - 1)}…` : t);
const pathOf = (pts: readonly Xy[], closed: boolean) => (pts.length ? `M${pts.map((p) => `${p[0].toFixed(1)},${p[1].toFixed(1)}`).join('L')}${closed ? 'Z' : ''}` : '');

type Drag =
  | { kind: 'move'; pinId: string; start: Xy; now: Xy; base: PinGeometry }
  | { kind: 'vertex'; pinId: string; index: number; now: Xy; base: PinGeometry };

/**
 * Pins over the map, drawn in data coordinates through the map's own mapping (`ctx.toScreen`), so they stay on the
 * same physical region through zoom, range changes and recomputation. Hover shows the title and the class under the
 * pin; a click selects it. Editors get tools to drop a point, drag a rectangle or draw a polygon, and can move a pin
 * or drag its corners/vertices.
 */
export function PinsLayer({ ctx, pins, selectedId, onSelect, regionsByPin, notices, edit, jump, large = false }: PinsLayerProps) {
  const svgRef = useRef<SVGSVGElement>(null);
  const [hover, setHover] = useState<string | null>(null);
  const [drag, setDrag] = useState<Drag | null>(null);
  const [draft, setDraft] = useState<{ points: Xy[]; cursor: Xy | null; rectStart: Xy | null }>({ points: [], cursor: null, rectStart: null });
  const tool = edit?.tool ?? 'none';

  // Jump: move the map's window around the pin.
  const ctxRef = useRef(ctx);
  ctxRef.current = ctx;
  const pinsRef = useRef(pins);
  pinsRef.current = pins;
  useEffect(() => {
    if (!jump) return;
    const pin = pinsRef.current.find((p) => p.id === jump.pinId);
    if (pin) ctxRef.current.setView(windowAround(pin.geometry, ctxRef.current));
  }, [jump?.n]); // eslint-disable-line react-hooks/exhaustive-deps

  // A new tool starts a new drawing; Esc cancels, Enter closes a polygon.
  useEffect(() => setDraft({ points: [], cursor: null, rectStart: null }), [tool]);
  const finishPolygon = () => {
    if (!edit) return;
    const pts = draft.points;
    if (pts.length >= 3) {
      edit.onCreate({ kind: 'polygon', vertices: pts.map((p) => toPinPoint(ctx.toData(p[0], p[1]))) });
      edit.onTool('none');
    }
  };
  const finishRef = useRef(finishPolygon);
  finishRef.current = finishPolygon;
  useEffect(() => {
    if (tool === 'none' && !drag) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape') {
        setDrag(null);
        setDraft({ points: [], cursor: null, rectStart: null });
        edit?.onTool('none');
      } else if (e.key === 'Enter' && tool === 'polygon') {
        e.preventDefault();
        finishRef.current();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [tool, drag, edit]);

  const local = (e: { clientX: number; clientY: number }): Xy => {
    const r = svgRef.current!.getBoundingClientRect();
    return [e.clientX - r.left, e.clientY - r.top];
  };

  // Geometry as shown: a pin being dragged shows where it would go.
  const shownGeometry = (pin: LayerPin): PinGeometry => {
    if (!drag || drag.pinId !== pin.id) return pin.geometry;
    return drag.kind === 'move'
      ? moveGeometry(drag.base, drag.now[0] - drag.start[0], drag.now[1] - drag.start[1], ctx.toScreen, ctx.toData)
      : reshapeGeometry(drag.base, drag.index, drag.now, ctx.toScreen, ctx.toData);
  };

  const startDrag = (e: ReactPointerEvent, next: Drag) => {
    e.stopPropagation();
    (e.currentTarget as Element).setPointerCapture?.(e.pointerId);
    setDrag(next);
  };
  const onPinPointerMove = (e: ReactPointerEvent) => {
    if (!drag) return;
    setDrag({ ...drag, now: local(e) });
  };
  const onPinPointerUp = (e: ReactPointerEvent, pin: LayerPin) => {
    if (!drag) {
      onSelect(pin.id);
      return;
    }
    const end = local(e);
    const moved = drag.kind === 'move' ? Math.hypot(end[0] - drag.start[0], end[1] - drag.start[1]) > 3 : true;
    const geometry = shownGeometry(pin);
    setDrag(null);
    if (moved && edit) edit.onChangeGeometry(pin.id, geometry);
    else onSelect(pin.id);
  };

  // Drawing surface (editors with a tool): clicks and drags create a pin instead of panning the map.
  const onDrawDown = (e: ReactPointerEvent) => {
    if (!edit || e.button !== 0) return;
    const p = local(e);
    if (tool === 'rect') {
      (e.currentTarget as Element).setPointerCapture?.(e.pointerId);
      setDraft({ points: [], cursor: p, rectStart: p });
    }
  };
  const onDrawMove = (e: ReactPointerEvent) => setDraft((d) => ({ ...d, cursor: local(e) }));
  const onDrawUp = (e: ReactPointerEvent) => {
    if (!edit || e.button !== 0) return;
    const p = local(e);
    if (tool === 'point') {
      edit.onCreate({ kind: 'point', at: toPinPoint(ctx.toData(p[0], p[1])) });
      edit.onTool('none');
    } else if (tool === 'rect' && draft.rectStart) {
      const s = draft.rectStart;
      setDraft({ points: [], cursor: p, rectStart: null });
      if (Math.abs(p[0] - s[0]) > 4 && Math.abs(p[1] - s[1]) > 4) {
        edit.onCreate(rectFromCorners(s, p, ctx.toData));
        edit.onTool('none');
      }
    } else if (tool === 'polygon') {
      setDraft((d) => {
        const last = d.points[d.points.length - 1];
        if (last && Math.hypot(last[0] - p[0], last[1] - p[1]) < 4) return d; // the second click of a double-click
        return { ...d, points: [...d.points, p] };
      });
    }
  };

  const hovered = hover ? pins.find((p) => p.id === hover) : null;
  const hoveredAnchor = hovered ? pinAnchor(shownGeometry(hovered), ctx.toScreen) : null;
  const fontSize = large ? 18 : 11.5;

  const drawn = useMemo(() => pins.map((pin) => ({ pin, pts: pinToScreen(shownGeometry(pin), ctx.toScreen) })), [pins, ctx, drag]); // eslint-disable-line react-hooks/exhaustive-deps

  return (
    <>
      <svg
        ref={svgRef}
        className="pins-layer"
        width={ctx.width}
        height={ctx.height}
        style={{ position: 'absolute', left: 0, top: 0, overflow: 'hidden', pointerEvents: 'none' }}
        aria-label="Pins"
        role="group"
      >
        {drawn.map(({ pin, pts }) => {
          const selected = pin.id === selectedId;
          const resolved = pin.status === 'resolved';
          const stroke = resolved ? '#77738a' : palette.pin;
          const anchor = pinAnchor(shownGeometry(pin), ctx.toScreen);
          const draggable = !!edit && tool === 'none';
          const sw = (selected ? 2.5 : 1.6) * (large ? 1.6 : 1);
          return (
            <g
              key={pin.id}
              className="pin"
              data-testid="pin"
              data-pin-id={pin.id}
              data-status={pin.status}
              role="button"
              aria-label={pin.title}
              tabIndex={0}
              style={{ pointerEvents: tool === 'none' ? 'visiblePainted' : 'none', cursor: draggable ? 'move' : 'pointer' }}
              onPointerEnter={() => setHover(pin.id)}
              onPointerLeave={() => setHover((h) => (h === pin.id ? null : h))}
              onPointerDown={(e) => {
                if (e.button !== 0) return;
                e.stopPropagation();
                if (draggable) startDrag(e, { kind: 'move', pinId: pin.id, start: local(e), now: local(e), base: pin.geometry });
              }}
              onPointerMove={onPinPointerMove}
              onPointerUp={(e) => {
                e.stopPropagation();
                onPinPointerUp(e, pin);
              }}
              onKeyDown={(e) => {
                if (e.key === 'Enter' || e.key === ' ') onSelect(pin.id);
              }}
            >
              {pin.geometry.kind === 'point' ? (
                <g transform={`translate(${anchor[0]},${anchor[1]})${large ? ' scale(1.6)' : ''}`}>
                  <path d="M0,0 C-3,-6 -8,-9 -8,-14 A8,8 0 1 1 8,-14 C8,-9 3,-6 0,0 Z" fill={resolved ? '#fff' : palette.pin} stroke={selected ? palette.ink : stroke} strokeWidth={selected ? 2 : 1.2} />
                  <circle cy={-14} r={3} fill={resolved ? stroke : '#fff'} />
                </g>
              ) : (
                <>
                  {/* The inside of an area pin lets clicks and drags through to the map (probe, pan, zoom), except
                      for the selected pin of an editor, which is moved by dragging its inside. The outline has a wide
                      invisible edge so it is easy to hover and grab. */}
                  <path d={pathOf(pts, true)} fill={palette.pin} fillOpacity={selected ? 0.16 : 0.07} stroke={stroke} strokeWidth={sw} strokeDasharray={resolved ? '5 4' : undefined} strokeLinejoin="round" pointerEvents={selected && draggable ? 'visiblePainted' : 'none'} />
                  <path className="pin-edge" d={pathOf(pts, true)} fill="none" stroke="transparent" strokeWidth={12} pointerEvents="stroke" />
                </>
              )}
              <text
                x={anchor[0] + (pin.geometry.kind === 'point' ? 10 * (large ? 1.6 : 1) : 0)}
                y={anchor[1] - (pin.geometry.kind === 'point' ? 16 * (large ? 1.6 : 1) : 6)}
                textAnchor={pin.geometry.kind === 'point' ? 'start' : 'middle'}
                fontSize={fontSize}
                fontWeight={600}
                fill={stroke}
                stroke="#fff"
                strokeWidth={large ? 5 : 3}
                paintOrder="stroke"
                pointerEvents="visiblePainted"
              >
                {shortTitle(pin.title, large ? 40 : 28)}
                {notices.has(pin.id) ? ' ⚠' : ''}
              </text>
              {selected &&
                edit &&
                tool === 'none' &&
                pin.geometry.kind !== 'point' &&
                pts.map((p, i) => (
                  <rect
                    key={i}
                    className="pin-handle"
                    data-testid="pin-handle"
                    x={p[0] - 4.5}
                    y={p[1] - 4.5}
                    width={9}
                    height={9}
                    fill="#fff"
                    stroke={palette.pin}
                    strokeWidth={1.5}
                    style={{ cursor: 'crosshair', pointerEvents: 'all' }}
                    onPointerDown={(e) => {
                      if (e.button !== 0) return;
                      startDrag(e, { kind: 'vertex', pinId: pin.id, index: i, now: local(e), base: pin.geometry });
                    }}
                  />
                ))}
            </g>
          );
        })}
        {edit && tool !== 'none' && (
          <g className="pin-drawing">
            <rect
              data-testid="pin-draw-surface"
              width={ctx.width}
              height={ctx.height}
              fill="transparent"
              style={{ pointerEvents: 'all', cursor: 'crosshair' }}
              onPointerDown={onDrawDown}
              onPointerMove={onDrawMove}
              onPointerUp={onDrawUp}
              onDoubleClick={() => finishPolygon()}
            />
            {tool === 'rect' && draft.rectStart && draft.cursor && (
              <rect
                x={Math.min(draft.rectStart[0], draft.cursor[0])}
                y={Math.min(draft.rectStart[1], draft.cursor[1])}
                width={Math.abs(draft.cursor[0] - draft.rectStart[0])}
                height={Math.abs(draft.cursor[1] - draft.rectStart[1])}
                fill={palette.pin}
                fillOpacity={0.1}
                stroke={palette.pin}
                strokeWidth={1.5}
                strokeDasharray="4 3"
                pointerEvents="none"
              />
            )}
            {tool === 'polygon' && draft.points.length > 0 && (
              <g pointerEvents="none">
                <path d={pathOf(draft.cursor ? [...draft.points, draft.cursor] : draft.points, false)} fill={palette.pin} fillOpacity={0.08} stroke={palette.pin} strokeWidth={1.5} strokeDasharray="4 3" />
                {draft.points.map((p, i) => (
                  <circle key={i} cx={p[0]} cy={p[1]} r={3.5} fill="#fff" stroke={palette.pin} strokeWidth={1.5} />
                ))}
              </g>
            )}
          </g>
        )}
      </svg>
      {edit && (
        <div className="pin-tools" role="toolbar" aria-label="Pin tools" style={{ position: 'absolute', left: 8, top: 8, display: 'flex', gap: 4, pointerEvents: 'auto', background: 'rgba(255,255,255,0.92)', borderRadius: 6, padding: 3, boxShadow: '0 1px 4px rgba(43,45,66,0.18)' }}>
          <Tooltip title="Add a pin at a point: click the map">
            <Button size="small" aria-label="Add point pin" aria-pressed={tool === 'point'} type={tool === 'point' ? 'primary' : 'text'} icon={<EnvironmentOutlined />} onClick={() => edit.onTool(tool === 'point' ? 'none' : 'point')} />
          </Tooltip>
          <Tooltip title="Pin a rectangle: drag across the map">
            <Button size="small" aria-label="Add rectangle pin" aria-pressed={tool === 'rect'} type={tool === 'rect' ? 'primary' : 'text'} icon={<BorderOutlined />} onClick={() => edit.onTool(tool === 'rect' ? 'none' : 'rect')} />
          </Tooltip>
          <Tooltip title="Pin a polygon: click its corners, double-click or press Enter to close, Esc cancels">
            <Button size="small" aria-label="Add polygon pin" aria-pressed={tool === 'polygon'} type={tool === 'polygon' ? 'primary' : 'text'} icon={<StarOutlined />} onClick={() => edit.onTool(tool === 'polygon' ? 'none' : 'polygon')} />
          </Tooltip>
          {tool !== 'none' && (
            <Tooltip title="Stop adding (Esc)">
              <Button size="small" aria-label="Stop adding a pin" type="text" icon={<CloseOutlined />} onClick={() => edit.onTool('none')} />
            </Tooltip>
          )}
          {tool !== 'none' && (
            <span role="status" style={{ fontSize: 12, alignSelf: 'center', padding: '0 6px', color: palette.ink }}>
              <AimOutlined />{' '}
              {tool === 'point' ? 'Click where the pin goes' : tool === 'rect' ? 'Drag a rectangle' : draft.points.length < 3 ? `Click the corners (${draft.points.length} so far)` : 'Double-click or Enter to close, Esc cancels'}
            </span>
          )}
        </div>
      )}
      {hovered && hoveredAnchor && !drag && (
        <div
          className="pin-tooltip"
          role="tooltip"
          style={{
            position: 'absolute',
            left: Math.min(hoveredAnchor[0] + 12, Math.max(0, ctx.width - 260)),
            top: Math.max(0, hoveredAnchor[1] + 8),
            maxWidth: 280,
            pointerEvents: 'none',
            background: 'rgba(255,255,255,0.97)',
            border: `1px solid ${palette.pin}`,
            borderRadius: 4,
            padding: '5px 9px',
            fontSize: large ? 16 : 12.5,
            lineHeight: 1.45,
            color: palette.ink,
            boxShadow: '0 1px 4px rgba(43,45,66,0.18)',
          }}
        >
          <div style={{ fontWeight: 600 }}>{hovered.title}</div>
          <div>Under it now: {describeRegion(regionsByPin.get(hovered.id) ?? null)}</div>
          {notices.has(hovered.id) && <div style={{ color: '#8a5a00' }}>{notices.get(hovered.id)}</div>}
          <div style={{ color: '#5b5d70' }}>
            {hovered.status === 'resolved' ? 'Resolved' : 'Open'}
            {hovered.category ? ` · ${hovered.category}` : ''}
          </div>
        </div>
      )}
    </>
  );
}
