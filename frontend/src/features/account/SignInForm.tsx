import { Alert, Button, Form, Input } from 'antd';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { applyServerErrors, emailRules } from '../../components/forms';

export interface SignInValues {
  email: string;
  password: string;
}

/** E-mail and password, checked in the browser first; the server's answer shows above the fields or beside them. */
export function SignInForm({ onSubmit, initialEmail, forgotHref = '/forgot-password' }: { onSubmit: (values: SignInValues) => Promise<unknown>; initialEmail?: string; forgotHref?: string }) {
  const [form] = Form.useForm<SignInValues>();
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async (values: SignInValues) => {
    setProblem(null);
    setBusy(true);
    try {
      await onSubmit({ email: values.email.trim(), password: values.password });
    } catch (error) {
      setProblem(applyServerErrors(form, error, ['email', 'password']));
    } finally {
      setBusy(false);
    }
  };

  return (
    <Form form={form} layout="vertical" onFinish={submit} initialValues={{ email: initialEmail ?? '' }} requiredMark={false} noValidate>
      {problem && <Alert type="error" title={problem} showIcon style={{ marginBottom: 16 }} role="alert" />}
      <Form.Item label="E-mail address" name="email" rules={emailRules} validateTrigger="onBlur">
        <Input type="email" autoComplete="username" autoFocus={!initialEmail} />
      </Form.Item>
      <Form.Item label="Password" name="password" rules={[{ required: true, message: 'Enter your password.' }]} extra={<Link to={forgotHref}>Forgot your password?</Link>}>
        <Input.Password autoComplete="current-password" autoFocus={!!initialEmail} />
      </Form.Item>
      <Button type="primary" htmlType="submit" block loading={busy}>
        Sign in
      </Button>
    </Form>
  );
}
