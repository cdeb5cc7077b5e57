import { useMemo } from 'react';
import { Alert, Button, Result, Spin, Typography } from 'antd';
import { ClockCircleOutlined, DesktopOutlined, DisconnectOutlined, EyeOutlined } from '@ant-design/icons';
import { useNavigate, useParams } from 'react-router-dom';
import type { SharedMapView } from '@fieldbound/shared';
import { useSharedPins } from '../features/pins/SharedPins';
import { ApiError } from '../api/client';
import { useSharedMap } from '../api/viewingLinks';
import { ExplorerPage } from '../features/explorer/ExplorerPage';
import { speciesMarkers } from '../features/explorer/speciesMarkers';
import { palette } from '../theme/palette';
import { ProblemState } from '../components/ProblemState';

const BAR_HEIGHT = 44;

/** Why a viewing link did not open, in the visitor's terms. */
export function LinkRefused({ error, onRetry }: { error: unknown; onRetry: () => void }) {
  const status = error instanceof ApiError ? error.status : 0;
  if (status === 410) {
    return (
      <Result
        icon={<ClockCircleOutlined style={{ color: palette.ink }} />}
        title="This viewing link has expired"
        subTitle="The person who shared the map set a date after which the link stops working. Ask them for a new link."
      />
    );
  }
  if (status === 404 || status === 400) {
    return (
      <Result
        icon={<DisconnectOutlined style={{ color: palette.ink }} />}
        title="This viewing link does not work"
        subTitle="It may have been revoked by the person who shared it, or it was copied incompletely. Check the address, or ask them for a new link."
      />
    );
  }
  if (status === 429) {
    return <Result status="warning" title="Too many requests" subTitle="This link was opened very often in a short time. Wait a minute and reload the page." />;
  }
  return <ProblemState error={error} what="the shared map" onRetry={onRetry} />;
}

/**
 * A map opened through a viewing link, with no account: the setup comes from the server, the map is computed here in
 * the visitor's browser, and nothing on the page edits or saves (the server refuses writes through a link anyway).
 */
export function SharedMapPage() {
  const { token } = useParams();
  const shared = useSharedMap(token);

  if (shared.isLoading) {
    return (
      <div style={{ margin: 'auto', padding: 48 }}>
        <Spin tip="Opening the shared map…" size="large">
          <div style={{ width: 200, height: 80 }} />
        </Spin>
      </div>
    );
  }
  if (shared.isError || !shared.data) return <LinkRefused error={shared.error} onRetry={() => shared.refetch()} />;

  return <SharedMapBody token={token!} map={shared.data} />;
}

/** The opened link: the map computed here with its species overlay, its pins read-only if the link shows them, kept live. */
function SharedMapBody({ token, map }: { token: string; map: SharedMapView }) {
  const pins = useSharedPins({ token, pins: map.pins });
  // The link's answer carries the species the overlay names (a visitor cannot read the team's lists).
  const species = useMemo(() => speciesMarkers(map.species), [map.species]);
  const navigate = useNavigate();
  return (
    <div style={{ display: 'flex', flexDirection: 'column' }} data-testid="shared-map">
      <header style={{ height: BAR_HEIGHT, display: 'flex', alignItems: 'center', gap: 12, padding: '0 12px', background: '#fff', borderBottom: `1px solid ${palette.unbound}` }}>
        <Typography.Title level={5} style={{ margin: 0, minWidth: 0, maxWidth: 560 }} ellipsis={{ tooltip: map.title }}>
          {map.title}
        </Typography.Title>
        <Typography.Text type="secondary" style={{ fontSize: 12.5, whiteSpace: 'nowrap' }}>
          <EyeOutlined /> Read-only view
        </Typography.Text>
        {map.description && (
          <Typography.Text type="secondary" style={{ fontSize: 12.5, minWidth: 0 }} ellipsis={{ tooltip: map.description }}>
            · {map.description}
          </Typography.Text>
        )}
        <div style={{ flex: 1 }} />
        {pins.headerButton}
        <Button size="small" icon={<DesktopOutlined />} onClick={() => navigate(`/view/${encodeURIComponent(token)}/present`)}>
          Present
        </Button>
      </header>
      <Alert
        banner
        type="info"
        showIcon={false}
        style={{ fontSize: 12.5, padding: '4px 12px' }}
        message="Computed in your browser from the shared setup. The regions are model estimates (an electron bound to a fixed polarizable atom, one Landau orbital at a time); read the caution under the map before quoting a number."
      />
      <ExplorerPage initialSetup={map.setup} readOnly speciesCatalogue={species} overlay={pins.overlay} style={{ height: `calc(100vh - 48px - ${BAR_HEIGHT}px - 30px)` }} />
      {pins.drawer}
    </div>
  );
}
