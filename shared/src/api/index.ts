export type { HealthResponse } from './health.js';
