import { Button, Table, Tooltip } from 'antd';
import { AimOutlined, WarningOutlined } from '@ant-design/icons';
import type { PinStatus } from '@fieldbound/shared';
import { StatusTag } from './PinThread';

export interface PinRow {
  id: string;
  title: string;
  status: PinStatus;
  category: string | null;
  replyCount?: number;
  updatedAt?: string;
  /** Class under the pin now, in words. */
  region: string | null;
  notice?: string;
}

export interface PinsTableProps {
  rows: readonly PinRow[];
  onOpen: (pinId: string) => void;
  onJump: (pinId: string) => void;
}

/** All pins of a map, filterable by status and category; a row opens the thread, the aim button moves the map to it. */
export function PinsTable({ rows, onOpen, onJump }: PinsTableProps) {
  const categories = [...new Set(rows.map((r) => r.category).filter((c): c is string => !!c))].sort();
  return (
    <Table<PinRow>
      size="small"
      rowKey="id"
      dataSource={rows as PinRow[]}
      pagination={rows.length > 20 ? { pageSize: 20, size: 'small' } : false}
      aria-label="Pins of this map"
      onRow={(row) => ({ onClick: () => onOpen(row.id), style: { cursor: 'pointer' } })}
      locale={{ emptyText: 'No pins yet.' }}
      columns={[
        {
          title: 'Pin',
          dataIndex: 'title',
          ellipsis: true,
          render: (title: string, row) => (
            <span>
              {row.notice && (
                <Tooltip title={row.notice}>
                  <WarningOutlined aria-label={row.notice} style={{ color: '#b07200', marginRight: 4 }} />
                </Tooltip>
              )}
              {title}
            </span>
          ),
        },
        {
          title: 'Status',
          dataIndex: 'status',
          width: 96,
          filters: [
            { text: 'Open', value: 'open' },
            { text: 'Resolved', value: 'resolved' },
          ],
          onFilter: (value, row) => row.status === value,
          render: (status: PinStatus) => <StatusTag status={status} />,
        },
        {
          title: 'Category',
          dataIndex: 'category',
          width: 110,
          ellipsis: true,
          filters: [...categories.map((c) => ({ text: c, value: c })), { text: 'None', value: '' }],
          onFilter: (value, row) => (row.category ?? '') === value,
          render: (c: string | null) => c ?? '—',
        },
        { title: 'Under it now', dataIndex: 'region', width: 110, ellipsis: true, render: (r: string | null) => r ?? '…' },
        ...(rows.some((r) => r.replyCount !== undefined) ? [{ title: 'Replies', dataIndex: 'replyCount', width: 70, align: 'right' as const }] : []),
        {
          title: '',
          key: 'jump',
          width: 40,
          render: (_: unknown, row: PinRow) => (
            <Tooltip title="Show on the map">
              <Button
                size="small"
                type="text"
                aria-label={`Show ${row.title} on the map`}
                icon={<AimOutlined />}
                onClick={(e) => {
                  e.stopPropagation();
                  onJump(row.id);
                }}
              />
            </Tooltip>
          ),
        },
      ]}
    />
  );
}
