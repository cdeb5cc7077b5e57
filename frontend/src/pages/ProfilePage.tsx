import { Alert, App, Button, Card, Form, Input, Space, Typography } from 'antd';
import { useState } from 'react';
import { useChangePassword, useMe, useMyActivity, useUpdateProfile } from '../api/auth';
import { applyServerErrors, nameRules, newPasswordRules, sameAs } from '../components/forms';
import { AuditList } from '../features/team/AuditList';

/** `/profile`: name, password, and the account's recent sign-ins. */
export function ProfilePage() {
  const { data: me } = useMe();
  const activity = useMyActivity();
  return (
    <div style={{ maxWidth: 720, width: '100%', margin: '0 auto', padding: '24px 16px' }}>
      <Typography.Title level={2}>Your account</Typography.Title>
      <Typography.Paragraph type="secondary">Signed in as {me!.user.email}.</Typography.Paragraph>
      <Space orientation="vertical" size="large" style={{ width: '100%' }}>
        <Card title="Name" size="small">
          <NameForm initial={me!.user.displayName} />
        </Card>
        <Card title="Change password" size="small">
          <ChangePasswordForm email={me!.user.email} />
        </Card>
        <Card title="Recent account activity" size="small">
          <AuditList events={activity.data ?? []} loading={activity.isPending} showActor={false} />
        </Card>
      </Space>
    </div>
  );
}

function NameForm({ initial }: { initial: string }) {
  const [form] = Form.useForm<{ displayName: string }>();
  const update = useUpdateProfile();
  const { message } = App.useApp();
  return (
    <Form
      form={form}
      layout="inline"
      initialValues={{ displayName: initial }}
      requiredMark={false}
      onFinish={async ({ displayName }) => {
        try {
          await update.mutateAsync({ displayName: displayName.trim() });
          message.success('Name saved.');
        } catch (error) {
          const problem = applyServerErrors(form, error, ['displayName']);
          if (problem) message.error(problem);
        }
      }}
    >
      <Form.Item name="displayName" rules={nameRules} style={{ flex: 1 }}>
        <Input aria-label="Your name" />
      </Form.Item>
      <Button htmlType="submit" loading={update.isPending}>
        Save
      </Button>
    </Form>
  );
}

interface PasswordValues {
  currentPassword: string;
  newPassword: string;
  confirm: string;
}

function ChangePasswordForm({ email }: { email: string }) {
  const [form] = Form.useForm<PasswordValues>();
  const change = useChangePassword();
  const [problem, setProblem] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  return (
    <Form
      form={form}
      layout="vertical"
      requiredMark={false}
      noValidate
      style={{ maxWidth: 400 }}
      onFinish={async ({ currentPassword, newPassword }) => {
        setProblem(null);
        setDone(false);
        try {
          await change.mutateAsync({ currentPassword, newPassword });
          form.resetFields();
          setDone(true);
        } catch (error) {
          setProblem(applyServerErrors(form, error, ['currentPassword', 'newPassword']));
        }
      }}
    >
      {problem && <Alert type="error" title={problem} showIcon style={{ marginBottom: 16 }} role="alert" />}
      {done && <Alert type="success" title="Password changed. Other devices were signed out; this one stays signed in." showIcon style={{ marginBottom: 16 }} />}
      <input type="email" autoComplete="username" value={email} readOnly hidden />
      <Form.Item label="Current password" name="currentPassword" rules={[{ required: true, message: 'Enter your current password.' }]}>
        <Input.Password autoComplete="current-password" />
      </Form.Item>
      <Form.Item label="New password" name="newPassword" rules={newPasswordRules}>
        <Input.Password autoComplete="new-password" />
      </Form.Item>
      <Form.Item label="New password again" name="confirm" dependencies={['newPassword']} rules={[{ required: true, message: 'Repeat the new password.' }, sameAs('newPassword')]}>
        <Input.Password autoComplete="new-password" />
      </Form.Item>
      <Button type="primary" htmlType="submit" loading={change.isPending}>
        Change password
      </Button>
    </Form>
  );
}
