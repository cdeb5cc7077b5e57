import { describe, expect, it } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import { MemoryRouter, useLocation } from 'react-router-dom';
import { App as AntdApp } from 'antd';
import { defaultSetup } from '@fieldbound/shared';
import { ExplorerPage } from './ExplorerPage';
import { FakeEngineWorker, ThrowingWorker, fakeEngineApi } from '../../workers/fakeWorkers';
import { geometryFromFields } from '../map-render/mapGeometry';

// A 4 × 4 map (no coarse pass) so the fake engine answers at once.
const setup = { ...defaultSetup(), grid: { nAlpha: 4, nField: 4 } };
const contourWorker = () => new FakeEngineWorker({ geometry: geometryFromFields }) as unknown as Worker;

describe('ExplorerPage when the engine worker fails', () => {
  it('shows a clear message with Retry (no endless spinner), and Retry computes the map with fresh workers', { timeout: 30_000 }, async () => {
    let broken = true;
    const engineWorker = () => (broken ? new ThrowingWorker() : new FakeEngineWorker(fakeEngineApi())) as unknown as Worker;
    render(
      <MemoryRouter initialEntries={['/explore']}>
        <AntdApp>
          <ExplorerPage initialSetup={setup} createEngineWorker={engineWorker} createContourWorker={contourWorker} />
        </AntdApp>
      </MemoryRouter>,
    );
    expect(await screen.findByText('Could not compute the map', {}, { timeout: 10_000 })).toBeTruthy();
    expect(screen.getByText(/^The engine worker stopped unexpectedly: Uncaught RangeError: Maximum call stack size exceeded\. Retry starts the engine afresh/)).toBeTruthy();
    expect(screen.queryByRole('status', { name: 'Computation progress' })).toBeNull();

    broken = false;
    fireEvent.click(screen.getByRole('button', { name: 'Retry' }));
    expect(await screen.findByText(/computed in \d+\.\d s/, {}, { timeout: 10_000 })).toBeTruthy();
    expect(screen.queryByText('Could not compute the map')).toBeNull();
  });
});

/** The address as the router holds it. */
function Address() {
  const location = useLocation();
  return <output aria-label="address">{location.search}</output>;
}

describe('ExplorerPage view state in the address', () => {
  const open = (entry: string) =>
    render(
      <MemoryRouter initialEntries={[entry]}>
        <AntdApp>
          <ExplorerPage initialSetup={setup} createEngineWorker={() => new FakeEngineWorker(fakeEngineApi()) as unknown as Worker} createContourWorker={contourWorker} />
          <Address />
        </AntdApp>
      </MemoryRouter>,
    );

  it("opening a map leaves its address alone: the map's own shown quantity and whole window are not added", { timeout: 30_000 }, async () => {
    open('/explore?team=7');
    expect(await screen.findByText(/computed in \d+\.\d s/, {}, { timeout: 10_000 })).toBeTruthy();
    expect(screen.getByLabelText('address').textContent).toBe('?team=7');
  });

  it('an address that names the shown quantity keeps it, and a probe point is added when one is probed', { timeout: 30_000 }, async () => {
    open('/explore?show=survivors&probe=20%2C5');
    expect(await screen.findByText(/computed in \d+\.\d s/, {}, { timeout: 10_000 })).toBeTruthy();
    const address = new URLSearchParams(screen.getByLabelText('address').textContent ?? '');
    expect(address.get('show')).toBe('survivors');
    expect(address.get('probe')).toBe('20,5');
    expect(address.get('alpha')).toBeNull();
  });
});
