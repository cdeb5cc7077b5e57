/**
 * Escapes text for XML character data and attribute values (both quote kinds): & < > " ' become
 * entity references; characters that XML 1.0 forbids (C0 controls other than tab, LF, CR; U+FFFE,
 * U+FFFF) are dropped, since no escape can carry them.
 *
 * @example
 * xmlEscape('a < b & "c"') // 'a &lt; b &amp; &quot;c&quot;'
 */
export function xmlEscape(text: string): string {
  return text
    .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

/** Reverses `xmlEscape` (the five predefined entities and numeric character references). */
export function xmlUnescape(text: string): string {
  return text.replace(/&(#x[0-9a-fA-F]+|#[0-9]+|amp|lt|gt|quot|apos);/g, (_, e: string) => {
    if (e[0] === '#') {
      const code = e[1] === 'x' ? parseInt(e.slice(2), 16) : parseInt(e.slice(1), 10);
      return String.fromCodePoint(code);
    }
    return ({ amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" } as Record<string, string>)[e];
  });
}
