import { describe, expect, it } from 'vitest';
import { defaultSetup } from '../setup/presets.js';
import { canonicalJson, setupFingerprint } from '../setup/fingerprint.js';
import { parseSetup } from '../setup/mapSetup.js';
import { crc32 } from './crc32.js';
import { figureMetadata, figureMetadataFromPngEntries, MODEL_CAVEAT, pngFigureEntries, readSvgFigureMetadata, svgMetadataElement } from './figureMetadata.js';
import { insertPngChunks, insertPngTextChunks, PngChunkError, pngPhysChunk, pngTextChunk, readPngTextChunks } from './pngTextChunks.js';
import { utf8Encode } from './utf8.js';
import { xmlEscape, xmlUnescape } from './xmlEscape.js';
import { base64ToBytes } from './base64.js';

// A widely circulated 1 × 1 RGBA PNG: signature, IHDR, IDAT, IEND, with CRCs written by another encoder.
const TINY_PNG = base64ToBytes('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==');

const setup = { ...defaultSetup(), species: ['Cs <"133">', 'Rb & K'] };
const meta = figureMetadata(setup, { engineVersion: '0.1.0', date: '2026-12-02T01:00:00Z', title: 'Cäsium α map' });

describe('CRC-32 (IEEE 802.3 polynomial)', () => {
  it('gives the standard check value 0xCBF43926 for "123456789" and known values for short inputs', () => {
    expect(crc32(utf8Encode('123456789'))).toBe(0xcbf43926);
    expect(crc32(new Uint8Array(0))).toBe(0);
    expect(crc32(utf8Encode('a'))).toBe(0xe8b7be43);
    expect(crc32(utf8Encode('The quick brown fox jumps over the lazy dog'))).toBe(0x414fa339);
  });

  it('continues a running CRC across pieces', () => {
    const bytes = utf8Encode('123456789');
    expect(crc32(bytes, 4, 9, crc32(bytes, 0, 4))).toBe(0xcbf43926);
  });

  it('matches the CRCs stored in a PNG written by another encoder (IHDR, IDAT, IEND)', () => {
    const view = new DataView(TINY_PNG.buffer);
    let at = 8;
    let chunks = 0;
    while (at < TINY_PNG.length) {
      const len = view.getUint32(at);
      expect(crc32(TINY_PNG, at + 4, at + 8 + len)).toBe(view.getUint32(at + 8 + len));
      at += 12 + len;
      chunks++;
    }
    expect(chunks).toBe(3);
    // The IEND chunk has no data, so its CRC is the CRC of the four letters: 0xAE426082.
    expect(crc32(utf8Encode('IEND'))).toBe(0xae426082);
  });
});

