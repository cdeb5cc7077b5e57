import type { BindingMapResult, LevelsInput, LevelState, MapSetup, MotionSettingsInput, PhaseMapResult } from '@fieldbound/shared';

/**
 * The typed contract of the engine worker (engine.worker.ts), called through comlink. Errors thrown inside cross
 * the boundary with their `name` and `message` only; results come back with their ArrayBuffers transferred.
 */
export interface EngineWorkerApi {
  /** Whole binding map of `setup` (the pool passes one band of rows as its own setup); reports cells done. */
  bindingMap(setup: MapSetup, onProgress: (cellsDone: number) => void): Promise<BindingMapResult>;
  /** Every state at one point (the probe). */
  levelsAt(input: LevelsInput): Promise<LevelState[]>;
  /** Moving-ion classes, widths and survivors of a binding map (binding energies reused, never recomputed). */
  phaseMap(binding: BindingMapResult, settings: MotionSettingsInput): Promise<PhaseMapResult>;
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
