import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { ApiError, apiFetch, json } from './client';
import type { CapturedMessage } from './types';

/** The local mail fake's messages; `available: false` when the server sends real e-mail. */
export function useMailbox() {
  return useQuery({
    queryKey: ['dev-mailbox'],
    queryFn: async (): Promise<{ available: boolean; messages: CapturedMessage[] }> => {
      try {
        const { messages } = await apiFetch<{ messages: CapturedMessage[] }>('/dev/mailbox', { auth: false });
        return { available: true, messages };
      } catch (error) {
        if (error instanceof ApiError && error.status === 404) return { available: false, messages: [] };
        throw error;
      }
    },
    refetchInterval: 3000,
  });
}

export function useClearMailbox() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch<void>('/dev/mailbox', json('DELETE', undefined, { auth: false })),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['dev-mailbox'] }),
  });
}
