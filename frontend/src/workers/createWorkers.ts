// The real worker constructors (Vite bundles each entry as its own module worker).
import { trackEngineWorker } from '../dev/faults';

export function createEngineWorker(): Worker {
  // trackEngineWorker does nothing unless the page was opened with ?faults (end-to-end fault tests).
  return trackEngineWorker(new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module', name: 'fieldbound-engine' }));
}

export function createContourWorker(): Worker {
  return new Worker(new URL('./contour.worker.ts', import.meta.url), { type: 'module', name: 'fieldbound-contours' });
}
