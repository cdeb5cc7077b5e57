import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreatedViewingLink, CreateViewingLinkRequest, SharedMapView, ViewingLinkView } from '@fieldbound/shared';
import { ApiError, apiFetch, json } from './client';

export const viewingLinkKeys = {
  forMap: (mapId: string) => ['viewing-links', mapId] as const,
  shared: (token: string) => ['shared-map', token] as const,
};

/** A map's viewing links (editors and owners), newest first as the server lists them. */
export function useViewingLinks(mapId: string, enabled = true) {
  return useQuery({
    queryKey: viewingLinkKeys.forMap(mapId),
    queryFn: () => apiFetch<ViewingLinkView[]>(`/maps/${mapId}/viewing-links`),
    enabled,
  });
}

/** Creates a link; the answer carries the token (shown once) and joins the cached list. */
export function useCreateViewingLink(mapId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateViewingLinkRequest) => apiFetch<CreatedViewingLink>(`/maps/${mapId}/viewing-links`, json('POST', body)),
    onSuccess: ({ link }) => {
      queryClient.setQueryData<ViewingLinkView[]>(viewingLinkKeys.forMap(mapId), (links) => (links ? [link, ...links.filter((l) => l.id !== link.id)] : links));
    },
  });
}

export function useRevokeViewingLink(mapId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (linkId: string) => apiFetch<void>(`/maps/${mapId}/viewing-links/${linkId}`, json('DELETE')),
    onSuccess: (_void, linkId) => {
      const now = new Date().toISOString();
      queryClient.setQueryData<ViewingLinkView[]>(viewingLinkKeys.forMap(mapId), (links) => links?.map((l) => (l.id === linkId ? { ...l, revokedAt: l.revokedAt ?? now } : l)));
    },
  });
}

/** The map behind a viewing link, for anyone holding it (no account: the request carries no token). */
export function useSharedMap(token: string | undefined) {
  return useQuery({
    queryKey: viewingLinkKeys.shared(token ?? ''),
    queryFn: () => apiFetch<SharedMapView>(`/view/${encodeURIComponent(token!)}`, { auth: false }),
    enabled: !!token,
    retry: (count, error) => !(error instanceof ApiError && error.status > 0 && error.status < 500) && count < 2,
    staleTime: Infinity,
    refetchOnWindowFocus: false,
  });
}
