import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { PinDetail, PinView } from '@fieldbound/shared';
import { fakeApi } from '../maps/testApi';
import { renderWithProviders } from '../../test-utils';
import { PinThread } from './PinThread';
import { testPin } from './testPin';

afterEach(() => vi.restoreAllMocks());

const detail = (over: Partial<PinDetail> = {}): PinDetail => ({
  ...testPin({
    author: { id: 'u1', displayName: 'Maren Solberg' },
    geometry: { kind: 'point', at: { alpha: 290, fieldTesla: 45 } },
    title: 'Cs near 45 T',
    body: 'Bound here?\n<img src=x onerror="window.hacked=1"> <b>not bold</b>',
    category: 'candidate',
    version: 4,
    createdAt: '2026-12-01T10:00:00Z',
    updatedAt: '2026-12-01T10:00:00Z',
    replyCount: 1,
  }),
  replies: [{ id: 'r1', author: { id: 'u2', displayName: 'Kofi Mensah' }, body: 'Width is tiny at 4 K.', createdAt: '2026-12-01T11:00:00Z' }],
  ...over,
});
const viewOf = ({ replies: _r, ...p }: PinDetail): PinView => p;

describe('PinThread', () => {
  it('shows title, status, author, the body as plain text (markup stays text), and replies with author and time', async () => {
    fakeApi({ 'GET /api/pins/p1': () => ({ status: 200, body: detail() }) });
    const { container } = renderWithProviders(<PinThread mapId="m1" pinId="p1" canEdit={false} regionText="bound" />);
    expect(await screen.findByRole('heading', { name: 'Cs near 45 T' })).toBeTruthy();
    expect(screen.getByText('Open')).toBeTruthy();
    expect(screen.getByText(/Maren Solberg/)).toBeTruthy();
    expect(container.querySelector('img')).toBeNull();
    expect(container.querySelector('article b')).toBeNull();
    expect(screen.getByText(/<img src=x onerror="window.hacked=1"> <b>not bold<\/b>/)).toBeTruthy();
    const replies = screen.getByRole('list', { name: 'Replies' });
    expect(within(replies).getByText('Kofi Mensah')).toBeTruthy();
    expect(within(replies).getByText('Width is tiny at 4 K.')).toBeTruthy();
    expect(replies.querySelector('time')?.getAttribute('datetime')).toBe('2026-12-01T11:00:00Z');
    expect(screen.getByTestId('pin-region').textContent).toBe('Under it now: bound');
    // A viewer replies but neither resolves nor deletes.
    expect(screen.queryByRole('button', { name: /Resolve/ })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Delete pin' })).toBeNull();
  }, 30_000);

  it('sends a reply and shows it in the thread without reloading it', async () => {
    let gets = 0;
    const calls = fakeApi({
      'GET /api/pins/p1': () => (gets++, { status: 200, body: detail() }),
      'POST /api/pins/p1/replies': (body) => ({ status: 201, body: { id: 'r2', author: { id: 'u9', displayName: 'Tariq Bello' }, body: (body as { body: string }).body, createdAt: '2026-12-02T03:00:00Z' } }),
    });
    renderWithProviders(<PinThread mapId="m1" pinId="p1" canEdit={false} regionText={null} />);
    fireEvent.change(await screen.findByRole('textbox', { name: 'Reply' }), { target: { value: 'Seen it in the lab too.' } });
    fireEvent.click(screen.getByRole('button', { name: 'Reply' }));
    expect(await screen.findByText('Seen it in the lab too.')).toBeTruthy();
    expect(screen.getByText('Tariq Bello')).toBeTruthy();
    expect(screen.getByRole('heading', { name: '2 replies' })).toBeTruthy();
    expect(calls.filter((c) => c.method === 'POST')).toEqual([{ method: 'POST', path: '/api/pins/p1/replies', body: { body: 'Seen it in the lab too.' } }]);
    expect(gets).toBe(1);
  }, 30_000);

  it('resolves with the version it read; on 409 shows the current pin and applies the change again on top of it', async () => {
    let patches = 0;
    const calls = fakeApi({
      'GET /api/pins/p1': () => ({ status: 200, body: detail() }),
      'PATCH /api/pins/p1': (body) => {
        patches++;
        if (patches === 1) return { status: 409, body: { statusCode: 409, code: 'version_conflict', message: 'changed', current: viewOf(detail({ version: 5, category: 'check' })) } };
        return { status: 200, body: viewOf(detail({ version: 6, status: 'resolved', category: 'check', resolvedAt: '2026-12-02T03:00:00Z', resolvedBy: { id: 'u1', displayName: 'Maren Solberg' }, ...(body as object) })) };
      },
    });
    renderWithProviders(<PinThread mapId="m1" pinId="p1" canEdit regionText={null} />);
    fireEvent.click(await screen.findByRole('button', { name: /Resolve/ }));
    expect(await screen.findByText('Someone changed this pin meanwhile')).toBeTruthy();
    expect(screen.getByText(/category check \(version 5\)/)).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Apply mine again' }));
    await waitFor(() => expect(screen.getByText('Resolved')).toBeTruthy());
    expect(screen.getByRole('button', { name: /Reopen/ })).toBeTruthy();
    const sent = calls.filter((c) => c.method === 'PATCH').map((c) => c.body);
    expect(sent).toEqual([{ expectedVersion: 4, status: 'resolved' }, { expectedVersion: 5, status: 'resolved' }]);
  }, 30_000);

  it('shows the class-change notice and lets the reader note it', async () => {
    fakeApi({ 'GET /api/pins/p1': () => ({ status: 200, body: detail() }) });
    const onAcknowledge = vi.fn();
    renderWithProviders(<PinThread mapId="m1" pinId="p1" canEdit={false} regionText="resonance" notice="class changed: bound → resonance" onAcknowledge={onAcknowledge} />);
    expect(await screen.findByText('class changed: bound → resonance')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Noted' }));
    expect(onAcknowledge).toHaveBeenCalledTimes(1);
  }, 30_000);
});
