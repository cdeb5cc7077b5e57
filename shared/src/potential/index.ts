// Adiabatic (transverse-averaged) polarization potentials. Only re-exports live here.
export { scaledPotential, makeScaledPotential } from './scaledPotential.js';
export { adiabaticPotential } from './adiabaticPotential.js';
export { scaledPotentialIntegral, potentialIntegral, scaledPotentialIntegralZeroCutoff } from './potentialIntegral.js';
export {
  scaledTailCoefficients,
  scaledPotentialTail,
  scaledPotentialAtOriginZeroCutoff,
  scaledPotentialNearAtomM0,
} from './limits.js';
