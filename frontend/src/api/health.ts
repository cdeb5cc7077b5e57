import { useQuery } from '@tanstack/react-query';
import type { HealthResponse } from '@fieldbound/shared';
import { ApiError, apiFetch } from './client';

/** The server and database status, refreshed every 30 s. A 503 still carries a readable body. */
export function useHealth() {
  return useQuery({
    queryKey: ['health'],
    queryFn: async (): Promise<HealthResponse> => {
      try {
        return await apiFetch<HealthResponse>('/health', { auth: false });
      } catch (error) {
        if (error instanceof ApiError && error.status === 503 && error.body && typeof error.body === 'object') {
          return error.body as HealthResponse;
        }
        throw error;
      }
    },
    refetchInterval: 30_000,
    retry: false,
  });
}
