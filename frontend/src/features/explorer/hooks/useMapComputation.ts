import { startTransition, useCallback, useEffect, useMemo, useRef, useState, useSyncExternalStore } from 'react';
import { bindingInputsKey, canonicalJson, type BindingMapResult, type MapSetup, type PhaseMapResult } from '@fieldbound/shared';
import type { EnginePool } from '../../../workers/enginePool';
import { MapComputeError } from '../../../workers/engineContract';
import { coarseSetup } from '../../../workers/rowBands';
import { motionInput } from './motionInput';

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
  /** Moving-ion classes of `result` (the engine's phaseMap), for the motion settings `phaseKey`; null for a fixed atom. */
  phase: PhaseMapResult | null;
  /** `motionKey` of the settings `phase` was computed for (null: none yet, or a fixed atom). */
  phaseKey: string | null;
  progress: ComputeProgress | null;
  error: MapComputeError | null;
  /** Wall time from the request to the first picture and to the full map, ms. */
  timings: { firstPictureMs: number | null; fullMs: number | null };
}

/**
 * Progress of a computation, kept outside React state: only the progress display subscribes to it, so a progress
 * tick re-renders that one small component and never the page (the setup form, the map, the toolbar).
 */
export interface ProgressStore {
  get(): ComputeProgress | null;
  set(progress: ComputeProgress | null): void;
  subscribe(listener: () => void): () => void;
}

