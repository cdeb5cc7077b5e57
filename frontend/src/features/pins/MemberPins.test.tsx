import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { PinView } from '@fieldbound/shared';
import { fakeApi } from '../maps/testApi';
import { renderWithProviders } from '../../test-utils';
import { useMemberPins } from './MemberPins';
import { testContext } from './testContext';
import { testPin } from './testPin';

afterEach(() => {
  vi.restoreAllMocks();
  localStorage.clear();
});

const pin = (over: Partial<PinView> = {}): PinView => testPin({ title: 'Edge of the m = 0 region', version: 2, ...over });

/** The member pins of map m1 with the overlay drawn on a 400 × 300 plot (α and B 1…10⁴ on log axes). */
function Harness({ canEdit }: { canEdit: boolean }) {
  const pins = useMemberPins({ mapId: 'm1', mapVersion: 1, canEdit });
  return (
    <div>
      {pins.headerButton}
      <div style={{ position: 'relative' }}>{pins.overlay(testContext())}</div>
      {pins.drawer}
    </div>
  );
}

describe('member pins', () => {
  it('moves a pin with the version it read; on 409 shows it where the other person left it and moves it again on request', async () => {
    let patches = 0;
    const calls = fakeApi({
      'GET /api/maps/m1/pins': () => ({ status: 200, body: [pin()] }),
      'PATCH /api/pins/p1': (body) => {
        patches++;
        if (patches === 1) return { status: 409, body: { statusCode: 409, code: 'version_conflict', message: 'changed', current: pin({ version: 3, geometry: { kind: 'point', at: { alpha: 10, fieldTesla: 10 } } }) } };
        return { status: 200, body: pin({ version: 4, geometry: (body as { geometry: PinView['geometry'] }).geometry }) };
      },
    });
    renderWithProviders(<Harness canEdit />);
    const marker = await screen.findByRole('button', { name: 'Edge of the m = 0 region' });
    fireEvent.pointerDown(marker, { button: 0, clientX: 200, clientY: 225 });
    fireEvent.pointerMove(marker, { clientX: 300, clientY: 225 });
    fireEvent.pointerUp(marker, { button: 0, clientX: 300, clientY: 225 });

    expect((await screen.findAllByText('Someone changed this pin meanwhile')).length).toBeGreaterThan(0);
    // Shown where the other person put it (α = 10 → x = 100) while the question is open.
    const where = () => /translate\(([-\d.]+),/.exec(document.querySelector('[data-pin-id="p1"] g[transform]')!.getAttribute('transform')!)![1];
    expect(Number(where())).toBeCloseTo(100, 6);
    fireEvent.click(screen.getByRole('button', { name: 'Move it to my place' }));
    await waitFor(() => expect(patches).toBe(2));
    await waitFor(() => expect(Number(where())).toBeCloseTo(300, 6));
    const sent = calls.filter((c) => c.method === 'PATCH').map((c) => c.body as { expectedVersion: number; geometry: { at: { alpha: number } } });
    expect(sent.map((b) => b.expectedVersion)).toEqual([2, 3]);
    expect(sent[1].geometry.at.alpha).toBeCloseTo(1000, 6);
  }, 30_000);

  it('gives a viewer the list and threads but no tools, and a click on a pin opens its thread', async () => {
    fakeApi({
      'GET /api/maps/m1/pins': () => ({ status: 200, body: [pin(), pin({ id: 'p2', title: 'Resolved one', status: 'resolved', category: 'check' })] }),
      'GET /api/pins/p1': () => ({ status: 200, body: { ...pin(), replies: [] } }),
    });
    renderWithProviders(<Harness canEdit={false} />);
    const marker = await screen.findByRole('button', { name: 'Edge of the m = 0 region' });
    expect(screen.queryByRole('toolbar', { name: 'Pin tools' })).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'Pins (2)' }));
    const table = await screen.findByRole('table');
    expect(within(table).getByText('Resolved one')).toBeTruthy();
    expect(within(table).getByText('check')).toBeTruthy();
    fireEvent.pointerDown(marker, { button: 0, clientX: 200, clientY: 225 });
    fireEvent.pointerUp(marker, { button: 0, clientX: 200, clientY: 225 });
    const thread = await screen.findByRole('article', { name: 'Thread: Edge of the m = 0 region' });
    expect(await within(thread).findByRole('textbox', { name: 'Reply' })).toBeTruthy();
    expect(within(thread).queryByRole('button', { name: /Resolve/ })).toBeNull();
  }, 30_000);
});
