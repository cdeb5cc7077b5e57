import { Alert, Button, Form, Input, Typography } from 'antd';
import { useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { useRegister } from '../api/auth';
import { AuthCard } from '../components/AuthCard';
import { safeNext } from '../components/RequireAuth';
import { applyServerErrors, emailRules, nameRules, newPasswordRules, sameAs } from '../components/forms';

interface Values {
  displayName: string;
  email: string;
  password: string;
  confirm: string;
}

export function SignUpPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const register = useRegister();
  const [form] = Form.useForm<Values>();
  const [problem, setProblem] = useState<string | null>(null);
  const next = safeNext(params.get('next'));
  const query = params.get('next') ? `?next=${encodeURIComponent(next)}` : '';

  const submit = async ({ displayName, email, password }: Values) => {
    setProblem(null);
    try {
      await register.mutateAsync({ displayName: displayName.trim(), email: email.trim(), password });
      navigate(next, { replace: true });
    } catch (error) {
      setProblem(applyServerErrors(form, error, ['displayName', 'email', 'password']));
    }
  };

  return (
    <AuthCard
      title="Create an account"
      intro="An account lets you start a research team or join one you were invited to."
      footer={
        <Typography.Text type="secondary">
          Already have an account? <Link to={`/sign-in${query}`}>Sign in</Link>
        </Typography.Text>
      }
    >
      <Form form={form} layout="vertical" onFinish={submit} requiredMark={false} noValidate>
        {problem && <Alert type="error" title={problem} showIcon style={{ marginBottom: 16 }} role="alert" />}
        <Form.Item label="Your name" name="displayName" rules={nameRules} extra="Shown to your team beside your pins and replies.">
          <Input autoComplete="name" autoFocus />
        </Form.Item>
        <Form.Item label="E-mail address" name="email" rules={emailRules} validateTrigger="onBlur">
          <Input type="email" autoComplete="email" />
        </Form.Item>
        <Form.Item label="Password" name="password" rules={newPasswordRules} extra="At least 10 characters; a short sentence is easy to remember.">
          <Input.Password autoComplete="new-password" />
        </Form.Item>
        <Form.Item label="Password again" name="confirm" dependencies={['password']} rules={[{ required: true, message: 'Repeat the password.' }, sameAs('password')]}>
          <Input.Password autoComplete="new-password" />
        </Form.Item>
        <Button type="primary" htmlType="submit" block loading={register.isPending}>
          Create account
        </Button>
      </Form>
    </AuthCard>
  );
}