export function createProgressStore(): ProgressStore {
  let value: ComputeProgress | null = null;
  const listeners = new Set<() => void>();
  return {
    get: () => value,
    set(progress) {
      if (progress === value) return;
      value = progress;
      for (const l of [...listeners]) l();
    },
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}

/** The current progress of a store (re-renders only the component that calls it). */
export function useProgress(store: ProgressStore | null | undefined): ComputeProgress | null {
  return useSyncExternalStore(store?.subscribe ?? noSubscribe, store?.get ?? noProgress);
}
const noSubscribe = () => () => {};
const noProgress = () => null;

/** A small least-recently-used cache, shared by every computation of one page. */
export class ResultCache<T = BindingMapResult> {
  private readonly entries = new Map<string, T>();
  constructor(private readonly capacity = 6) {}
  get(key: string): T | undefined {
    const hit = this.entries.get(key);
    if (hit !== undefined) {
      this.entries.delete(key);
      this.entries.set(key, hit);
    }
    return hit;
  }
  set(key: string, value: T): void {
    this.entries.delete(key);
    this.entries.set(key, value);
    while (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value!);
  }
}

/** The caches of one page: binding maps by `bindingInputsKey`, their moving-ion classes by binding key and motion key. */
export interface MapCaches {
  binding: ResultCache<BindingMapResult>;
  phase: ResultCache<PhaseMapResult>;
}

export function createMapCaches(): MapCaches {
  return { binding: new ResultCache(), phase: new ResultCache() };
}

/** What the moving-ion classes depend on (ion motion, mass, observation time), or null for a fixed atom. */
export function motionKey(setup: MapSetup): string | null {
  const input = motionInput(setup);
  return input ? canonicalJson(input) : null;
}

/** Shortest interval between progress renders, ms. */
const PROGRESS_RENDER_MS = 250;

/** A coarse first pass pays off only when the full grid has at least four times its cells. */
export const COARSE_SIDE = 64;
/** The first pass is a picture, not a measurement: its model is built to 10⁻³ relative (the full map: 10⁻⁶). */
export const COARSE_TOLERANCE = 1e-3;
function wantsCoarse(setup: MapSetup): boolean {
  return setup.grid.nAlpha * setup.grid.nField >= 4 * COARSE_SIDE * COARSE_SIDE;
}

const IDLE: MapComputation = {
  status: 'idle', result: null, resultSetup: null, resultPass: null, phase: null, phaseKey: null, progress: null, error: null,
  timings: { firstPictureMs: null, fullMs: null },
};

/** The state as stored: with the binding key and attempt it belongs to (see `useMapComputation`). */
interface StoredComputation extends MapComputation {
  forKey: string | null;
  forAttempt: number;
}
const IDLE_STORED: StoredComputation = { ...IDLE, forKey: null, forAttempt: -1 };
const NO_TIMINGS: MapComputation['timings'] = { firstPictureMs: null, fullMs: null };

export interface UseMapComputationOptions {
  timeoutMs: number;
  /** Names the User Timing marks of this computation (`fieldbound:<label>:start`, `…:coarse-result`, `…:full-result`). */
  label?: string;
}

function mark(label: string | undefined, what: string) {
  if (label) performance.mark(`fieldbound:${label}:${what}`);
}

/** Longest wait for the frames before running anyway (a page in a background tab gets no frames). */
const FRAME_WAIT_MS = 250;

/**
 * Runs `run` in a task of its own after the next two frames are rendered (or after `FRAME_WAIT_MS` when they do not
 * come); returns a function that cancels it.
 */
export function afterTwoFrames(run: () => void): () => void {
  let done = false;
  let frame: number | null = null;
  let afterFrame: ReturnType<typeof setTimeout> | null = null;
  const go = () => {
    if (done) return;
    done = true;
    cancel();
    run();
  };
  const cancel = () => {
    done = true;
    if (frame !== null && typeof cancelAnimationFrame === 'function') cancelAnimationFrame(frame);
    if (afterFrame !== null) clearTimeout(afterFrame);
    clearTimeout(fallback);
  };
  const fallback = setTimeout(go, FRAME_WAIT_MS);
  // Two frames: the first lays out and paints what the render committed; a map view that learns its size in that
  // frame (ResizeObserver) draws itself at that size, and the second frame lays that out and paints it.
  if (typeof requestAnimationFrame === 'function') {
    frame = requestAnimationFrame(() => {
      frame = requestAnimationFrame(() => (afterFrame = setTimeout(go, 0)));
    });
  }
  return cancel;
}

/**
 * Computes the map of `setup` in the pool. The quick first pass (64 × 64, model to 10⁻³; each worker computes a band
 * of it whole, see `EnginePool.computeMap`'s `quick`) runs first and alone — on a busy 2-core machine the first
 * picture is there sooner than if the full pass shared the cores with it — then the full grid, whose result
 * replaces the first one in place. Ion motion is applied to each row band by the engine's phaseMap as
 * it is computed. Binding maps are cached by `bindingInputsKey` and classes by motion settings too, so changing
 * display, contour levels, the shown orbital, motion or observation time never recomputes binding energies:
 * changing motion or τ only reruns the classification (`computePhase`). A new setup cancels the work in flight.
 * `cancel` stops; `retry` starts again after an error (with fresh workers after a crash).
 */
export function useMapComputation(pool: EnginePool | null, setup: MapSetup | null, caches: MapCaches, options: UseMapComputationOptions) {
  const [stored, setState] = useState<StoredComputation>(IDLE_STORED);
  const [attempt, setAttempt] = useState(0);
  const [progress] = useState(createProgressStore);
  const controller = useRef<AbortController | null>(null);
  const key = setup ? bindingInputsKey(setup) : null;
  const wantedMotion = setup ? motionKey(setup) : null;
  const setupRef = useRef(setup);
  setupRef.current = setup;
  const { timeoutMs, label } = options;

  // Binding energies (and the classes for the motion asked for when the computation starts).
  useEffect(() => {
    const current = setupRef.current;
    if (!pool || !current || !key) {
      setState(IDLE_STORED);
      return;
    }
    const startMotion = motionKey(current);
    const cached = caches.binding.get(key);
    const belongs = { forKey: key, forAttempt: attempt };
    if (cached) {
      const phase = startMotion ? (caches.phase.get(`${key}|${startMotion}`) ?? null) : null;
      setState({ ...IDLE, status: 'done', result: cached, resultSetup: current, resultPass: 'full', phase, phaseKey: phase ? startMotion : null, ...belongs });
      return;
    }
    const abort = new AbortController();
    controller.current = abort;
    const requested = performance.now();
    mark(label, 'requested');
    // The work goes to the workers after the next two frames: the render that asked for the map (on a first visit, the
    // whole explorer mounting) and the frames that show it are done before the computation starts, so none of their
    // main-thread work falls inside the computation. Times still run from the request.
    const cancelStart = afterTwoFrames(() => {
      if (abort.signal.aborted) return;
      mark(label, 'start');
      let firstPictureMs: number | null = null;
      let fullDone = false;
      let lastProgress = -Infinity;
      const motionSetup = startMotion ? current : null;
      const coarse = wantsCoarse(current) ? coarseSetup(current, COARSE_SIDE) : null;

      progress.set(null);
      // No state update here: until a result of this key and attempt is stored, the hook reports 'computing' (a render
      // of the whole page less, in the task that starts the computation).
      const fail = (e: unknown) => {
        if (abort.signal.aborted) return; // superseded by a newer setup, or stopped by the user (`cancel` set the state)
        abort.abort();
        progress.set(null);
        const error = e instanceof MapComputeError ? e : new MapComputeError('engine', String(e));
        setState((s) => ({ ...s, status: 'error', progress: null, error, ...belongs }));
      };

      const onProgress = (pass: ComputeProgress['pass']) => (p: { done: number; total: number }) => {
        if (abort.signal.aborted) return;
        // At most a few renders a second: progress must never cost the page its smoothness.
        const now = performance.now();
        if (now - lastProgress < PROGRESS_RENDER_MS && p.done < p.total) return;
        lastProgress = now;
        const elapsedMs = now - requested;
        const remainingMs = p.done >= Math.max(1, p.total * 0.05) ? (elapsedMs / p.done) * (p.total - p.done) : null;
        progress.set({ pass, done: p.done, total: p.total, elapsedMs, remainingMs });
      };
      const fullPass = () =>
        pool.computeMap(current, { timeoutMs, signal: abort.signal, motionSetup, onProgress: onProgress('full') }).then((r) => {
          if (abort.signal.aborted) return;
          fullDone = true;
          progress.set(null);
          caches.binding.set(key, r.binding);
          if (r.phase && startMotion) caches.phase.set(`${key}|${startMotion}`, r.phase);
          const fullMs = performance.now() - requested;
          mark(label, 'full-result');
          setState({
            status: 'done', result: r.binding, resultSetup: current, resultPass: 'full', phase: r.phase, phaseKey: r.phase ? startMotion : null,
            progress: null, error: null, timings: { firstPictureMs: firstPictureMs ?? fullMs, fullMs }, ...belongs,
          });
        }, fail);

      if (coarse) {
        // The quick pass runs alone, so it has the machine's cores to itself; the full pass starts once it is in.
        pool
          .computeMap(coarse, { timeoutMs, signal: abort.signal, tolerance: COARSE_TOLERANCE, quick: true, motionSetup, onProgress: onProgress('coarse') })
          .then((r) => {
            if (abort.signal.aborted || fullDone) return;
            firstPictureMs = performance.now() - requested;
            mark(label, 'coarse-result');
            // A plain update, not a transition: a transition waits behind (and restarts after) each progress update,
            // and rendering a result is cheap (the host page and the form are memoised; contours are the worker's).
            setState((s) => ({ ...s, status: 'computing', error: null, progress: null, result: r.binding, resultSetup: coarse, resultPass: 'coarse', phase: r.phase, phaseKey: r.phase ? startMotion : null, timings: { firstPictureMs, fullMs: null }, ...belongs }));
          }, fail)
          .then(() => {
            if (!abort.signal.aborted) void fullPass();
          });
      } else {
        void fullPass();
      }
    });
    return () => {
      cancelStart();
      abort.abort();
    };
    // `attempt` re-runs after Retry; the setup itself is read through the ref and keyed by `key`.
  }, [pool, key, caches, attempt, timeoutMs, label, progress]);

  // Moving-ion classes for motion settings other than those the result was classified for: the engine's
  // phaseMap on the binding energies already computed (split by rows over the pool), nothing else.
  // The state of this key and attempt, or — until its first result is stored — the last one's picture, computing.
  const fresh = !key || (stored.forKey === key && stored.forAttempt === attempt);
  const state = useMemo<MapComputation>(() => (fresh ? stored : { ...stored, status: 'computing', error: null, progress: null, timings: NO_TIMINGS }), [stored, fresh]);
  const { result, resultSetup, phaseKey, resultPass } = state;
  useEffect(() => {
    if (!pool || !result || !resultSetup || !wantedMotion || phaseKey === wantedMotion) return;
    const current = setupRef.current;
    if (!current) return;
    const cacheKey = resultPass === 'full' && key ? `${key}|${wantedMotion}` : null;
    const hit = cacheKey ? caches.phase.get(cacheKey) : undefined;
    if (hit) {
      setState((s) => (s.result === result ? { ...s, phase: hit, phaseKey: wantedMotion } : s));
      return;
    }
    const abort = new AbortController();
    pool.computePhase(current, result, { timeoutMs, signal: abort.signal }).then(
      (phase) => {
        if (abort.signal.aborted) return;
        if (cacheKey) caches.phase.set(cacheKey, phase);
        startTransition(() => setState((s) => (s.result === result ? { ...s, phase, phaseKey: wantedMotion } : s)));
      },
      (e: unknown) => {
        if (abort.signal.aborted) return;
        const error = e instanceof MapComputeError ? e : new MapComputeError('engine', String(e));
        setState((s) => (s.result === result ? { ...s, status: 'error', error } : s));
      },
    );
    return () => abort.abort();
  }, [pool, result, resultSetup, resultPass, phaseKey, wantedMotion, key, caches, timeoutMs]);

  const belongsRef = useRef({ forKey: key, forAttempt: attempt });
  belongsRef.current = { forKey: key, forAttempt: attempt };
  const cancel = useCallback(() => {
    controller.current?.abort();
    progress.set(null);
    setState((s) => {
      const now = belongsRef.current;
      const computing = now.forKey !== null && (s.forKey !== now.forKey || s.forAttempt !== now.forAttempt || s.status === 'computing');
      return computing ? { ...s, status: 'error', progress: null, error: new MapComputeError('cancelled', 'Computation cancelled.'), ...now } : s;
    });
  }, [progress]);
  const retry = useCallback(() => {
    // After a crash start from fresh workers; otherwise just run again.
    if (state.error?.kind === 'crash') pool?.restart();
    setAttempt((a) => a + 1);
  }, [pool, state.error]);
  // Classes count only when they belong to the motion settings asked for now (a fixed atom: none).
  const phase = wantedMotion && state.phaseKey === wantedMotion ? state.phase : null;
  return { state, progress, phase, motionWanted: wantedMotion !== null, cancel, retry };
}
