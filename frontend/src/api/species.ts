import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CsvIssue, CsvRejectedBody, SpeciesListDetail, SpeciesListResponse, SpeciesListView } from '@fieldbound/shared';
import { ApiError, apiFetch, json } from './client';

export const speciesKeys = {
  catalogue: ['species', 'catalogue'] as const,
  team: (teamId: string) => ['species', 'team', teamId] as const,
  lists: (teamId: string) => ['species', 'team', teamId, 'lists'] as const,
};

/** The built-in catalogue: the same for everyone and rarely changed, so it is kept for the session. */
export function useSpeciesCatalogue() {
  return useQuery({
    queryKey: speciesKeys.catalogue,
    queryFn: () => apiFetch<SpeciesListResponse>('/species/catalogue').then((r) => r.items),
    staleTime: Infinity,
  });
}

/** The catalogue and the team's own species in one list (the map overlay looks names up here). */
export function useTeamSpecies(teamId: string | null) {
  return useQuery({
    queryKey: speciesKeys.team(teamId ?? ''),
    queryFn: () => apiFetch<SpeciesListResponse>(`/teams/${teamId}/species`).then((r) => r.items),
    enabled: !!teamId,
    staleTime: 5 * 60_000,
  });
}

export function useSpeciesLists(teamId: string | null) {
  return useQuery({
    queryKey: speciesKeys.lists(teamId ?? ''),
    queryFn: () => apiFetch<SpeciesListView[]>(`/teams/${teamId}/species-lists`),
    enabled: !!teamId,
  });
}

/** The per-line problems of a rejected CSV, or null when `error` is something else. */
export function csvIssuesOf(error: unknown): CsvIssue[] | null {
  if (error instanceof ApiError && error.status === 400 && error.code === 'csv_rejected') return (error.body as CsvRejectedBody).issues ?? [];
  return null;
}

export function useUploadSpeciesList(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ name, file }: { name: string; file: File }) => {
      const form = new FormData();
      form.append('name', name);
      form.append('file', file, file.name);
      return apiFetch<SpeciesListDetail>(`/teams/${teamId}/species-lists`, { method: 'POST', body: form });
    },
    onSuccess: (list) => {
      const { species, ...view } = list;
      queryClient.setQueryData<SpeciesListView[]>(speciesKeys.lists(teamId), (lists) => (lists ? [view, ...lists] : lists));
      queryClient.setQueryData<SpeciesListResponse['items']>(speciesKeys.team(teamId), (items) => (items ? [...items, ...species] : items));
    },
  });
}

export function useDeleteSpeciesList(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (listId: string) => apiFetch<void>(`/teams/${teamId}/species-lists/${listId}`, json('DELETE')),
    onSuccess: (_void, listId) => {
      queryClient.setQueryData<SpeciesListView[]>(speciesKeys.lists(teamId), (lists) => lists?.filter((l) => l.id !== listId));
      queryClient.setQueryData<SpeciesListResponse['items']>(speciesKeys.team(teamId), (items) => items?.filter((s) => s.list?.id !== listId));
    },
  });
}
