import { Card, Typography } from 'antd';
import { Outlet } from 'react-router-dom';
import { useCurrentTeam } from '../state/currentTeam';
import { CreateTeamForm } from '../features/team/CreateTeamForm';

/** Team-scoped pages need a team: a person in none is offered to start one (or to wait for an invitation). */
export function RequireTeam() {
  const { team } = useCurrentTeam();
  if (team) return <Outlet />;
  return (
    <div style={{ margin: '48px auto', maxWidth: 560, padding: '0 16px' }} data-testid="no-team">
      <Typography.Title level={3}>Start a research team</Typography.Title>
      <Typography.Paragraph type="secondary">
        Maps, pins and threads belong to a team, and only its members see them. Create a team for your group and invite
        colleagues by e-mail — or, if a colleague already runs one, ask them for an invitation and open the link in their
        e-mail.
      </Typography.Paragraph>
      <Card>
        <CreateTeamForm />
      </Card>
    </div>
  );
}
