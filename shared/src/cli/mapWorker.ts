/// <reference types="node" />
/**
 * Worker thread of `fieldbound map`: prepares the interpolation model (one worker) or fills row
 * blocks of the binding map from it and classifies them for the ion motion (every worker).
 * Messages in: {kind: 'prepare', setup} | {kind: 'model', model} | {kind: 'rows', rowStart, rowEnd}.
 * Messages out: {kind: 'progress', done, total} | {kind: 'model', model} | {kind: 'block', binding, phase}
 * | {kind: 'error', name, message, stack}.
 */
import { parentPort } from 'node:worker_threads';
import { evaluateBindingMapRows } from '../map/evaluateBindingMapRows.js';
import type { BindingMapModel } from '../map/bindingMapModel.js';
import { prepareBindingMap } from '../map/prepareBindingMap.js';
import { phaseMap } from '../motion/phaseMap.js';
import type { MapSetup } from '../setup/mapSetup.js';

export type WorkerRequest =
  | { kind: 'prepare'; setup: MapSetup }
  | { kind: 'model'; model: BindingMapModel }
  | { kind: 'rows'; rowStart: number; rowEnd: number };

if (!parentPort) throw new Error('mapWorker.ts runs only as a worker thread');
const port = parentPort;
let model: BindingMapModel | null = null;

port.on('message', (msg: WorkerRequest) => {
  try {
    if (msg.kind === 'prepare') {
      const prepared = prepareBindingMap(msg.setup, { onProgress: (p) => port.postMessage({ kind: 'progress', done: p.done, total: p.total }) });
      port.postMessage({ kind: 'model', model: prepared });
    } else if (msg.kind === 'model') {
      model = msg.model;
    } else {
      if (!model) throw new Error('rows requested before the model was sent');
      const binding = evaluateBindingMapRows(model, msg.rowStart, msg.rowEnd, {
        onProgress: (p) => port.postMessage({ kind: 'progress', done: p.done, total: p.total }),
      });
      const phase = phaseMap(model.setup, binding);
      const buffers = [binding.bindingHartree, binding.counts, binding.flags, phase.stateClass, phase.widthHartree, phase.widthFlags, phase.survivors, phase.fractions]
        .filter((a) => a !== null)
        .map((a) => a.buffer as ArrayBuffer);
      port.postMessage({ kind: 'block', binding, phase }, buffers);
    }
  } catch (e) {
    const err = e as Error;
    port.postMessage({ kind: 'error', name: err?.name ?? 'Error', message: err?.message ?? String(e), stack: err?.stack ?? '' });
  }
});
