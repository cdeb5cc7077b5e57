import { afterEach, describe, expect, it, vi } from 'vitest';
import { configure, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { App as AntdApp } from 'antd';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider, createMemoryRouter, useParams } from 'react-router-dom';
import type { MapSetup } from '@fieldbound/shared';
import type { ExplorerPageProps } from '../features/explorer/ExplorerPage';
import { CurrentTeamProvider } from '../state/currentTeam';
import { fakeApi, me, sampleMap } from '../features/maps/testApi';
import { MapPage } from './MapPage';

// The explorer (workers, d3) is another feature: here it is a stand-in that shows the setup it was opened with and
// lets the test change the setup or save from the setup panel, through the same props the real one uses.
vi.mock('../features/explorer/ExplorerPage', () => ({
  ExplorerPage: (props: ExplorerPageProps) => {
    const changed = (max: number): MapSetup => ({ ...props.initialSetup!, alphaAxis: { ...props.initialSetup!.alphaAxis, max } });
    return (
      <div>
        <span data-testid="opened-with">α max {props.initialSetup?.alphaAxis.max}</span>
        <span data-testid="read-only">{props.readOnly ? 'read-only' : 'editable'}</span>
        <button onClick={() => props.onSetupChange?.(changed(500))}>Edit the setup</button>
        {props.onSaveSetup && <button onClick={() => props.onSaveSetup!(changed(500))}>{props.saveLabel}</button>}
      </div>
    );
  },
}));
vi.mock('../features/export', () => ({ ExportMenu: () => <button>Export</button>, ImportSetupDialog: () => null }));

// A loaded machine renders antd slowly: allow time rather than fail on speed (no test here is about speed).
vi.setConfig({ testTimeout: 60_000 });
configure({ asyncUtilTimeout: 15_000 });

afterEach(() => {
  vi.restoreAllMocks();
  localStorage.clear();
});

/** The real page for m1; the copy (m2) only shows that it was opened. */
function MapOrCopy() {
  const { mapId } = useParams();
  return mapId === 'm1' ? <MapPage /> : <div>map page of {mapId}</div>;
}

function renderAt(path: string) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  const router = createMemoryRouter(
    [
      { path: '/maps/:mapId', element: <MapOrCopy /> },
      { path: '/maps', element: <div>all maps</div> },
    ],
    { initialEntries: [path] },
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
  return { client, router };
}

const base = sampleMap();
const theirs = sampleMap({ version: 4, title: 'Alkali atoms, wider range', updatedBy: { id: 'u2', displayName: 'Bea' }, setup: { ...base.setup, alphaAxis: { ...base.setup.alphaAxis, max: 2000 } } });
const conflict = { status: 409, body: { statusCode: 409, code: 'version_conflict', message: 'The map was changed.', current: theirs } };

async function editAndSave() {
  await screen.findByRole('heading', { name: base.title });
  fireEvent.click(screen.getByRole('button', { name: 'Edit the setup' }));
  expect((await screen.findByTestId('save-state')).textContent).toContain('Unsaved changes');
  fireEvent.click(screen.getByRole('button', { name: /Save$/ }));
}

