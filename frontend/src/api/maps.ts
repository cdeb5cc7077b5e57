import { keepPreviousData, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type {
  CreateMapRequest, DeletedMapItem, DuplicateMapRequest, MapDetail, MapDiffResponse, MapListItem, MapListResponse, MapSetup,
  MapSortKey, MapVersionDetail, MapVersionSummary, PutResultSummaryRequest, ResultSummary, UpdateMapRequest, VersionConflictBody,
} from '@fieldbound/shared';
import { ApiError, apiFetch, apiFetchBlob, json } from './client';

export interface MapListParams {
  search?: string;
  sort?: MapSortKey;
  order?: 'asc' | 'desc';
}

/** Stable query keys: everything about maps starts with 'maps', so one prefix reaches them all. */
export const mapKeys = {
  all: ['maps'] as const,
  lists: (teamId: string) => ['maps', 'list', teamId] as const,
  list: (teamId: string, params: MapListParams) => ['maps', 'list', teamId, { search: params.search ?? '', sort: params.sort ?? 'updatedAt', order: params.order ?? null }] as const,
  deleted: (teamId: string) => ['maps', 'deleted', teamId] as const,
  detail: (mapId: string) => ['maps', 'detail', mapId] as const,
  versions: (mapId: string) => ['maps', 'detail', mapId, 'versions'] as const,
  version: (mapId: string, n: number) => ['maps', 'detail', mapId, 'versions', n] as const,
  diff: (mapId: string, from: number, to: number) => ['maps', 'detail', mapId, 'diff', from, to] as const,
  thumbnail: (url: string) => ['maps', 'thumbnail', url] as const,
};

/** The server's current map when `error` is a 409 version conflict, else null. */
export function conflictOf(error: unknown): MapDetail | null {
  if (error instanceof ApiError && error.status === 409 && error.code === 'version_conflict') {
    return (error.body as VersionConflictBody<MapDetail>).current ?? null;
  }
  return null;
}

function listItemOf(map: MapDetail): MapListItem {
  const { setup: _setup, ...item } = map;
  return item;
}

/** Writes a map's new state into its detail cache and into every cached list of its team (no refetch). */
export function storeMap(queryClient: QueryClient, map: MapDetail): void {
  queryClient.setQueryData(mapKeys.detail(map.id), map);
  queryClient.setQueriesData<MapListResponse>({ queryKey: mapKeys.lists(map.teamId) }, (list) =>
    list ? { ...list, items: list.items.map((item) => (item.id === map.id ? listItemOf(map) : item)) } : list,
  );
}

function dropFromLists(queryClient: QueryClient, teamId: string, mapId: string): void {
  queryClient.setQueriesData<MapListResponse>({ queryKey: mapKeys.lists(teamId) }, (list) =>
    list ? { items: list.items.filter((item) => item.id !== mapId), total: Math.max(0, list.total - (list.items.some((i) => i.id === mapId) ? 1 : 0)) } : list,
  );
}

/** A new map goes to the top of the team's lists; lists sorted by something else refetch in the background. */
function addToLists(queryClient: QueryClient, map: MapDetail): void {
  queryClient.setQueriesData<MapListResponse>({ queryKey: mapKeys.lists(map.teamId) }, (list) =>
    list && !list.items.some((i) => i.id === map.id) ? { items: [listItemOf(map), ...list.items], total: list.total + 1 } : list,
  );
  void queryClient.invalidateQueries({ queryKey: mapKeys.lists(map.teamId), refetchType: 'none' });
}

export function useMapList(teamId: string | null, params: MapListParams) {
  return useQuery({
    queryKey: mapKeys.list(teamId ?? '', params),
    queryFn: () => {
      const q = new URLSearchParams({ limit: '200' });
      if (params.search) q.set('search', params.search);
      if (params.sort) q.set('sort', params.sort);
      if (params.order) q.set('order', params.order);
      return apiFetch<MapListResponse>(`/teams/${teamId}/maps?${q}`);
    },
    enabled: !!teamId,
    placeholderData: keepPreviousData,
  });
}

export function useDeletedMaps(teamId: string | null, enabled: boolean) {
  return useQuery({
    queryKey: mapKeys.deleted(teamId ?? ''),
    queryFn: () => apiFetch<DeletedMapItem[]>(`/teams/${teamId}/maps/deleted`),
    enabled: !!teamId && enabled,
  });
}

export function useMap(mapId: string | undefined) {
  return useQuery({
    queryKey: mapKeys.detail(mapId ?? ''),
    queryFn: () => apiFetch<MapDetail>(`/maps/${mapId}`),
    enabled: !!mapId,
    retry: (count, error) => !(error instanceof ApiError && error.status < 500) && count < 2,
    // The page holds unsaved edits against this copy: never swap it under the person's feet while it is open
    // (saves, reloads and restores write it from their answers), but forget it when the page closes, so the next
    // visit starts from the server's newest version.
    staleTime: Infinity,
    gcTime: 0,
  });
}

export function useCreateMap(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateMapRequest) => apiFetch<MapDetail>(`/teams/${teamId}/maps`, json('POST', body)),
    onSuccess: (map) => {
      queryClient.setQueryData(mapKeys.detail(map.id), map);
      addToLists(queryClient, map);
    },
  });
}

