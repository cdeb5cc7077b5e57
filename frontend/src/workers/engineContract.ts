import type {
  BindingMapModel, BindingMapResult, LevelState, LevelsInput, MapSetup, MotionStateResult, PhaseMapResult,
} from '@fieldbound/shared';

/** Binding energies of some rows of a map and, when ion motion is set, their moving-ion classes (same rows). */
export interface MapRowsResult {
  binding: BindingMapResult;
  phase: PhaseMapResult | null;
}

/** Every state at one point (the probe): the fixed-atom levels and, with ion motion, each state's width and class. */
export interface ProbeResult {
  levels: LevelState[];
  /** One entry per level (same order), from the engine's `motionStates`; null when the atom is held fixed. */
  motion: MotionStateResult[] | null;
}

/**
 * The typed contract of the engine worker (engine.worker.ts), called through comlink. Errors thrown inside cross
 * the boundary with their `name` and `message` only; results come back with their ArrayBuffers transferred.
 *
 * A map is computed in two steps so that several workers share one preparation: `prepareMap` builds the engine's
 * interpolation model once (small plain data, posted back), then `evaluateRows` fills row blocks from it in any
 * worker. Ion motion is applied to each block by the engine's `phaseMap`, which reuses the binding energies;
 * `phaseRows` reclassifies rows already computed when only the motion settings or the observation time change.
 */
export interface EngineWorkerApi {
  /** The engine's `prepareBindingMap` (model of every orbital over the setup's ranges); reports cells done. */
  prepareMap(setup: MapSetup, tolerance: number | undefined, onProgress: (cellsDone: number) => void): Promise<BindingMapModel>;
  /**
   * Rows [rowStart, rowEnd) of the map from a prepared model (`evaluateBindingMapRows`), with the moving-ion classes
   * of those rows when `motionSetup` asks for ion motion (`phaseMap(motionSetup, rows)`); reports cells done.
   */
  evaluateRows(model: BindingMapModel, rowStart: number, rowEnd: number, motionSetup: MapSetup | null, onProgress: (cellsDone: number) => void): Promise<MapRowsResult>;
  /**
   * A whole (small) map in one call: `prepareBindingMap` to `tolerance`, every row, and the moving-ion classes when
   * `motionSetup` asks for ion motion. The quick first pass uses it: no round trip through the page between the
   * model and the rows, so a busy page never delays the first picture.
   */
  computeRows(setup: MapSetup, tolerance: number | undefined, motionSetup: MapSetup | null, onProgress: (cellsDone: number) => void): Promise<MapRowsResult>;
  /**
   * Joins row bands (lowest field first) into one map (`mergeBands`, `mergePhases`). Done in a worker so the page
   * never allocates and copies the full map's arrays itself; the bands' buffers are transferred in and the joined
   * map's out.
   */
  joinRows(parts: MapRowsResult[]): Promise<MapRowsResult>;
  /** Moving-ion classes of rows already computed (`phaseMap(setup, binding)`): binding energies are never recomputed. */
  phaseRows(setup: MapSetup, binding: BindingMapResult): Promise<PhaseMapResult>;
  /** Every state at one point (the probe), with `motionStates` for the setup's ion motion. */
  probeAt(input: LevelsInput, motionSetup: MapSetup): Promise<ProbeResult>;
}

/** Every distinct ArrayBuffer of some row results (for a transfer list, which must not name a buffer twice). */
export function rowBuffers(parts: readonly MapRowsResult[], { alphas = true }: { alphas?: boolean } = {}): ArrayBuffer[] {
  const out = new Set<ArrayBuffer>();
  for (const { binding, phase } of parts) {
    for (const a of [binding.fieldsAu, binding.bindingHartree, binding.counts, binding.flags, ...(alphas ? [binding.alphas] : [])]) out.add(a.buffer as ArrayBuffer);
    if (phase) for (const a of [phase.stateClass, phase.widthHartree, phase.widthFlags, phase.survivors, ...(phase.fractions ? [phase.fractions] : [])]) out.add(a.buffer as ArrayBuffer);
  }
  return [...out];
}

/** Why a computation did not finish. */
export type MapComputeErrorKind = 'crash' | 'engine' | 'invalid-setup' | 'timeout' | 'cancelled';

/** A computation that did not finish, with a message meant for the user. */
export class MapComputeError extends Error {
  override readonly name = 'MapComputeError';
  constructor(
    readonly kind: MapComputeErrorKind,
    message: string,
  ) {
    super(message);
  }
}

/** Turns anything thrown by a worker call into a MapComputeError with a readable message. */
export function toComputeError(error: unknown): MapComputeError {
  if (error instanceof MapComputeError) return error;
  const name = typeof error === 'object' && error !== null && 'name' in error ? String((error as { name: unknown }).name) : 'Error';
  const message = typeof error === 'object' && error !== null && 'message' in error ? String((error as { message: unknown }).message) : String(error);
  if (name === 'SetupValidationError' || name === 'EngineInputError') return new MapComputeError('invalid-setup', `The setup cannot be computed: ${message}`);
  return new MapComputeError('engine', `The engine stopped with an error (${name}): ${message}`);
}
