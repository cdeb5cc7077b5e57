import { afterEach, describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import type { HealthResponse } from '@fieldbound/shared';
import { HealthBadge } from './HealthBadge';

function renderWithQuery() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  return render(
    <QueryClientProvider client={client}>
      <HealthBadge />
    </QueryClientProvider>,
  );
}

function health(database: HealthResponse['database']): HealthResponse {
  return { status: database.status === 'up' ? 'ok' : 'degraded', version: '9.9.9', database, time: '2026-01-01T00:00:00Z' };
}

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('HealthBadge', () => {
  it('shows "Database connected" when /api/health reports the database up', async () => {
    const fetchMock = vi.fn(async () => new Response(JSON.stringify(health({ status: 'up', latencyMs: 1.2, serverVersion: '15.8' })), { status: 200 }));
    vi.stubGlobal('fetch', fetchMock);
    renderWithQuery();
    expect(await screen.findByText('Database connected')).toBeTruthy();
    expect(fetchMock).toHaveBeenCalledWith('/api/health', expect.anything());
  });

  it('reads the body of a 503 and shows "Database unavailable" rather than a network error', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => new Response(JSON.stringify(health({ status: 'down', latencyMs: null, serverVersion: null })), { status: 503 })));
    renderWithQuery();
    expect(await screen.findByText('Database unavailable')).toBeTruthy();
  });

  it('shows "Server unreachable" when the request itself fails', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => { throw new TypeError('Failed to fetch'); }));
    renderWithQuery();
    expect(await screen.findByText('Server unreachable')).toBeTruthy();
  });
});
