import { MODEL_CAVEAT, svgMetadataElement, type FigureMetadata } from '@fieldbound/shared';
import { palette } from '../../theme/palette';

const SVG_NS = 'http://www.w3.org/2000/svg';

/** What goes into an exported figure besides the map itself. */
export interface FigureOptions {
  /** Keep pins (elements with class `pins` / `pin-marker` or `data-export-layer="pins"`). */
  pins: boolean;
  /** Keep species markers and labels (class `species` or `data-export-layer="species"`). */
  species: boolean;
  /** Add the caption block below the map: title, model caveat, engine version and fingerprint, date. */
  caption: boolean;
  /** Printed size in millimetres; the height follows the map's aspect (plus the caption) when omitted. */
  widthMm: number;
  heightMm?: number;
  meta: FigureMetadata;
  /** `@font-face` rules to embed (the shipped font as data URLs); none when omitted. */
  fontCss?: string;
}

/** Interactive-only parts of the map view, never exported. */
const ALWAYS_REMOVED = ['.crosshair', '.map-overlay', '.probe-marker', '[data-export-layer="interactive"]'];
const PIN_LAYERS = ['.pins', '.pin-marker', '[data-export-layer="pins"]'];
const SPECIES_LAYERS = ['.species', '.species-marker', '[data-export-layer="species"]'];

/** Height of a caption block of three single lines in the figure's own units (CSS px of the map view). */
export const CAPTION_HEIGHT = 58;

/** Caption lines as set: text, font size, weight, colour; long lines wrapped to the figure's width. */
function captionLayout(meta: FigureMetadata, width: number): { lines: [string, number, number, string][]; height: number } {
  const [title, caveat, origin] = captionLines(meta);
  const lines: [string, number, number, string][] = [];
  for (const [text, size, weight, fill] of [
    [title, 14, 600, palette.ink],
    [caveat, 11, 400, palette.ink],
    [origin, 10, 400, '#55576b'],
  ] as const) {
    for (const line of wrap(text, width - 32, size)) lines.push([line, size, weight, fill]);
  }
  return { lines, height: lines.reduce((h, l) => h + l[1] + 4, 0) + 10 };
}

/** Captions taller than three lines grow the figure: the caption height for this metadata and width. */
export function captionHeight(meta: FigureMetadata, width: number): number {
  return Math.max(CAPTION_HEIGHT, captionLayout(meta, width).height);
}
export const FIGURE_FONT_FAMILY = "'IBM Plex Sans', sans-serif";

/** Size of the map view's drawing: its viewBox, or its width/height attributes. */
export function svgSize(svg: SVGSVGElement): { width: number; height: number } {
  const vb = svg.getAttribute('viewBox')?.trim().split(/[\s,]+/).map(Number);
  if (vb && vb.length === 4 && vb.every(Number.isFinite) && vb[2] > 0 && vb[3] > 0) return { width: vb[2], height: vb[3] };
  const width = parseFloat(svg.getAttribute('width') ?? '');
  const height = parseFloat(svg.getAttribute('height') ?? '');
  if (!(width > 0) || !(height > 0)) throw new Error('the map has no size yet (width and height are missing); wait until it is drawn');
  return { width, height };
}

/**
 * A standalone figure from the map view's SVG (the same d3 scene, cloned; the page is not touched):
 * interactive parts removed, every text set in the shipped font, pins and species kept or removed, a caption block appended below, the
 * shipped font embedded as `@font-face` when given, printed size in millimetres with the drawing's own
 * coordinates as the viewBox. The figure metadata is added by `serializeFigure`.
 */
