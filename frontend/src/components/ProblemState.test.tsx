import { afterEach, describe, expect, it, vi } from 'vitest';
import { configure, fireEvent, render, screen } from '@testing-library/react';
import { App as AntdApp } from 'antd';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider, createMemoryRouter } from 'react-router-dom';
import { defaultSetup, SETUP_PRESETS, type MapSetup } from '@fieldbound/shared';
import { useState } from 'react';
import { ApiError, session } from '../api/client';
import { CurrentTeamProvider } from '../state/currentTeam';
import { fakeApi, me, sampleMap } from '../features/maps/testApi';
import { jsonResponse } from '../test-utils';
import { MapPage } from '../pages/MapPage';
import { SetupPanel } from '../features/explorer/SetupPanel';
import type { SetupDraft } from '../features/explorer/setupDraft';
import { describeProblem } from './ProblemState';
import { ComputeStatus, type ComputeStatusProps } from '../features/explorer/ComputeStatus';
import { MapComputeError } from '../workers/engineContract';

// The explorer (workers, d3) is not what these tests are about: a stand-in shows the map was opened.
vi.mock('../features/explorer/ExplorerPage', () => ({ ExplorerPage: () => <div data-testid="explorer">explorer</div> }));
vi.mock('../features/export', () => ({ ExportMenu: () => <button>Export</button>, ImportSetupDialog: () => null }));

vi.setConfig({ testTimeout: 60_000 });
configure({ asyncUtilTimeout: 15_000 });

afterEach(() => {
  vi.restoreAllMocks();
  localStorage.clear();
});

describe('describeProblem', () => {
  it('tells a request that never reached the server (status 0) from a server that answered 503 or 500, and 404 from both', () => {
    expect(describeProblem(new ApiError(0, 'x', null), 'the maps')).toMatchObject({ kind: 'offline', title: 'Fieldbound cannot reach its server' });
    expect(describeProblem(new ApiError(0, 'x', null), 'the maps').detail).toMatch(/^The maps could not be loaded because the server did not answer/);
    expect(describeProblem(new ApiError(503, 'database_unavailable', null), 'this map')).toMatchObject({ kind: 'unavailable', title: 'The server is up, but cannot serve this right now' });
    expect(describeProblem(new ApiError(500, 'boom', null), 'this map')).toMatchObject({ kind: 'server', title: 'The server failed while loading this map' });
    expect(describeProblem(new ApiError(404, 'nope', null), 'this map')).toMatchObject({ kind: 'not-found', title: 'This map is not available' });
    expect(describeProblem(new Error('parse error in line 3'), 'the species')).toMatchObject({ kind: 'other', detail: 'parse error in line 3' });
  });
});

function renderMapPage() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  const router = createMemoryRouter(
    [
      { path: '/maps/:mapId', element: <MapPage /> },
      { path: '/maps', element: <div>all maps</div> },
    ],
    { initialEntries: ['/maps/m1'] },
  );
  render(
    <QueryClientProvider client={client}>
      <AntdApp>
        <CurrentTeamProvider>
          <RouterProvider router={router} />
        </CurrentTeamProvider>
      </AntdApp>
    </QueryClientProvider>,
  );
}

