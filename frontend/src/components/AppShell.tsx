import { Layout, Space, Typography } from 'antd';
import { Link, Outlet } from 'react-router-dom';
import { useMe } from '../api/auth';
import { HealthBadge } from './HealthBadge';
import { TeamSwitcher } from './TeamSwitcher';
import { UserMenu } from './UserMenu';
import { palette } from '../theme/palette';

/** Slim top bar (home, team, status, account) and the page below it; the map pages use the full remaining height. */
export function AppShell() {
  const { data: me } = useMe();
  return (
    <Layout style={{ minHeight: '100%' }}>
      <Layout.Header
        style={{ display: 'flex', alignItems: 'center', justifyContent: 'space-between', gap: 16, borderBottom: `1px solid ${palette.unbound}` }}
      >
        <Space size="middle">
          <Link to="/maps" aria-label="Fieldbound home" style={{ display: 'flex', alignItems: 'center', gap: 8 }}>
            <img src="/favicon.svg" alt="" width={22} height={22} />
            <Typography.Text strong style={{ fontSize: 17, letterSpacing: 0.2, color: palette.ink }}>
              Fieldbound
            </Typography.Text>
          </Link>
          {me && <TeamSwitcher />}
        </Space>
        <Space size="large">
          <HealthBadge />
          <UserMenu />
        </Space>
      </Layout.Header>
      <Layout.Content style={{ display: 'flex', flexDirection: 'column' }}>
        <Outlet />
      </Layout.Content>
    </Layout>
  );
}