export type UpdateMapVars = Omit<UpdateMapRequest, 'expectedVersion'>;

/**
 * Saves an edit of a map. Optimistic: the cached map shows the edit at once and goes back to what it was if the
 * save fails. A stale `expectedVersion` fails with a 409 ApiError whose `current` (see `conflictOf`) is the map now.
 */
export function useUpdateMap(mapId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (vars: UpdateMapVars & { expectedVersion: number }) => apiFetch<MapDetail>(`/maps/${mapId}`, json('PATCH', vars)),
    onMutate: async (vars) => {
      await queryClient.cancelQueries({ queryKey: mapKeys.detail(mapId), exact: true });
      const previous = queryClient.getQueryData<MapDetail>(mapKeys.detail(mapId));
      if (previous) {
        const { expectedVersion: _v, ...patch } = vars;
        queryClient.setQueryData<MapDetail>(mapKeys.detail(mapId), { ...previous, ...patch });
      }
      return { previous };
    },
    onError: (_error, _vars, context) => {
      if (context?.previous) queryClient.setQueryData(mapKeys.detail(mapId), context.previous);
    },
    onSuccess: (map) => {
      storeMap(queryClient, map);
      void queryClient.invalidateQueries({ queryKey: mapKeys.versions(mapId), exact: true });
    },
  });
}

/** Soft delete: the map leaves the lists at once (and comes back if the server refuses). */
export function useDeleteMap(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (mapId: string) => apiFetch<void>(`/maps/${mapId}`, json('DELETE')),
    onMutate: async (mapId) => {
      await queryClient.cancelQueries({ queryKey: mapKeys.lists(teamId) });
      const snapshots = queryClient.getQueriesData<MapListResponse>({ queryKey: mapKeys.lists(teamId) });
      dropFromLists(queryClient, teamId, mapId);
      return { snapshots };
    },
    onError: (_error, _mapId, context) => {
      for (const [key, data] of context?.snapshots ?? []) queryClient.setQueryData(key, data);
    },
    onSuccess: (_void, mapId) => {
      queryClient.removeQueries({ queryKey: mapKeys.detail(mapId) });
      void queryClient.invalidateQueries({ queryKey: mapKeys.deleted(teamId) });
    },
  });
}

/** Takes a map out of the bin (owners; also the "Undo" after a delete). */
export function useRestoreMap(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (mapId: string) => apiFetch<MapDetail>(`/maps/${mapId}/restore`, json('POST')),
    onSuccess: (map) => {
      queryClient.setQueryData(mapKeys.detail(map.id), map);
      addToLists(queryClient, map);
      queryClient.setQueryData<DeletedMapItem[]>(mapKeys.deleted(teamId), (items) => items?.filter((i) => i.id !== map.id));
    },
  });
}

export function useDuplicateMap() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ mapId, ...body }: DuplicateMapRequest & { mapId: string }) => apiFetch<MapDetail>(`/maps/${mapId}/duplicate`, json('POST', body)),
    onSuccess: (map) => {
      queryClient.setQueryData(mapKeys.detail(map.id), map);
      addToLists(queryClient, map);
    },
  });
}