export function buildFigureSvg(source: SVGSVGElement, options: FigureOptions): SVGSVGElement {
  const { width, height } = svgSize(source);
  const svg = source.cloneNode(true) as SVGSVGElement;
  const remove = [...ALWAYS_REMOVED, ...(options.pins ? [] : PIN_LAYERS), ...(options.species ? [] : SPECIES_LAYERS)];
  for (const el of svg.querySelectorAll(remove.join(','))) el.remove();
  svg.removeAttribute('style');
  svg.removeAttribute('class');
  svg.setAttribute('xmlns', SVG_NS);
  svg.setAttribute('font-family', FIGURE_FONT_FAMILY);
  // Text everywhere in the shipped font: d3 axes set font-family="sans-serif" on their groups, and CSS
  // (font-family: inherit) does not travel with the file.
  for (const el of svg.querySelectorAll('[font-family]')) el.setAttribute('font-family', FIGURE_FONT_FAMILY);
  for (const el of svg.querySelectorAll<SVGElement>('[style*="font-family"]')) el.style.removeProperty('font-family');
  const doc = svg.ownerDocument;

  const totalHeight = height + (options.caption ? captionHeight(options.meta, width) : 0);
  svg.setAttribute('viewBox', `0 0 ${width} ${totalHeight}`);
  const heightMm = options.heightMm ?? (options.widthMm * totalHeight) / width;
  svg.setAttribute('width', `${round(options.widthMm)}mm`);
  svg.setAttribute('height', `${round(heightMm)}mm`);
  svg.setAttribute('preserveAspectRatio', 'xMidYMid meet');

  // White paper under everything (the page's background is CSS, which does not travel with the SVG).
  const paper = doc.createElementNS(SVG_NS, 'rect');
  paper.setAttribute('class', 'figure-paper');
  paper.setAttribute('width', String(width));
  paper.setAttribute('height', String(totalHeight));
  paper.setAttribute('fill', '#ffffff');
  svg.insertBefore(paper, svg.firstChild);

  if (options.fontCss) {
    const style = doc.createElementNS(SVG_NS, 'style');
    style.textContent = options.fontCss;
    const defs = doc.createElementNS(SVG_NS, 'defs');
    defs.setAttribute('class', 'figure-fonts');
    defs.appendChild(style);
    svg.insertBefore(defs, svg.firstChild);
  }

  if (options.caption) svg.appendChild(captionBlock(doc, options.meta, width, height));
  return svg;
}

/** The caption lines of a figure (also used for the PDF document properties). */
export function captionLines(meta: FigureMetadata): [string, string, string] {
  return [meta.title, `${capitalise(MODEL_CAVEAT)}.`, `Fieldbound engine ${meta.engineVersion} · setup fingerprint ${meta.setupFingerprint} · ${meta.date}`];
}

function captionBlock(doc: Document, meta: FigureMetadata, width: number, top: number): SVGGElement {
  const g = doc.createElementNS(SVG_NS, 'g');
  g.setAttribute('class', 'figure-caption');
  g.setAttribute('transform', `translate(16,${top + 8})`);
  let y = 0;
  for (const [text, size, weight, fill] of captionLayout(meta, width).lines) {
    y += size + 4;
    const t = doc.createElementNS(SVG_NS, 'text');
    t.setAttribute('x', '0');
    t.setAttribute('y', String(y));
    t.setAttribute('font-size', String(size));
    t.setAttribute('font-weight', String(weight));
    t.setAttribute('fill', fill);
    t.textContent = text;
    g.appendChild(t);
  }
  return g;
}

/** Breaks a line at spaces so it fits the figure (≈ 0.55 em per character for Plex Sans). */
function wrap(text: string, widthPx: number, size: number): string[] {
  const max = Math.max(12, Math.floor(widthPx / (0.55 * size)));
  const out: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    if (line && line.length + 1 + word.length > max) {
      out.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) out.push(line);
  return out;
}

/**
 * The figure as SVG text: XML declaration, then the root `<svg>` with the figure metadata (setup as
 * canonical JSON, engine version, fingerprint, date) as its first child.
 */
export function serializeFigure(svg: SVGSVGElement, meta: FigureMetadata): string {
  const text = new XMLSerializer().serializeToString(svg);
  const open = text.indexOf('>', text.indexOf('<svg'));
  if (open < 0) throw new Error('not an SVG element');
  const selfClosing = text[open - 1] === '/';
  const body = selfClosing ? `${text.slice(0, open - 1)}>${svgMetadataElement(meta)}</svg>` : `${text.slice(0, open + 1)}${svgMetadataElement(meta)}${text.slice(open + 1)}`;
  return `<?xml version="1.0" encoding="UTF-8"?>\n${body}\n`;
}

function round(v: number): string {
  return String(Math.round(v * 100) / 100);
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
