/// <reference lib="webworker" />
// The engine worker: imports only the engine (@fieldbound/shared) and comlink. One instance per pool slot.
import { expose, transfer } from 'comlink';
import {
  evaluateBindingMapRows, levels, motionSettingsFromSetup, motionStates, phaseMap, prepareBindingMap,
  type BindingMapModel, type BindingMapResult, type LevelsInput, type MapSetup, type PhaseMapResult,
} from '@fieldbound/shared';
import { rowBuffers, type EngineWorkerApi, type MapRowsResult } from './engineContract';
import { joinRowResults } from './mergePhases';
import { probeMotionInputs } from './probeMotion';

/** Progress messages at most every 50 ms: each one is a postMessage to the page. */
const PROGRESS_INTERVAL_MS = 50;

function throttled(onProgress: (cellsDone: number) => void) {
  let last = 0;
  return (p: { done: number; total: number }) => {
    const now = performance.now();
    if (now - last >= PROGRESS_INTERVAL_MS || p.done === p.total) {
      last = now;
      void onProgress(p.done);
    }
  };
}

function bindingBuffers(r: BindingMapResult): ArrayBuffer[] {
  // `alphas` is shared with the model (not copied per block), so it is cloned rather than transferred.
  return [r.fieldsAu, r.bindingHartree, r.counts, r.flags].map((a) => a.buffer as ArrayBuffer);
}

function phaseBuffers(p: PhaseMapResult): ArrayBuffer[] {
  return [p.stateClass, p.widthHartree, p.widthFlags, p.survivors, ...(p.fractions ? [p.fractions] : [])].map((a) => a.buffer as ArrayBuffer);
}

const api: EngineWorkerApi = {
  async prepareMap(setup: MapSetup, tolerance: number | undefined, onProgress: (cellsDone: number) => void) {
    return prepareBindingMap(setup, { tolerance, onProgress: throttled(onProgress) });
  },
  async evaluateRows(model: BindingMapModel, rowStart: number, rowEnd: number, motionSetup: MapSetup | null, onProgress: (cellsDone: number) => void) {
    const report = throttled(onProgress);
    const window = evaluateBindingMapRows(model, rowStart, rowEnd, { onProgress: (p) => report({ done: Math.floor(p.done / 2), total: p.total }) });
    const { rowStart: _s, rowEnd: _e, ...binding } = window;
    void _s;
    void _e;
    // Ion motion on these rows only: the engine's phaseMap reuses the binding energies just computed.
    const phase = motionSetup && motionSettingsFromSetup(motionSetup) ? phaseMap(motionSetup, binding) : null;
    report({ done: binding.cellCount, total: binding.cellCount });
    const result: MapRowsResult = { binding, phase };
    return transfer(result, [...bindingBuffers(binding), ...(phase ? phaseBuffers(phase) : [])]);
  },
  async computeRows(setup: MapSetup, tolerance: number | undefined, motionSetup: MapSetup | null, onProgress: (cellsDone: number) => void) {
    const report = throttled(onProgress);
    const total = setup.grid.nAlpha * setup.grid.nField;
    // Preparation counts as 40 % of the cells, as in the pool's split computation.
    const model = prepareBindingMap(setup, { tolerance, onProgress: (p) => report({ done: Math.floor(0.4 * p.done), total }) });
    const window = evaluateBindingMapRows(model, 0, setup.grid.nField, { onProgress: (p) => report({ done: Math.floor(0.4 * total + 0.3 * p.done), total }) });
    const { rowStart: _s, rowEnd: _e, ...binding } = window;
    void _s;
    void _e;
    const phase = motionSetup && motionSettingsFromSetup(motionSetup) ? phaseMap(motionSetup, binding) : null;
    report({ done: total, total });
    const result: MapRowsResult = { binding, phase };
    // The model is dropped here, so `alphas` (shared with it) is transferred too.
    return transfer(result, rowBuffers([result]));
  },
  async joinRows(parts: MapRowsResult[]) {
    const joined = joinRowResults(parts);
    return transfer(joined, rowBuffers([joined]));
  },
  async phaseRows(setup: MapSetup, binding: BindingMapResult) {
    const phase = phaseMap(setup, binding);
    return transfer(phase, phaseBuffers(phase));
  },
  async probeAt(input: LevelsInput, motionSetup: MapSetup) {
    const states = levels(input);
    const settings = motionSettingsFromSetup(motionSetup);
    // States below the energy floor count as absent, exactly as on the map (stored there as ε = 0).
    const motion = settings ? motionStates({ fieldAu: input.fieldAu, states: probeMotionInputs(states), motion: settings }) : null;
    return { levels: states, motion };
  },
};

expose(api);
