import { Alert, Button, Form, Input, Result } from 'antd';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { useForgotPassword } from '../api/auth';
import { AuthCard } from '../components/AuthCard';
import { applyServerErrors, emailRules } from '../components/forms';
import { LocalMailboxHint } from '../components/LocalMailboxHint';

export function ForgotPasswordPage() {
  const forgot = useForgotPassword();
  const [form] = Form.useForm<{ email: string }>();
  const [problem, setProblem] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);

  if (sentTo) {
    return (
      <AuthCard title="Check your mailbox">
        <Result
          status="success"
          title={`If ${sentTo} has an account, a link is on its way.`}
          subTitle="The link lets you choose a new password once and works for one hour."
          extra={<LocalMailboxHint />}
        />
      </AuthCard>
    );
  }

  return (
    <AuthCard
      title="Forgot your password?"
      intro="Enter the address of your account; we send a one-time link to choose a new password."
      footer={<Link to="/sign-in">Back to sign in</Link>}
    >
      <Form
        form={form}
        layout="vertical"
        requiredMark={false}
        noValidate
        onFinish={async ({ email }) => {
          setProblem(null);
          try {
            await forgot.mutateAsync({ email: email.trim() });
            setSentTo(email.trim());
          } catch (error) {
            setProblem(applyServerErrors(form, error, ['email']));
          }
        }}
      >
        {problem && <Alert type="error" title={problem} showIcon style={{ marginBottom: 16 }} role="alert" />}
        <Form.Item label="E-mail address" name="email" rules={emailRules}>
          <Input type="email" autoComplete="email" autoFocus />
        </Form.Item>
        <Button type="primary" htmlType="submit" block loading={forgot.isPending}>
          Send the link
        </Button>
      </Form>
    </AuthCard>
  );
}
