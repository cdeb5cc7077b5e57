import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, json } from './client';
import { meKey } from './auth';
import type { AuditEventView, InvitationView, MemberView, SentInvitation, TeamRole, TeamView } from './types';

const teamKey = (teamId: string) => ['team', teamId] as const;

export function useTeam(teamId: string | null) {
  return useQuery({
    queryKey: teamKey(teamId ?? ''),
    queryFn: () => apiFetch<TeamView>(`/teams/${teamId}`),
    enabled: !!teamId,
  });
}

export function useMembers(teamId: string | null) {
  return useQuery({
    queryKey: [...teamKey(teamId ?? ''), 'members'],
    queryFn: () => apiFetch<MemberView[]>(`/teams/${teamId}/members`),
    enabled: !!teamId,
  });
}

export function useInvitations(teamId: string | null, enabled = true) {
  return useQuery({
    queryKey: [...teamKey(teamId ?? ''), 'invitations'],
    queryFn: () => apiFetch<InvitationView[]>(`/teams/${teamId}/invitations`),
    enabled: !!teamId && enabled,
  });
}

export function useTeamAudit(teamId: string | null, enabled = true) {
  return useQuery({
    queryKey: [...teamKey(teamId ?? ''), 'audit'],
    queryFn: () => apiFetch<{ events: AuditEventView[] }>(`/teams/${teamId}/audit?limit=100`).then((r) => r.events),
    enabled: !!teamId && enabled,
  });
}

/** Mutations on one team refresh that team's queries and the signed-in person's team list. */
function useTeamMutation<TVars, TResult>(teamId: string, fn: (vars: TVars) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: async () => {
      await Promise.all([queryClient.invalidateQueries({ queryKey: teamKey(teamId) }), queryClient.invalidateQueries({ queryKey: meKey })]);
    },
  });
}

export function useCreateTeam() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { name: string }) => apiFetch<TeamView>('/teams', json('POST', body)),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meKey }),
  });
}

export function useRenameTeam(teamId: string) {
  return useTeamMutation(teamId, (body: { name: string }) => apiFetch<TeamView>(`/teams/${teamId}`, json('PATCH', body)));
}

export function useDeleteTeam(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch<void>(`/teams/${teamId}`, json('DELETE')),
    onSuccess: async () => {
      queryClient.removeQueries({ queryKey: teamKey(teamId) });
      await queryClient.invalidateQueries({ queryKey: meKey });
    },
  });
}

export function useChangeRole(teamId: string) {
  return useTeamMutation(teamId, ({ userId, role }: { userId: string; role: TeamRole }) =>
    apiFetch<MemberView>(`/teams/${teamId}/members/${userId}`, json('PATCH', { role })),
  );
}

export function useRemoveMember(teamId: string) {
  return useTeamMutation(teamId, (userId: string) => apiFetch<void>(`/teams/${teamId}/members/${userId}`, json('DELETE')));
}

export function useInvite(teamId: string) {
  return useTeamMutation(teamId, (body: { email: string; role: TeamRole }) => apiFetch<SentInvitation>(`/teams/${teamId}/invitations`, json('POST', body)));
}

export function useResendInvitation(teamId: string) {
  return useTeamMutation(teamId, (invitationId: string) => apiFetch<SentInvitation>(`/teams/${teamId}/invitations/${invitationId}/resend`, json('POST')));
}

export function useRevokeInvitation(teamId: string) {
  return useTeamMutation(teamId, (invitationId: string) => apiFetch<void>(`/teams/${teamId}/invitations/${invitationId}`, json('DELETE')));
}
