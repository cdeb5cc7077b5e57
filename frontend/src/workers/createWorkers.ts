// The real worker constructors (Vite bundles each entry as its own module worker).
export function createEngineWorker(): Worker {
  return new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module', name: 'fieldbound-engine' });
}

export function createContourWorker(): Worker {
  return new Worker(new URL('./contour.worker.ts', import.meta.url), { type: 'module', name: 'fieldbound-contours' });
}
