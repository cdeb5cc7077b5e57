// Test doubles for engine workers (tests only; the app always runs the real engine.worker.ts).
import { expose } from 'comlink';
import type { BindingMapResult, MapSetup } from '@fieldbound/shared';
import type { EngineWorkerApi } from './engineContract';

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
    expose(api, channel.port2);
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
 * A tiny deterministic "engine" for pool tests: ε = (row + 1) · 10⁻⁹ hartree for m = 0 in every cell, m ≥ 1
 * unbound, where the row is found from the band's lowest field on the parent's 1…45 T log axis of `rows` rows.
 */
export function fakeBindingMap(rows: number) {
  return async (setup: MapSetup, onProgress: (cells: number) => void): Promise<BindingMapResult> => {
    const start = Math.round((Math.log(setup.fieldAxis.min) / Math.log(45)) * (rows - 1));
    return fakeBand(setup, start, start + setup.grid.nField - 1, onProgress);
  };
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
