import { Spin } from 'antd';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { useMe } from '../api/auth';
import { EmptyPage } from './EmptyPage';

/** Only a same-site path may be a `next` target (no `//host`, no scheme), and never the sign-in pages themselves. */
export function safeNext(next: string | null | undefined, fallback = '/maps'): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return fallback;
  if (/^\/(sign-in|sign-up)(\/|\?|$)/.test(next)) return fallback;
  return next;
}

export function signInPath(location: { pathname: string; search: string; hash?: string }): string {
  const next = `${location.pathname}${location.search}${location.hash ?? ''}`;
  return `/sign-in?next=${encodeURIComponent(next)}`;
}

/** Wraps the routes that need a signed-in person: others go to sign-in and come back afterwards. */
export function RequireAuth() {
  const { data: me, isPending, isError, error } = useMe();
  const location = useLocation();
  if (isPending) {
    return (
      <div style={{ margin: 'auto', padding: 48 }}>
        <Spin description="Opening your session…" />
      </div>
    );
  }
  if (isError) {
    return <EmptyPage title="The server did not answer">{error.message}</EmptyPage>;
  }
  if (!me) return <Navigate to={signInPath(location)} replace />;
  return <Outlet />;
}
