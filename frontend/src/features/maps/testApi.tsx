// Test helpers of the saved-maps screens: a fake API answering fetch by method and path, and sample maps.
import { vi } from 'vitest';
import { defaultSetup, type MapDetail } from '@fieldbound/shared';
import { session } from '../../api/client';
import type { MeView, TeamRole } from '../../api/types';
import { jsonResponse } from '../../test-utils';

export type Handler = (body: unknown, url: URL) => { status: number; body?: unknown } | Promise<{ status: number; body?: unknown }>;

/** Routes `METHOD /api/path` (query string ignored) to handlers; records every call; unknown routes answer 404. */
export function fakeApi(routes: Record<string, Handler>) {
  const calls: { method: string; path: string; body: unknown }[] = [];
  session.set('test-access-token');
  vi.spyOn(globalThis, 'fetch').mockImplementation(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(String(input), 'http://localhost');
    const method = (init?.method ?? 'GET').toUpperCase();
    const body = typeof init?.body === 'string' ? JSON.parse(init.body) : (init?.body ?? null);
    calls.push({ method, path: url.pathname, body });
    const handler = routes[`${method} ${url.pathname}`];
    if (!handler) return jsonResponse(404, { statusCode: 404, code: 'not_found', message: `No fake for ${method} ${url.pathname}` });
    const answer = await handler(body, url);
    return answer.status === 204 ? new Response(null, { status: 204 }) : jsonResponse(answer.status, answer.body);
  });
  return calls;
}

export function me(role: TeamRole, teamId = 't1', teamName = 'Magnetic anions'): MeView {
  return { user: { id: 'u1', email: 'ada@institute.edu', displayName: 'Ada', createdAt: '2026-12-01T00:00:00Z' }, teams: [{ id: teamId, name: teamName, role }] };
}

export function sampleMap(overrides: Partial<MapDetail> = {}): MapDetail {
  return {
    id: 'm1',
    teamId: 't1',
    title: 'Alkali atoms in laboratory fields',
    description: '',
    tags: ['alkali'],
    version: 3,
    createdAt: '2026-12-01T10:00:00Z',
    createdBy: { id: 'u1', displayName: 'Ada' },
    updatedAt: '2026-12-01T11:00:00Z',
    updatedBy: { id: 'u1', displayName: 'Ada' },
    summary: null,
    thumbnailUrl: null,
    setup: defaultSetup(),
    ...overrides,
  };
}
