import { EmptyPage } from '../components/EmptyPage';

export function SignInPage() {
  return (
    <EmptyPage title="Sign in">
      Research groups keep their maps private; members sign in with their e-mail address.
    </EmptyPage>
  );
}