describe('MapPage error states', () => {
  it('explains a 503 in our words, and "Try again" opens the map once the server answers', async () => {
    let available = false;
    fakeApi({
      'GET /api/users/me': () => ({ status: 200, body: me('editor') }),
      'GET /api/maps/m1': () => (available ? { status: 200, body: sampleMap() } : { status: 503, body: { statusCode: 503, code: 'database_unavailable', message: 'The database is not reachable.' } }),
      'GET /api/teams/t1/species': () => ({ status: 200, body: { items: [] } }),
    });
    renderMapPage();
    expect(await screen.findByText('The server is up, but cannot serve this right now')).toBeTruthy();
    expect(screen.getByTestId('problem-state').getAttribute('data-kind')).toBe('unavailable');
    available = true;
    fireEvent.click(screen.getByRole('button', { name: 'Try again' }));
    expect(await screen.findByRole('heading', { name: sampleMap().title })).toBeTruthy();
    expect(screen.queryByTestId('problem-state')).toBeNull();
  });

  it('says the server cannot be reached when the request fails on the network, and offers the way back to the maps', async () => {
    session.set('test-access-token');
    vi.spyOn(globalThis, 'fetch').mockImplementation(async (input) => {
      const path = new URL(String(input), 'http://localhost').pathname;
      if (path === '/api/users/me') return jsonResponse(200, me('editor'));
      if (path === '/api/maps/m1') throw new TypeError('Failed to fetch');
      return jsonResponse(404, { statusCode: 404, message: 'no fake' });
    });
    renderMapPage();
    expect(await screen.findByText('Fieldbound cannot reach its server')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Back to the maps' }));
    expect(await screen.findByText('all maps')).toBeTruthy();
  });

  it('shows "not available" without a retry for a map of another team (404)', async () => {
    fakeApi({
      'GET /api/users/me': () => ({ status: 200, body: me('editor') }),
      'GET /api/maps/m1': () => ({ status: 404, body: { statusCode: 404, code: 'map_not_found', message: 'Map not found.' } }),
    });
    renderMapPage();
    expect(await screen.findByText('This map is not available')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Try again' })).toBeNull();
  });
});

function Panel({ initial, speciesOptions }: { initial: MapSetup; speciesOptions?: { value: string; label: string }[] }) {
  const [draft, setDraft] = useState<SetupDraft>(initial);
  return <SetupPanel draft={draft} issues={[]} needsCompute={false} onCompute={() => {}} onChange={setDraft} speciesOptions={speciesOptions} />;
}

describe('the magnet safety note and the species field in the setup', () => {
  it('shows the safety note for laboratory fields and not for neutron-star surfaces', () => {
    const lab = defaultSetup();
    const { unmount } = render(<Panel initial={lab} />);
    expect(screen.getByRole('note', { name: 'Safety near strong magnets' }).textContent).toMatch(/laboratory’s own safety rules/);
    unmount();
    const star = SETUP_PRESETS.find((p) => p.id === 'neutron-star')!;
    render(<Panel initial={{ ...lab, fieldAxis: star.fieldAxis, display: { ...lab.display, fieldUnit: star.fieldUnit } }} />);
    expect(screen.queryByRole('note', { name: 'Safety near strong magnets' })).toBeNull();
  });

  it('lists the species the overlay can mark and shows the ones the setup already marks', () => {
    render(<Panel initial={{ ...defaultSetup(), species: ['Mg'] }} speciesOptions={[{ value: 'Mg', label: 'Magnesium (Mg) · α = 71.2 a₀³' }, { value: 'Cd', label: 'Cadmium (Cd) · α = 46 a₀³' }]} />);
    const field = screen.getByRole('combobox', { name: 'Species on the map' });
    expect(field.closest('.ant-select')?.textContent).toContain('Magnesium (Mg)');
    expect(field.closest('.ant-select')?.textContent).not.toContain('Cadmium');
  });
});

describe('the computation’s failure message', () => {
  it('explains a crashed engine worker in our words and offers Retry', () => {
    const onRetry = vi.fn();
    const error = new MapComputeError('crash', 'The engine worker stopped unexpectedly.');
    // Only the fields the status box reads; the rest of the computation state is not its concern.
    const state = { status: 'error', progress: null, error } as unknown as ComputeStatusProps['state'];
    render(<ComputeStatus state={state} onCancel={() => {}} onRetry={onRetry} what="the map" />);
    const alert = screen.getByRole('alert');
    expect(alert.textContent).toContain('Could not compute the map');
    expect(alert.textContent).toContain('Retry starts the engine afresh in this tab; your setup and saved maps are not affected.');
    fireEvent.click(screen.getByRole('button', { name: 'Retry' }));
    expect(onRetry).toHaveBeenCalledTimes(1);
  });
});
