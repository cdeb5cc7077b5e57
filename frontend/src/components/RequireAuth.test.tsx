import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen } from '@testing-library/react';
import { Route, Routes, useLocation } from 'react-router-dom';
import { session } from '../api/client';
import { jsonResponse, renderWithProviders } from '../test-utils';
import { RequireAuth, safeNext } from './RequireAuth';

afterEach(() => {
  vi.unstubAllGlobals();
  session.set(null);
});

function WhereAmI() {
  const location = useLocation();
  return <div data-testid="where">{location.pathname + location.search}</div>;
}

describe('RequireAuth', { timeout: 20_000 }, () => {
  it('sends a signed-out visitor to /sign-in with the page they wanted in ?next=', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => jsonResponse(401, { statusCode: 401, code: 'refresh_token_missing', message: 'no session' })));
    renderWithProviders(
      <Routes>
        <Route element={<RequireAuth />}>
          <Route path="/team" element={<div>team page</div>} />
        </Route>
        <Route path="/sign-in" element={<WhereAmI />} />
      </Routes>,
      { path: '/team?tab=members' },
    );
    expect((await screen.findByTestId('where')).textContent).toBe('/sign-in?next=%2Fteam%3Ftab%3Dmembers');
  });

  it('shows the page to a signed-in person', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string) =>
        url === '/api/auth/refresh'
          ? jsonResponse(200, { accessToken: 't' })
          : jsonResponse(200, { user: { id: 'u', email: 'a@b.c', displayName: 'A', createdAt: '' }, teams: [] }),
      ),
    );
    renderWithProviders(
      <Routes>
        <Route element={<RequireAuth />}>
          <Route path="/team" element={<div>team page</div>} />
        </Route>
      </Routes>,
      { path: '/team' },
    );
    expect(await screen.findByText('team page')).toBeTruthy();
  });
});

describe('safeNext', () => {
  it('accepts same-site paths and refuses other hosts, schemes and the sign-in pages', () => {
    expect(safeNext('/team?x=1')).toBe('/team?x=1');
    expect(safeNext('//evil.example/x')).toBe('/maps');
    expect(safeNext('https://evil.example')).toBe('/maps');
    expect(safeNext('/\\evil.example')).toBe('/maps');
    expect(safeNext('/sign-in?next=/x')).toBe('/maps');
    expect(safeNext(null)).toBe('/maps');
  });
});
