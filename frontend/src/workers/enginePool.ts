import { wrap, proxy, transfer, type Remote } from 'comlink';
import type { BindingMapModel, BindingMapResult, MapProgress, MapSetup, PhaseMapResult } from '@fieldbound/shared';
import { MapComputeError, rowBuffers, toComputeError, type EngineWorkerApi, type MapRowsResult } from './engineContract';
import { joinRowResults, mergePhases, sliceRows } from './mergePhases';
import { bandSetup, splitRows } from './rowBands';

/** Share of a map's progress count given to preparing the engine's model. */
const PREPARE_SHARE = 0.4;

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
  /** Exact number of row bands (overrides bandsPerWorker). */
  bands?: number;
  /**
   * The quick first pass of a small (coarse) grid: one band per worker, each computed whole by its worker from a
   * model of its own field range (`computeRows`), joined on the page.
   */
  quick?: boolean;
  /** Accuracy of the engine's model (default: the engine's 1e-6); the quick first pass asks for less. */
  tolerance?: number;
  /** The setup whose ion motion classifies the rows (null or motion "none": binding energies only). */
  motionSetup?: MapSetup | null;
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

  /**
   * Computes the map of `setup` over the pool: one worker prepares the engine's model (`prepareMap`), then every
   * worker fills row bands from it (`evaluateRows`), each band classified for `motionSetup`'s ion motion by the
   * engine's `phaseMap`. Results are joined in row order, in a worker. Progress counts the preparation as 40 % of the
   * cells. A single band, or the quick pass (`quick`), is computed whole by each worker (`computeRows`).
   */
  async computeMap(setup: MapSetup, options: ComputeMapOptions): Promise<MapRowsResult> {
    const nField = setup.grid.nField;
    const total = setup.grid.nAlpha * nField;
    const bands = splitRows(nField, options.bands ?? this.size * (options.bandsPerWorker ?? 2));
    let prepared = 0;
    const done = new Array<number>(bands.length).fill(0);
    const report = () => {
      const value = Math.floor(PREPARE_SHARE * prepared + (1 - PREPARE_SHARE) * done.reduce((s, d) => s + d, 0));
      options.onProgress?.({ done: Math.min(total, value), total });
    };
    const motionSetup = options.motionSetup ?? null;
    if (options.quick || bands.length === 1) {
      // The quick pass: every worker computes a band of its own whole (model of the band's field range, rows,
      // classes) in one call — no model shared through the page, so nothing waits for a round trip. The bands are
      // small (a coarse grid) and joined here.
      const own = options.quick ? splitRows(nField, this.size) : bands;
      const doneOf = new Array<number>(own.length).fill(0);
      return this.runJob(options, async (submit) => {
        const parts = await Promise.all(
          own.map((band, k) =>
            submit<MapRowsResult>((api) =>
              api.computeRows(
                own.length === 1 ? setup : bandSetup(setup, band),
                options.tolerance,
                motionSetup,
                proxy((cells: number) => {
                  doneOf[k] = cells;
                  options.onProgress?.({ done: Math.min(total, doneOf.reduce((x, y) => x + y, 0)), total });
                }),
              ),
            ),
          ),
        );
        return joinRowResults(parts);
      });
    }
    return this.runJob(options, async (submit) => {
      const model = await submit<BindingMapModel>((api) =>
        api.prepareMap(
          setup,
          options.tolerance,
          proxy((cells: number) => {
            prepared = cells;
            report();
          }),
        ),
      );
      prepared = total;
      report();
      const parts = await Promise.all(
        bands.map((band, k) =>
          submit<MapRowsResult>((api) =>
            api.evaluateRows(
              model,
              band.start,
              band.end + 1,
              motionSetup,
              proxy((cells: number) => {
                done[k] = cells;
                report();
              }),
            ),
          ).then((part) => {
            done[k] = (band.end - band.start + 1) * setup.grid.nAlpha;
            report();
            return part;
          }),
        ),
      );
      // Joined in a worker (all are idle by now): the page only receives the joined map's buffers.
      return submit<MapRowsResult>((api) => api.joinRows(transfer(parts, rowBuffers(parts))));
    });
  }

  /**
   * Moving-ion classes of a computed map for `setup`'s ion motion, split by rows over the pool (the engine's
   * `phaseMap` per band). The binding energies are reused as they are: nothing of the binding map is recomputed.
   */
  async computePhase(setup: MapSetup, binding: BindingMapResult, options: RunOptions & { bandsPerWorker?: number }): Promise<PhaseMapResult> {
    const bands = splitRows(binding.nField, this.size * (options.bandsPerWorker ?? 2), 1);
    return this.runJob(options, async (submit) => {
      const parts = await Promise.all(
        bands.map((band) => {
          const rows = sliceRows(binding, band.start, band.end);
          return submit<PhaseMapResult>((api) => api.phaseRows(setup, transfer(rows, [rows.bindingHartree.buffer as ArrayBuffer, rows.counts.buffer as ArrayBuffer, rows.flags.buffer as ArrayBuffer])));
        }),
      );
      return mergePhases(parts, bands.map((b) => (b.end - b.start + 1) * binding.nAlpha), binding.mMax + 1, binding.levelsPerOrbital);
    });
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
