/**
 * WOFF 1.0 → the plain sfnt (TrueType/OpenType) font it wraps (W3C WOFF File Format 1.0, 2012): each
 * table is stored zlib-compressed when that is smaller; we inflate the compressed ones and write the
 * sfnt offset table, table records (with the original checksums) and 4-byte-aligned table data.
 * The PDF writer needs a TrueType file, and the app ships its font as WOFF.
 *
 * `inflate` decompresses zlib data (the browser's `DecompressionStream('deflate')` by default).
 * Throws an Error naming the problem for bytes that are not WOFF 1.0.
 */
export async function woffToSfnt(woff: Uint8Array, inflate: (zlib: Uint8Array) => Promise<Uint8Array> = inflateZlib): Promise<Uint8Array> {
  const v = new DataView(woff.buffer, woff.byteOffset, woff.byteLength);
  if (woff.length < 44 || v.getUint32(0) !== 0x774f4646) throw new Error('not a WOFF 1.0 font (signature "wOFF" missing)');
  const flavor = v.getUint32(4);
  const numTables = v.getUint16(12);
  const tables: { tag: number; checksum: number; data: Uint8Array }[] = [];
  for (let k = 0; k < numTables; k++) {
    const e = 44 + 20 * k;
    const tag = v.getUint32(e);
    const offset = v.getUint32(e + 4);
    const compLength = v.getUint32(e + 8);
    const origLength = v.getUint32(e + 12);
    const checksum = v.getUint32(e + 16);
    if (offset + compLength > woff.length) throw new Error(`WOFF table ${tagText(tag)} runs past the end of the file`);
    const stored = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? await inflate(stored) : stored;
    if (data.length !== origLength) throw new Error(`WOFF table ${tagText(tag)} inflates to ${data.length} bytes, expected ${origLength}`);
    tables.push({ tag, checksum, data });
  }
  // Table records are sorted by tag (the sfnt rule); data follows in the same order.
  tables.sort((a, b) => a.tag - b.tag);
  const headerSize = 12 + 16 * numTables;
  let size = headerSize;
  for (const t of tables) size += (t.data.length + 3) & ~3;
  const out = new Uint8Array(size);
  const o = new DataView(out.buffer);
  let pow = 1;
  let log = 0;
  while (pow * 2 <= numTables) {
    pow *= 2;
    log++;
  }
  o.setUint32(0, flavor);
  o.setUint16(4, numTables);
  o.setUint16(6, pow * 16);
  o.setUint16(8, log);
  o.setUint16(10, numTables * 16 - pow * 16);
  let at = headerSize;
  tables.forEach((t, k) => {
    const r = 12 + 16 * k;
    o.setUint32(r, t.tag);
    o.setUint32(r + 4, t.checksum);
    o.setUint32(r + 8, at);
    o.setUint32(r + 12, t.data.length);
    out.set(t.data, at);
    at += (t.data.length + 3) & ~3;
  });
  return out;
}

/** sfnt table checksum: the sum of the big-endian 32-bit words (zero-padded), modulo 2³². */
export function sfntTableChecksum(data: Uint8Array): number {
  let sum = 0;
  const n = (data.length + 3) & ~3;
  for (let i = 0; i < n; i += 4) {
    const w = ((data[i] ?? 0) << 24) | ((data[i + 1] ?? 0) << 16) | ((data[i + 2] ?? 0) << 8) | (data[i + 3] ?? 0);
    sum = (sum + (w >>> 0)) >>> 0;
  }
  return sum;
}

function tagText(tag: number): string {
  return JSON.stringify(String.fromCharCode((tag >>> 24) & 255, (tag >>> 16) & 255, (tag >>> 8) & 255, tag & 255));
}

async function inflateZlib(zlib: Uint8Array): Promise<Uint8Array> {
  const stream = new Blob([zlib as BlobPart]).stream().pipeThrough(new DecompressionStream('deflate'));
  return new Uint8Array(await new Response(stream).arrayBuffer());
}
