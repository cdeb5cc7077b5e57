export type { HealthResponse } from './health.js';
export * from './common.js';
export * from './maps.js';
export * from './pins.js';
export * from './links.js';
export * from './species.js';
export * from './accounts.js';
export * from './live.js';