describe('MapPage saving', () => {
  it('sends the edited setup with the version it was based on and shows "Saved" with the new version', async () => {
    const calls = fakeApi({
      'GET /api/users/me': () => ({ status: 200, body: me('editor') }),
      'GET /api/maps/m1': () => ({ status: 200, body: base }),
      'GET /api/teams/t1/species': () => ({ status: 200, body: { items: [] } }),
      'PATCH /api/maps/m1': (body) => ({ status: 200, body: { ...base, version: 4, setup: (body as { setup: MapSetup }).setup } }),
    });
    renderAt('/maps/m1');
    await editAndSave();
    await waitFor(() => expect(screen.getByTestId('save-state').textContent).toContain('Saved · version 4'));
    const patch = calls.find((c) => c.method === 'PATCH')!;
    expect(patch.body).toMatchObject({ expectedVersion: 3, setup: { alphaAxis: { max: 500 } } });
  });

  it('on 409 shows the server’s version (number, author) and "Reload theirs" reopens the explorer with their setup', async () => {
    fakeApi({
      'GET /api/users/me': () => ({ status: 200, body: me('editor') }),
      'GET /api/maps/m1': () => ({ status: 200, body: base }),
      'GET /api/teams/t1/species': () => ({ status: 200, body: { items: [] } }),
      'PATCH /api/maps/m1': () => conflict,
    });
    renderAt('/maps/m1');
    expect((await screen.findByTestId('opened-with')).textContent).toBe('α max 1000');
    await editAndSave();
    const dialog = await screen.findByRole('dialog', { name: 'This map was saved by someone else' });
    expect(within(dialog).getByText('Bea')).toBeTruthy();
    expect(within(dialog).getByText('Alkali atoms, wider range')).toBeTruthy();
    // The optimistic edit was rolled back: the page still says the edit is unsaved, on version 3.
    expect(screen.getByTestId('save-state').textContent).toContain('Unsaved changes · version 3');
    fireEvent.click(within(dialog).getByRole('button', { name: 'Reload theirs' }));
    await waitFor(() => expect(screen.getByTestId('opened-with').textContent).toBe('α max 2000'));
    expect(screen.getByTestId('save-state').textContent).toContain('Saved · version 4');
    expect(screen.getByRole('heading', { name: 'Alkali atoms, wider range' })).toBeTruthy();
  });

  it('on 409 "Keep mine as a copy" duplicates the map, saves my setup into the copy and opens it', async () => {
    const copy = sampleMap({ id: 'm2', version: 1, title: `${base.title} (my copy)` });
    const calls = fakeApi({
      'GET /api/users/me': () => ({ status: 200, body: me('editor') }),
      'GET /api/maps/m1': () => ({ status: 200, body: base }),
      'GET /api/teams/t1/species': () => ({ status: 200, body: { items: [] } }),
      'PATCH /api/maps/m1': () => conflict,
      'POST /api/maps/m1/duplicate': () => ({ status: 201, body: copy }),
      'PATCH /api/maps/m2': (body) => ({ status: 200, body: { ...copy, version: 2, setup: (body as { setup: MapSetup }).setup } }),
    });
    const { router } = renderAt('/maps/m1');
    await editAndSave();
    const dialog = await screen.findByRole('dialog', { name: 'This map was saved by someone else' });
    fireEvent.click(within(dialog).getByRole('button', { name: 'Keep mine as a copy' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/maps/m2'));
    expect(await screen.findByText('map page of m2')).toBeTruthy();
    expect(calls.find((c) => c.method === 'POST' && c.path === '/api/maps/m1/duplicate')!.body).toEqual({ title: `${base.title} (my copy)` });
    expect(calls.find((c) => c.method === 'PATCH' && c.path === '/api/maps/m2')!.body).toMatchObject({ expectedVersion: 1, setup: { alphaAxis: { max: 500 } } });
  });

  it('asks before leaving with unsaved changes and stays when told to', async () => {
    fakeApi({
      'GET /api/users/me': () => ({ status: 200, body: me('editor') }),
      'GET /api/maps/m1': () => ({ status: 200, body: base }),
      'GET /api/teams/t1/species': () => ({ status: 200, body: { items: [] } }),
    });
    const { router } = renderAt('/maps/m1');
    await screen.findByRole('heading', { name: base.title });
    fireEvent.click(screen.getByRole('button', { name: 'Edit the setup' }));
    await screen.findByText(/Unsaved changes/);
    fireEvent.click(screen.getByRole('link', { name: 'All maps' }));
    const ask = await screen.findByRole('dialog', { name: 'Leave without saving?' });
    fireEvent.click(within(ask).getByRole('button', { name: 'Stay' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/maps/m1'));
  });

  it('gives a viewer no Save, no Share and no renaming, and says the map is read-only for them', async () => {
    fakeApi({
      'GET /api/users/me': () => ({ status: 200, body: me('viewer') }),
      'GET /api/maps/m1': () => ({ status: 200, body: base }),
      'GET /api/teams/t1/species': () => ({ status: 200, body: { items: [] } }),
    });
    renderAt('/maps/m1');
    expect((await screen.findByTestId('save-state')).textContent).toContain('Read only: you are a viewer');
    expect(screen.queryByRole('button', { name: /Save/ })).toBeNull();
    expect(screen.queryByRole('button', { name: /Share/ })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Rename' })).toBeNull();
  });
});
