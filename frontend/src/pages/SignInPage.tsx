import { Alert, Typography } from 'antd';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { useSignIn } from '../api/auth';
import { AuthCard } from '../components/AuthCard';
import { safeNext } from '../components/RequireAuth';
import { SignInForm } from '../features/account/SignInForm';

export function SignInPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const next = safeNext(params.get('next'));
  const query = params.get('next') ? `?next=${encodeURIComponent(next)}` : '';
  const notice = params.get('reset') ? 'Your password was changed. Sign in with the new one.' : null;

  return (
    <AuthCard
      title="Sign in"
      intro="Research groups keep their maps private to their members. Sign in with the e-mail address your team invited."
      footer={
        <Typography.Text type="secondary">
          New to Fieldbound? <Link to={`/sign-up${query}`}>Create an account</Link>
        </Typography.Text>
      }
    >
      {notice && <Alert type="success" title={notice} showIcon style={{ marginBottom: 16 }} />}
      <SignInForm
        initialEmail={params.get('email') ?? undefined}
        onSubmit={async (values) => {
          await signIn.mutateAsync(values);
          navigate(next, { replace: true });
        }}
      />
    </AuthCard>
  );
}
