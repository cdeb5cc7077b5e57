/// <reference lib="webworker" />
// The contour worker: turns a map's per-cell fields into region and iso-line paths (d3-contour), which takes
// 100–200 ms for a 256 × 256 grid — too long for the page's main thread.
import { expose } from 'comlink';
import { geometryFromFields, type MapFields, type MapGeometry } from '../features/map-render/mapGeometry';

export interface ContourWorkerApi {
  geometry(fields: MapFields): MapGeometry;
}

const api: ContourWorkerApi = {
  geometry: (fields) => geometryFromFields(fields),
};

expose(api);
