import { afterEach, describe, expect, it, vi } from 'vitest';
import { configure, screen } from '@testing-library/react';
import { Route, Routes } from 'react-router-dom';
import { defaultSetup } from '@fieldbound/shared';
import type { ExplorerPageProps } from '../features/explorer/ExplorerPage';
import { fakeApi } from '../features/maps/testApi';
import { renderWithProviders } from '../test-utils';
import { SharedMapPage } from './SharedMapPage';

vi.mock('../features/explorer/ExplorerPage', () => ({
  ExplorerPage: (props: ExplorerPageProps) => (
    <div data-testid="explorer">
      {props.readOnly ? 'read-only' : 'editable'} · save {props.onSaveSetup ? 'offered' : 'not offered'} · α max {props.initialSetup?.alphaAxis.max}
    </div>
  ),
}));
vi.setConfig({ testTimeout: 60_000 });
configure({ asyncUtilTimeout: 15_000 });

afterEach(() => {
  vi.restoreAllMocks();
});

function open(status: number, body: unknown) {
  const calls = fakeApi({ 'GET /api/view/tok-1': () => ({ status, body }) });
  renderWithProviders(
    <Routes>
      <Route path="/view/:token" element={<SharedMapPage />} />
    </Routes>,
    { path: '/view/tok-1' },
  );
  return calls;
}

describe('SharedMapPage', () => {
  it('opens the shared setup read-only, with no save, the caption "Read-only view" and the model caution', async () => {
    open(200, { title: 'Alkali atoms', description: 'For the seminar', setup: defaultSetup(), species: [], pins: null });
    expect((await screen.findByTestId('explorer')).textContent).toBe('read-only · save not offered · α max 1000');
    expect(screen.getByRole('heading', { name: 'Alkali atoms' })).toBeTruthy();
    expect(screen.getByText('Read-only view')).toBeTruthy();
    expect(screen.getByText(/model estimates/)).toBeTruthy();
  });

  it('explains an expired link (410)', async () => {
    open(410, { statusCode: 410, code: 'viewing_link_expired', message: 'This viewing link has expired.' });
    expect(await screen.findByText('This viewing link has expired')).toBeTruthy();
    expect(screen.queryByTestId('explorer')).toBeNull();
  });

  it('explains a revoked or unknown link (404)', async () => {
    open(404, { statusCode: 404, code: 'viewing_link_not_found', message: 'This viewing link does not exist or was revoked.' });
    expect(await screen.findByText('This viewing link does not work')).toBeTruthy();
    expect(screen.queryByTestId('explorer')).toBeNull();
  });
});
