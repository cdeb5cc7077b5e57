import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { ApiError, apiFetch, json, session } from './client';
import type { AuditEventView, MeView, SessionView, UserView } from './types';

export const meKey = ['me'] as const;

/** The signed-in person and their teams; null when nobody is signed in. */
export function useMe() {
  return useQuery({
    queryKey: meKey,
    queryFn: async (): Promise<MeView | null> => {
      try {
        return await apiFetch<MeView>('/users/me');
      } catch (error) {
        if (error instanceof ApiError && error.status === 401) return null;
        throw error;
      }
    },
    staleTime: 60_000,
    retry: (count, error) => !(error instanceof ApiError && error.status < 500) && count < 2,
  });
}

/** After any call that starts a session: keep the token, reload who is signed in. */
function useStartSession() {
  const queryClient = useQueryClient();
  return async (result: SessionView) => {
    session.set(result.accessToken);
    queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== 'me' && q.queryKey[0] !== 'health' });
    queryClient.setQueryData(meKey, await apiFetch<MeView>('/users/me'));
  };
}

export function useSignIn() {
  const start = useStartSession();
  return useMutation({
    mutationFn: (body: { email: string; password: string }) => apiFetch<SessionView>('/auth/sign-in', json('POST', body, { auth: false })),
    onSuccess: start,
  });
}

export function useRegister() {
  const start = useStartSession();
  return useMutation({
    mutationFn: (body: { email: string; password: string; displayName: string }) =>
      apiFetch<SessionView>('/auth/register', json('POST', body, { auth: false })),
    onSuccess: start,
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch<void>('/auth/sign-out', json('POST', undefined, { auth: false })),
    onSettled: () => {
      session.set(null);
      queryClient.setQueryData(meKey, null);
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== 'me' && q.queryKey[0] !== 'health' });
    },
  });
}

export function useForgotPassword() {
  return useMutation({
    mutationFn: (body: { email: string }) => apiFetch<{ message: string }>('/auth/forgot-password', json('POST', body, { auth: false })),
  });
}

export function useResetLink(token: string) {
  return useQuery({
    queryKey: ['reset-link', token],
    queryFn: () => apiFetch<{ email: string; expiresAt: string }>(`/auth/reset-password/${encodeURIComponent(token)}`, { auth: false }),
    retry: false,
  });
}

export function useResetPassword() {
  return useMutation({
    mutationFn: (body: { token: string; password: string }) => apiFetch<{ email: string }>('/auth/reset-password', json('POST', body, { auth: false })),
  });
}

export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { currentPassword: string; newPassword: string }) => apiFetch<SessionView>('/auth/change-password', json('POST', body)),
    onSuccess: (result) => {
      session.set(result.accessToken);
      void queryClient.invalidateQueries({ queryKey: ['activity'] });
    },
  });
}

export function useUpdateProfile() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { displayName: string }) => apiFetch<UserView>('/users/me', json('PATCH', body)),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meKey }),
  });
}

export function useMyActivity() {
  return useQuery({
    queryKey: ['activity'],
    queryFn: () => apiFetch<{ events: AuditEventView[] }>('/users/me/activity').then((r) => r.events),
  });
}
