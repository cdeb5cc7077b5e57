// The methods note: a paper-ready description of a map's model, numerics and parameters, with BibTeX.
export * from './methodsNote.js';
export * from './methodsBibtex.js';
export * from './checkBibtex.js';
export * from './references.js';
export * from './formatForText.js';
