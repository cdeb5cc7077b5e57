import { MODEL_CAVEAT, xmlEscape, type FigureMetadata } from '@fieldbound/shared';
import type { PdfFont } from './fonts';
import { prepareTextForPdf } from './pdfText';

/** Loads jsPDF and svg2pdf.js only when a PDF is asked for (they are large). */
async function loadPdfLibraries() {
  const [{ jsPDF }, { svg2pdf }] = await Promise.all([import('jspdf'), import('svg2pdf.js/dist/svg2pdf.es.min.js')]);
  return { jsPDF, svg2pdf };
}

/**
 * A PDF of a built figure (`buildFigureSvg`), one page of exactly the figure's printed size, vector
 * throughout (svg2pdf.js draws the SVG with jsPDF). The shipped font is embedded when `fonts` are given
 * (text is first split so that every glyph comes from an embedded subset, see pdfText.ts). The document
 * information carries the title, the model caveat, the engine version and fingerprint, and the creation
 * date; the setup itself (canonical JSON) goes into the XMP metadata packet in our own namespace.
 *
 * `figure` is modified (text rewritten for the PDF fonts): pass a clone used only for this.
 */
export async function figurePdf(figure: SVGSVGElement, p: { widthMm: number; heightMm: number; meta: FigureMetadata; fonts?: readonly PdfFont[]; date: Date }): Promise<Uint8Array> {
  const { jsPDF, svg2pdf } = await loadPdfLibraries();
  const doc = new jsPDF({ unit: 'mm', format: [p.widthMm, p.heightMm], orientation: p.widthMm >= p.heightMm ? 'landscape' : 'portrait', compress: true });
  if (p.fonts && p.fonts.length > 0) {
    for (const f of p.fonts) {
      doc.addFileToVFS(f.file, f.base64);
      doc.addFont(f.file, f.family, f.style);
    }
    prepareTextForPdf(figure);
  } else {
    // Without the embedded font, fall back to the PDF base font (Latin-1 only).
    figure.setAttribute('font-family', 'helvetica');
  }
  // svg2pdf reads layout from the live DOM: attach the clone off-screen while drawing.
  const host = figure.ownerDocument.createElement('div');
  host.style.cssText = 'position:fixed;left:-100000px;top:0;width:0;height:0;overflow:hidden';
  host.appendChild(figure);
  figure.ownerDocument.body.appendChild(host);
  try {
    await svg2pdf(figure, doc, { x: 0, y: 0, width: p.widthMm, height: p.heightMm });
  } finally {
    host.remove();
  }
  doc.setProperties({
    title: p.meta.title,
    subject: `${MODEL_CAVEAT}. Setup fingerprint ${p.meta.setupFingerprint}.`,
    keywords: `Fieldbound; engine ${p.meta.engineVersion}; setup fingerprint ${p.meta.setupFingerprint}`,
    creator: `Fieldbound engine ${p.meta.engineVersion}`,
    author: '',
  });
  doc.setCreationDate(p.date);
  // A complete XMP packet of our own (rawXml), so the record has its own namespace and prefix.
  const ns = 'urn:fieldbound:figure:1';
  doc.addMetadata(
    `<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#">` +
      `<rdf:Description rdf:about="" xmlns:dc="http://purl.org/dc/elements/1.1/" xmlns:fb="${ns}">` +
      `<dc:title><rdf:Alt><rdf:li xml:lang="x-default">${xmlEscape(p.meta.title)}</rdf:li></rdf:Alt></dc:title>` +
      `<fb:engineVersion>${xmlEscape(p.meta.engineVersion)}</fb:engineVersion><fb:setupFingerprint>${xmlEscape(p.meta.setupFingerprint)}</fb:setupFingerprint>` +
      `<fb:date>${xmlEscape(p.meta.date)}</fb:date><fb:setup>${xmlEscape(p.meta.setupJson)}</fb:setup>` +
      `</rdf:Description></rdf:RDF></x:xmpmeta>`,
    true,
  );
  return new Uint8Array(doc.output('arraybuffer'));
}
