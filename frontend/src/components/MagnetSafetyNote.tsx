import { Typography } from 'antd';
import { WarningOutlined } from '@ant-design/icons';
import { palette } from '../theme/palette';

/** The one sentence we show wherever a map is used to plan work near a strong magnet. */
export const MAGNET_SAFETY_TEXT =
  'Planning an experiment near a strong magnet? Fringe fields reach well beyond the bore and pull ferromagnetic objects in hard; they affect pacemakers and other implants; a quench releases cryogen gas that can displace the air. Your laboratory’s own safety rules and safety officer decide — this map does not.';

/**
 * A short, quiet safety note for experiment planning (field bands, the laboratory and pulsed-field presets).
 * It never blocks anything: it points to the laboratory's own rules.
 */
export function MagnetSafetyNote({ compact = false }: { compact?: boolean }) {
  return (
    <div
      role="note"
      aria-label="Safety near strong magnets"
      data-testid="magnet-safety-note"
      style={{ display: 'flex', gap: 8, alignItems: 'flex-start', fontSize: compact ? 11.5 : 12.5, lineHeight: 1.45, color: palette.ink, background: 'rgba(92,122,234,0.07)', border: `1px solid rgba(92,122,234,0.35)`, borderRadius: 4, padding: compact ? '4px 8px' : '6px 10px' }}
    >
      <WarningOutlined aria-hidden style={{ color: '#2c3f99', marginTop: 3 }} />
      <Typography.Text style={{ fontSize: 'inherit', color: 'inherit' }}>{MAGNET_SAFETY_TEXT}</Typography.Text>
    </div>
  );
}
