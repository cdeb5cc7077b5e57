/// <reference lib="webworker" />
// The engine worker: imports only the engine (@fieldbound/shared) and comlink. One instance per pool slot.
import { expose, transfer } from 'comlink';
import { bindingMap, levels, type BindingMapResult, type LevelsInput, type MapSetup } from '@fieldbound/shared';
import type { EngineWorkerApi } from './engineContract';

/** Progress messages at most every 50 ms: each one is a postMessage to the page. */
const PROGRESS_INTERVAL_MS = 50;

function buffersOf(r: BindingMapResult): ArrayBuffer[] {
  return [r.alphas, r.fieldsAu, r.bindingHartree, r.counts, r.flags].map((a) => a.buffer as ArrayBuffer);
}

const api: EngineWorkerApi = {
  async bindingMap(setup: MapSetup, onProgress: (cellsDone: number) => void) {
    let last = 0;
    const result = bindingMap(setup, {
      onProgress: (p) => {
        const now = performance.now();
        if (now - last >= PROGRESS_INTERVAL_MS || p.done === p.total) {
          last = now;
          void onProgress(p.done);
        }
      },
    });
    return transfer(result, buffersOf(result));
  },
  async levelsAt(input: LevelsInput) {
    return levels(input);
  },
};

expose(api);
