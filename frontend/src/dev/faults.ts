/**
 * Fault injection for end-to-end tests — off unless the page was opened with `?faults` in its address.
 *
 * With the switch on, every engine worker the app creates is remembered, and `window.fieldboundFaults`
 * offers `killEngineWorkers()`: it terminates those workers (their computation stops dead, as when the
 * browser kills a worker) and fires on each the `error` event a crashed worker fires, so the app goes through
 * exactly the path of a real crash. It reaches nothing a user cannot already do in their own tab with the
 * browser's developer tools, and nothing on the server. docs/operations.md, docs/security.md.
 */
export interface FieldboundFaults {
  /** Terminates every live engine worker of this tab; answers how many there were. */
  killEngineWorkers(): number;
}

declare global {
  interface Window {
    fieldboundFaults?: FieldboundFaults;
  }
}

const enabled = typeof window !== 'undefined' && new URLSearchParams(window.location.search).has('faults');
const engineWorkers = new Set<Worker>();

if (enabled) {
  window.fieldboundFaults = {
    killEngineWorkers() {
      const victims = [...engineWorkers];
      engineWorkers.clear();
      for (const worker of victims) {
        worker.terminate();
        worker.dispatchEvent(new ErrorEvent('error', { message: 'the worker was terminated (?faults switch)' }));
      }
      return victims.length;
    },
  };
}

/** Remembers an engine worker for `killEngineWorkers` when the switch is on; otherwise does nothing. */
export function trackEngineWorker(worker: Worker): Worker {
  if (enabled) engineWorkers.add(worker);
  return worker;
}
