import { crc32 } from './crc32.js';
import { utf8Decode, utf8Encode } from './utf8.js';

/**
 * Text chunks of a PNG file (PNG specification, 2nd ed., W3C Recommendation 2003 / ISO/IEC 15948:2003,
 * §11.3.4): `tEXt` holds Latin-1 text, `iTXt` UTF-8 text (here always uncompressed, with empty language
 * tag and translated keyword). A chunk is length (4 bytes, big-endian) · type (4) · data · CRC-32 of type
 * and data (4).
 */
export interface PngTextEntry {
  /** 1–79 printable Latin-1 characters, no leading, trailing or double spaces (e.g. "Software"). */
  keyword: string;
  text: string;
}

/** Thrown for bytes that are not a PNG or a keyword/text the chunk cannot carry. */
export class PngChunkError extends Error {
  override readonly name = 'PngChunkError';
}

const SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

function checkSignature(png: Uint8Array): void {
  if (png.length < 8 + 25 || SIGNATURE.some((b, k) => png[k] !== b)) throw new PngChunkError('not a PNG file (signature missing)');
}

function checkKeyword(keyword: string): void {
  if (!/^[\x20-\x7e\xa1-\xff]{1,79}$/.test(keyword) || /^ | $| {2}/.test(keyword)) {
    throw new PngChunkError(`PNG text keyword must be 1–79 printable Latin-1 characters without leading, trailing or double spaces, got ${JSON.stringify(keyword)}`);
  }
}

function latin1Decode(bytes: Uint8Array): string {
  let s = '';
  for (let i = 0; i < bytes.length; i += 8192) s += String.fromCharCode(...bytes.subarray(i, Math.min(bytes.length, i + 8192)));
  return s;
}

function latin1(text: string): Uint8Array {
  const out = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) out[i] = text.charCodeAt(i);
  return out;
}

/** True when every character of `text` fits a tEXt chunk (Latin-1 without NUL). */
function isLatin1(text: string): boolean {
  return /^[\x01-\xff]*$/.test(text);
}

/** One PNG chunk: length · type · data · CRC-32 of type and data. */
export function pngChunk(type: string, data: Uint8Array): Uint8Array {
  if (!/^[A-Za-z]{4}$/.test(type)) throw new PngChunkError(`PNG chunk type must be four ASCII letters, got ${JSON.stringify(type)}`);
  const out = new Uint8Array(12 + data.length);
  const view = new DataView(out.buffer);
  view.setUint32(0, data.length);
  out.set(latin1(type), 4);
  out.set(data, 8);
  view.setUint32(8 + data.length, crc32(out, 4, 8 + data.length));
  return out;
}

/**
 * One text chunk for an entry: `tEXt` when key and text are Latin-1, otherwise (or when `utf8` is set)
 * an uncompressed `iTXt`.
 */
export function pngTextChunk(entry: PngTextEntry, options: { utf8?: boolean } = {}): Uint8Array {
  checkKeyword(entry.keyword);
  if (!options.utf8 && isLatin1(entry.text)) {
    const k = latin1(entry.keyword);
    const t = latin1(entry.text);
    const data = new Uint8Array(k.length + 1 + t.length);
    data.set(k, 0);
    data.set(t, k.length + 1);
    return pngChunk('tEXt', data);
  }
  const k = latin1(entry.keyword);
  const t = utf8Encode(entry.text);
  // keyword NUL, compression flag 0, compression method 0, language tag "" NUL, translated keyword "" NUL, text
  const data = new Uint8Array(k.length + 5 + t.length);
  data.set(k, 0);
  data.set(t, k.length + 5);
  return pngChunk('iTXt', data);
}

/**
 * A copy of `png` with text chunks inserted right after IHDR (before any image data, so readers see
 * them early). The image itself is untouched. Throws `PngChunkError` when `png` is not a PNG whose
 * first chunk is IHDR.
 *
 * @example
 * insertPngTextChunks(png, [{ keyword: 'Software', text: 'Fieldbound 0.1.0' }])
 */
