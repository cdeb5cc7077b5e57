import { useEffect, useState } from 'react';
import { Alert, Button, Drawer, Empty, Popconfirm, Select, Space, Table, Tag, Typography } from 'antd';
import type { MapChange, MapVersionSummary } from '@fieldbound/shared';
import { useMapDiff, useMapVersions } from '../../api/maps';
import { formatScientific } from '../map-render/formatNumber';
import { formatDateTime, personName } from './MapBits';

export interface VersionsDrawerProps {
  mapId: string;
  currentVersion: number;
  open: boolean;
  onClose: () => void;
  /** Editors only: make version `n` the newest. */
  onRestore?: (n: number) => void;
  restoring?: number | null;
}

/** A value of the diff as a reader wants it: numbers in scientific notation, lists and objects as compact text. */
export function formatChangeValue(value: unknown): string {
  if (value === undefined) return '—';
  if (typeof value === 'number') return Math.abs(value) >= 1e4 || (value !== 0 && Math.abs(value) < 1e-2) ? formatScientific(value) : String(value);
  if (typeof value === 'string') return value;
  if (Array.isArray(value)) return value.length ? value.map(formatChangeValue).join(', ') : '(none)';
  if (value && typeof value === 'object') return Object.entries(value).map(([k, v]) => `${k}: ${formatChangeValue(v)}`).join('; ');
  return String(value);
}

/** `setup.alphaAxis.min` → `alphaAxis › min` (the setup is implied: every map has one). */
function parameterLabel(path: string): string {
  return path.replace(/^setup\./, '').split('.').join(' › ');
}

function Diff({ mapId, from, to }: { mapId: string; from: number; to: number }) {
  const diff = useMapDiff(mapId, from, to);
  if (from === to) return <Typography.Text type="secondary">Choose two different versions.</Typography.Text>;
  if (diff.isError) return <Alert type="error" showIcon message={diff.error.message} />;
  return (
    <Table<MapChange>
      size="small"
      rowKey="path"
      loading={diff.isLoading}
      dataSource={diff.data?.changes ?? []}
      pagination={false}
      locale={{ emptyText: <Empty image={Empty.PRESENTED_IMAGE_SIMPLE} description="No parameter differs between these versions." /> }}
      columns={[
        { title: 'Parameter', key: 'path', render: (_, c) => <code style={{ fontSize: 12 }}>{parameterLabel(c.path)}</code> },
        { title: `Version ${from}`, key: 'before', render: (_, c) => <span style={{ fontVariantNumeric: 'tabular-nums' }}>{formatChangeValue(c.before)}</span> },
        { title: `Version ${to}`, key: 'after', render: (_, c) => <span style={{ fontVariantNumeric: 'tabular-nums' }}>{formatChangeValue(c.after)}</span> },
      ]}
    />
  );
}

/** Saved versions with author and time, the parameters that changed between any two, and restore for editors. */
export function VersionsDrawer({ mapId, currentVersion, open, onClose, onRestore, restoring = null }: VersionsDrawerProps) {
  const versions = useMapVersions(mapId, open);
  const [from, setFrom] = useState<number | null>(null);
  const [to, setTo] = useState<number | null>(null);
  useEffect(() => {
    if (open) {
      setTo(currentVersion);
      setFrom(Math.max(1, currentVersion - 1));
    }
  }, [open, currentVersion]);
  const options = (versions.data ?? []).map((v) => ({ value: v.number, label: `Version ${v.number}` }));

  return (
    <Drawer title="Versions" placement="right" size={560} open={open} onClose={onClose} destroyOnHidden>
      {versions.isError && <Alert type="error" showIcon message={versions.error.message} />}
      <Table<MapVersionSummary>
        size="small"
        rowKey="number"
        loading={versions.isLoading}
        dataSource={versions.data ?? []}
        pagination={false}
        scroll={{ y: 280 }}
        columns={[
          {
            title: 'Version',
            key: 'n',
            width: 90,
            render: (_, v) => (
              <Space size={4}>
                {v.number}
                {v.number === currentVersion && <Tag color="default">current</Tag>}
              </Space>
            ),
          },
          {
            title: 'Saved',
            key: 'who',
            render: (_, v) => (
              <Space direction="vertical" size={0}>
                <span>{formatDateTime(v.createdAt)}</span>
                <Typography.Text type="secondary" style={{ fontSize: 12 }}>
                  by {personName(v.createdBy)}
                  {v.restoredFrom !== null ? ` · restored from version ${v.restoredFrom}` : ''}
                  {v.duplicatedFrom ? ' · copied from another map' : ''}
                </Typography.Text>
              </Space>
            ),
          },
          ...(onRestore
            ? [
                {
                  title: '',
                  key: 'restore',
                  width: 96,
                  render: (_: unknown, v: MapVersionSummary) =>
                    v.number === currentVersion ? null : (
                      <Popconfirm
                        title={`Restore version ${v.number}?`}
                        description="It becomes the newest version; unsaved changes on this page are dropped. Nothing is deleted."
                        okText="Restore"
                        onConfirm={() => onRestore(v.number)}
                      >
                        <Button size="small" loading={restoring === v.number}>
                          Restore
                        </Button>
                      </Popconfirm>
                    ),
                },
              ]
            : []),
        ]}
      />
      <Typography.Title level={5} style={{ marginTop: 20 }}>
        What changed
      </Typography.Title>
      <Space style={{ marginBottom: 12 }}>
        <Select aria-label="From version" style={{ width: 130 }} value={from} onChange={setFrom} options={options} />
        →
        <Select aria-label="To version" style={{ width: 130 }} value={to} onChange={setTo} options={options} />
      </Space>
      {from !== null && to !== null && <Diff mapId={mapId} from={from} to={to} />}
    </Drawer>
  );
}
