import { afterEach, describe, expect, it, vi } from 'vitest';
import { configure, fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { ViewingLinkView } from '@fieldbound/shared';
import { renderWithProviders } from '../../test-utils';
import { fakeApi } from './testApi';
import { ShareDialog } from './ShareDialog';

// A loaded machine renders antd slowly: allow time rather than fail on speed (no test here is about speed).
vi.setConfig({ testTimeout: 60_000 });
configure({ asyncUtilTimeout: 15_000 });

afterEach(() => {
  vi.restoreAllMocks();
});

const existing: ViewingLinkView = {
  id: 'l1',
  mapId: 'm1',
  createdBy: { id: 'u1', displayName: 'Ada' },
  createdAt: '2026-12-01T10:00:00Z',
  expiresAt: null,
  includePins: true,
  viewCount: 17,
  lastViewedAt: '2026-12-01T12:00:00Z',
  revokedAt: null,
};
const fresh: ViewingLinkView = { ...existing, id: 'l2', viewCount: 0, lastViewedAt: null, includePins: false, createdAt: '2026-12-02T01:00:00Z' };

function setup() {
  const calls = fakeApi({
    'GET /api/maps/m1/viewing-links': () => ({ status: 200, body: [existing] }),
    'POST /api/maps/m1/viewing-links': () => ({ status: 201, body: { link: fresh, token: 'tok-123', path: '/view/tok-123' } }),
    'DELETE /api/maps/m1/viewing-links/l1': () => ({ status: 204 }),
  });
  renderWithProviders(<ShareDialog mapId="m1" mapTitle="Alkali atoms" open onClose={() => undefined} origin="https://fieldbound.example" now={() => new Date('2026-12-02T01:30:00Z')} />);
  return calls;
}

describe('ShareDialog', () => {
  it('lists the existing links with their view counts, pins choice and status', async () => {
    setup();
    const row = (await screen.findByText('17')).closest('tr')!;
    expect(within(row).getByText(/with pins/)).toBeTruthy();
    expect(within(row).getByText('never')).toBeTruthy();
    expect(within(row).getByText('active')).toBeTruthy();
  });

  it('creates a link without pins, shows the full link once with a Copy link button, and adds it to the list', async () => {
    const calls = setup();
    await screen.findByText('17');
    fireEvent.click(screen.getByRole('checkbox', { name: 'Show pins' }));
    fireEvent.click(screen.getByRole('button', { name: /Create viewing link/ }));
    const field = (await screen.findByRole('textbox', { name: 'New viewing link' })) as HTMLInputElement;
    expect(field.value).toBe('https://fieldbound.example/view/tok-123');
    expect(calls.find((c) => c.method === 'POST')!.body).toEqual({ expiresAt: null, includePins: false });
    const writeText = vi.fn(async () => undefined);
    Object.defineProperty(navigator, 'clipboard', { value: { writeText }, configurable: true });
    fireEvent.click(screen.getByRole('button', { name: /Copy link/ }));
    await waitFor(() => expect(writeText).toHaveBeenCalledWith('https://fieldbound.example/view/tok-123'));
    expect(await screen.findByRole('button', { name: /Copied/ })).toBeTruthy();
    expect(screen.getAllByText(/without pins/).length).toBe(1);
  });

  it('revokes a link only after confirmation and marks it revoked', async () => {
    const calls = setup();
    await screen.findByText('17');
    fireEvent.click(screen.getByRole('button', { name: 'Revoke' }));
    expect(calls.some((c) => c.method === 'DELETE')).toBe(false);
    const confirm = await screen.findByText('Revoke this viewing link?');
    const pop = confirm.closest('.ant-popover')! as HTMLElement;
    fireEvent.click(within(pop).getByRole('button', { name: 'Revoke' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'DELETE' && c.path === '/api/maps/m1/viewing-links/l1')).toBe(true));
    expect(await screen.findByText(/^revoked/)).toBeTruthy();
  });
});
