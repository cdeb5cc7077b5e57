import { afterEach, describe, expect, it } from 'vitest';
import { defaultSetup, type MapProgress } from '@fieldbound/shared';
import { EnginePool, defaultPoolSize } from './enginePool';
import { MapComputeError } from './engineContract';
import { FakeEngineWorker, ThrowingWorker, fakeBindingMap } from './fakeWorkers';

const setup = { ...defaultSetup(), grid: { nAlpha: 4, nField: 10 } };
let pool: EnginePool | null = null;
afterEach(() => pool?.dispose());

const working = () => new FakeEngineWorker({ bindingMap: fakeBindingMap(10) }) as unknown as Worker;

describe('defaultPoolSize', () => {
  it('uses one worker per core, at least 1 and at most 4', () => {
    expect(defaultPoolSize(undefined)).toBe(1);
    expect(defaultPoolSize(2)).toBe(2);
    expect(defaultPoolSize(16)).toBe(4);
  });
});

describe('EnginePool.computeMap', () => {
  it('splits 10 rows over 2 workers, joins them in order and reports every cell done', async () => {
    pool = new EnginePool({ createWorker: working, size: 2 });
    const progress: MapProgress[] = [];
    const result = await pool.computeMap(setup, { timeoutMs: 5000, onProgress: (p) => progress.push(p) });
    expect(result.nField).toBe(10);
    expect(Array.from(result.fieldsAu)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(result.bindingHartree[9 * 4]).toBeCloseTo(10e-9, 20);
    expect(progress.at(-1)).toEqual({ done: 40, total: 40 });
  });

  it('turns a worker that throws into a clear "stopped unexpectedly" error, and a retry on the same pool succeeds', async () => {
    const created: (ThrowingWorker | FakeEngineWorker)[] = [];
    pool = new EnginePool({
      size: 2,
      // The first two workers throw; every replacement works.
      createWorker: () => {
        const w = created.length < 2 ? new ThrowingWorker() : new FakeEngineWorker({ bindingMap: fakeBindingMap(10) });
        created.push(w);
        return w as unknown as Worker;
      },
    });
    const failure = await pool.computeMap(setup, { timeoutMs: 5000 }).catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(MapComputeError);
    expect((failure as MapComputeError).kind).toBe('crash');
    expect((failure as MapComputeError).message).toBe('The engine worker stopped unexpectedly: Uncaught RangeError: Maximum call stack size exceeded.');
    // Both broken workers were terminated and replaced.
    expect(created.slice(0, 2).every((w) => w.terminated)).toBe(true);
    expect(created).toHaveLength(4);
    const result = await pool.computeMap(setup, { timeoutMs: 5000 });
    expect(result.nField).toBe(10);
  });

  it('reports an error thrown inside the engine with its name and message', async () => {
    pool = new EnginePool({
      size: 1,
      createWorker: () =>
        new FakeEngineWorker({
          bindingMap: async () => {
            const e = new Error('alpha must be positive and finite, got NaN');
            e.name = 'EngineInputError';
            throw e;
          },
        }) as unknown as Worker,
    });
    const failure = (await pool.computeMap(setup, { timeoutMs: 5000 }).catch((e: unknown) => e)) as MapComputeError;
    expect(failure.kind).toBe('invalid-setup');
    expect(failure.message).toBe('The setup cannot be computed: alpha must be positive and finite, got NaN');
  });

  it('stops a computation that never answers after the timeout and terminates its worker', async () => {
    const created: FakeEngineWorker[] = [];
    pool = new EnginePool({
      size: 1,
      createWorker: () => {
        const w = new FakeEngineWorker({ bindingMap: () => new Promise(() => {}) });
        created.push(w);
        return w as unknown as Worker;
      },
    });
    const failure = (await pool.computeMap(setup, { timeoutMs: 30 }).catch((e: unknown) => e)) as MapComputeError;
    expect(failure.kind).toBe('timeout');
    expect(failure.message).toMatch(/took longer than 0 s and was stopped/);
    expect(created[0].terminated).toBe(true);
    expect(created).toHaveLength(2); // replaced by a fresh worker
  });

  it('cancels on abort: rejects at once with "Computation cancelled." and replaces the busy worker', async () => {
    const created: FakeEngineWorker[] = [];
    pool = new EnginePool({
      size: 1,
      createWorker: () => {
        const w = new FakeEngineWorker({ bindingMap: () => new Promise(() => {}) });
        created.push(w);
        return w as unknown as Worker;
      },
    });
    const controller = new AbortController();
    const pending = pool.computeMap(setup, { timeoutMs: 60_000, signal: controller.signal }).catch((e: unknown) => e);
    await new Promise((r) => setTimeout(r, 10));
    controller.abort();
    const failure = (await pending) as MapComputeError;
    expect(failure.kind).toBe('cancelled');
    expect(failure.message).toBe('Computation cancelled.');
    expect(created[0].terminated).toBe(true);
  });
});