export function insertPngTextChunks(png: Uint8Array, entries: readonly PngTextEntry[], options: { utf8?: boolean } = {}): Uint8Array {
  return insertPngChunks(
    png,
    entries.map((e) => pngTextChunk(e, options)),
  );
}

/**
 * A copy of `png` with whole chunks (from `pngChunk`) inserted right after IHDR. Throws `PngChunkError`
 * when `png` is not a PNG whose first chunk is IHDR.
 */
export function insertPngChunks(png: Uint8Array, chunks: readonly Uint8Array[]): Uint8Array {
  checkSignature(png);
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  const ihdrLength = view.getUint32(8);
  const type = String.fromCharCode(png[12], png[13], png[14], png[15]);
  if (type !== 'IHDR') throw new PngChunkError(`PNG: first chunk is ${JSON.stringify(type)}, expected IHDR`);
  const afterIhdr = 8 + 12 + ihdrLength;
  const extra = chunks.reduce((s, c) => s + c.length, 0);
  const out = new Uint8Array(png.length + extra);
  out.set(png.subarray(0, afterIhdr), 0);
  let at = afterIhdr;
  for (const c of chunks) {
    out.set(c, at);
    at += c.length;
  }
  out.set(png.subarray(afterIhdr), at);
  return out;
}

/**
 * The `pHYs` chunk stating the resolution (PNG specification §11.3.5.3): pixels per metre in x and y,
 * unit metre. `dpi` is converted with 1 inch = 0.0254 m and rounded.
 *
 * @example
 * pngPhysChunk(300) // 11 813 pixels per metre
 */
export function pngPhysChunk(dpi: number): Uint8Array {
  if (!(dpi > 0) || !Number.isFinite(dpi)) throw new PngChunkError(`resolution must be a positive number of dots per inch, got ${dpi}`);
  const ppm = Math.round(dpi / 0.0254);
  const data = new Uint8Array(9);
  const v = new DataView(data.buffer);
  v.setUint32(0, ppm);
  v.setUint32(4, ppm);
  data[8] = 1;
  return pngChunk('pHYs', data);
}

/** One chunk as read back: its type and whether its CRC matched. */
export interface PngTextRead extends PngTextEntry {
  type: 'tEXt' | 'iTXt';
  crcOk: boolean;
}

/**
 * Every uncompressed `tEXt` and `iTXt` chunk of a PNG, in file order, with a CRC check per chunk
 * (compressed iTXt and zTXt chunks are skipped: this reader needs no inflater).
 */
export function readPngTextChunks(png: Uint8Array): PngTextRead[] {
  checkSignature(png);
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  const out: PngTextRead[] = [];
  let at = 8;
  while (at + 12 <= png.length) {
    const length = view.getUint32(at);
    const type = String.fromCharCode(png[at + 4], png[at + 5], png[at + 6], png[at + 7]);
    const dataStart = at + 8;
    const dataEnd = dataStart + length;
    if (dataEnd + 4 > png.length) throw new PngChunkError(`PNG: chunk ${JSON.stringify(type)} at byte ${at} runs past the end of the file`);
    if (type === 'tEXt' || type === 'iTXt') {
      const crcOk = crc32(png, at + 4, dataEnd) === view.getUint32(dataEnd);
      const data = png.subarray(dataStart, dataEnd);
      const nul = data.indexOf(0);
      const keyword = latin1Decode(data.subarray(0, nul < 0 ? data.length : nul));
      if (type === 'tEXt') {
        out.push({ type, keyword, text: nul < 0 ? '' : latin1Decode(data.subarray(nul + 1)), crcOk });
      } else if (nul >= 0 && data[nul + 1] === 0) {
        const lang = data.indexOf(0, nul + 3);
        const translated = lang < 0 ? -1 : data.indexOf(0, lang + 1);
        if (translated >= 0) out.push({ type, keyword, text: utf8Decode(data.subarray(translated + 1)), crcOk });
      }
    }
    if (type === 'IEND') break;
    at = dataEnd + 4;
  }
  return out;
}
