import { App, Button, Popconfirm, Space, Table, Tag, Tooltip } from 'antd';
import { useResendInvitation, useRevokeInvitation } from '../../api/teams';
import type { InvitationView } from '../../api/types';

function when(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

/** Open invitations (pending or expired) with re-send and revoke. */
export function InvitationsTable({ teamId, invitations, loading }: { teamId: string; invitations: InvitationView[]; loading: boolean }) {
  const { message } = App.useApp();
  const resend = useResendInvitation(teamId);
  const revoke = useRevokeInvitation(teamId);
  return (
    <Table<InvitationView>
      rowKey="id"
      size="middle"
      loading={loading}
      dataSource={invitations}
      pagination={false}
      locale={{ emptyText: 'No open invitations.' }}
      columns={[
        { title: 'E-mail', dataIndex: 'email' },
        { title: 'Role', dataIndex: 'role', render: (role: string) => <Tag>{role}</Tag> },
        {
          title: 'Status',
          dataIndex: 'status',
          render: (status: string, i) => (
            <Space size={4} wrap>
              <Tag color={status === 'expired' ? 'warning' : 'processing'}>{status}</Tag>
              {i.mailStatus === 'pending' && status === 'pending' ? (
                <Tooltip
                  title={`The e-mail could not be delivered yet${i.mailAttempts > 1 ? ` (${i.mailAttempts} attempts)` : ''}. The server sends it again by itself${i.nextMailAttemptAt ? `, next at ${when(i.nextMailAttemptAt)}` : ''}.`}
                >
                  <Tag color="gold" data-testid="mail-pending">
                    mail pending
                  </Tag>
                </Tooltip>
              ) : null}
            </Space>
          ),
        },
        { title: 'Last sent', dataIndex: 'lastSentAt', render: (v: string, i) => `${when(v)}${i.sendCount > 1 ? ` (${i.sendCount}×)` : ''}` },
        { title: 'Expires', dataIndex: 'expiresAt', render: when },
        {
          title: '',
          key: 'actions',
          align: 'right',
          render: (_: unknown, i) => (
            <Space>
              <Button
                size="small"
                onClick={async () => {
                  try {
                    const result = await resend.mutateAsync(i.id);
                    if (result.emailSent) message.success(`Sent again to ${i.email}; the earlier link no longer works.`);
                    else message.warning('The e-mail could not be sent yet; it is marked “mail pending” and goes out automatically when the mail server answers.');
                  } catch (error) {
                    message.error((error as Error).message);
                  }
                }}
              >
                Re-send
              </Button>
              <Popconfirm
                title={`Revoke the invitation to ${i.email}?`}
                description="The link in the e-mail stops working."
                okText="Revoke"
                okButtonProps={{ danger: true }}
                onConfirm={async () => {
                  try {
                    await revoke.mutateAsync(i.id);
                    message.success('Invitation revoked.');
                  } catch (error) {
                    message.error((error as Error).message);
                  }
                }}
              >
                <Button size="small" danger type="text">
                  Revoke
                </Button>
              </Popconfirm>
            </Space>
          ),
        },
      ]}
    />
  );
}
