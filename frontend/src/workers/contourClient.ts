import { transfer, wrap, type Remote } from 'comlink';
import type { MapFields, MapGeometry } from '../features/map-render/mapGeometry';
import type { ContourWorkerApi } from './contour.worker';
import { MapComputeError } from './engineContract';

/**
 * One contour worker, used latest-wins: a newer request makes older pending ones resolve to null. A crashed
 * worker is replaced and the request fails with a MapComputeError.
 */
export class ContourClient {
  private worker: Worker;
  private api: Remote<ContourWorkerApi>;
  private generation = 0;
  private crash: ((e: MapComputeError) => void) | null = null;

  constructor(private readonly createWorker: () => Worker) {
    [this.worker, this.api] = this.spawn();
  }

  private spawn(): [Worker, Remote<ContourWorkerApi>] {
    const worker = this.createWorker();
    worker.addEventListener('error', (event) => {
      const message = event instanceof ErrorEvent && event.message ? `: ${event.message}` : '';
      this.worker.terminate();
      [this.worker, this.api] = this.spawn();
      this.crash?.(new MapComputeError('crash', `Drawing the map failed${message}.`));
    });
    return [worker, wrap<ContourWorkerApi>(worker)];
  }

  /** Geometry of the fields, or null when a newer request superseded this one. The fields' buffers are transferred. */
  async geometry(fields: MapFields): Promise<MapGeometry | null> {
    const mine = ++this.generation;
    const crashed = new Promise<never>((_, reject) => {
      this.crash = reject;
    });
    crashed.catch(() => {}); // settled through the race below; never an unhandled rejection
    const result = await Promise.race([this.api.geometry(transfer(fields, [fields.region.buffer as ArrayBuffer, fields.energy.buffer as ArrayBuffer])), crashed]);
    return mine === this.generation ? result : null;
  }

  dispose(): void {
    this.worker.terminate();
  }
}
