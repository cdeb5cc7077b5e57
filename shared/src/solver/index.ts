export * from './types.js';
export * from './solveBoundStates.js';
export * from './brentRoot.js';
export * from './thresholdCouplings.js';
