import { afterEach, describe, expect, it } from 'vitest';
import { canonicalJson, defaultSetup, ENGINE_VERSION, figureMetadata, readSvgFigureMetadata, setupFingerprint } from '@fieldbound/shared';
import { makeFigure } from './exportFigure';
import { buildFigureSvg, CAPTION_HEIGHT, captionHeight, serializeFigure } from './figureSvg';
import { pngPixelSize } from './figurePng';
import { prepareTextForPdf, textRuns } from './pdfText';
import { inflateNode, loadFontFromDisk, mapViewSvg } from './testFixtures';
import { inflateSync } from 'node:zlib';

/** Every stream of a PDF, inflated when it is Flate-compressed (as text). */
function inflatedStreams(pdf: Uint8Array): string[] {
  const text = new TextDecoder('latin1').decode(pdf);
  const out: string[] = [];
  const re = /(?<!end)stream\r?\n/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(text))) {
    const start = m.index + m[0].length;
    const end = text.indexOf('endstream', start);
    const raw = pdf.subarray(start, end);
    try {
      out.push(new TextDecoder().decode(inflateSync(raw)));
    } catch {
      out.push(new TextDecoder().decode(raw));
    }
  }
  return out;
}

const setup = { ...defaultSetup(), species: ['Cs'] };
const meta = figureMetadata(setup, { engineVersion: ENGINE_VERSION, date: '2026-12-02T01:30:00.000Z', title: 'Caesium & rubidium <lab>' });
const DATE = new Date('2026-12-02T01:30:00.000Z');

afterEach(() => {
  document.body.innerHTML = '';
});

