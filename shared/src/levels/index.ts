export * from './types.js';
export * from './levels.js';
export * from './solveOrbital.js';
export * from './countStates.js';
export * from './orbitalThresholds.js';
export * from './orbitalWeakCoupling.js';
export * from './weakCouplingCoefficients.js';
export * from './levelFlags.js';
