/// <reference types="node" />
import { extname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { BindingMapModel } from '../map/bindingMapModel.js';
import type { BindingMapResult, PhaseMapResult } from '../map/mapTypes.js';
import type { MapSetup } from '../setup/mapSetup.js';
import { assembleBlocks, rowBlocks, shapeOfModel, type MapBlock } from './assembleBlocks.js';
import type { WorkerRequest } from './mapWorker.js';

/** Progress of `computeClassifiedMap`: the stage and its own count. */
export interface PoolProgress {
  stage: 'models' | 'cells';
  done: number;
  total: number;
}

export interface PoolOptions {
  threads: number;
  onProgress?: (p: PoolProgress) => void;
  signal?: AbortSignal;
}

type WorkerMessage =
  | { kind: 'progress'; done: number; total: number }
  | { kind: 'model'; model: BindingMapModel }
  | ({ kind: 'block' } & MapBlock)
  | { kind: 'error'; name: string; message: string; stack: string };

/**
 * A worker running mapWorker next to this file: mapWorker.js when built; when run from the TypeScript
 * source through tsx (tests, development) the worker first registers tsx itself, because Node 20 does
 * not pass the main thread's module hooks on to worker threads.
 */
function startWorker(): Worker {
  const ext = extname(fileURLToPath(import.meta.url)) || '.js';
  const url = new URL(`./mapWorker${ext}`, import.meta.url);
  if (ext !== '.ts') return new Worker(url);
  const api = import.meta.resolve('tsx/esm/api');
  return new Worker(`import(${JSON.stringify(api)}).then((tsx) => { tsx.register(); return import(${JSON.stringify(url.href)}); });`, { eval: true });
}

function abortError(): Error {
  const e = new Error('the computation was cancelled');
  e.name = 'AbortError';
  return e;
}

/**
 * The whole classified map of a (validated) setup on `threads` worker threads: one worker prepares the
 * interpolation model (prepareBindingMap), then every worker fills row blocks (evaluateBindingMapRows)
 * and classifies them (phaseMap); the blocks are stitched into the same BindingMapResult and
 * PhaseMapResult as bindingMap + phaseMap in one thread. Aborting `signal` terminates the workers and
 * rejects with an Error named 'AbortError'; a worker's error rejects with that error.
 */
export async function computeClassifiedMap(setup: MapSetup, options: PoolOptions): Promise<{ binding: BindingMapResult; phase: PhaseMapResult }> {
  const t0 = Date.now();
  const threads = Math.max(1, Math.min(options.threads, setup.grid.nField));
  const workers: Worker[] = [];
  const stopAll = (): void => {
    for (const w of workers) void w.terminate();
  };
  try {
    return await new Promise((resolve, reject) => {
      let settled = false;
      const fail = (e: Error): void => {
        if (settled) return;
        settled = true;
        reject(e);
      };
      if (options.signal?.aborted) return fail(abortError());
      options.signal?.addEventListener('abort', () => fail(abortError()), { once: true });

      const blocks: MapBlock[] = [];
      let queue: [number, number][] = [];
      const blockDone = new Map<Worker, number>();
      let cellsDone = 0;
      let cellTotal = 0;
      let reported = 0;
      const reportCells = (): void => {
        let running = 0;
        for (const v of blockDone.values()) running += v;
        // monotone: a block's last progress message and the block itself may arrive in either order
        reported = Math.max(reported, Math.min(cellTotal, cellsDone + running));
        options.onProgress?.({ stage: 'cells', done: reported, total: cellTotal });
      };
      let model: BindingMapModel | null = null;

      const dispatch = (w: Worker): void => {
        const next = queue.shift();
        if (next) w.postMessage({ kind: 'rows', rowStart: next[0], rowEnd: next[1] } satisfies WorkerRequest);
      };

      const onMessage = (w: Worker, msg: WorkerMessage): void => {
        if (settled) return;
        if (msg.kind === 'error') {
          const e = new Error(msg.message);
          e.name = msg.name;
          e.stack = msg.stack;
          return fail(e);
        }
        if (msg.kind === 'progress') {
          if (!model) options.onProgress?.({ stage: 'models', done: msg.done, total: msg.total });
          else {
            blockDone.set(w, msg.done);
            reportCells();
          }
          return;
        }
        if (msg.kind === 'model') {
          model = msg.model;
          const shape = shapeOfModel(model);
          cellTotal = shape.nAlpha * shape.nField;
          queue = rowBlocks(shape.nField, threads);
          options.onProgress?.({ stage: 'cells', done: 0, total: cellTotal });
          for (const x of workers) {
            x.postMessage({ kind: 'model', model } satisfies WorkerRequest);
            dispatch(x);
          }
          return;
        }
        blocks.push({ binding: msg.binding, phase: msg.phase });
        cellsDone += msg.binding.cellCount;
        blockDone.set(w, 0);
        reportCells();
        if (cellsDone >= cellTotal) {
          settled = true;
          try {
            resolve(assembleBlocks(shapeOfModel(model!), blocks, Date.now() - t0));
          } catch (e) {
            reject(e as Error);
          }
          return;
        }
        dispatch(w);
      };

      for (let k = 0; k < threads; k++) {
        const w = startWorker();
        workers.push(w);
        w.on('message', (msg: WorkerMessage) => onMessage(w, msg));
        w.on('error', (e) => fail(e));
        w.on('exit', (code) => {
          if (!settled && code !== 0) fail(new Error(`a worker thread stopped unexpectedly (exit code ${code})`));
        });
      }
      workers[0]!.postMessage({ kind: 'prepare', setup } satisfies WorkerRequest);
    });
  } finally {
    stopAll();
  }
}
