import { afterEach, describe, expect, it, vi } from 'vitest';
import { act, renderHook, waitFor } from '@testing-library/react';
import { defaultSetup, type MapSetup } from '@fieldbound/shared';
import { EnginePool } from '../../../workers/enginePool';
import { FakeEngineWorker, fakeEngineApi } from '../../../workers/fakeWorkers';
import { afterTwoFrames, createMapCaches, useMapComputation } from './useMapComputation';

let pool: EnginePool | null = null;
afterEach(() => pool?.dispose());

/** A pool of two fake engine workers that count every call by method. */
function countingPool(calls: Record<string, number>) {
  const api = fakeEngineApi();
  const count = <A extends unknown[], R>(name: string, f: (...args: A) => R) => (...args: A) => {
    calls[name] = (calls[name] ?? 0) + 1;
    return f(...args);
  };
  return new EnginePool({
    size: 2,
    createWorker: () => new FakeEngineWorker({ prepareMap: count('prepareMap', api.prepareMap), evaluateRows: count('evaluateRows', api.evaluateRows), phaseRows: count('phaseRows', api.phaseRows) }) as unknown as Worker,
  });
}

const base: MapSetup = { ...defaultSetup(), grid: { nAlpha: 4, nField: 8 }, motion: { kind: 'temperature', kelvin: 4 } };

describe('useMapComputation', () => {
  it('computes binding energies once: motion and τ changes rerun only phaseMap, display and contour changes nothing', { timeout: 30_000 }, async () => {
    const calls: Record<string, number> = {};
    pool = countingPool(calls);
    const caches = createMapCaches();
    const { result, rerender } = renderHook(({ setup }) => useMapComputation(pool, setup, caches, { timeoutMs: 5000 }), { initialProps: { setup: base } });
    await waitFor(() => expect(result.current.state.status).toBe('done'));
    expect(result.current.phase).not.toBeNull();
    expect(calls).toEqual({ prepareMap: 1, evaluateRows: 4 });

    // Another temperature and another observation time: classes again, binding energies reused.
    rerender({ setup: { ...base, motion: { kind: 'temperature', kelvin: 77 }, observationTimeSeconds: 2 } });
    await waitFor(() => expect(calls.phaseRows).toBe(4));
    await waitFor(() => expect(result.current.phase).not.toBeNull());
    expect(calls.prepareMap).toBe(1);
    expect(calls.evaluateRows).toBe(4);

    // Display, contour levels and the shown orbital: no engine call at all.
    rerender({ setup: { ...base, motion: { kind: 'temperature', kelvin: 77 }, observationTimeSeconds: 2, contours: { levelsKelvin: [0.5] }, display: { ...base.display, energyUnit: 'GHz', shown: { kind: 'survivors' } } } });
    await new Promise((r) => setTimeout(r, 50));
    expect(calls).toEqual({ prepareMap: 1, evaluateRows: 4, phaseRows: 4 });

    // Back to the first motion settings: the classes come from the cache.
    rerender({ setup: base });
    await waitFor(() => expect(result.current.phase).not.toBeNull());
    expect(calls).toEqual({ prepareMap: 1, evaluateRows: 4, phaseRows: 4 });

    // A fixed atom: no classes, nothing computed.
    rerender({ setup: { ...base, motion: { kind: 'none' } } });
    expect(result.current.phase).toBeNull();
    expect(result.current.motionWanted).toBe(false);
    expect(calls).toEqual({ prepareMap: 1, evaluateRows: 4, phaseRows: 4 });

    // A binding input (the cutoff): a new model and new rows.
    rerender({ setup: { ...base, shortRange: { ...base.shortRange, cutoffBohr: 3 } } });
    await waitFor(() => expect(calls.prepareMap).toBe(2));
  });
});

describe('useMapComputation status', () => {
  it('is computing from the render that asks for a new map, cancels to a "cancelled" error, and computes again after Retry', { timeout: 30_000 }, async () => {
    let hang = true;
    const api = fakeEngineApi();
    pool = new EnginePool({
      size: 1,
      createWorker: () =>
        new FakeEngineWorker({ ...api, prepareMap: (...args: Parameters<typeof api.prepareMap>) => (hang ? new Promise<never>(() => {}) : api.prepareMap(...args)) }) as unknown as Worker,
    });
    const caches = createMapCaches();
    const { result } = renderHook(() => useMapComputation(pool, base, caches, { timeoutMs: 5000 }));
    expect(result.current.state.status).toBe('computing');
    act(() => result.current.cancel());
    expect(result.current.state.status).toBe('error');
    expect(result.current.state.error?.kind).toBe('cancelled');
    hang = false;
    pool.restart();
    act(() => result.current.retry());
    expect(result.current.state.status).toBe('computing');
    await waitFor(() => expect(result.current.state.status).toBe('done'));
    expect(result.current.state.result?.nField).toBe(8);
  });
});

describe('afterTwoFrames (when the computation is handed to the workers)', () => {
  /** A controllable frame clock in place of the browser's. */
  function frames() {
    const queue = new Map<number, FrameRequestCallback>();
    let next = 1;
    vi.stubGlobal('requestAnimationFrame', (cb: FrameRequestCallback) => {
      queue.set(next, cb);
      return next++;
    });
    vi.stubGlobal('cancelAnimationFrame', (id: number) => queue.delete(id));
    return {
      tick() {
        const due = [...queue.values()];
        queue.clear();
        for (const cb of due) cb(performance.now());
      },
    };
  }
  afterEach(() => {
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('runs once, in a task after the second frame, not after the first', () => {
    vi.useFakeTimers();
    const clock = frames();
    const run = vi.fn();
    afterTwoFrames(run);
    clock.tick();
    vi.advanceTimersByTime(1);
    expect(run).not.toHaveBeenCalled();
    clock.tick();
    expect(run).not.toHaveBeenCalled(); // not inside the frame: in a task of its own
    vi.advanceTimersByTime(1);
    expect(run).toHaveBeenCalledTimes(1);
    vi.advanceTimersByTime(1000);
    expect(run).toHaveBeenCalledTimes(1);
  });

  it('runs after a bounded wait when no frames come (a page in a background tab), and never after cancel', () => {
    vi.useFakeTimers();
    frames(); // frames requested, never rendered
    const run = vi.fn();
    afterTwoFrames(run);
    vi.advanceTimersByTime(249);
    expect(run).not.toHaveBeenCalled();
    vi.advanceTimersByTime(1);
    expect(run).toHaveBeenCalledTimes(1);

    const clock = frames();
    const cancelled = vi.fn();
    const cancel = afterTwoFrames(cancelled);
    clock.tick();
    cancel();
    clock.tick();
    vi.advanceTimersByTime(1000);
    expect(cancelled).not.toHaveBeenCalled();
  });
});
