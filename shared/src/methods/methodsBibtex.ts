import type { MapSetup } from '../setup/mapSetup.js';
import { citedReferences } from './methodsNote.js';
import { REFERENCES } from './references.js';

/**
 * BibTeX entries for exactly the references `methodsNote(setup, …)` cites, in citation order,
 * separated by blank lines.
 *
 * @example
 * methodsBibtex(defaultSetup()).startsWith('@misc{dlmf,') // true (DLMF is cited first)
 */
export function methodsBibtex(setup: MapSetup): string {
  return citedReferences(setup)
    .map((id) => REFERENCES[id].bibtex)
    .join('\n\n') + '\n';
}
