export type { EvenPotential, Parity, BoundStateOptions, BoundState, BoundStateSpectrum } from './types.js';
export {
  solveBoundStates,
  countBoundStates,
  createBoundStateSolver,
  type BoundStateSolver,
  type SolveCallOptions,
} from './solveBoundStates.js';
export { thresholdCouplings } from './thresholdCouplings.js';
export { brentRoot } from './brentRoot.js';