describe('figure SVG', () => {
  it('drops the interactive parts, keeps or drops pins and species, and leaves the page untouched', () => {
    const source = mapViewSvg();
    const fig = buildFigureSvg(source, { pins: false, species: true, caption: false, widthMm: 170, meta });
    expect(fig.querySelector('.crosshair')).toBeNull();
    expect(fig.querySelector('.map-overlay')).toBeNull();
    expect(fig.querySelector('.probe-marker')).toBeNull();
    expect(fig.querySelector('.pins')).toBeNull();
    expect(fig.querySelector('.species text')?.textContent).toBe('Cs');
    expect(fig.querySelector('.region-bound')).not.toBeNull();
    const noSpecies = buildFigureSvg(source, { pins: true, species: false, caption: false, widthMm: 170, meta });
    expect(noSpecies.querySelector('.species')).toBeNull();
    expect(noSpecies.querySelector('.pins circle')).not.toBeNull();
    // every text in the shipped font (d3 axes set sans-serif on their groups)
    expect(fig.querySelector('.tick')!.getAttribute('font-family')).toBe("'IBM Plex Sans', sans-serif");
    expect(fig.getAttribute('font-family')).toBe("'IBM Plex Sans', sans-serif");
    // the source still has everything
    expect(source.querySelector('.crosshair')).not.toBeNull();
    expect(source.querySelector('.pins')).not.toBeNull();
  });

  it('has the printed size in millimetres, the drawing as viewBox, and a caption block with title, caveat, engine version and fingerprint', () => {
    const fig = buildFigureSvg(mapViewSvg(), { pins: true, species: true, caption: true, widthMm: 160, meta });
    const captionH = captionHeight(meta, 400);
    expect(captionH).toBeGreaterThan(CAPTION_HEIGHT); // two lines wrap on a 400-unit-wide map
    expect(fig.getAttribute('viewBox')).toBe(`0 0 400 ${300 + captionH}`);
    expect(fig.getAttribute('width')).toBe('160mm');
    expect(fig.getAttribute('height')).toBe(`${Math.round(((160 * (300 + captionH)) / 400) * 100) / 100}mm`);
    const lines = [...fig.querySelectorAll('.figure-caption text')].map((t) => t.textContent);
    expect(lines.join(' ')).toBe(
      `Caesium & rubidium <lab> Model estimates; adiabatic single-orbital approximation; see methods note. Fieldbound engine ${ENGINE_VERSION} · setup fingerprint ${setupFingerprint(setup)} · 2026-12-02T01:30:00.000Z`,
    );
    expect(lines.length).toBe(5);
    const wide = buildFigureSvg(mapViewSvg(), { pins: true, species: true, caption: true, widthMm: 160, meta: { ...meta, title: 'T' } });
    expect(wide.querySelectorAll('.figure-caption text').length).toBeLessThanOrEqual(5);
  });

  it('serializes with the figure record in <metadata>, which reads back to the setup', () => {
    const text = serializeFigure(buildFigureSvg(mapViewSvg(), { pins: true, species: true, caption: true, widthMm: 170, meta }), meta);
    expect(text.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg')).toBe(true);
    expect(text.indexOf('<metadata>')).toBeLessThan(text.indexOf('<rect'));
    const back = readSvgFigureMetadata(text);
    expect(back).toEqual(meta);
    expect(JSON.parse(back!.setupJson)).toEqual(JSON.parse(canonicalJson(setup)));
    expect(new DOMParser().parseFromString(text, 'image/svg+xml').querySelector('parsererror')).toBeNull();
  });

  it('makeFigure SVG embeds the shipped font as @font-face data URLs and names the file after the title', async () => {
    const f = await makeFigure(mapViewSvg(), setup, { format: 'svg', title: 'Cs map', widthMm: 170, dpi: 300, pins: true, species: true, caption: true }, { date: DATE, loadFont: loadFontFromDisk });
    expect(f.fontWarning).toBeNull();
    expect(f.fileName).toBe('Cs-map.svg');
    const text = await f.blob.text();
    expect((text.match(/@font-face\{font-family:'IBM Plex Sans'/g) ?? []).length).toBe(3);
    expect(text).toContain('data:font/woff2;base64,d09GMg'); // "wOF2"
    expect(readSvgFigureMetadata(text)!.setupFingerprint).toBe(setupFingerprint(setup));
  });

  it('makeFigure still makes the SVG when the font cannot be loaded, and says so', async () => {
    const f = await makeFigure(mapViewSvg(), setup, { format: 'svg', title: 'x', widthMm: 100, dpi: 300, pins: true, species: true, caption: false }, { date: DATE, loadFont: () => Promise.reject(new Error('offline')) });
    expect(f.fontWarning).toMatch(/could not be embedded \(offline\)/);
    expect(await f.blob.text()).not.toContain('@font-face');
  });
});

describe('figure PDF', () => {
  it('is a one-page vector PDF with the font embedded, the title and fingerprint in its info, and the setup in XMP', async () => {
    const f = await makeFigure(mapViewSvg(), setup, { format: 'pdf', title: 'Cs map', widthMm: 170, dpi: 300, pins: true, species: true, caption: true }, { date: DATE, loadFont: loadFontFromDisk, inflate: inflateNode });
    expect(f.fontWarning).toBeNull();
    expect(f.fileName).toBe('Cs-map.pdf');
    const bytes = new Uint8Array(await f.blob.arrayBuffer());
    const text = new TextDecoder('latin1').decode(bytes);
    expect(text.startsWith('%PDF-')).toBe(true);
    expect((text.match(/\/Type \/Page\b/g) ?? []).length).toBe(1);
    expect(text).toMatch(/\/FontFile2/);
    expect(text).toContain('/Title (Cs map)');
    expect(text).toContain(`setup fingerprint ${setupFingerprint(setup)}`);
    expect(text).toContain('urn:fieldbound:figure:1');
    const streams = inflatedStreams(bytes);
    const xmp = streams.find((s) => s.includes('<fb:setup>'))!;
    expect(xmp).toContain('xmlns:fb="urn:fieldbound:figure:1"');
    expect(xmp).toContain(`<fb:setupFingerprint>${setupFingerprint(setup)}</fb:setupFingerprint>`);
    const setupText = /<fb:setup>([^<]*)<\/fb:setup>/.exec(xmp)![1].replace(/&quot;/g, '"').replace(/&amp;/g, '&');
    expect(JSON.parse(setupText)).toEqual(JSON.parse(canonicalJson(setup)));
    // page size = 170 mm wide (482 pt)
    const box = /\/MediaBox \[0 0 ([\d.]+) ([\d.]+)\]/.exec(text)!;
    expect(Number(box[1])).toBeCloseTo((170 / 25.4) * 72, 0);
  }, 30_000);

  it('text runs: Greek goes to its own font, superscripts and subscripts become raised or lowered digits', () => {
    expect(textRuns('10⁻⁹ α')).toEqual([
      { kind: 'latin', text: '10' },
      { kind: 'super', text: '−9' },
      { kind: 'latin', text: ' ' },
      { kind: 'greek', text: 'α' },
    ]);
    expect(textRuns('a₀³')).toEqual([{ kind: 'latin', text: 'a' }, { kind: 'sub', text: '0' }, { kind: 'super', text: '3' }]);
    const svg = mapViewSvg();
    const n = prepareTextForPdf(svg);
    expect(n).toBe(2); // the tick label 10⁻⁶ and the axis label
    const label = [...svg.querySelectorAll('text')].at(-1)!;
    const spans = [...label.querySelectorAll('tspan')].map((t) => [t.textContent, t.getAttribute('dy'), t.getAttribute('font-family'), t.getAttribute('font-size')]);
    expect(spans).toEqual([
      ['Polarizability ', null, null, null],
      ['α', null, 'IBM Plex Sans Greek', null],
      [' (a', null, null, null],
      ['0', '2.6', null, '9.1'],
      ['3', '-7.54', null, '9.1'],
      [') at 10', '4.94', null, null],
      ['−9', '-4.94', null, '9.1'],
    ]);
  });
});

describe('PNG size', () => {
  it('converts millimetres and dpi to pixels and refuses sizes a browser cannot draw', () => {
    expect(pngPixelSize(170, 127.5, 300)).toEqual({ width: 2008, height: 1506 });
    expect(() => pngPixelSize(1000, 800, 600)).toThrow(/23622 × 18898 pixels, above the limit of 12000 pixels per side/);
  });
});
