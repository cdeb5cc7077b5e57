// Units: CODATA 2018 constants, branded number types, conversions. Only re-exports live here.
export * from './codata2018.js';
export * from './brand.js';
export * from './constructors.js';
export * from './convert.js';