describe('PNG text chunks', () => {
  it('a tEXt chunk has the layout length · type · keyword NUL text · CRC', () => {
    const c = pngTextChunk({ keyword: 'Title', text: 'map' });
    expect([...c]).toEqual([0, 0, 0, 9, 0x74, 0x45, 0x58, 0x74, 0x54, 0x69, 0x74, 0x6c, 0x65, 0, 0x6d, 0x61, 0x70, ...u32(crc32(c, 4, 17))]);
  });

  it('inserts the figure record after IHDR and reads it back (tEXt and UTF-8 iTXt) with valid CRCs', () => {
    const out = insertPngTextChunks(TINY_PNG, pngFigureEntries(meta));
    expect(out.length).toBeGreaterThan(TINY_PNG.length);
    expect(out.subarray(0, 33)).toEqual(TINY_PNG.subarray(0, 33)); // signature + IHDR untouched
    expect(out.subarray(out.length - (TINY_PNG.length - 33))).toEqual(TINY_PNG.subarray(33)); // image data untouched
    const read = readPngTextChunks(out);
    expect(read.every((r) => r.crcOk)).toBe(true);
    expect(read.find((r) => r.keyword === 'Title')).toMatchObject({ type: 'iTXt', text: 'Cäsium α map' }); // α is outside Latin-1
    const back = figureMetadataFromPngEntries(read);
    expect(back).toEqual(meta);
    expect(parseSetup(JSON.parse(back!.setupJson))).toEqual(setup);
    expect(read.find((r) => r.keyword === 'Description')!.text).toBe(MODEL_CAVEAT);
  });

  it('uses iTXt for text outside Latin-1 and tEXt otherwise', () => {
    const read = readPngTextChunks(insertPngTextChunks(TINY_PNG, [{ keyword: 'A', text: 'µ only' }, { keyword: 'B', text: 'α β' }]));
    expect(read.map((r) => [r.keyword, r.type, r.text])).toEqual([['A', 'tEXt', 'µ only'], ['B', 'iTXt', 'α β']]);
  });

  it('detects a corrupted chunk by its CRC', () => {
    const out = insertPngTextChunks(TINY_PNG, [{ keyword: 'Comment', text: 'abc' }]);
    out[33 + 8 + 8] ^= 1; // flip a bit in the text
    expect(readPngTextChunks(out)[0].crcOk).toBe(false);
  });

  it('a pHYs chunk states 300 dpi as 11 811 pixels per metre, unit metre, with a valid CRC', () => {
    const c = pngPhysChunk(300);
    const v = new DataView(c.buffer);
    expect(v.getUint32(0)).toBe(9);
    expect(String.fromCharCode(...c.subarray(4, 8))).toBe('pHYs');
    expect(v.getUint32(8)).toBe(11811);
    expect(v.getUint32(12)).toBe(11811);
    expect(c[16]).toBe(1);
    expect(v.getUint32(17)).toBe(crc32(c, 4, 17));
    const out = insertPngChunks(TINY_PNG, [c]);
    expect(out.length).toBe(TINY_PNG.length + 21);
  });

  it('refuses bytes that are not a PNG and keywords the format cannot carry', () => {
    expect(() => insertPngTextChunks(new Uint8Array(50), [])).toThrow(PngChunkError);
    expect(() => pngTextChunk({ keyword: '', text: 'x' })).toThrow(/keyword/);
    expect(() => pngTextChunk({ keyword: ' lead', text: 'x' })).toThrow(/keyword/);
    expect(() => pngTextChunk({ keyword: 'k'.repeat(80), text: 'x' })).toThrow(/keyword/);
  });
});

describe('SVG <metadata>', () => {
  it('carries the canonical setup JSON XML-escaped, with engine version, fingerprint, date and title', () => {
    const el = svgMetadataElement(meta);
    expect(el.startsWith('<metadata><fb:figure xmlns:fb="urn:fieldbound:figure:1" engine-version="0.1.0"')).toBe(true);
    expect(el).toContain(`setup-fingerprint="${setupFingerprint(setup)}"`);
    expect(el).toContain('date="2026-12-02T01:00:00Z"');
    expect(el).not.toContain('Cs <"133">'); // escaped
    expect(el).toContain('Cs &lt;\\&quot;133\\&quot;&gt;');
    const back = readSvgFigureMetadata(`<svg xmlns="http://www.w3.org/2000/svg">${el}<g/></svg>`);
    expect(back).toEqual(meta);
    expect(back!.setupJson).toBe(canonicalJson(setup));
  });

  it('xmlEscape escapes the five special characters, drops forbidden controls, and xmlUnescape reverses it', () => {
    expect(xmlEscape(`a<b>&"c"'d'\u0001`)).toBe('a&lt;b&gt;&amp;&quot;c&quot;&apos;d&apos;');
    expect(xmlUnescape('&lt;&#x3b1;&#945;&amp;lt;')).toBe('<αα&lt;');
    expect(readSvgFigureMetadata('<svg/>')).toBeNull();
  });
});

function u32(v: number): number[] {
  return [(v >>> 24) & 255, (v >>> 16) & 255, (v >>> 8) & 255, v & 255];
}

describe('reopening a figure as a setup', () => {
  it('finds the setup in an exported PNG and SVG, and passes JSON through', async () => {
    const { importFileText } = await import('./figureSetupText.js');
    const png = insertPngTextChunks(TINY_PNG, pngFigureEntries(meta));
    expect(importFileText(png)).toEqual({ kind: 'png-figure', text: canonicalJson(setup) });
    const svg = utf8Encode(`<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg">${svgMetadataElement(meta)}</svg>`);
    expect(importFileText(svg)).toEqual({ kind: 'svg-figure', text: canonicalJson(setup) });
    expect(importFileText(utf8Encode('\ufeff{"a":1}'))).toEqual({ kind: 'json', text: '{"a":1}' });
    expect(importFileText(TINY_PNG).kind).toBe('figure-without-setup');
    expect(importFileText(utf8Encode('<svg/>')).kind).toBe('figure-without-setup');
  });
});
