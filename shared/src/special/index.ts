// Special functions in float64, one concept per file. Only re-exports live here.
export { gamma, lnGamma, factorial } from './gamma.js';
export { erfc, erfcx } from './erfc.js';
export { expint1, expn, expnScaled } from './expint.js';
export { tricomiU2 } from './tricomiU2.js';
export { tricomiU32 } from './tricomiU32.js';
