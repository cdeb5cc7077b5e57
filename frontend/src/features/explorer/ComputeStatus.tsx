import { memo } from 'react';
import { Alert, Button, Space, Typography } from 'antd';
import { palette } from '../../theme/palette';
import { formatScientific } from '../map-render/formatNumber';
import { useProgress, type MapComputation, type ProgressStore } from './hooks/useMapComputation';

function duration(ms: number): string {
  if (ms < 1000) return `${Math.max(0, Math.round(ms / 100) / 10)} s`;
  const s = Math.round(ms / 1000);
  return s < 90 ? `${s} s` : `${Math.floor(s / 60)} min ${s % 60} s`;
}

export interface ComputeStatusProps {
  state: MapComputation;
  onCancel: () => void;
  onRetry: () => void;
  /** What is being computed, e.g. "the map" or "the zoomed window". */
  what: string;
  /** Live progress (the computation's store); without it `state.progress` is shown. */
  progress?: ProgressStore | null;
}

/**
 * The bar of cells done: a plain bar scaled by a transform. Unlike antd's Progress (whose width transition makes the
 * page re-lay-out and repaint every frame for 0.3 s after each update, and whose CSS antd removes and re-inserts as
 * the status comes and goes) an update costs one composited frame.
 */
function CellsBar({ percent }: { percent: number }) {
  return (
    <div role="progressbar" aria-label="Cells done" aria-valuemin={0} aria-valuemax={100} aria-valuenow={percent} style={{ height: 6, margin: '4px 0', borderRadius: 3, background: 'rgba(43,45,66,0.08)', overflow: 'hidden' }}>
      <div style={{ height: '100%', background: palette.bound, transformOrigin: 'left center', transform: `scaleX(${percent / 100})`, willChange: 'transform' }} />
    </div>
  );
}

/** Progress (cells done, time left, Cancel) while computing; a clear message with Retry when it failed. */
export const ComputeStatus = memo(function ComputeStatus({ state, onCancel, onRetry, what, progress }: ComputeStatusProps) {
  const live = useProgress(progress);
  if (state.status === 'error' && state.error) {
    const cancelled = state.error.kind === 'cancelled';
    return (
      <Alert
        type={cancelled ? 'info' : 'error'}
        showIcon
        role="alert"
        title={cancelled ? `Computation of ${what} cancelled` : `Could not compute ${what}`}
        description={
          state.error.kind === 'crash' ? (
            <>
              {state.error.message} Retry starts the engine afresh in this tab; your setup and saved maps are not affected. If it stops again, the browser may be short of memory: try a coarser grid or fewer orbitals.
            </>
          ) : (
            state.error.message
          )
        }
        action={
          <Button size="small" type={cancelled ? 'default' : 'primary'} onClick={onRetry}>
            {cancelled ? 'Compute again' : 'Retry'}
          </Button>
        }
        style={{ maxWidth: 460 }}
      />
    );
  }
  if (state.status !== 'computing') return null;
  const p = progress ? live : state.progress;
  const percent = p && p.total > 0 ? Math.floor((100 * p.done) / p.total) : 0;
  return (
    // Its own compositing layer (will-change): its updates never repaint the map under it.
    <div role="status" aria-label="Computation progress" style={{ willChange: 'transform', background: 'rgba(255,255,255,0.96)', border: `1px solid ${palette.unbound}`, borderRadius: 6, padding: '6px 12px', minWidth: 300, boxShadow: '0 2px 8px rgba(43,45,66,0.12)' }}>
      <Space orientation="vertical" size={2} style={{ width: '100%' }}>
        <Typography.Text style={{ fontSize: 12 }}>
          Computing {what}
          {p ? (p.pass === 'coarse' ? ' — quick first pass' : ' — full resolution') : ''}
        </Typography.Text>
        <CellsBar percent={percent} />
        <Space style={{ justifyContent: 'space-between', width: '100%' }}>
          <Typography.Text type="secondary" style={{ fontSize: 12 }}>
            {p ? `${formatScientific(p.done, { digits: 6, plainMax: 1e7 })} of ${formatScientific(p.total, { digits: 6, plainMax: 1e7 })} cells` : 'starting…'}
            {p && p.remainingMs !== null ? ` · about ${duration(p.remainingMs)} left` : ''}
          </Typography.Text>
          <Button size="small" onClick={onCancel}>
            Cancel
          </Button>
        </Space>
      </Space>
    </div>
  );
});
