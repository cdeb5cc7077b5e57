import { afterEach, describe, expect, it } from 'vitest';
import { STATE_CLASS, defaultSetup, type BindingMapResult, type MapProgress, type MapSetup } from '@fieldbound/shared';
import { EnginePool, defaultPoolSize } from './enginePool';
import { MapComputeError, type MapRowsResult } from './engineContract';
import { joinRowResults } from './mergePhases';
import { FakeEngineWorker, ThrowingWorker, fakeEngineApi } from './fakeWorkers';

const setup = { ...defaultSetup(), grid: { nAlpha: 4, nField: 10 } };
let pool: EnginePool | null = null;
afterEach(() => pool?.dispose());

const working = () => new FakeEngineWorker(fakeEngineApi()) as unknown as Worker;

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
    const { binding: result, phase } = await pool.computeMap(setup, { timeoutMs: 5000, onProgress: (p) => progress.push(p) });
    expect(phase).toBeNull(); // the atom is held fixed
    expect(result.nField).toBe(10);
    expect(Array.from(result.fieldsAu)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(result.bindingHartree[9 * 4]).toBeCloseTo(10e-9, 20);
    expect(progress.at(-1)).toEqual({ done: 40, total: 40 });
  });

  it('turns a worker that throws into a clear "stopped unexpectedly" error, and a retry on the same pool succeeds', async () => {
    const created: (ThrowingWorker | FakeEngineWorker)[] = [];
    pool = new EnginePool({
      size: 2,
      // The first worker throws; the second and every replacement work.
      createWorker: () => {
        const w = created.length < 1 ? new ThrowingWorker() : new FakeEngineWorker(fakeEngineApi());
        created.push(w);
        return w as unknown as Worker;
      },
    });
    const failure = await pool.computeMap(setup, { timeoutMs: 5000 }).catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(MapComputeError);
    expect((failure as MapComputeError).kind).toBe('crash');
    expect((failure as MapComputeError).message).toBe('The engine worker stopped unexpectedly: Uncaught RangeError: Maximum call stack size exceeded.');
    // The broken worker (it got the first call) was terminated and replaced.
    expect(created[0].terminated).toBe(true);
    expect(created).toHaveLength(3);
    const { binding: result } = await pool.computeMap(setup, { timeoutMs: 5000 });
    expect(result.nField).toBe(10);
  });

  it('reports an error thrown inside the engine with its name and message', async () => {
    pool = new EnginePool({
      size: 1,
      createWorker: () =>
        new FakeEngineWorker({
          prepareMap: async () => {
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
        const w = new FakeEngineWorker({ prepareMap: () => new Promise(() => {}) });
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
        const w = new FakeEngineWorker({ prepareMap: () => new Promise(() => {}) });
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

/** Counts the calls of each method of a fake engine (shared by every worker of a pool). */
function countingApi(calls: Record<string, number>) {
  const api = fakeEngineApi();
  const count = <A extends unknown[], R>(name: string, f: (...args: A) => R) => (...args: A) => {
    calls[name] = (calls[name] ?? 0) + 1;
    return f(...args);
  };
  return { prepareMap: count('prepareMap', api.prepareMap), evaluateRows: count('evaluateRows', api.evaluateRows), phaseRows: count('phaseRows', api.phaseRows) };
}

describe('EnginePool: the quick pass and the join', () => {
  it('computes a single band (the quick first pass) in one computeRows call, with its tolerance and motion', async () => {
    const seen: { tolerance: number | undefined; motion: boolean }[] = [];
    const api = fakeEngineApi();
    // No prepareMap / evaluateRows of its own: a split computation on this worker would fail.
    const quickOnly = {
      computeRows: async (s: MapSetup, tolerance: number | undefined, motionSetup: MapSetup | null, onProgress: (cells: number) => void) => {
        seen.push({ tolerance, motion: motionSetup !== null });
        const model = await api.prepareMap(s, tolerance, () => {});
        return api.evaluateRows(model, 0, s.grid.nField, motionSetup, onProgress);
      },
    };
    pool = new EnginePool({ createWorker: () => new FakeEngineWorker(quickOnly) as unknown as Worker, size: 2 });
    const moving: MapSetup = { ...setup, motion: { kind: 'temperature', kelvin: 4 } };
    const progress: MapProgress[] = [];
    const { binding, phase } = await pool.computeMap(moving, { timeoutMs: 5000, bands: 1, tolerance: 1e-3, motionSetup: moving, onProgress: (p) => progress.push(p) });
    expect(seen).toEqual([{ tolerance: 1e-3, motion: true }]);
    expect(binding.nField).toBe(10);
    expect(phase!.survivors).toHaveLength(40);
    expect(progress.at(-1)).toEqual({ done: 40, total: 40 });
  });

  it('splits the quick pass over the workers: each computes a band of rows whole from its own setup, joined in row order', async () => {
    const seen: MapSetup[] = [];
    const api = fakeEngineApi();
    const quickOnly = {
      computeRows: async (s: MapSetup, tolerance: number | undefined, motionSetup: MapSetup | null, onProgress: (cells: number) => void) => {
        seen.push(s);
        const model = await api.prepareMap(s, tolerance, () => {});
        return api.evaluateRows(model, 0, s.grid.nField, motionSetup, onProgress);
      },
    };
    pool = new EnginePool({ createWorker: () => new FakeEngineWorker(quickOnly) as unknown as Worker, size: 2 });
    const wide: MapSetup = { ...setup, fieldAxis: { ...setup.fieldAxis, scale: 'linear', min: 1, max: 10 } };
    const { binding } = await pool.computeMap(wide, { timeoutMs: 5000, quick: true, tolerance: 1e-3 });
    // Rows 0…4 (1…5 T) and 5…9 (6…10 T): the same rows as the whole map's.
    expect(seen.map((s) => [s.fieldAxis.min, s.fieldAxis.max, s.grid.nField])).toEqual([[1, 5, 5], [6, 10, 5]]);
    expect(binding.nField).toBe(10);
    // The fake engine numbers each band's rows from 0: the join keeps the lower band first.
    expect(Array.from(binding.fieldsAu)).toEqual([0, 1, 2, 3, 4, 0, 1, 2, 3, 4]);
  });

  it('joins the row bands in a worker (one joinRows call) into the same map as joined in row order', async () => {
    const calls: Record<string, number> = {};
    const counted = countingApi(calls);
    pool = new EnginePool({
      size: 2,
      createWorker: () =>
        new FakeEngineWorker({
          ...counted,
          joinRows: async (parts: MapRowsResult[]) => {
            calls.joinRows = (calls.joinRows ?? 0) + 1;
            return joinRowResults(parts);
          },
        }) as unknown as Worker,
    });
    const { binding } = await pool.computeMap(setup, { timeoutMs: 5000 });
    expect(calls).toEqual({ prepareMap: 1, evaluateRows: 4, joinRows: 1 });
    expect(Array.from(binding.fieldsAu)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    for (let j = 0; j < 10; j++) expect(binding.bindingHartree[j * 4]).toBeCloseTo((j + 1) * 1e-9, 20);
  });
});

describe('EnginePool with ion motion', () => {
  const moving: MapSetup = { ...setup, motion: { kind: 'temperature', kelvin: 4 } };

  it('prepares the model once, fills 4 bands from it and joins their classes in row order', async () => {
    const calls: Record<string, number> = {};
    pool = new EnginePool({ createWorker: () => new FakeEngineWorker(countingApi(calls)) as unknown as Worker, size: 2 });
    const { binding, phase } = await pool.computeMap(moving, { timeoutMs: 5000, motionSetup: moving });
    expect(calls).toEqual({ prepareMap: 1, evaluateRows: 4 });
    // Fake classes: rows 4…9 (ε ≥ 5 × 10⁻⁹) bound, rows 0…3 resonances; 4 columns per row.
    expect(Array.from(phase!.survivors)).toEqual(Array.from({ length: 40 }, (_, c) => (Math.floor(c / 4) >= 4 ? 1 : 0)));
    expect(phase!.stateClass[3 * 4]).toBe(STATE_CLASS.RESONANCE);
    expect(phase!.stateClass[4 * 4]).toBe(STATE_CLASS.BOUND);
    expect(binding.nField).toBe(10);
  });

  it('reclassifies a computed map for new motion settings with phaseRows only (no preparation, no binding rows)', async () => {
    const calls: Record<string, number> = {};
    pool = new EnginePool({ createWorker: () => new FakeEngineWorker(countingApi(calls)) as unknown as Worker, size: 2 });
    const { binding } = await pool.computeMap(setup, { timeoutMs: 5000 });
    const before: BindingMapResult = { ...binding, bindingHartree: binding.bindingHartree.slice() };
    const phase = await pool.computePhase(moving, binding, { timeoutMs: 5000 });
    expect(calls).toEqual({ prepareMap: 1, evaluateRows: 4, phaseRows: 4 });
    expect(phase.survivors).toHaveLength(40);
    expect(phase.survivors[39]).toBe(1);
    expect(phase.survivors[0]).toBe(0);
    // The map handed in is left intact (its bands were copied before they were sent).
    expect(Array.from(binding.bindingHartree)).toEqual(Array.from(before.bindingHartree));
  });
});
