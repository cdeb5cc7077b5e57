// Exports that leave the app: CSV and JSON map files, the JSON import, figure metadata (SVG, PNG).
export * from './exportLimits.js';
export * from './mapCsv.js';
export * from './readMapCsv.js';
export * from './mapJson.js';
export * from './importMapJson.js';
export * from './jsonSyntaxError.js';
export * from './typedArrayCodec.js';
export * from './base64.js';
export * from './utf8.js';
export * from './crc32.js';
export * from './pngTextChunks.js';
export * from './xmlEscape.js';
export * from './figureMetadata.js';
export * from './resultFingerprint.js';
export * from './figureSetupText.js';
