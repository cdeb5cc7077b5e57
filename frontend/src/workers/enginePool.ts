import { wrap, proxy, type Remote } from 'comlink';
import type { BindingMapResult, MapSetup, MapProgress } from '@fieldbound/shared';
import { MapComputeError, toComputeError, type EngineWorkerApi } from './engineContract';
import { mergeBands } from './mergeBands';
import { bandSetup, splitRows } from './rowBands';

/** Workers for whole maps: one per core, at least 1, at most 4. */
export function defaultPoolSize(hardwareConcurrency: number | undefined): number {
  return Math.max(1, Math.min(4, Math.floor(hardwareConcurrency ?? 1) || 1));
}

export interface EnginePoolOptions {
  /** Makes one engine worker (the app passes the Vite worker constructor; tests pass a fake). */
  createWorker: () => Worker;
  size: number;
}

export interface RunOptions {
  /** Give up (and restart the workers involved) after this long. */
  timeoutMs: number;
  signal?: AbortSignal;
}

export interface ComputeMapOptions extends RunOptions {
  onProgress?: (progress: MapProgress) => void;
  /** Bands per worker: more bands balance uneven rows better. Default 2. */
  bandsPerWorker?: number;
}

interface Job {
  failed: MapComputeError | null;
  fail: (error: MapComputeError) => void;
}

interface Task {
  job: Job;
  run: (api: Remote<EngineWorkerApi>) => Promise<unknown>;
  resolve: (value: unknown) => void;
  reject: (error: MapComputeError) => void;
}

interface Slot {
  worker: Worker;
  api: Remote<EngineWorkerApi>;
  task: Task | null;
}

/**
 * A pool of engine workers. Splits a map by rows across the workers, reports progress in cells, and never
 * leaves a caller waiting: a worker that crashes (an `error` event), an engine error, a timeout or a cancel
 * each reject with a `MapComputeError`, and any worker that was busy is terminated and replaced.
 */
export class EnginePool {
  private readonly slots: Slot[] = [];
  private readonly queue: Task[] = [];
  private disposed = false;

  constructor(private readonly options: EnginePoolOptions) {
    for (let k = 0; k < Math.max(1, options.size); k++) this.slots.push(this.spawn());
  }

  get size(): number {
    return this.slots.length;
  }

  /** Computes the whole binding map of `setup`, split by rows over the pool. */
  async computeMap(setup: MapSetup, options: ComputeMapOptions): Promise<BindingMapResult> {
    const bands = splitRows(setup.grid.nField, this.size * (options.bandsPerWorker ?? 2));
    const total = setup.grid.nAlpha * setup.grid.nField;
    const done = new Array<number>(bands.length).fill(0);
    const report = () => options.onProgress?.({ done: done.reduce((s, d) => s + d, 0), total });
    return this.runJob(options, (submit) =>
      Promise.all(
        bands.map((band, k) =>
          submit<BindingMapResult>((api) =>
            api.bindingMap(
              bandSetup(setup, band),
              proxy((cells: number) => {
                done[k] = cells;
                report();
              }),
            ),
          ).then((result) => {
            done[k] = (band.end - band.start + 1) * setup.grid.nAlpha;
            report();
            return result;
          }),
        ),
      ).then(mergeBands),
    );
  }

  /** Runs one call on the next free worker (the probe), with the same timeout and failure rules. */
  run<T>(call: (api: Remote<EngineWorkerApi>) => Promise<T>, options: RunOptions): Promise<T> {
    return this.runJob(options, (submit) => submit(call));
  }

  /** Stops every computation: queued calls are dropped, busy workers terminated and replaced. */
  cancelAll(): void {
    const cancelled = new MapComputeError('cancelled', 'Computation cancelled.');
    for (const t of [...this.queue]) t.job.fail(cancelled);
    for (const s of this.slots) s.task?.job.fail(cancelled);
  }

