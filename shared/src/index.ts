// Public surface of @fieldbound/shared. Only re-exports live here.
export * from './api/index.js';
export * from './solver/index.js';
export * from './setup/index.js';
export * from './errors.js';
export * from './units/index.js';
export * from './special/index.js';
export * from './potential/index.js';
export * from './map/index.js';
export * from './levels/index.js';
export * from './version.js';
export * from './export/index.js';
export * from './methods/index.js';
export * from './motion/index.js';
export * from './validation/index.js';
