/// <reference lib="webworker" />
// The contour worker: turns a map's per-cell fields into region and iso-line paths (d3-contour), which takes
// 100–200 ms for a 256 × 256 grid — too long for the page's main thread.
import { expose } from 'comlink';
import { geometryFromFields, type MapFields, type MapGeometry } from '../features/map-render/mapGeometry';
import { warmUpFields } from '../features/map-render/warmUpFields';

export interface ContourWorkerApi {
  geometry(fields: MapFields): MapGeometry;
}

const api: ContourWorkerApi = {
  geometry: (fields) => geometryFromFields(fields),
};

expose(api);

/**
 * Warm-up when the worker starts: the contour code runs only twice per map, too few times for the JIT, so the
 * first pictures' contours took several times their steady time. A few small synthetic maps, one per task, so a
 * real request waits at most one of them.
 */
const WARM_UP_RUNS = 12;
function warmUp(k: number) {
  if (k >= WARM_UP_RUNS) return;
  geometryFromFields(warmUpFields(48, k % 2 === 0 ? 'survivors' : 'orbital'));
  setTimeout(() => warmUp(k + 1), 0);
}
setTimeout(() => warmUp(0), 0);
