import { transfer, wrap, type Remote } from 'comlink';
import type { MapFields, MapGeometry } from '../features/map-render/mapGeometry';
import type { ContourWorkerApi } from './contour.worker';
import { MapComputeError } from './engineContract';

/**
 * One contour worker serving every layer of a page (requests run in order). A crashed worker is replaced and
 * the requests in flight fail with a MapComputeError. Callers drop answers they no longer need.
 */
export class ContourClient {
  private worker: Worker;
  private api: Remote<ContourWorkerApi>;
  private readonly crashHandlers = new Set<(e: MapComputeError) => void>();

  constructor(private readonly createWorker: () => Worker) {
    [this.worker, this.api] = this.spawn();
  }

  private spawn(): [Worker, Remote<ContourWorkerApi>] {
    const worker = this.createWorker();
    worker.addEventListener('error', (event) => {
      const message = event instanceof ErrorEvent && event.message ? `: ${event.message}` : '';
      this.worker.terminate();
      [this.worker, this.api] = this.spawn();
      const error = new MapComputeError('crash', `Drawing the map failed${message}.`);
      for (const handler of [...this.crashHandlers]) handler(error);
    });
    return [worker, wrap<ContourWorkerApi>(worker)];
  }

  /** Geometry of the fields. The fields' buffers are transferred (the caller must not use them afterwards). */
  async geometry(fields: MapFields): Promise<MapGeometry> {
    let handler: ((e: MapComputeError) => void) | undefined;
    const crashed = new Promise<never>((_, reject) => {
      handler = reject;
      this.crashHandlers.add(reject);
    });
    try {
      return await Promise.race([this.api.geometry(transfer(fields, [fields.region.buffer as ArrayBuffer, fields.energy.buffer as ArrayBuffer])), crashed]);
    } finally {
      if (handler) this.crashHandlers.delete(handler);
    }
  }

  dispose(): void {
    this.worker.terminate();
  }
}
