export * from './mapSetup.js';
export * from './presets.js';
export * from './fingerprint.js';
