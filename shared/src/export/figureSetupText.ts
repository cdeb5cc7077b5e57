import { figureMetadataFromPngEntries, readSvgFigureMetadata } from './figureMetadata.js';
import { readPngTextChunks } from './pngTextChunks.js';
import { utf8Decode } from './utf8.js';

/** What an import file turned out to be, and the JSON text to validate. */
export type ImportFileText =
  | { kind: 'json'; text: string }
  | { kind: 'png-figure' | 'svg-figure'; text: string }
  | { kind: 'figure-without-setup'; text: null; message: string };

/**
 * The JSON to import from a file's bytes: a JSON file as it is, or the setup recorded in an exported
 * PNG figure (text chunk) or SVG figure (`<metadata>`), so a figure can be reopened as a map.
 *
 * @example
 * importFileText(pngBytes) // { kind: 'png-figure', text: '{"alphaAxis":…}' }
 */
export function importFileText(bytes: Uint8Array): ImportFileText {
  const isPng = bytes.length > 8 && bytes[0] === 0x89 && bytes[1] === 0x50 && bytes[2] === 0x4e && bytes[3] === 0x47;
  if (isPng) {
    let meta = null;
    try {
      meta = figureMetadataFromPngEntries(readPngTextChunks(bytes).filter((c) => c.crcOk));
    } catch {
      meta = null;
    }
    return meta
      ? { kind: 'png-figure', text: meta.setupJson }
      : { kind: 'figure-without-setup', text: null, message: 'this PNG carries no Fieldbound setup (it was not exported by Fieldbound, or its text chunks were removed)' };
  }
  const text = utf8Decode(bytes).replace(/^\ufeff/, '');
  if (/^\s*</.test(text)) {
    const meta = readSvgFigureMetadata(text);
    return meta
      ? { kind: 'svg-figure', text: meta.setupJson }
      : { kind: 'figure-without-setup', text: null, message: 'this SVG carries no Fieldbound setup in its <metadata>' };
  }
  return { kind: 'json', text };
}
