import { App, Button, Card, Popconfirm, Space, Tabs, Tag, Typography } from 'antd';
import { useNavigate } from 'react-router-dom';
import { useMe } from '../api/auth';
import { useDeleteTeam, useInvitations, useInvite, useMembers, useRenameTeam, useTeam, useTeamAudit } from '../api/teams';
import { ROLE_DESCRIPTIONS } from '../api/types';
import { AuditList } from '../features/team/AuditList';
import { InvitationsTable } from '../features/team/InvitationsTable';
import { InviteForm } from '../features/team/InviteForm';
import { MembersTable } from '../features/team/MembersTable';
import { useCurrentTeam } from '../state/currentTeam';
import { LocalMailboxHint } from '../components/LocalMailboxHint';

/** `/team`: the current team's members, invitations and activity. */
export function TeamPage() {
  const { team: current } = useCurrentTeam();
  const teamId = current!.id;
  const { data: me } = useMe();
  const team = useTeam(teamId);
  const members = useMembers(teamId);
  const role = team.data?.role ?? current!.role;
  const isOwner = role === 'owner';
  const invitations = useInvitations(teamId, isOwner);
  const audit = useTeamAudit(teamId, isOwner);
  const invite = useInvite(teamId);
  const rename = useRenameTeam(teamId);
  const remove = useDeleteTeam(teamId);
  const navigate = useNavigate();
  const { message } = App.useApp();

  const name = team.data?.name ?? current!.name;
  const items = [
    {
      key: 'members',
      label: 'Members',
      children: (
        <Space orientation="vertical" size="large" style={{ width: '100%' }}>
          {isOwner && (
            <Card title="Invite a colleague" size="small">
              <InviteForm onInvite={(values) => invite.mutateAsync(values)} />
              <div style={{ marginTop: 8 }}>
                <LocalMailboxHint />
              </div>
            </Card>
          )}
          <MembersTable
            teamId={teamId}
            members={members.data ?? []}
            loading={members.isPending}
            myId={me!.user.id}
            myRole={role}
            onLeft={() => {
              message.success(`You left ${name}.`);
              navigate('/maps');
            }}
          />
        </Space>
      ),
    },
    ...(isOwner
      ? [
          {
            key: 'invitations',
            label: `Invitations${invitations.data?.length ? ` (${invitations.data.length})` : ''}`,
            children: <InvitationsTable teamId={teamId} invitations={invitations.data ?? []} loading={invitations.isPending} />,
          },
          { key: 'activity', label: 'Activity', children: <AuditList events={audit.data ?? []} loading={audit.isPending} /> },
          {
            key: 'settings',
            label: 'Settings',
            children: (
              <Card size="small" title="Delete the team">
                <Typography.Paragraph>
                  Deleting {name} removes its members, invitations and everything the team owns. It cannot be undone.
                </Typography.Paragraph>
                <Popconfirm
                  title={`Delete ${name} for everyone?`}
                  okText="Delete"
                  okButtonProps={{ danger: true }}
                  onConfirm={async () => {
                    await remove.mutateAsync();
                    message.success(`${name} was deleted.`);
                    navigate('/maps');
                  }}
                >
                  <Button danger loading={remove.isPending}>
                    Delete team
                  </Button>
                </Popconfirm>
              </Card>
            ),
          },
        ]
      : []),
  ];

  return (
    <div style={{ maxWidth: 1080, width: '100%', margin: '0 auto', padding: '24px 16px' }}>
      <Space align="baseline" wrap>
        <Typography.Title
          level={2}
          style={{ margin: 0 }}
          editable={
            isOwner
              ? {
                  triggerType: ['icon'],
                  tooltip: 'Rename the team',
                  onChange: async (value) => {
                    const trimmed = value.trim();
                    if (!trimmed || trimmed === name) return;
                    try {
                      await rename.mutateAsync({ name: trimmed });
                    } catch (error) {
                      message.error((error as Error).message);
                    }
                  },
                }
              : false
          }
        >
          {name}
        </Typography.Title>
        <Tag title={ROLE_DESCRIPTIONS[role]}>you are {role === 'viewer' ? 'a' : 'an'} {role}</Tag>
      </Space>
      <Typography.Paragraph type="secondary" style={{ marginTop: 4 }}>
        {ROLE_DESCRIPTIONS[role][0].toUpperCase() + ROLE_DESCRIPTIONS[role].slice(1)}.
      </Typography.Paragraph>
      <Tabs items={items} />
    </div>
  );
}