  /** Stops everything and starts every worker afresh (used by Retry after a crash). */
  restart(): void {
    this.cancelAll();
    for (const slot of [...this.slots]) this.replace(slot);
  }

  dispose(): void {
    this.cancelAll();
    this.disposed = true;
    for (const s of this.slots) s.worker.terminate();
  }

  private runJob<T>(options: RunOptions, body: (submit: <U>(run: (api: Remote<EngineWorkerApi>) => Promise<U>) => Promise<U>) => Promise<T>): Promise<T> {
    if (this.disposed) return Promise.reject(new MapComputeError('cancelled', 'The engine has been shut down.'));
    return new Promise<T>((resolve, reject) => {
      let timer: ReturnType<typeof setTimeout> | undefined;
      const onAbort = () => job.fail(new MapComputeError('cancelled', 'Computation cancelled.'));
      const finish = () => {
        clearTimeout(timer);
        options.signal?.removeEventListener('abort', onAbort);
      };
      const job: Job = {
        failed: null,
        fail: (error) => {
          if (job.failed) return;
          job.failed = error;
          finish();
          // Drop this job's queued calls and stop the workers running its others.
          for (let k = this.queue.length - 1; k >= 0; k--) if (this.queue[k].job === job) this.queue.splice(k, 1);
          for (const slot of this.slots) {
            if (slot.task?.job === job) this.replace(slot);
          }
          reject(error);
          this.schedule();
        },
      };
      if (options.signal?.aborted) {
        reject(new MapComputeError('cancelled', 'Computation cancelled.'));
        return;
      }
      options.signal?.addEventListener('abort', onAbort);
      timer = setTimeout(
        () => job.fail(new MapComputeError('timeout', `The computation took longer than ${Math.round(options.timeoutMs / 1000)} s and was stopped. Try a coarser grid or fewer orbitals.`)),
        options.timeoutMs,
      );
      const submit = <U,>(run: (api: Remote<EngineWorkerApi>) => Promise<U>) =>
        new Promise<U>((res, rej) => {
          this.queue.push({ job, run, resolve: res as (v: unknown) => void, reject: rej });
          this.schedule();
        });
      body(submit).then(
        (value) => {
          if (job.failed) return;
          finish();
          resolve(value);
        },
        (error: unknown) => job.fail(toComputeError(error)),
      );
    });
  }

  private schedule(): void {
    for (const slot of this.slots) {
      if (slot.task || this.queue.length === 0) continue;
      const task = this.queue.shift()!;
      slot.task = task;
      task.run(slot.api).then(
        (value) => {
          if (slot.task !== task) return; // the slot was replaced meanwhile
          slot.task = null;
          task.resolve(value);
          this.schedule();
        },
        (error: unknown) => {
          if (slot.task !== task) return;
          slot.task = null;
          task.reject(toComputeError(error));
          this.schedule();
        },
      );
    }
  }

  private spawn(): Slot {
    const worker = this.options.createWorker();
    const slot: Slot = { worker, api: wrap<EngineWorkerApi>(worker), task: null };
    const crashed = (event: Event) => {
      if (this.slots.indexOf(slot) < 0 || slot.worker !== worker) return;
      const detail = event instanceof ErrorEvent && event.message ? `: ${event.message}` : '';
      const task = slot.task;
      this.replace(slot);
      const error = new MapComputeError('crash', `The engine worker stopped unexpectedly${detail}.`);
      if (task) task.job.fail(error);
      this.schedule();
    };
    worker.addEventListener('error', crashed);
    worker.addEventListener('messageerror', crashed);
    return slot;
  }

  /** Terminates a slot's worker and puts a fresh one in its place. */
  private replace(slot: Slot): void {
    const k = this.slots.indexOf(slot);
    slot.worker.terminate();
    slot.task = null;
    if (k >= 0 && !this.disposed) this.slots[k] = this.spawn();
  }
}
