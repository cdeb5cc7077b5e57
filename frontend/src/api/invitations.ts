import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, json, session } from './client';
import { meKey } from './auth';
import type { InvitationPreview, MeView, SessionView, TeamRole } from './types';

export function useInvitationPreview(token: string) {
  return useQuery({
    queryKey: ['invitation', token],
    queryFn: () => apiFetch<InvitationPreview>(`/invitations/${encodeURIComponent(token)}`, { auth: false }),
    retry: false,
    staleTime: Infinity,
  });
}

/** The signed-in person joins the team the invitation is for. */
export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch<{ teamId: string; role: TeamRole }>(`/invitations/${encodeURIComponent(token)}/accept`, json('POST')),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meKey }),
  });
}

/** Creates the invited address's account, joins and signs in. */
export function useAcceptWithNewAccount(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { displayName: string; password: string }) =>
      apiFetch<SessionView & { teamId: string }>(`/invitations/${encodeURIComponent(token)}/register`, json('POST', body, { auth: false })),
    onSuccess: async (result) => {
      session.set(result.accessToken);
      queryClient.setQueryData(meKey, await apiFetch<MeView>('/users/me'));
    },
  });
}
