import { memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Button, Drawer, Tooltip } from 'antd';
import { ColumnWidthOutlined } from '@ant-design/icons';
import type { MapSetup } from '@fieldbound/shared';
import type { EnginePool } from '../../workers/enginePool';
import { ProbePanel } from './ProbePanel';
import type { ProbePoint } from './viewState';

/**
 * Widths of the drawer: on opening a share of the explorer (the state table scrolls sideways on a laptop screen;
 * most of the map stays in view); the wide view (button in the header) leaves 480 px of the explorer (the setup
 * column and a strip of the map) and shows the whole table from about 1280 px up; dragging the left edge sets pixels.
 */
type ProbeWidth = 'opening' | 'wide' | number;
const OPENING = { size: '44%', wrapper: { minWidth: 440, maxWidth: 760 } };
const WIDE = { size: 'calc(100% - 480px)', wrapper: { minWidth: 440 } };
/** Dragging stops here, and leaves at least this much of the explorer uncovered. */
const MIN_WIDTH = 360;
const KEEP_UNCOVERED = 160;

const BODY = { padding: '12px 16px' };

export interface ProbeDrawerProps {
  point: ProbePoint | null;
  setup: MapSetup;
  pool: EnginePool | null;
  onClose: () => void;
  /** The drawer's width in pixels while it is open (0 when closed), so the explorer can keep the map beside it. */
  onCoverChange?: (px: number) => void;
}

/**
 * The probe in a drawer over the right of the explorer (inside its box, so the host page's header stays
 * reachable). Its edge can be dragged; a header button switches between the opening width and a wide view.
 * Memoised: typing in the setup re-renders the explorer, not the drawer.
 */
export const ProbeDrawer = memo(function ProbeDrawer({ point, setup, pool, onClose, onCoverChange }: ProbeDrawerProps) {
  const [width, setWidth] = useState<ProbeWidth>('opening');
  const panel = useRef<HTMLDivElement>(null);
  // Report the open drawer's width as it opens, is dragged or switches views (a ResizeObserver: read after layout).
  // The panel element arrives through a callback ref: the drawer mounts it after its own first render.
  const [panelEl, setPanelEl] = useState<HTMLDivElement | null>(null);
  const panelRefs = useCallback((el: HTMLDivElement | null) => {
    panel.current = el;
    setPanelEl(el);
  }, []);
  const open = point !== null;
  useEffect(() => {
    if (!open || !panelEl || !onCoverChange) return;
    const report = () => onCoverChange(panelEl.offsetWidth);
    report();
    if (typeof ResizeObserver === 'undefined') return () => onCoverChange(0);
    const observer = new ResizeObserver(report);
    observer.observe(panelEl);
    return () => {
      observer.disconnect();
      onCoverChange(0);
    };
  }, [open, panelEl, onCoverChange]);
  const onResize = useCallback((next: number) => {
    // The drawer's root spans the explorer: what it leaves of the map is measured against that.
    const root = panel.current?.closest<HTMLElement>('.ant-drawer');
    const max = root ? Math.max(MIN_WIDTH, root.clientWidth - KEEP_UNCOVERED) : Infinity;
    setWidth(Math.round(Math.min(max, Math.max(MIN_WIDTH, next))));
  }, []);
  const wide = width === 'wide';
  const preset = width === 'opening' ? OPENING : wide ? WIDE : null;
  const styles = useMemo(() => ({ body: BODY, wrapper: preset?.wrapper }), [preset]);
  return (
    <Drawer
      title="Probe"
      placement="right"
      size={preset ? preset.size : width}
      resizable={{ onResize }}
      panelRef={panelRefs}
      open={point !== null}
      onClose={onClose}
      mask={false}
      destroyOnHidden
      getContainer={false}
      styles={styles}
      extra={
        <Tooltip title={wide ? 'Back to the opening width' : 'Widen over the map (or drag the left edge)'}>
          <Button type="text" size="small" icon={<ColumnWidthOutlined />} aria-label="Wide probe view" aria-pressed={wide} onClick={() => setWidth(wide ? 'opening' : 'wide')} />
        </Tooltip>
      }
    >
      {point && <ProbePanel point={point} setup={setup} pool={pool} />}
    </Drawer>
  );
});
