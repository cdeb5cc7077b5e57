import { Space, Tooltip, Typography } from 'antd';
import type { PersonRef, ResultSummary } from '@fieldbound/shared';
import { useThumbnail } from '../../api/maps';
import { palette } from '../../theme/palette';
import { THUMBNAIL_SIZE } from './resultSummary';

const dateTime = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });

/** "2 Dec 2026, 01:40" in the reader's time zone. */
export function formatDateTime(iso: string | null | undefined): string {
  return iso ? dateTime.format(new Date(iso)) : '—';
}

export function personName(person: PersonRef | null | undefined): string {
  return person?.displayName ?? 'a former member';
}

/** The map's small picture, or a paper-grey tile saying none is stored yet. */
export function MapThumbnail({ url, title }: { url: string | null; title: string }) {
  const src = useThumbnail(url);
  const box = { width: THUMBNAIL_SIZE.width / 1.5, height: THUMBNAIL_SIZE.height / 1.5, borderRadius: 3, border: `1px solid ${palette.unbound}`, display: 'block' };
  if (!src) {
    return (
      <div aria-label={url ? `Loading the picture of ${title}` : 'No picture yet'} style={{ ...box, background: palette.unbound, fontSize: 10, color: '#6b6d7c', display: 'flex', alignItems: 'center', justifyContent: 'center', textAlign: 'center' }}>
        {url ? '' : 'not computed'}
      </div>
    );
  }
  return <img src={src} alt={`Picture of ${title}`} style={{ ...box, objectFit: 'cover' }} />;
}

function Swatch({ kind }: { kind: 'bound' | 'resonance' | 'unbound' }) {
  const background =
    kind === 'resonance' ? `repeating-linear-gradient(45deg, ${palette.resonance} 0 2px, #f3d9a4 2px 4px)` : kind === 'bound' ? palette.bound : palette.unbound;
  return <span aria-hidden style={{ display: 'inline-block', width: 9, height: 9, marginRight: 4, background, border: `1px solid ${palette.ink}33`, verticalAlign: 'baseline' }} />;
}

/** Bound / resonance / unbound counts of the last computation, with the class named in words (never colour alone). */
export function SummaryCounts({ summary }: { summary: ResultSummary | null }) {
  if (!summary) return <Typography.Text type="secondary">not computed yet</Typography.Text>;
  const n = (v: number) => v.toLocaleString('en');
  return (
    <Tooltip
      title={`Orbital–cell pairs by class · engine ${summary.engineVersion} · ${(summary.computationMs / 1000).toFixed(1)} s · ${formatDateTime(summary.computedAt)}${summary.matchesCurrentSetup ? '' : ' · the setup has changed since'}`}
    >
      <Space size={10} style={{ fontVariantNumeric: 'tabular-nums', fontSize: 12.5, opacity: summary.matchesCurrentSetup ? 1 : 0.6 }}>
        <span>
          <Swatch kind="bound" />
          {n(summary.counts.bound)} bound
        </span>
        <span>
          <Swatch kind="resonance" />
          {n(summary.counts.resonance)} resonance
        </span>
        <span>
          <Swatch kind="unbound" />
          {n(summary.counts.unbound)} unbound
        </span>
      </Space>
    </Tooltip>
  );
}
