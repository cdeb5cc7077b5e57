import { Alert, Button, Form, Input, Result, Spin } from 'antd';
import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { useResetLink, useResetPassword } from '../api/auth';
import { AuthCard } from '../components/AuthCard';
import { applyServerErrors, newPasswordRules, sameAs } from '../components/forms';

export function ResetPasswordPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const link = useResetLink(token);
  const reset = useResetPassword();
  const [form] = Form.useForm<{ password: string; confirm: string }>();
  const [problem, setProblem] = useState<string | null>(null);

  if (link.isPending) return <Spin style={{ margin: 48 }} />;
  if (link.isError) {
    return (
      <AuthCard title="This link cannot be used">
        <Result status="warning" title={link.error.message} extra={<Link to="/forgot-password">Ask for a new link</Link>} />
      </AuthCard>
    );
  }

  return (
    <AuthCard title="Choose a new password" intro={<>For {link.data.email}. Every device signed in to this account will be signed out.</>}>
      <Form
        form={form}
        layout="vertical"
        requiredMark={false}
        noValidate
        onFinish={async ({ password }) => {
          setProblem(null);
          try {
            const { email } = await reset.mutateAsync({ token, password });
            navigate(`/sign-in?reset=1&email=${encodeURIComponent(email)}`, { replace: true });
          } catch (error) {
            setProblem(applyServerErrors(form, error, ['password']));
          }
        }}
      >
        {problem && <Alert type="error" title={problem} showIcon style={{ marginBottom: 16 }} role="alert" />}
        <input type="email" autoComplete="username" value={link.data.email} readOnly hidden />
        <Form.Item label="New password" name="password" rules={newPasswordRules}>
          <Input.Password autoComplete="new-password" autoFocus />
        </Form.Item>
        <Form.Item label="New password again" name="confirm" dependencies={['password']} rules={[{ required: true, message: 'Repeat the password.' }, sameAs('password')]}>
          <Input.Password autoComplete="new-password" />
        </Form.Item>
        <Button type="primary" htmlType="submit" block loading={reset.isPending}>
          Set the new password
        </Button>
      </Form>
    </AuthCard>
  );
}
