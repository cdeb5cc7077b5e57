import { useState } from 'react';
import { Alert, App, AutoComplete, Button, Empty, Input, Popconfirm, Space, Spin, Tag, Typography } from 'antd';
import { AimOutlined, CheckOutlined, DeleteOutlined, UndoOutlined } from '@ant-design/icons';
import { PIN_LIMITS, type PinReplyView, type PinView, type UpdatePinRequest } from '@fieldbound/shared';
import { pinConflictOf, useDeletePin, usePin, useReply, useUpdatePin } from '../../api/pins';
import { palette } from '../../theme/palette';

const when = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** Plain text as typed: React escapes it, line breaks are kept; never interpreted as HTML. */
export function PlainText({ text }: { text: string }) {
  return <div style={{ whiteSpace: 'pre-wrap', overflowWrap: 'anywhere' }}>{text}</div>;
}

export function StatusTag({ status }: { status: PinView['status'] }) {
  return status === 'resolved' ? <Tag color="default">Resolved</Tag> : <Tag color={palette.pin}>Open</Tag>;
}

function Reply({ reply }: { reply: PinReplyView }) {
  return (
    <li className="pin-reply" style={{ padding: '8px 0', borderTop: `1px solid ${palette.unbound}` }}>
      <Typography.Text strong>{reply.author?.displayName ?? 'A former member'}</Typography.Text>{' '}
      <Typography.Text type="secondary" style={{ fontSize: 12 }}>
        <time dateTime={reply.createdAt}>{when(reply.createdAt)}</time>
      </Typography.Text>
      <PlainText text={reply.body} />
    </li>
  );
}

export interface PinThreadProps {
  mapId: string;
  pinId: string;
  /** Editors resolve, reopen, categorise and delete; everyone in the team replies. */
  canEdit: boolean;
  /** "bound", "mostly resonance (60 %)…" */
  regionText: string | null;
  notice?: string;
  onAcknowledge?: () => void;
  onJump?: () => void;
  onDeleted?: () => void;
  categories?: readonly string[];
}

