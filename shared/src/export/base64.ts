/**
 * Base64 (RFC 4648 §4, standard alphabet, with '=' padding) of bytes, written without platform APIs
 * (no `btoa`/`Buffer` in the engine's build).
 *
 * @example
 * bytesToBase64(new Uint8Array([0x66, 0x6f, 0x6f])) // 'Zm9v'
 */
const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
const DECODE = (() => {
  const t = new Int16Array(128).fill(-1);
  for (let i = 0; i < ALPHABET.length; i++) t[ALPHABET.charCodeAt(i)] = i;
  return t;
})();

export function bytesToBase64(bytes: Uint8Array): string {
  const parts: string[] = [];
  const CHUNK = 3 * 8192;
  for (let start = 0; start < bytes.length; start += CHUNK) {
    const end = Math.min(bytes.length, start + CHUNK);
    const codes: number[] = [];
    for (let i = start; i < end; i += 3) {
      const b0 = bytes[i];
      const b1 = i + 1 < end ? bytes[i + 1] : 0;
      const b2 = i + 2 < end ? bytes[i + 2] : 0;
      codes.push(ALPHABET.charCodeAt(b0 >> 2), ALPHABET.charCodeAt(((b0 & 3) << 4) | (b1 >> 4)));
      codes.push(i + 1 < end ? ALPHABET.charCodeAt(((b1 & 15) << 2) | (b2 >> 6)) : 61);
      codes.push(i + 2 < end ? ALPHABET.charCodeAt(b2 & 63) : 61);
    }
    parts.push(String.fromCharCode(...codes));
  }
  return parts.join('');
}

/** Thrown by `base64ToBytes` for text that is not base64. */
export class Base64Error extends Error {
  override readonly name = 'Base64Error';
}

/**
 * Decodes standard base64 (padding optional; no whitespace allowed). Throws `Base64Error` naming the
 * first bad character's position.
 *
 * @example
 * base64ToBytes('Zm9v') // Uint8Array [0x66, 0x6f, 0x6f]
 */
export function base64ToBytes(text: string): Uint8Array {
  let end = text.length;
  while (end > 0 && text.charCodeAt(end - 1) === 61) end--;
  if (text.length - end > 2) throw new Base64Error(`base64: too much '=' padding at position ${end}`);
  if (end % 4 === 1) throw new Base64Error(`base64: length ${end} is not a valid base64 length`);
  const out = new Uint8Array(Math.floor((end * 3) / 4));
  let acc = 0;
  let bits = 0;
  let n = 0;
  for (let i = 0; i < end; i++) {
    const c = text.charCodeAt(i);
    const v = c < 128 ? DECODE[c] : -1;
    if (v < 0) throw new Base64Error(`base64: unexpected character ${JSON.stringify(text[i])} at position ${i}`);
    acc = ((acc << 6) | v) & 0xffffff;
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      out[n++] = (acc >> bits) & 0xff;
    }
  }
  return out;
}
