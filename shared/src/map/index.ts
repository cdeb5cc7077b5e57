export * from './mapTypes.js';
