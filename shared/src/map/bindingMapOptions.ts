import type { AbortSignalLike } from './abortError.js';
import type { MapProgress } from './mapTypes.js';

/** Options of `bindingMap`, `bindingMapWindow` and `bindingMapDirect`. */
export interface BindingMapOptions {
  /** Called with the number of cells finished so far (monotone non-decreasing, ends at total). */
  onProgress?: (p: MapProgress) => void;
  /** Checked between chunks of work; when aborted the call throws an Error named 'AbortError'. */
  signal?: AbortSignalLike;
  /**
   * Relative accuracy every stored binding energy must reach against a direct solve. Default 1e-6;
   * allowed 1e-9…1e-2 (smaller values cost more solves; the solver itself is good to ~1e-10).
   */
  tolerance?: number;
}
