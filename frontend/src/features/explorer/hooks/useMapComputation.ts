import { useCallback, useEffect, useRef, useState } from 'react';
import { bindingInputsKey, type BindingMapResult, type MapSetup } from '@fieldbound/shared';
import type { EnginePool } from '../../../workers/enginePool';
import { MapComputeError } from '../../../workers/engineContract';
import { coarseSetup } from '../../../workers/rowBands';

export interface ComputeProgress {
  pass: 'coarse' | 'full';
  done: number;
  total: number;
  elapsedMs: number;
  /** Estimated time left, ms (null until a few cells are done). */
  remainingMs: number | null;
}

export interface MapComputation {
  status: 'idle' | 'computing' | 'done' | 'error';
  /** The best result so far for the setup (coarse while the full pass runs), with the setup it belongs to. */
  result: BindingMapResult | null;
  resultSetup: MapSetup | null;
  resultPass: 'coarse' | 'full' | null;
  progress: ComputeProgress | null;
  error: MapComputeError | null;
  /** Wall time from the request to the first picture and to the full map, ms. */
  timings: { firstPictureMs: number | null; fullMs: number | null };
}

/** A small cache of results by `bindingInputsKey`, shared by every computation of one page. */
export class ResultCache {
  private readonly entries = new Map<string, BindingMapResult>();
  constructor(private readonly capacity = 6) {}
  get(key: string): BindingMapResult | undefined {
    const hit = this.entries.get(key);
    if (hit) {
      this.entries.delete(key);
      this.entries.set(key, hit);
    }
    return hit;
  }
  set(key: string, value: BindingMapResult): void {
    this.entries.delete(key);
    this.entries.set(key, value);
    while (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value!);
  }
}

/** Shortest interval between progress renders, ms. */
const PROGRESS_RENDER_MS = 250;

/** A coarse first pass pays off only when the full grid has at least four times its cells. */
export const COARSE_SIDE = 64;
function wantsCoarse(setup: MapSetup): boolean {
  return setup.grid.nAlpha * setup.grid.nField >= 4 * COARSE_SIDE * COARSE_SIDE;
}

const IDLE: MapComputation = { status: 'idle', result: null, resultSetup: null, resultPass: null, progress: null, error: null, timings: { firstPictureMs: null, fullMs: null } };

export interface UseMapComputationOptions {
  timeoutMs: number;
}

/**
 * Computes the binding map of `setup` in the pool: a coarse pass first (drawn at once), then the full grid.
 * Results are cached by `bindingInputsKey`, so changing display, contour levels, motion or observation time never
 * recomputes. A new setup cancels the computation in flight. `cancel` stops; `retry` starts again after an error.
 */
export function useMapComputation(pool: EnginePool | null, setup: MapSetup | null, cache: ResultCache, options: UseMapComputationOptions) {
  const [state, setState] = useState<MapComputation>(IDLE);
  const [attempt, setAttempt] = useState(0);
  const controller = useRef<AbortController | null>(null);
  const key = setup ? bindingInputsKey(setup) : null;
  const setupRef = useRef(setup);
  setupRef.current = setup;

  useEffect(() => {
    const current = setupRef.current;
    if (!pool || !current || !key) {
      setState(IDLE);
      return;
    }
    const cached = cache.get(key);
    if (cached) {
      setState({ ...IDLE, status: 'done', result: cached, resultSetup: current, resultPass: 'full' });
      return;
    }
    const abort = new AbortController();
    controller.current = abort;
    const started = performance.now();
    let firstPictureMs: number | null = null;
    let lastProgress = -Infinity;

    const runPass = async (pass: 'coarse' | 'full', passSetup: MapSetup): Promise<BindingMapResult> => {
      const passKey = bindingInputsKey(passSetup);
      const hit = cache.get(passKey);
      if (hit) return hit;
      const passStart = performance.now();
      const result = await pool.computeMap(passSetup, {
        timeoutMs: options.timeoutMs,
        signal: abort.signal,
        onProgress: (p) => {
          if (abort.signal.aborted) return;
          // At most a few renders a second: progress must never cost the page its smoothness.
          const now = performance.now();
          if (now - lastProgress < PROGRESS_RENDER_MS && p.done < p.total) return;
          lastProgress = now;
          const elapsedMs = now - passStart;
          const remainingMs = p.done >= Math.max(1, p.total * 0.02) ? (elapsedMs / p.done) * (p.total - p.done) : null;
          setState((s) => ({ ...s, progress: { pass, done: p.done, total: p.total, elapsedMs, remainingMs } }));
        },
      });
      cache.set(passKey, result);
      return result;
    };

    setState((s) => ({ ...s, status: 'computing', error: null, progress: null, timings: { firstPictureMs: null, fullMs: null } }));
    (async () => {
      try {
        if (wantsCoarse(current)) {
          const coarse = coarseSetup(current, COARSE_SIDE);
          const r = await runPass('coarse', coarse);
          if (abort.signal.aborted) return;
          firstPictureMs = performance.now() - started;
          setState((s) => ({ ...s, result: r, resultSetup: coarse, resultPass: 'coarse', timings: { firstPictureMs, fullMs: null } }));
        }
        const full = await runPass('full', current);
        if (abort.signal.aborted) return;
        const fullMs = performance.now() - started;
        setState({ status: 'done', result: full, resultSetup: current, resultPass: 'full', progress: null, error: null, timings: { firstPictureMs: firstPictureMs ?? fullMs, fullMs } });
      } catch (e) {
        if (abort.signal.aborted && e instanceof MapComputeError && e.kind === 'cancelled') {
          // Superseded by a newer setup, or stopped by the user (then `cancel` already set the state).
          return;
        }
        const error = e instanceof MapComputeError ? e : new MapComputeError('engine', String(e));
        setState((s) => ({ ...s, status: 'error', progress: null, error }));
      }
    })();
    return () => abort.abort();
    // `attempt` re-runs after Retry; the setup itself is read through the ref and keyed by `key`.
  }, [pool, key, cache, attempt, options.timeoutMs]);

  const cancel = useCallback(() => {
    controller.current?.abort();
    setState((s) => (s.status === 'computing' ? { ...s, status: 'error', progress: null, error: new MapComputeError('cancelled', 'Computation cancelled.') } : s));
  }, []);
  const retry = useCallback(() => {
    // After a crash start from fresh workers; otherwise just run again.
    if (state.error?.kind === 'crash') pool?.restart();
    setAttempt((a) => a + 1);
  }, [pool, state.error]);
  return { state, cancel, retry };
}
