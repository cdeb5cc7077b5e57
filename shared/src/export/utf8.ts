/**
 * UTF-8 encoding and decoding of JavaScript strings without any platform API (the engine's build has
 * no DOM or Node types, so neither `TextEncoder` nor `Buffer` is assumed). Lone surrogates are
 * encoded as U+FFFD; malformed input decodes to U+FFFD per bad sequence (Unicode 15, §3.9, "best
 * practice" substitution of maximal subparts is simplified here to one U+FFFD per offending byte).
 *
 * @example
 * utf8Encode('µ') // Uint8Array [0xc2, 0xb5]
 */
export function utf8Encode(text: string): Uint8Array {
  // Worst case 3 bytes per UTF-16 code unit.
  const out = new Uint8Array(text.length * 3);
  let n = 0;
  for (let i = 0; i < text.length; i++) {
    let c = text.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff && i + 1 < text.length) {
      const d = text.charCodeAt(i + 1);
      if (d >= 0xdc00 && d <= 0xdfff) {
        c = 0x10000 + ((c - 0xd800) << 10) + (d - 0xdc00);
        i++;
      }
    }
    if (c >= 0xd800 && c <= 0xdfff) c = 0xfffd;
    if (c < 0x80) out[n++] = c;
    else if (c < 0x800) {
      out[n++] = 0xc0 | (c >> 6);
      out[n++] = 0x80 | (c & 63);
    } else if (c < 0x10000) {
      out[n++] = 0xe0 | (c >> 12);
      out[n++] = 0x80 | ((c >> 6) & 63);
      out[n++] = 0x80 | (c & 63);
    } else {
      out[n++] = 0xf0 | (c >> 18);
      out[n++] = 0x80 | ((c >> 12) & 63);
      out[n++] = 0x80 | ((c >> 6) & 63);
      out[n++] = 0x80 | (c & 63);
    }
  }
  return out.slice(0, n);
}

/** Decodes UTF-8 bytes (see `utf8Encode`). @example utf8Decode(new Uint8Array([0xc2, 0xb5])) // 'µ' */
export function utf8Decode(bytes: Uint8Array): string {
  let s = '';
  const codes: number[] = [];
  const flush = () => {
    s += String.fromCharCode(...codes);
    codes.length = 0;
  };
  for (let i = 0; i < bytes.length; ) {
    const b = bytes[i];
    let c = 0xfffd;
    let len = 1;
    if (b < 0x80) c = b;
    else if (b >= 0xc2 && b < 0xe0) len = 2;
    else if (b >= 0xe0 && b < 0xf0) len = 3;
    else if (b >= 0xf0 && b < 0xf5) len = 4;
    if (len > 1) {
      let v = b & (len === 2 ? 0x1f : len === 3 ? 0x0f : 0x07);
      let ok = i + len <= bytes.length;
      for (let k = 1; ok && k < len; k++) {
        const t = bytes[i + k];
        if ((t & 0xc0) !== 0x80) ok = false;
        else v = (v << 6) | (t & 63);
      }
      const min = len === 2 ? 0x80 : len === 3 ? 0x800 : 0x10000;
      if (ok && v >= min && v <= 0x10ffff && !(v >= 0xd800 && v <= 0xdfff)) c = v;
      else len = 1;
    }
    if (c >= 0x10000) {
      c -= 0x10000;
      codes.push(0xd800 + (c >> 10), 0xdc00 + (c & 0x3ff));
    } else codes.push(c);
    if (codes.length > 8192) flush();
    i += len;
  }
  flush();
  return s;
}
