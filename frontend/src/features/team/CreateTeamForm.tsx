import { Alert, Button, Form, Input } from 'antd';
import { useState } from 'react';
import { useCreateTeam } from '../../api/teams';
import { applyServerErrors } from '../../components/forms';
import { useCurrentTeam } from '../../state/currentTeam';

/** Name a new team; the creator becomes its owner and it becomes the current team. */
export function CreateTeamForm({ onCreated, autoFocus = true }: { onCreated?: (teamId: string) => void; autoFocus?: boolean }) {
  const [form] = Form.useForm<{ name: string }>();
  const create = useCreateTeam();
  const { selectTeam } = useCurrentTeam();
  const [problem, setProblem] = useState<string | null>(null);
  return (
    <Form
      form={form}
      layout="vertical"
      requiredMark={false}
      noValidate
      onFinish={async ({ name }) => {
        setProblem(null);
        try {
          const team = await create.mutateAsync({ name: name.trim() });
          selectTeam(team.id);
          form.resetFields();
          onCreated?.(team.id);
        } catch (error) {
          setProblem(applyServerErrors(form, error, ['name']));
        }
      }}
    >
      {problem && <Alert type="error" title={problem} showIcon style={{ marginBottom: 16 }} role="alert" />}
      <Form.Item
        label="Team name"
        name="name"
        rules={[
          { required: true, whitespace: true, message: 'Enter a name for the team.' },
          { max: 100, message: 'A team name has at most 100 characters.' },
        ]}
        extra="Usually the research group, e.g. “Atomic theory group, Lund”."
      >
        <Input autoFocus={autoFocus} />
      </Form.Item>
      <Button type="primary" htmlType="submit" loading={create.isPending} block>
        Create team
      </Button>
    </Form>
  );
}
