// Test doubles for engine workers (tests only; the app always runs the real engine.worker.ts).
import { expose } from 'comlink';
import { STATE_CLASS, type BindingMapModel, type BindingMapResult, type MapSetup, type PhaseMapResult } from '@fieldbound/shared';
import type { EngineWorkerApi } from './engineContract';
import { joinRowResults } from './mergePhases';

/**
 * A Worker stand-in that serves `api` over a MessageChannel with comlink, as the real worker does.
 * `terminate()` closes the channel, so calls in flight never answer (like a real terminated worker).
 */
export class FakeEngineWorker extends EventTarget {
  private readonly port: MessagePort;
  terminated = false;
  constructor(api: Partial<EngineWorkerApi> | object) {
    super();
    const channel = new MessageChannel();
    this.port = channel.port1;
    expose({ ...composedCalls(api as Partial<EngineWorkerApi>), ...api }, channel.port2);
    this.port.addEventListener('message', (event) => this.dispatchEvent(new MessageEvent('message', { data: (event as MessageEvent).data })));
    this.port.start();
  }
  postMessage(message: unknown, transfer?: Transferable[]): void {
    if (!this.terminated) this.port.postMessage(message, transfer ?? []);
  }
  terminate(): void {
    this.terminated = true;
    this.port.close();
  }
}

/**
 * The engine worker's composite calls built from an engine double's own calls, as the real worker composes the
 * engine's: `computeRows` = `prepareMap` + `evaluateRows` of every row; `joinRows` = the real join.
 */
function composedCalls(api: Partial<EngineWorkerApi>): Pick<EngineWorkerApi, 'computeRows' | 'joinRows'> {
  return {
    async computeRows(setup, tolerance, motionSetup, onProgress) {
      if (!api.prepareMap || !api.evaluateRows) throw new Error('this engine double has no prepareMap / evaluateRows');
      const model = await api.prepareMap(setup, tolerance, () => {});
      return api.evaluateRows(model, 0, setup.grid.nField, motionSetup, onProgress);
    },
    async joinRows(parts) {
      return joinRowResults(parts);
    },
  };
}

/** A Worker stand-in whose script throws: every message it receives raises an `error` event, as an uncaught exception would. */
export class ThrowingWorker extends EventTarget {
  terminated = false;
  postMessage(): void {
    setTimeout(() => {
      if (!this.terminated) this.dispatchEvent(new ErrorEvent('error', { message: 'Uncaught RangeError: Maximum call stack size exceeded' }));
    }, 0);
  }
  terminate(): void {
    this.terminated = true;
  }
}

/**
 * A tiny deterministic "engine" for pool and page tests: ε = (row + 1) · 10⁻⁹ hartree for m = 0 in every cell,
 * m ≥ 1 unbound. The fake model is just the setup; rows are those of the setup's own grid. Ion motion: every state
 * with ε ≥ 5 · 10⁻⁹ hartree is bound, the others are resonances (enough to see which rows were classified).
 */
export function fakeEngineApi(options: { prepareDelayMs?: number } = {}): Pick<EngineWorkerApi, 'prepareMap' | 'evaluateRows' | 'phaseRows'> {
  return {
    async prepareMap(setup: MapSetup, _tolerance: number | undefined, onProgress: (cells: number) => void) {
      if (options.prepareDelayMs) await new Promise((r) => setTimeout(r, options.prepareDelayMs));
      await onProgress(setup.grid.nAlpha * setup.grid.nField);
      return { setup } as unknown as BindingMapModel;
    },
    async evaluateRows(model: BindingMapModel, rowStart: number, rowEnd: number, motionSetup: MapSetup | null, onProgress: (cells: number) => void) {
      const binding = fakeBand(model.setup, rowStart, rowEnd - 1, onProgress);
      return { binding, phase: motionSetup && motionSetup.motion.kind !== 'none' ? fakePhase(binding) : null };
    },
    async phaseRows(_setup: MapSetup, binding: BindingMapResult) {
      return fakePhase(binding);
    },
  };
}

function fakePhase(binding: BindingMapResult): PhaseMapResult {
  const n = binding.bindingHartree.length;
  const stateClass = new Uint8Array(n);
  const survivors = new Uint16Array(binding.cellCount);
  for (let k = 0; k < n; k++) {
    const e = binding.bindingHartree[k];
    stateClass[k] = e <= 0 ? STATE_CLASS.NONE : e >= 5e-9 ? STATE_CLASS.BOUND : STATE_CLASS.RESONANCE;
    if (stateClass[k] === STATE_CLASS.BOUND) survivors[k % binding.cellCount]++;
  }
  return { engineVersion: 'fake', stateClass, widthHartree: new Float64Array(n), widthFlags: new Uint8Array(n), survivors, fractions: null, elapsedMs: 1 };
}

function fakeBand(setup: MapSetup, start: number, end: number, onProgress: (cells: number) => void): BindingMapResult {
  const nAlpha = setup.grid.nAlpha;
  const nField = end - start + 1;
  const cellCount = nAlpha * nField;
  const mMax = setup.orbitals.mMax;
  const bindingHartree = new Float64Array((mMax + 1) * cellCount);
  const counts = new Uint16Array((mMax + 1) * cellCount);
  for (let j = 0; j < nField; j++) {
    for (let i = 0; i < nAlpha; i++) {
      bindingHartree[j * nAlpha + i] = (start + j + 1) * 1e-9;
      counts[j * nAlpha + i] = 1;
    }
    onProgress((j + 1) * nAlpha);
  }
  return {
    engineVersion: 'fake', nAlpha, nField, cellCount, mMax, levelsPerOrbital: 1,
    alphas: new Float64Array(nAlpha), fieldsAu: Float64Array.from({ length: nField }, (_, j) => start + j),
    bindingHartree, counts, flags: new Uint8Array((mMax + 1) * cellCount), maxRelError: 0, elapsedMs: 1,
  };
}
