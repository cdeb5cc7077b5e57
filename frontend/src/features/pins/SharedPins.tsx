import { useMemo, useState } from 'react';
import { Button, Drawer, Space, Typography } from 'antd';
import { AimOutlined, ArrowLeftOutlined, PushpinOutlined } from '@ant-design/icons';
import type { SharedPin } from '@fieldbound/shared';
import { useLiveSharedMap } from '../../api/live';
import { palette } from '../../theme/palette';
import { LiveBadge } from './MemberPins';
import { describeRegion } from './pinGeometry';
import { PinsTable, type PinRow } from './PinsTable';
import { PlainText, StatusTag } from './PinThread';
import { usePinsOverlay } from './usePinsOverlay';

const NO_PINS: SharedPin[] = [];

/**
 * Pins of a viewing link, read-only: markers with tooltips, a list with jump-to-pin and each pin's text. Nothing is
 * draggable and there are no tools or reply boxes; the link holder's live stream keeps them current.
 */
export function useSharedPins({ token, pins }: { token: string | undefined; pins: SharedPin[] | null }) {
  const live = useLiveSharedMap(token, !!token);
  const list = pins ?? NO_PINS;
  const layer = usePinsOverlay({ pins: list });
  const { selectedId, select, jumpTo, regions, notices } = layer;
  const [listOpen, setListOpen] = useState(false);
  const rows: PinRow[] = useMemo(
    () => list.map((p) => ({ id: p.id, title: p.title, status: p.status, category: p.category, region: regions ? describeRegion(regions.byPin.get(p.id) ?? null) : null, notice: notices.get(p.id) })),
    [list, regions, notices],
  );
  const selected = selectedId ? list.find((p) => p.id === selectedId) : undefined;

  const headerButton = (
    <Space size={8}>
      <LiveBadge status={live} />
      {pins && (
        <Button size="small" icon={<PushpinOutlined />} onClick={() => setListOpen(true)}>
          Pins ({list.length})
        </Button>
      )}
    </Space>
  );

  const drawer = pins && (
    <Drawer
      title={
        <Space>
          <PushpinOutlined style={{ color: palette.pin }} /> Pins
        </Space>
      }
      placement="right"
      size={400}
      open={listOpen || !!selected}
      mask={false}
      onClose={() => {
        setListOpen(false);
        select(null);
      }}
    >
      {selected ? (
        <article aria-label={`Pin: ${selected.title}`}>
          <Button type="link" icon={<ArrowLeftOutlined />} style={{ padding: 0, marginBottom: 8 }} onClick={() => {
            setListOpen(true);
            select(null);
          }}>
            All pins
          </Button>
          <Space align="start" style={{ justifyContent: 'space-between', width: '100%' }}>
            <Typography.Title level={4} style={{ margin: 0, overflowWrap: 'anywhere' }}>
              {selected.title}
            </Typography.Title>
            <StatusTag status={selected.status} />
          </Space>
          <Typography.Paragraph type="secondary" style={{ fontSize: 12.5, margin: '4px 0 8px' }}>
            {selected.category ? `${selected.category} · ` : ''}Under it now: {regions ? describeRegion(regions.byPin.get(selected.id) ?? null) : '…'}
            {notices.get(selected.id) ? ` · ${notices.get(selected.id)}` : ''}
          </Typography.Paragraph>
          {selected.body ? <PlainText text={selected.body} /> : <Typography.Text type="secondary">No description.</Typography.Text>}
          <Button size="small" icon={<AimOutlined />} style={{ marginTop: 12 }} onClick={() => jumpTo(selected.id)}>
            Show on the map
          </Button>
        </article>
      ) : (
        <PinsTable rows={rows} onOpen={select} onJump={jumpTo} />
      )}
    </Drawer>
  );

  return { overlay: pins ? layer.overlay : undefined, headerButton, drawer, liveStatus: live };
}
