import { ENGINE_VERSION, figureMetadata, type FigureMetadata, type MapSetup } from '@fieldbound/shared';
import { downloadBlob, fileNameFrom } from './download';
import { buildFigureSvg, captionHeight, serializeFigure, svgSize } from './figureSvg';
import { figurePdf } from './figurePdf';
import { figurePng, pngPixelSize } from './figurePng';
import { embeddedFontCss, pdfFonts, type FetchBytes } from './fonts';

export type FigureFormat = 'svg' | 'png' | 'pdf';

export interface FigureRequest {
  format: FigureFormat;
  title: string;
  widthMm: number;
  /** Resolution of a PNG in dots per inch. */
  dpi: number;
  pins: boolean;
  species: boolean;
  caption: boolean;
}

/** Printed height of the figure for a width, keeping the map's aspect (plus the caption block). */
export function figureHeightMm(source: SVGSVGElement, widthMm: number, caption: boolean, meta?: FigureMetadata): number {
  const { width, height } = svgSize(source);
  const extra = caption ? (meta ? captionHeight(meta, width) : captionHeight({ title: '', setupJson: '', setupFingerprint: '0000000000000000', engineVersion: '0.0.0', date: '0000-00-00T00:00:00.000Z' }, width)) : 0;
  return (widthMm * (height + extra)) / width;
}

/** A finished figure file. */
export interface FigureFile {
  blob: Blob;
  fileName: string;
  meta: FigureMetadata;
}

/**
 * Builds the figure file of the map view's SVG in the requested format, with the figure record in its
 * metadata. `loadFont` fetches the shipped font files (injectable for tests); when it fails the figure
 * is still made, with the viewer's fonts, and `fontWarning` says so.
 */
export async function makeFigure(
  source: SVGSVGElement,
  setup: MapSetup,
  request: FigureRequest,
  p: { date: Date; engineVersion?: string; loadFont?: FetchBytes; inflate?: (z: Uint8Array) => Promise<Uint8Array> },
): Promise<FigureFile & { fontWarning: string | null }> {
  const meta = figureMetadata(setup, { engineVersion: p.engineVersion ?? ENGINE_VERSION, date: p.date.toISOString(), title: request.title });
  const heightMm = figureHeightMm(source, request.widthMm, request.caption, meta);
  let fontWarning: string | null = null;
  const base = { pins: request.pins, species: request.species, caption: request.caption, widthMm: request.widthMm, heightMm, meta };

  if (request.format === 'pdf') {
    let fonts;
    try {
      fonts = await pdfFonts(p.loadFont, p.inflate);
    } catch (e) {
      fontWarning = `The figure font could not be embedded (${(e as Error).message}); the PDF uses Helvetica.`;
    }
    const figure = buildFigureSvg(source, base);
    const bytes = await figurePdf(figure, { widthMm: request.widthMm, heightMm, meta, fonts, date: p.date });
    return { blob: new Blob([bytes as BlobPart], { type: 'application/pdf' }), fileName: fileNameFrom(request.title, 'pdf'), meta, fontWarning };
  }

  let fontCss: string | undefined;
  try {
    fontCss = await embeddedFontCss(p.loadFont);
  } catch (e) {
    fontWarning = `The figure font could not be embedded (${(e as Error).message}); viewers will use their own sans-serif font.`;
  }
  const text = serializeFigure(buildFigureSvg(source, { ...base, fontCss }), meta);
  if (request.format === 'svg') {
    return { blob: new Blob([text], { type: 'image/svg+xml' }), fileName: fileNameFrom(request.title, 'svg'), meta, fontWarning };
  }
  const size = pngPixelSize(request.widthMm, heightMm, request.dpi);
  const png = await figurePng(text, size, request.dpi, meta);
  return { blob: new Blob([png as BlobPart], { type: 'image/png' }), fileName: fileNameFrom(request.title, 'png'), meta, fontWarning };
}

/** Makes the figure and saves it. */
export async function exportFigure(source: SVGSVGElement, setup: MapSetup, request: FigureRequest, date: Date): Promise<string | null> {
  const f = await makeFigure(source, setup, request, { date });
  downloadBlob(f.blob, f.fileName);
  return f.fontWarning;
}
