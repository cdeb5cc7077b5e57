/// <reference lib="webworker" />
// The engine worker: imports only the engine (@fieldbound/shared) and comlink. One instance per pool slot.
import { expose, transfer } from 'comlink';
import {
  allocateCellMotionOutput, bindingMap, classifyCells, levels, validateMotionSettings,
  type BindingMapResult, type LevelsInput, type MapSetup, type MotionSettingsInput, type PhaseMapResult,
} from '@fieldbound/shared';
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
  async phaseMap(binding: BindingMapResult, input: MotionSettingsInput) {
    const t0 = performance.now();
    const settings = validateMotionSettings(input);
    const out = allocateCellMotionOutput(binding, settings);
    classifyCells(binding, settings, out);
    // (Written as an assertion so it fits the result contract with or without the per-state width flags.)
    const result = {
      engineVersion: binding.engineVersion,
      stateClass: out.stateClass,
      widthHartree: out.widthHartree,
      widthFlags: out.flags,
      survivors: out.survivors,
      fractions: out.fractions,
      elapsedMs: performance.now() - t0,
    } as PhaseMapResult;
    const buffers = [out.stateClass, out.widthHartree, out.flags, out.survivors, ...(out.fractions ? [out.fractions] : [])].map((a) => a.buffer as ArrayBuffer);
    return transfer(result, buffers);
  },
};

expose(api);
