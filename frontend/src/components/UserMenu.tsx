import { DownOutlined, UserOutlined } from '@ant-design/icons';
import { Button, Dropdown, Space } from 'antd';
import { Link, useLocation, useNavigate } from 'react-router-dom';
import { useMe, useSignOut } from '../api/auth';

/** The signed-in person's menu, or a sign-in link. */
export function UserMenu() {
  const { data: me } = useMe();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const { pathname } = useLocation();
  if (!me) {
    if (pathname === '/sign-in') return null;
    return (
      <Link to="/sign-in">
        <Button type="primary" size="small">
          Sign in
        </Button>
      </Link>
    );
  }
  return (
    <Dropdown
      trigger={['click']}
      menu={{
        items: [
          { key: 'who', label: me.user.email, disabled: true },
          { type: 'divider' },
          { key: 'team', label: <Link to="/team">Team and members</Link> },
          { key: 'profile', label: <Link to="/profile">Your account</Link> },
          { type: 'divider' },
          {
            key: 'sign-out',
            label: 'Sign out',
            onClick: () => signOut.mutate(undefined, { onSettled: () => navigate('/sign-in', { replace: true }) }),
          },
        ],
      }}
    >
      <Button type="text" aria-label="Account menu" data-testid="user-menu">
        <Space size={6}>
          <UserOutlined />
          {me.user.displayName}
          <DownOutlined style={{ fontSize: 10 }} />
        </Space>
      </Button>
    </Dropdown>
  );
}