/** "Keep mine as a copy" after a conflict: duplicate the map, then save my setup (and title) as the copy's next version. */
export function useSaveAsCopy() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ mapId, title, setup }: { mapId: string; title: string; setup: MapSetup }) => {
      const copy = await apiFetch<MapDetail>(`/maps/${mapId}/duplicate`, json('POST', { title }));
      return apiFetch<MapDetail>(`/maps/${copy.id}`, json('PATCH', { expectedVersion: copy.version, setup }));
    },
    onSuccess: (map) => {
      queryClient.setQueryData(mapKeys.detail(map.id), map);
      addToLists(queryClient, map);
    },
  });
}

export function useMapVersions(mapId: string, enabled = true) {
  return useQuery({
    queryKey: mapKeys.versions(mapId),
    queryFn: () => apiFetch<MapVersionSummary[]>(`/maps/${mapId}/versions`),
    enabled,
  });
}

export function useMapVersion(mapId: string, n: number | null) {
  return useQuery({
    queryKey: mapKeys.version(mapId, n ?? 0),
    queryFn: () => apiFetch<MapVersionDetail>(`/maps/${mapId}/versions/${n}`),
    enabled: n !== null,
    staleTime: Infinity, // a saved version never changes
  });
}

export function useMapDiff(mapId: string, from: number | null, to: number | null) {
  return useQuery({
    queryKey: mapKeys.diff(mapId, from ?? 0, to ?? 0),
    queryFn: () => apiFetch<MapDiffResponse>(`/maps/${mapId}/diff?from=${from}&to=${to}`),
    enabled: from !== null && to !== null && from !== to,
    staleTime: Infinity,
  });
}

/** Makes an old version the newest (a new version; history is never rewritten). 409 like a save. */
export function useRestoreVersion(mapId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ number, expectedVersion }: { number: number; expectedVersion: number }) =>
      apiFetch<MapDetail>(`/maps/${mapId}/versions/${number}/restore`, json('POST', { expectedVersion })),
    onSuccess: (map) => {
      storeMap(queryClient, map);
      void queryClient.invalidateQueries({ queryKey: mapKeys.versions(mapId), exact: true });
    },
  });
}

/** Attaches the last computation's summary; the answer goes into the cached map and lists. */
export function usePutSummary(mapId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: PutResultSummaryRequest) => apiFetch<ResultSummary>(`/maps/${mapId}/summary`, json('PUT', body)),
    onSuccess: (summary) => {
      const map = queryClient.getQueryData<MapDetail>(mapKeys.detail(mapId));
      if (map) storeMap(queryClient, { ...map, summary });
    },
  });
}

export function usePutThumbnail(mapId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (png: Blob) => {
      const form = new FormData();
      form.append('file', png, 'thumbnail.png');
      return apiFetch<{ thumbnailUrl: string }>(`/maps/${mapId}/thumbnail`, { method: 'PUT', body: form });
    },
    onSuccess: ({ thumbnailUrl }) => {
      const map = queryClient.getQueryData<MapDetail>(mapKeys.detail(mapId));
      if (map) storeMap(queryClient, { ...map, thumbnailUrl });
    },
  });
}

function dataUrlOf(blob: Blob): Promise<string> {
  return new Promise((resolve, reject) => {
    const reader = new FileReader();
    reader.onload = () => resolve(String(reader.result));
    reader.onerror = () => reject(reader.error ?? new Error('The picture could not be read.'));
    reader.readAsDataURL(blob);
  });
}

/**
 * A thumbnail as a data: URL. The image needs the access token, so a plain <img src> cannot load it, and the page's
 * Content-Security-Policy allows images from 'self' and data: only (not blob:). Thumbnails are small (≤ 256 KB).
 */
export function useThumbnail(url: string | null) {
  const query = useQuery({
    queryKey: mapKeys.thumbnail(url ?? ''),
    queryFn: async () => dataUrlOf(await apiFetchBlob(url!)),
    enabled: !!url,
    staleTime: Infinity, // the URL carries the upload time: a new thumbnail is a new key
    gcTime: 10 * 60_000,
  });
  return query.data ?? null;
}
