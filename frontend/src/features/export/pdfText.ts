import { PDF_GREEK_FONT_FAMILY } from './fonts';

const SVG_NS = 'http://www.w3.org/2000/svg';
const SUPER: Record<string, string> = { '⁰': '0', '¹': '1', '²': '2', '³': '3', '⁴': '4', '⁵': '5', '⁶': '6', '⁷': '7', '⁸': '8', '⁹': '9', '⁻': '−', '⁺': '+' };
const SUB: Record<string, string> = { '₀': '0', '₁': '1', '₂': '2', '₃': '3', '₄': '4', '₅': '5', '₆': '6', '₇': '7', '₈': '8', '₉': '9', '₋': '−', '₊': '+' };

/** A piece of text set in one way: plain Latin, Greek (its own font), raised or lowered. */
export interface TextRun {
  kind: 'latin' | 'greek' | 'super' | 'sub';
  text: string;
}

const kindOf = (c: string): TextRun['kind'] => {
  // ¹ ² ³ are in the Latin font, but are set raised like the other digits so that 10¹² looks even.
  if (c in SUPER) return 'super';
  if (c in SUB) return 'sub';
  const code = c.codePointAt(0)!;
  if (code >= 0x370 && code <= 0x3ff) return 'greek';
  return 'latin';
};

/**
 * Splits text into runs the PDF fonts can set: Greek letters (a separate subset font), superscript and
 * subscript characters (which no shipped subset has) as ordinary digits to be raised or lowered.
 *
 * @example
 * textRuns('10⁻⁹ α') // [{ kind: 'latin', text: '10' }, { kind: 'super', text: '−9' }, { kind: 'latin', text: ' ' }, { kind: 'greek', text: 'α' }]
 */
export function textRuns(text: string): TextRun[] {
  const runs: TextRun[] = [];
  for (const c of text) {
    const kind = kindOf(c);
    const ch = kind === 'super' ? SUPER[c] : kind === 'sub' ? SUB[c] : c;
    const last = runs[runs.length - 1];
    if (last && last.kind === kind) last.text += ch;
    else runs.push({ kind, text: ch });
  }
  return runs;
}

function fontSizeOf(el: Element | null): number {
  for (let e = el; e; e = e.parentElement) {
    const v = parseFloat(e.getAttribute('font-size') ?? '');
    if (v > 0) return v;
  }
  return 12;
}

/**
 * Rewrites the text of an SVG (in place; call it on the export clone) for the PDF writer: every text
 * node that needs it becomes tspans — Greek in the Greek font, superscripts raised by 0.38 em at 70 %
 * size, subscripts lowered by 0.2 em — so every glyph comes from an embedded font. Plain Latin text is
 * left as it is. Returns the number of text nodes rewritten.
 */
export function prepareTextForPdf(svg: SVGSVGElement): number {
  const doc = svg.ownerDocument;
  let rewritten = 0;
  const holders = [...svg.querySelectorAll('text, tspan')];
  for (const holder of holders) {
    for (const node of [...holder.childNodes]) {
      if (node.nodeType !== 3) continue;
      const runs = textRuns(node.textContent ?? '');
      if (runs.every((r) => r.kind === 'latin')) continue;
      const size = fontSizeOf(holder);
      const frag = doc.createDocumentFragment();
      let shift = 0;
      for (const r of runs) {
        const t = doc.createElementNS(SVG_NS, 'tspan');
        t.textContent = r.text;
        const target = r.kind === 'super' ? -0.38 * size : r.kind === 'sub' ? 0.2 * size : 0;
        if (target !== shift) t.setAttribute('dy', String(Math.round((target - shift) * 100) / 100));
        shift = target;
        if (r.kind === 'super' || r.kind === 'sub') t.setAttribute('font-size', String(Math.round(0.7 * size * 100) / 100));
        if (r.kind === 'greek') t.setAttribute('font-family', PDF_GREEK_FONT_FAMILY);
        frag.appendChild(t);
      }
      if (shift !== 0 && node.nextSibling) {
        // Something follows in the same text element: return to the baseline with a raised space.
        const back = doc.createElementNS(SVG_NS, 'tspan');
        back.setAttribute('dy', String(Math.round(-shift * 100) / 100));
        back.textContent = ' ';
        frag.appendChild(back);
      }
      holder.replaceChild(frag, node);
      rewritten++;
    }
  }
  return rewritten;
}