/** A pin's thread: title, body, status, category, replies with author and time, a reply box; editors resolve or reopen. */
export function PinThread({ mapId, pinId, canEdit, regionText, notice, onAcknowledge, onJump, onDeleted, categories = [] }: PinThreadProps) {
  const pin = usePin(pinId);
  const update = useUpdatePin();
  const remove = useDeletePin(mapId);
  const reply = useReply(mapId, pinId);
  const { message } = App.useApp();
  const [text, setText] = useState('');
  const [category, setCategory] = useState<string | null>(null);
  const [conflict, setConflict] = useState<{ current: PinView; retry: Omit<UpdatePinRequest, 'expectedVersion'> } | null>(null);

  if (pin.isLoading) return <Spin style={{ display: 'block', margin: 24 }} />;
  if (pin.isError || !pin.data) return <Empty description={pin.error?.message ?? 'This pin is not available any more.'} />;
  const p = pin.data;

  const change = (changes: Omit<UpdatePinRequest, 'expectedVersion'>, expectedVersion = p.version) =>
    update.mutate(
      { pinId, expectedVersion, ...changes },
      {
        onSuccess: () => setConflict(null),
        onError: (error) => {
          const current = pinConflictOf(error);
          if (current) setConflict({ current, retry: changes });
          else message.error(`Not saved: ${error.message}`);
        },
      },
    );

  const sendReply = () => {
    const body = text.trim();
    if (!body) return;
    reply.mutate(body, { onSuccess: () => setText(''), onError: (e) => message.error(`Reply not sent: ${e.message}`) });
  };

  return (
    <article aria-label={`Thread: ${p.title}`} className="pin-thread">
      <Space align="start" style={{ justifyContent: 'space-between', width: '100%' }}>
        <Typography.Title level={4} style={{ margin: 0, overflowWrap: 'anywhere' }}>
          {p.title}
        </Typography.Title>
        <StatusTag status={p.status} />
      </Space>
      <Typography.Paragraph type="secondary" style={{ fontSize: 12.5, margin: '4px 0 8px' }}>
        {p.author?.displayName ?? 'A former member'} · <time dateTime={p.createdAt}>{when(p.createdAt)}</time>
        {p.resolvedAt ? ` · resolved by ${p.resolvedBy?.displayName ?? 'a former member'} ${when(p.resolvedAt)}` : ''}
      </Typography.Paragraph>
      <Space wrap size={6} style={{ marginBottom: 8 }}>
        {p.category && !canEdit && <Tag>{p.category}</Tag>}
        {regionText && (
          <Typography.Text style={{ fontSize: 12.5 }} data-testid="pin-region">
            Under it now: {regionText}
          </Typography.Text>
        )}
        {onJump && (
          <Button size="small" icon={<AimOutlined />} onClick={onJump}>
            Show on the map
          </Button>
        )}
      </Space>
      {notice && (
        <Alert
          type="warning"
          showIcon
          style={{ marginBottom: 8 }}
          title={notice}
          description="A recomputation put a different class under this pin than the one first seen here."
          action={onAcknowledge && <Button size="small" onClick={onAcknowledge}>Noted</Button>}
        />
      )}
      {conflict && (
        <Alert
          type="warning"
          showIcon
          style={{ marginBottom: 8 }}
          title="Someone changed this pin meanwhile"
          description={`It is now ${conflict.current.status}${conflict.current.category ? `, category ${conflict.current.category}` : ''} (version ${conflict.current.version}). Your change was not saved.`}
          action={
            <Space orientation="vertical">
              <Button size="small" type="primary" onClick={() => change(conflict.retry, conflict.current.version)}>
                Apply mine again
              </Button>
              <Button size="small" onClick={() => setConflict(null)}>
                Keep theirs
              </Button>
            </Space>
          }
        />
      )}
      <div style={{ marginTop: 4 }}>{p.body ? <PlainText text={p.body} /> : <Typography.Text type="secondary">No description.</Typography.Text>}</div>

      {canEdit && (
        <Space wrap style={{ margin: '12px 0' }}>
          {p.status === 'open' ? (
            <Button icon={<CheckOutlined />} loading={update.isPending} onClick={() => change({ status: 'resolved' })}>
              Resolve
            </Button>
          ) : (
            <Button icon={<UndoOutlined />} loading={update.isPending} onClick={() => change({ status: 'open' })}>
              Reopen
            </Button>
          )}
          <AutoComplete
            aria-label="Category"
            size="middle"
            style={{ width: 160 }}
            placeholder="Category"
            value={category ?? p.category ?? ''}
            options={categories.map((c) => ({ value: c }))}
            onChange={(v: string) => setCategory(v.slice(0, PIN_LIMITS.maxCategoryLength))}
            onBlur={() => {
              if (category === null) return;
              const next = category.trim() || null;
              setCategory(null);
              if (next !== p.category) change({ category: next });
            }}
          />
          <Popconfirm title="Delete this pin and its thread?" okText="Delete" okButtonProps={{ danger: true }} onConfirm={() => remove.mutate(pinId, { onSuccess: onDeleted, onError: (e) => message.error(e.message) })}>
            <Button danger type="text" icon={<DeleteOutlined />} aria-label="Delete pin" />
          </Popconfirm>
        </Space>
      )}

      <Typography.Title level={5} style={{ marginTop: 16 }}>
        {p.replies.length === 0 ? 'No replies yet' : `${p.replies.length} ${p.replies.length === 1 ? 'reply' : 'replies'}`}
      </Typography.Title>
      <ul aria-label="Replies" style={{ listStyle: 'none', padding: 0, margin: 0 }}>
        {p.replies.map((r) => (
          <Reply key={r.id} reply={r} />
        ))}
      </ul>
      <div style={{ marginTop: 12 }}>
        <Input.TextArea
          aria-label="Reply"
          placeholder="Write a reply (plain text; @name@example.org tells a team member by e-mail)"
          autoSize={{ minRows: 2, maxRows: 8 }}
          maxLength={PIN_LIMITS.maxBodyLength}
          value={text}
          onChange={(e) => setText(e.target.value)}
          onKeyDown={(e) => {
            if (e.key === 'Enter' && (e.ctrlKey || e.metaKey)) sendReply();
          }}
        />
        <Button type="primary" style={{ marginTop: 8 }} disabled={!text.trim()} loading={reply.isPending} onClick={sendReply}>
          Reply
        </Button>
      </div>
    </article>
  );
}
