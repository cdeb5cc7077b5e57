import { useState } from 'react';
import { Alert, Button, Checkbox, DatePicker, Empty, Form, Input, Modal, Popconfirm, Space, Table, Tag, Typography } from 'antd';
import { CopyOutlined, LinkOutlined } from '@ant-design/icons';
import type { CreatedViewingLink, ViewingLinkView } from '@fieldbound/shared';
import { useCreateViewingLink, useRevokeViewingLink, useViewingLinks } from '../../api/viewingLinks';
import { formatDateTime, personName } from './MapBits';

export interface ShareDialogProps {
  mapId: string;
  mapTitle: string;
  open: boolean;
  onClose: () => void;
  /** Page origin for the full link (tests pass one). */
  origin?: string;
  /** Clock (tests). */
  now?: () => Date;
}

type LinkState = 'active' | 'revoked' | 'expired';
function linkState(link: ViewingLinkView, now: Date): LinkState {
  if (link.revokedAt) return 'revoked';
  if (link.expiresAt && new Date(link.expiresAt) <= now) return 'expired';
  return 'active';
}

interface DateValue {
  endOf(unit: 'day'): { toDate(): Date };
  isBefore(other: Date, unit: 'day'): boolean;
}

/**
 * Viewing links of a map: a read-only link anyone can open without an account, with an optional expiry and with or
 * without pins. The full link is shown once, right after it is made; the list shows each link's views and revocation.
 */
export function ShareDialog({ mapId, mapTitle, open, onClose, origin = window.location.origin, now = () => new Date() }: ShareDialogProps) {
  const links = useViewingLinks(mapId, open);
  const create = useCreateViewingLink(mapId);
  const revoke = useRevokeViewingLink(mapId);
  const [expires, setExpires] = useState<DateValue | null>(null);
  const [includePins, setIncludePins] = useState(true);
  const [created, setCreated] = useState<CreatedViewingLink | null>(null);
  const [copied, setCopied] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const fullUrl = created ? `${origin}${created.path}` : '';

  const make = () => {
    setError(null);
    setCopied(false);
    create.mutate(
      { expiresAt: expires ? expires.endOf('day').toDate().toISOString() : null, includePins },
      { onSuccess: setCreated, onError: (e) => setError(e.message) },
    );
  };
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(fullUrl);
      setCopied(true);
    } catch {
      setError('The browser did not allow copying: select the link and copy it by hand.');
    }
  };
  const close = () => {
    setCreated(null);
    setCopied(false);
    setError(null);
    onClose();
  };
  const today = now();

  return (
    <Modal title={`Share “${mapTitle}”`} open={open} onCancel={close} footer={<Button onClick={close}>Done</Button>} width={760} destroyOnHidden>
      <Typography.Paragraph type="secondary">
        A viewing link opens this map read-only, without an account: the map is computed in the visitor's browser, and nothing can be changed through it.
      </Typography.Paragraph>

      <Form layout="inline" onFinish={make} style={{ rowGap: 8 }}>
        <Form.Item label="Expires">
          <DatePicker
            aria-label="Expiry date"
            placeholder="never"
            value={expires as never}
            onChange={(d) => setExpires(d as DateValue | null)}
            disabledDate={(d) => (d as unknown as DateValue).isBefore(today, 'day')}
          />
        </Form.Item>
        <Form.Item>
          <Checkbox checked={includePins} onChange={(e) => setIncludePins(e.target.checked)}>
            Show pins
          </Checkbox>
        </Form.Item>
        <Form.Item>
          <Button type="primary" htmlType="submit" icon={<LinkOutlined />} loading={create.isPending}>
            Create viewing link
          </Button>
        </Form.Item>
      </Form>

      {created && (
        <Alert
          style={{ marginTop: 12 }}
          type="success"
          message="Viewing link created"
          description={
            <Space direction="vertical" style={{ width: '100%' }}>
              <Space.Compact style={{ width: '100%' }}>
                <Input readOnly value={fullUrl} aria-label="New viewing link" onFocus={(e) => e.target.select()} />
                <Button icon={<CopyOutlined />} onClick={copy}>
                  {copied ? 'Copied' : 'Copy link'}
                </Button>
              </Space.Compact>
              <Typography.Text type="secondary">Copy it now: for safety the full link is shown only this once. You can revoke it below at any time.</Typography.Text>
            </Space>
          }
        />
      )}
      {error && <Alert style={{ marginTop: 12 }} type="error" showIcon message={error} />}

      <Typography.Title level={5} style={{ marginTop: 20 }}>
        Links of this map
      </Typography.Title>
      <Table<ViewingLinkView>
        size="small"
        rowKey="id"
        loading={links.isLoading}
        dataSource={links.data ?? []}
        pagination={false}
        locale={{ emptyText: <Empty image={Empty.PRESENTED_IMAGE_SIMPLE} description={links.isError ? links.error.message : 'No viewing links yet.'} /> }}
        columns={[
          {
            title: 'Created',
            key: 'created',
            render: (_, l) => (
              <Space direction="vertical" size={0}>
                <span>{formatDateTime(l.createdAt)}</span>
                <Typography.Text type="secondary" style={{ fontSize: 12 }}>
                  by {personName(l.createdBy)}
                  {l.includePins ? ' · with pins' : ' · without pins'}
                </Typography.Text>
              </Space>
            ),
          },
          { title: 'Expires', key: 'expires', render: (_, l) => (l.expiresAt ? formatDateTime(l.expiresAt) : 'never') },
          {
            title: 'Views',
            key: 'views',
            align: 'right',
            render: (_, l) => (
              <span style={{ fontVariantNumeric: 'tabular-nums' }} title={l.lastViewedAt ? `last viewed ${formatDateTime(l.lastViewedAt)}` : 'not opened yet'}>
                {l.viewCount}
              </span>
            ),
          },
          {
            title: 'Status',
            key: 'state',
            render: (_, l) => {
              const s = linkState(l, today);
              return s === 'active' ? <Tag color="green">active</Tag> : s === 'expired' ? <Tag>expired</Tag> : <Tag color="red">revoked {formatDateTime(l.revokedAt)}</Tag>;
            },
          },
          {
            title: '',
            key: 'revoke',
            align: 'right',
            render: (_, l) =>
              linkState(l, today) === 'active' ? (
                <Popconfirm
                  title="Revoke this viewing link?"
                  description="Anyone opening it will be told it no longer works. This cannot be undone."
                  okText="Revoke"
                  okButtonProps={{ danger: true }}
                  onConfirm={() => revoke.mutateAsync(l.id).catch((e: Error) => setError(e.message))}
                >
                  <Button size="small" danger loading={revoke.isPending && revoke.variables === l.id}>
                    Revoke
                  </Button>
                </Popconfirm>
              ) : null,
          },
        ]}
      />
    </Modal>
  );
}
