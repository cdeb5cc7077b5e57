import { App, Button, Input, Popconfirm, Select, Space, Table, Tag, Typography } from 'antd';
import { useMemo, useState } from 'react';
import { useChangeRole, useRemoveMember } from '../../api/teams';
import { TEAM_ROLES, type MemberView, type TeamRole } from '../../api/types';

function date(iso: string | null): string {
  return iso ? new Date(iso).toLocaleDateString(undefined, { dateStyle: 'medium' }) : '—';
}

/** Members with their roles. Owners change roles and remove people; everyone can leave. */
export function MembersTable({ teamId, members, myId, myRole, loading, onLeft }: { teamId: string; members: MemberView[]; myId: string; myRole: TeamRole; loading: boolean; onLeft: () => void }) {
  const { message } = App.useApp();
  const changeRole = useChangeRole(teamId);
  const remove = useRemoveMember(teamId);
  const [search, setSearch] = useState('');
  const isOwner = myRole === 'owner';
  const rows = useMemo(() => {
    const q = search.trim().toLowerCase();
    return q ? members.filter((m) => m.displayName.toLowerCase().includes(q) || m.email.includes(q)) : members;
  }, [members, search]);

  return (
    <Space orientation="vertical" style={{ width: '100%' }}>
      <Input.Search placeholder="Search members by name or e-mail" allowClear value={search} onChange={(e) => setSearch(e.target.value)} style={{ maxWidth: 360 }} />
      <Table<MemberView>
        rowKey="userId"
        size="middle"
        loading={loading}
        dataSource={rows}
        pagination={rows.length > 20 ? { pageSize: 20 } : false}
        columns={[
          {
            title: 'Name',
            dataIndex: 'displayName',
            sorter: (a, b) => a.displayName.localeCompare(b.displayName),
            render: (name: string, m) => (
              <>
                {name} {m.userId === myId && <Tag>you</Tag>}
              </>
            ),
          },
          { title: 'E-mail', dataIndex: 'email' },
          {
            title: 'Role',
            dataIndex: 'role',
            render: (role: TeamRole, m) =>
              isOwner ? (
                <Select<TeamRole>
                  size="small"
                  value={role}
                  style={{ width: 110 }}
                  aria-label={`Role of ${m.displayName}`}
                  options={TEAM_ROLES.map((r) => ({ value: r, label: r }))}
                  onChange={async (next) => {
                    try {
                      await changeRole.mutateAsync({ userId: m.userId, role: next });
                      message.success(`${m.displayName} is now ${next === 'viewer' ? 'a' : 'an'} ${next}.`);
                    } catch (error) {
                      message.error((error as Error).message);
                    }
                  }}
                />
              ) : (
                <Tag>{role}</Tag>
              ),
          },
          { title: 'Joined', dataIndex: 'joinedAt', render: date },
          { title: 'Last sign-in', dataIndex: 'lastSignInAt', render: date },
          {
            title: '',
            key: 'actions',
            align: 'right',
            render: (_: unknown, m) => {
              const self = m.userId === myId;
              if (!self && !isOwner) return null;
              return (
                <Popconfirm
                  title={self ? 'Leave this team?' : `Remove ${m.displayName}?`}
                  description={self ? 'You lose access to its maps until someone invites you again.' : 'They lose access to the team’s maps at once.'}
                  okText={self ? 'Leave' : 'Remove'}
                  okButtonProps={{ danger: true }}
                  onConfirm={async () => {
                    try {
                      await remove.mutateAsync(m.userId);
                      if (self) onLeft();
                      else message.success(`${m.displayName} was removed.`);
                    } catch (error) {
                      message.error((error as Error).message);
                    }
                  }}
                >
                  <Button size="small" danger type="text">
                    {self ? 'Leave' : 'Remove'}
                  </Button>
                </Popconfirm>
              );
            },
          },
        ]}
      />
      <Typography.Text type="secondary">
        {members.length} member{members.length === 1 ? '' : 's'}
      </Typography.Text>
    </Space>
  );
}
