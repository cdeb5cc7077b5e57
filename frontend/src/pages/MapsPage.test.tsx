import { afterEach, describe, expect, it, vi } from 'vitest';
import { configure, fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { MapListResponse } from '@fieldbound/shared';
import { CurrentTeamProvider } from '../state/currentTeam';
import { fakeApi, me, sampleMap } from '../features/maps/testApi';
import { renderWithProviders } from '../test-utils';
import type { TeamRole } from '../api/types';
import { MapsPage } from './MapsPage';

vi.mock('../features/export', () => ({ ImportSetupDialog: () => null }));
// A loaded machine renders antd slowly: allow time rather than fail on speed (no test here is about speed).
vi.setConfig({ testTimeout: 60_000 });
configure({ asyncUtilTimeout: 15_000 });

afterEach(() => {
  vi.restoreAllMocks();
  localStorage.clear();
});

const list: MapListResponse = {
  items: [sampleMap({ summary: { engineVersion: '0.1.0', setupFingerprint: 'f', counts: { bound: 1200, resonance: 0, unbound: 800 }, computationMs: 1500, computedAt: '2026-12-01T11:00:00Z', computedBy: null, matchesCurrentSetup: true } })],
  total: 1,
};

function renderAs(role: TeamRole, maps: MapListResponse = list) {
  const calls = fakeApi({
    'GET /api/users/me': () => ({ status: 200, body: me(role) }),
    'GET /api/teams/t1/maps': () => ({ status: 200, body: maps }),
    'GET /api/teams/t1/maps/deleted': () => ({ status: 200, body: [{ id: 'm9', title: 'Old scan', deletedAt: '2026-12-01T09:00:00Z', deletedBy: { id: 'u1', displayName: 'Ada' }, restorableUntil: '2026-12-31T09:00:00Z' }] }),
  });
  renderWithProviders(
    <CurrentTeamProvider>
      <MapsPage />
    </CurrentTeamProvider>,
  );
  return calls;
}

describe('MapsPage', () => {
  it('lists title, tags, author and the summary counts of each map', async () => {
    renderAs('viewer');
    expect(await screen.findByRole('link', { name: 'Alkali atoms in laboratory fields' })).toBeTruthy();
    expect(screen.getByText('alkali')).toBeTruthy();
    expect(screen.getByText('1,200 bound')).toBeTruthy();
    expect(screen.getByText('800 unbound')).toBeTruthy();
    expect(screen.getByText(/by Ada · version 3/)).toBeTruthy();
  });

  it('shows a viewer no New map, no Import, no Recently deleted and no row actions', async () => {
    renderAs('viewer');
    await screen.findByRole('link', { name: 'Alkali atoms in laboratory fields' });
    expect(screen.queryByRole('button', { name: /New map/ })).toBeNull();
    expect(screen.queryByRole('button', { name: /Import a setup/ })).toBeNull();
    expect(screen.queryByRole('button', { name: /Recently deleted/ })).toBeNull();
    expect(screen.queryByRole('button', { name: /Actions for/ })).toBeNull();
  });

  it('gives an editor New map, Import and Duplicate/Delete, but not the bin', async () => {
    renderAs('editor');
    await screen.findByRole('link', { name: 'Alkali atoms in laboratory fields' });
    expect(screen.getByRole('button', { name: /New map/ })).toBeTruthy();
    expect(screen.getByRole('button', { name: /Import a setup/ })).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Recently deleted/ })).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'Actions for Alkali atoms in laboratory fields' }));
    expect(await screen.findByText('Duplicate…')).toBeTruthy();
    expect(screen.getByText('Delete')).toBeTruthy();
  });

  it('gives an owner the bin with its deleted maps and a Restore button', async () => {
    const calls = renderAs('owner');
    fireEvent.click(await screen.findByRole('button', { name: /Recently deleted/ }));
    const bin = await screen.findByRole('region', { name: 'Recently deleted' });
    expect(await within(bin).findByText('Old scan')).toBeTruthy();
    expect(within(bin).getByRole('button', { name: /Restore/ })).toBeTruthy();
    expect(calls.some((c) => c.path === '/api/teams/t1/maps/deleted')).toBe(true);
  });

  it('sends the search text to the server', async () => {
    renderAs('viewer');
    await screen.findByRole('link', { name: 'Alkali atoms in laboratory fields' });
    fireEvent.change(screen.getByRole('searchbox', { name: 'Search maps' }), { target: { value: 'sodium' } });
    await waitFor(() => expect(fetchUrls().some((u) => u.includes('search=sodium'))).toBe(true));
  });

  it('offers an editor of an empty team to create the first map', async () => {
    renderAs('editor', { items: [], total: 0 });
    expect(await screen.findByText('No maps in Magnetic anions yet')).toBeTruthy();
    expect(screen.getAllByRole('button', { name: /New map/ }).length).toBe(2);
  });
});

function fetchUrls(): string[] {
  return (globalThis.fetch as unknown as { mock: { calls: [RequestInfo | URL][] } }).mock.calls.map(([u]) => String(u));
}
