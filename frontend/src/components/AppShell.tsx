import { Layout, Space, Typography } from 'antd';
import { Link, Outlet } from 'react-router-dom';
import { HealthBadge } from './HealthBadge';
import { palette } from '../theme/palette';

/** Slim top bar and the page below it; the map pages use the full remaining height. */
export function AppShell() {
  return (
    <Layout style={{ minHeight: '100%' }}>
      <Layout.Header
        style={{ display: 'flex', alignItems: 'center', justifyContent: 'space-between', borderBottom: `1px solid ${palette.unbound}` }}
      >
        <Link to="/maps" aria-label="Fieldbound home" style={{ display: 'flex', alignItems: 'center', gap: 8 }}>
          <img src="/favicon.svg" alt="" width={22} height={22} />
          <Typography.Text strong style={{ fontSize: 17, letterSpacing: 0.2, color: palette.ink }}>
            Fieldbound
          </Typography.Text>
        </Link>
        <Space size="large">
          <HealthBadge />
        </Space>
      </Layout.Header>
      <Layout.Content style={{ display: 'flex', flexDirection: 'column' }}>
        <Outlet />
      </Layout.Content>
    </Layout>
  );
}
