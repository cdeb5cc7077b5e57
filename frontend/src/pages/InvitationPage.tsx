import { Alert, Button, Descriptions, Form, Input, Result, Space, Spin, Typography } from 'antd';
import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { useMe, useSignOut } from '../api/auth';
import { useAcceptInvitation, useAcceptWithNewAccount, useInvitationPreview } from '../api/invitations';
import { ROLE_DESCRIPTIONS, type InvitationPreview } from '../api/types';
import { AuthCard } from '../components/AuthCard';
import { applyServerErrors, nameRules, newPasswordRules, sameAs } from '../components/forms';
import { useCurrentTeam } from '../state/currentTeam';

function formatDate(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

/** `/invitations/:token`: what the invitation is for, then join — signed in, by signing in, or with a new account. */
export function InvitationPage() {
  const { token = '' } = useParams();
  const preview = useInvitationPreview(token);
  const me = useMe();

  if (preview.isPending || me.isPending) return <Spin style={{ margin: 48 }} />;
  if (preview.isError) {
    return (
      <AuthCard title="This invitation cannot be used">
        <Result status="warning" title={preview.error.message} extra={<Link to="/maps">Go to Fieldbound</Link>} />
      </AuthCard>
    );
  }
  const invitation = preview.data;
  return (
    <AuthCard title={`Join ${invitation.teamName}`} intro={<InvitationSummary invitation={invitation} />}>
      {me.data ? (
        me.data.user.email === invitation.email ? (
          <AcceptAsSignedIn token={token} invitation={invitation} />
        ) : (
          <WrongAccount invitation={invitation} signedInAs={me.data.user.email} />
        )
      ) : invitation.accountExists ? (
        <Space orientation="vertical" style={{ width: '100%' }}>
          <Typography.Paragraph>{invitation.email} already has a Fieldbound account. Sign in with it to join.</Typography.Paragraph>
          <Link to={`/sign-in?next=${encodeURIComponent(`/invitations/${token}`)}&email=${encodeURIComponent(invitation.email)}`}>
            <Button type="primary" block>
              Sign in to join
            </Button>
          </Link>
        </Space>
      ) : (
        <NewAccountForm token={token} invitation={invitation} />
      )}
    </AuthCard>
  );
}

function InvitationSummary({ invitation }: { invitation: InvitationPreview }) {
  return (
    <>
      {invitation.invitedByName ?? 'A colleague'} invited <strong>{invitation.email}</strong> to the research team{' '}
      <strong>{invitation.teamName}</strong>.
      <Descriptions size="small" column={1} style={{ marginTop: 12 }}>
        <Descriptions.Item label="Role">
          {invitation.role} — {ROLE_DESCRIPTIONS[invitation.role]}
        </Descriptions.Item>
        <Descriptions.Item label="Link valid until">{formatDate(invitation.expiresAt)}</Descriptions.Item>
      </Descriptions>
    </>
  );
}

function useEnterTeam() {
  const navigate = useNavigate();
  const { selectTeam } = useCurrentTeam();
  return (teamId: string) => {
    selectTeam(teamId);
    navigate('/maps', { replace: true });
  };
}

function AcceptAsSignedIn({ token, invitation }: { token: string; invitation: InvitationPreview }) {
  const accept = useAcceptInvitation(token);
  const enter = useEnterTeam();
  return (
    <Space orientation="vertical" style={{ width: '100%' }}>
      {accept.isError && <Alert type="error" title={accept.error.message} showIcon role="alert" />}
      <Button type="primary" block loading={accept.isPending} onClick={async () => enter((await accept.mutateAsync()).teamId)}>
        Join {invitation.teamName}
      </Button>
    </Space>
  );
}

function WrongAccount({ invitation, signedInAs }: { invitation: InvitationPreview; signedInAs: string }) {
  const signOut = useSignOut();
  return (
    <Space orientation="vertical" style={{ width: '100%' }}>
      <Alert
        type="warning"
        showIcon
        title={`You are signed in as ${signedInAs}`}
        description={`This invitation is for ${invitation.email}. Sign out, then open the link again to join with that address.`}
      />
      <Button block onClick={() => signOut.mutate()} loading={signOut.isPending}>
        Sign out
      </Button>
    </Space>
  );
}

interface NewAccountValues {
  displayName: string;
  password: string;
  confirm: string;
}

function NewAccountForm({ token, invitation }: { token: string; invitation: InvitationPreview }) {
  const [form] = Form.useForm<NewAccountValues>();
  const register = useAcceptWithNewAccount(token);
  const enter = useEnterTeam();
  const [problem, setProblem] = useState<string | null>(null);
  return (
    <Form
      form={form}
      layout="vertical"
      requiredMark={false}
      noValidate
      onFinish={async ({ displayName, password }) => {
        setProblem(null);
        try {
          const result = await register.mutateAsync({ displayName: displayName.trim(), password });
          enter(result.teamId);
        } catch (error) {
          setProblem(applyServerErrors(form, error, ['displayName', 'password']));
        }
      }}
    >
      <Typography.Paragraph>Create your account to join. You will sign in with {invitation.email}.</Typography.Paragraph>
      {problem && <Alert type="error" title={problem} showIcon style={{ marginBottom: 16 }} role="alert" />}
      <input type="email" autoComplete="username" value={invitation.email} readOnly hidden />
      <Form.Item label="Your name" name="displayName" rules={nameRules}>
        <Input autoComplete="name" autoFocus />
      </Form.Item>
      <Form.Item label="Password" name="password" rules={newPasswordRules} extra="At least 10 characters.">
        <Input.Password autoComplete="new-password" />
      </Form.Item>
      <Form.Item label="Password again" name="confirm" dependencies={['password']} rules={[{ required: true, message: 'Repeat the password.' }, sameAs('password')]}>
        <Input.Password autoComplete="new-password" />
      </Form.Item>
      <Button type="primary" htmlType="submit" block loading={register.isPending}>
        Create account and join
      </Button>
    </Form>
  );
}
