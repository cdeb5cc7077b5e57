import { PlusOutlined, TeamOutlined } from '@ant-design/icons';
import { Divider, Modal, Select, Typography } from 'antd';
import { useState } from 'react';
import { useCurrentTeam } from '../state/currentTeam';
import { CreateTeamForm } from '../features/team/CreateTeamForm';

/** The current team in the top bar: switch between one's teams, or start a new one. */
export function TeamSwitcher() {
  const { team, teams, selectTeam } = useCurrentTeam();
  const [creating, setCreating] = useState(false);
  return (
    <>
      <Select
        aria-label="Current team"
        data-testid="team-switcher"
        value={team?.id}
        placeholder="No team yet"
        variant="borderless"
        style={{ minWidth: 180, maxWidth: 280 }}
        suffixIcon={<TeamOutlined />}
        onChange={selectTeam}
        options={teams.map((t) => ({ value: t.id, label: t.name, role: t.role }))}
        optionRender={(option) => (
          <span>
            {option.label} <Typography.Text type="secondary">· {String(option.data.role)}</Typography.Text>
          </span>
        )}
        popupRender={(menu) => (
          <>
            {menu}
            <Divider style={{ margin: '4px 0' }} />
            <Typography.Link style={{ display: 'block', padding: '4px 12px' }} onClick={() => setCreating(true)}>
              <PlusOutlined /> New team…
            </Typography.Link>
          </>
        )}
      />
      <Modal title="Start a research team" open={creating} onCancel={() => setCreating(false)} footer={null} destroyOnHidden>
        <Typography.Paragraph type="secondary">You become its owner and can invite colleagues by e-mail.</Typography.Paragraph>
        <CreateTeamForm onCreated={() => setCreating(false)} />
      </Modal>
    </>
  );
}
