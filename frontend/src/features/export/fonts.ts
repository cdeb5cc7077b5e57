import latin400Woff2 from '@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff2?url';
import latin600Woff2 from '@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-600-normal.woff2?url';
import greek400Woff2 from '@fontsource/ibm-plex-sans/files/ibm-plex-sans-greek-400-normal.woff2?url';
import latin400Woff from '@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff?url';
import latin600Woff from '@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-600-normal.woff?url';
import greek400Woff from '@fontsource/ibm-plex-sans/files/ibm-plex-sans-greek-400-normal.woff?url';
import { bytesToBase64 } from '@fieldbound/shared';
import { woffToSfnt } from './woffToSfnt';

/**
 * The shipped font (IBM Plex Sans, SIL Open Font License 1.1, from @fontsource/ibm-plex-sans) for
 * exported figures: WOFF2 data URLs for SVG `@font-face`, and TrueType files (unwrapped from WOFF) for
 * the PDF writer, which reads only TrueType. The subsets are those the app loads: Latin (400, 600) and
 * Greek (400). Characters outside them (superscript digits, subscript ₀) fall back to the viewer's fonts
 * in SVG; the PDF path rewrites them as raised or lowered ordinary digits (pdfText.ts).
 */
export type FetchBytes = (url: string) => Promise<Uint8Array>;

const fetchBytes: FetchBytes = async (url) => {
  const r = await fetch(url);
  if (!r.ok) throw new Error(`could not load the font ${url} (HTTP ${r.status})`);
  return new Uint8Array(await r.arrayBuffer());
};

const LATIN_RANGE = 'U+0000-00FF,U+0131,U+0152-0153,U+02BB-02BC,U+02C6,U+02DA,U+02DC,U+0304,U+0308,U+0329,U+2000-206F,U+20AC,U+2122,U+2191,U+2193,U+2212,U+2215,U+FEFF,U+FFFD';
const GREEK_RANGE = 'U+0370-0377,U+037A-037F,U+0384-038A,U+038C,U+038E-03A1,U+03A3-03FF';

/** Family name under which the Greek subset is registered in the PDF (jsPDF sets one font per run). */
export const PDF_GREEK_FONT_FAMILY = 'IBM Plex Sans Greek';

const FACES = [
  { weight: 400, woff2: latin400Woff2, woff: latin400Woff, range: LATIN_RANGE, pdfFamily: 'IBM Plex Sans', pdfStyle: 'normal' },
  { weight: 600, woff2: latin600Woff2, woff: latin600Woff, range: LATIN_RANGE, pdfFamily: 'IBM Plex Sans', pdfStyle: 'bold' },
  { weight: 400, woff2: greek400Woff2, woff: greek400Woff, range: GREEK_RANGE, pdfFamily: PDF_GREEK_FONT_FAMILY, pdfStyle: 'normal' },
] as const;

/** `@font-face` rules with the font files inlined as data URLs (about 60 kB of CSS). */
export async function embeddedFontCss(load: FetchBytes = fetchBytes): Promise<string> {
  const rules = await Promise.all(
    FACES.map(async (f) => {
      const data = bytesToBase64(await load(f.woff2));
      return `@font-face{font-family:'IBM Plex Sans';font-style:normal;font-weight:${f.weight};src:url(data:font/woff2;base64,${data}) format('woff2');unicode-range:${f.range};}`;
    }),
  );
  return rules.join('\n');
}

/** One TrueType font for jsPDF: VFS file name, family, style and the file as base64. */
export interface PdfFont {
  file: string;
  family: string;
  style: 'normal' | 'bold';
  base64: string;
}

/** The PDF fonts: Plex Sans Latin regular and semibold (as "bold"), and the Greek subset as its own family. */
export async function pdfFonts(load: FetchBytes = fetchBytes, inflate?: (z: Uint8Array) => Promise<Uint8Array>): Promise<PdfFont[]> {
  return Promise.all(
    FACES.map(async (f) => {
      const ttf = await woffToSfnt(await load(f.woff), inflate);
      return { file: `${f.pdfFamily.replace(/ /g, '')}-${f.pdfStyle}.ttf`, family: f.pdfFamily, style: f.pdfStyle, base64: bytesToBase64(ttf) };
    }),
  );
}
