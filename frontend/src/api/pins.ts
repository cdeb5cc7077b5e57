import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { CreatePinRequest, PinDetail, PinReplyView, PinView, UpdatePinRequest, VersionConflictBody } from '@fieldbound/shared';
import { ApiError, apiFetch, json } from './client';

/** Stable query keys: a map's pin list and one pin's thread. */
export const pinKeys = {
  all: ['pins'] as const,
  list: (mapId: string) => ['pins', 'list', mapId] as const,
  detail: (pinId: string) => ['pins', 'detail', pinId] as const,
};

/** The server's current pin when `error` is a 409 version conflict, else null. */
export function pinConflictOf(error: unknown): PinView | null {
  if (error instanceof ApiError && error.status === 409) {
    const body = error.body as Partial<VersionConflictBody<PinView>> | null;
    return body?.current ?? null;
  }
  return null;
}

/**
 * Writes a pin's new state into the list and its thread (no refetch). An older copy never replaces a newer one, so a
 * live event and the answer to one's own request may arrive in either order.
 */
export function storePin(queryClient: QueryClient, pin: PinView): void {
  queryClient.setQueryData<PinView[]>(pinKeys.list(pin.mapId), (list) => {
    if (!list) return list;
    const old = list.find((p) => p.id === pin.id);
    if (!old) return [...list, pin];
    if (old.version > pin.version) return list;
    return list.map((p) => (p.id === pin.id ? { ...pin, replyCount: Math.max(pin.replyCount, p.replyCount) } : p));
  });
  queryClient.setQueryData<PinDetail>(pinKeys.detail(pin.id), (detail) =>
    detail && detail.version <= pin.version ? { ...detail, ...pin, replyCount: Math.max(pin.replyCount, detail.replyCount), replies: detail.replies } : detail,
  );
}

/** Removes a pin from the list and forgets its thread. */
export function dropPin(queryClient: QueryClient, mapId: string, pinId: string): void {
  queryClient.setQueryData<PinView[]>(pinKeys.list(mapId), (list) => list?.filter((p) => p.id !== pinId));
  queryClient.removeQueries({ queryKey: pinKeys.detail(pinId), exact: true });
}

/** Adds a reply to the thread (once) and sets the pin's reply count. */
export function storeReply(queryClient: QueryClient, mapId: string, pinId: string, reply: PinReplyView, replyCount?: number): void {
  queryClient.setQueryData<PinDetail>(pinKeys.detail(pinId), (detail) => {
    if (!detail || detail.replies.some((r) => r.id === reply.id)) return detail;
    const replies = [...detail.replies, reply];
    return { ...detail, replies, replyCount: replyCount ?? Math.max(detail.replyCount, replies.length) };
  });
  queryClient.setQueryData<PinView[]>(pinKeys.list(mapId), (list) =>
    list?.map((p) => (p.id === pinId ? { ...p, replyCount: replyCount ?? p.replyCount + 1 } : p)),
  );
}

/** All pins of a map (members). */
export function usePins(mapId: string | undefined, enabled = true) {
  return useQuery({
    queryKey: pinKeys.list(mapId ?? ''),
    queryFn: () => apiFetch<PinView[]>(`/maps/${mapId}/pins`),
    enabled: !!mapId && enabled,
  });
}

/** One pin with its thread. */
export function usePin(pinId: string | null) {
  return useQuery({
    queryKey: pinKeys.detail(pinId ?? ''),
    queryFn: () => apiFetch<PinDetail>(`/pins/${pinId}`),
    enabled: !!pinId,
  });
}

export function useCreatePin(mapId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreatePinRequest) => apiFetch<PinView>(`/maps/${mapId}/pins`, json('POST', body)),
    onSuccess: (pin) => storePin(queryClient, pin),
  });
}

/** Edits, moves, resolves or reopens a pin; a stale `expectedVersion` fails with a 409 (see `pinConflictOf`). */
export function useUpdatePin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ pinId, ...body }: UpdatePinRequest & { pinId: string }) => apiFetch<PinView>(`/pins/${pinId}`, json('PATCH', body)),
    onSuccess: (pin) => storePin(queryClient, pin),
    onError: (error) => {
      const current = pinConflictOf(error);
      if (current) storePin(queryClient, current);
    },
  });
}

export function useDeletePin(mapId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (pinId: string) => apiFetch<void>(`/pins/${pinId}`, json('DELETE')),
    onSuccess: (_void, pinId) => dropPin(queryClient, mapId, pinId),
  });
}

export function useReply(mapId: string, pinId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: string) => apiFetch<PinReplyView>(`/pins/${pinId}/replies`, json('POST', { body })),
    onSuccess: (reply) => storeReply(queryClient, mapId, pinId, reply),
  });
}
