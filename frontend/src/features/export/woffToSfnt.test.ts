import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { inflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { sfntTableChecksum, woffToSfnt } from './woffToSfnt';

const require = createRequire(import.meta.url);
const woffPath = require.resolve('@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff');

describe('WOFF 1.0 → sfnt', () => {
  it('unwraps the shipped IBM Plex Sans WOFF into a TrueType file whose tables match their stored checksums', async () => {
    const woff = new Uint8Array(readFileSync(woffPath));
    const sfnt = await woffToSfnt(woff, async (z) => new Uint8Array(inflateSync(z)));
    const v = new DataView(sfnt.buffer);
    expect(v.getUint32(0)).toBe(new DataView(woff.buffer, woff.byteOffset).getUint32(4)); // flavour kept (0x00010000 for TrueType)
    const numTables = v.getUint16(4);
    expect(numTables).toBeGreaterThan(8);
    const tags: string[] = [];
    for (let k = 0; k < numTables; k++) {
      const r = 12 + 16 * k;
      const tag = String.fromCharCode(...sfnt.subarray(r, r + 4));
      tags.push(tag);
      const offset = v.getUint32(r + 8);
      const length = v.getUint32(r + 12);
      expect(offset % 4).toBe(0);
      const table = sfnt.subarray(offset, offset + length);
      if (tag === 'head') {
        // head's checksum is computed with checkSumAdjustment (bytes 8–11) set to zero.
        const copy = table.slice();
        copy.fill(0, 8, 12);
        expect(sfntTableChecksum(copy)).toBe(v.getUint32(r + 4));
      } else {
        expect(sfntTableChecksum(table)).toBe(v.getUint32(r + 4));
      }
    }
    expect(tags).toEqual([...tags].sort());
    for (const t of ['cmap', 'glyf', 'head', 'hhea', 'hmtx', 'loca', 'maxp', 'name', 'post']) expect(tags).toContain(t);
  });

  it('refuses bytes that are not WOFF 1.0', async () => {
    await expect(woffToSfnt(new Uint8Array(60))).rejects.toThrow(/not a WOFF 1\.0 font/);
  });
});
