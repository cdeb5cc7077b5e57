import { Alert, Button, Form, Input, Select, Space } from 'antd';
import { useState } from 'react';
import { ROLE_DESCRIPTIONS, TEAM_ROLES, type SentInvitation, type TeamRole } from '../../api/types';
import { applyServerErrors } from '../../components/forms';

export interface InviteValues {
  email: string;
  role: TeamRole;
}

/** An address and a role; the server's answer (already a member, already invited) shows beside the address. */
export function InviteForm({ onInvite }: { onInvite: (values: InviteValues) => Promise<SentInvitation> }) {
  const [form] = Form.useForm<InviteValues>();
  const [problem, setProblem] = useState<string | null>(null);
  const [notice, setNotice] = useState<{ type: 'success' | 'warning'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <Form
      form={form}
      layout="vertical"
      requiredMark={false}
      noValidate
      initialValues={{ email: '', role: 'viewer' }}
      onFinish={async (values) => {
        setProblem(null);
        setNotice(null);
        setBusy(true);
        try {
          const email = values.email.trim().toLowerCase();
          const result = await onInvite({ email, role: values.role });
          setNotice(
            result.emailSent
              ? { type: 'success', text: `Invitation sent to ${email}.` }
              : { type: 'warning', text: `The invitation to ${email} is saved, but the e-mail could not be sent yet. It stays marked “mail pending” in the list and is sent again automatically when the mail server answers.` },
          );
          form.resetFields(['email']);
        } catch (error) {
          setProblem(applyServerErrors(form, error, ['email', 'role']));
        } finally {
          setBusy(false);
        }
      }}
    >
      {problem && <Alert type="error" title={problem} showIcon style={{ marginBottom: 12 }} role="alert" />}
      {notice && <Alert type={notice.type} title={notice.text} showIcon closable style={{ marginBottom: 12 }} />}
      <Space.Compact style={{ width: '100%', alignItems: 'flex-start' }}>
        <Form.Item
          name="email"
          label="E-mail address"
          style={{ flex: 1, marginBottom: 8 }}
          rules={[
            { required: true, whitespace: true, message: 'Enter the e-mail address to invite.' },
            { type: 'email', message: 'Enter a valid e-mail address, such as name@institute.edu.' },
          ]}
        >
          <Input type="email" placeholder="colleague@institute.edu" />
        </Form.Item>
        <Form.Item name="role" label="Role" style={{ width: 150, marginBottom: 8 }} rules={[{ required: true, message: 'Choose a role.' }]}>
          <Select options={TEAM_ROLES.map((role) => ({ value: role, label: role, title: ROLE_DESCRIPTIONS[role] }))} aria-label="Role" />
        </Form.Item>
      </Space.Compact>
      <Form.Item noStyle shouldUpdate={(a, b) => a.role !== b.role}>
        {({ getFieldValue }) => (
          <div style={{ color: 'rgba(43,45,66,0.65)', marginBottom: 12, fontSize: 13 }}>
            A{getFieldValue('role') === 'viewer' ? '' : 'n'} {getFieldValue('role')} {ROLE_DESCRIPTIONS[getFieldValue('role') as TeamRole] ?? ''}.
            The link in the e-mail works once and expires after 7 days.
          </div>
        )}
      </Form.Item>
      <Button type="primary" htmlType="submit" loading={busy}>
        Send invitation
      </Button>
    </Form>
  );
}
