import { Badge, Tooltip } from 'antd';
import { useHealth } from '../api/health';

/** A small status light in the top bar: is the server up, and does it reach its database? */
export function HealthBadge() {
  const { data, isPending, isError, error } = useHealth();
  if (isPending) return <Badge status="processing" text="Connecting…" />;
  if (isError) {
    return (
      <Tooltip title={error.message}>
        <Badge status="error" text="Server unreachable" data-testid="health" />
      </Tooltip>
    );
  }
  const up = data.database.status === 'up';
  const details = up
    ? `Fieldbound ${data.version} · PostgreSQL ${data.database.serverVersion} · ${data.database.latencyMs} ms`
    : `Fieldbound ${data.version} · database not reachable`;
  return (
    <Tooltip title={details}>
      <Badge
        status={up ? 'success' : 'error'}
        text={up ? 'Database connected' : 'Database unavailable'}
        data-testid="health"
        data-state={up ? 'up' : 'down'}
      />
    </Tooltip>
  );
}
