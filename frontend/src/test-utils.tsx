import { App as AntdApp } from 'antd';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { configure, render } from '@testing-library/react';
import type { ReactElement } from 'react';
import { MemoryRouter } from 'react-router-dom';

// findBy…/waitFor wait up to 5 s: antd renders slowly when the machine is busy.
configure({ asyncUtilTimeout: 5000 });

/** Renders with a fresh query client (no retries), antd's App context and a router at `path`. */
export function renderWithProviders(ui: ReactElement, { path = '/' }: { path?: string } = {}) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return {
    client,
    ...render(
      <QueryClientProvider client={client}>
        <AntdApp>
          <MemoryRouter initialEntries={[path]}>{ui}</MemoryRouter>
        </AntdApp>
      </QueryClientProvider>,
    ),
  };
}

/** A JSON Response as fetch would resolve it. */
export function jsonResponse(status: number, body: unknown): Response {
  return new Response(body === undefined ? null : JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}
