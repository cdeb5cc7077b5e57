import { Button, Empty, List, Result, Space, Spin, Tag, Typography } from 'antd';
import { Fragment, type ReactNode } from 'react';
import { useClearMailbox, useMailbox } from '../api/mailbox';
import type { CapturedMessage } from '../api/types';

/** Plain text with every http(s) address turned into a link. */
function linkify(text: string): ReactNode[] {
  const parts = text.split(/(https?:\/\/[^\s<>"')\]]+)/g);
  return parts.map((part, i) =>
    /^https?:\/\//.test(part) ? (
      <a key={i} href={part}>
        {part}
      </a>
    ) : (
      <Fragment key={i}>{part}</Fragment>
    ),
  );
}

/**
 * `/dev/mailbox`: the messages the local mail fake received, newest first, with clickable links.
 * Exists only while the server uses the fake (no FIELDBOUND_SMTP_URL).
 */
export function MailboxPage() {
  const { data, isPending, isError, error } = useMailbox();
  const clear = useClearMailbox();
  if (isPending) return <Spin style={{ margin: 48 }} />;
  if (isError) return <Result status="error" title="The mailbox could not be read" subTitle={error.message} />;
  if (!data.available) {
    return <Result status="info" title="No local mailbox here" subTitle="This server sends e-mail through a real SMTP server, so messages go to real inboxes." />;
  }
  return (
    <div style={{ maxWidth: 900, width: '100%', margin: '0 auto', padding: '24px 16px' }}>
      <Space align="baseline" style={{ justifyContent: 'space-between', width: '100%' }}>
        <Typography.Title level={2} style={{ margin: 0 }}>
          Local mailbox
        </Typography.Title>
        <Button onClick={() => clear.mutate()} disabled={!data.messages.length} loading={clear.isPending}>
          Empty the mailbox
        </Button>
      </Space>
      <Typography.Paragraph type="secondary">
        This development server delivers e-mail to a local SMTP server instead of the internet. Every message it sent is
        here, newest first; the list refreshes by itself.
      </Typography.Paragraph>
      {data.messages.length === 0 ? (
        <Empty description="No messages yet. Invite a colleague or ask for a password reset, and the e-mail appears here." />
      ) : (
        <List<CapturedMessage>
          dataSource={data.messages}
          renderItem={(m) => (
            <List.Item key={m.id} data-testid="mail-message">
              <div style={{ width: '100%' }}>
                <Space wrap size={4}>
                  <Typography.Text strong>{m.subject}</Typography.Text>
                  <Typography.Text type="secondary">
                    to {m.to.join(', ')} · {new Date(m.receivedAt).toLocaleString()}
                  </Typography.Text>
                  {m.links.length > 0 && <Tag>{m.links.length} link{m.links.length > 1 ? 's' : ''}</Tag>}
                </Space>
                <pre style={{ whiteSpace: 'pre-wrap', fontFamily: 'inherit', margin: '8px 0 0', overflowWrap: 'anywhere' }}>{linkify(m.text)}</pre>
              </div>
            </List.Item>
          )}
        />
      )}
    </div>
  );
}
