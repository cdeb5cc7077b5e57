/**
 * Just enough MIME to read what our own mailer sends (text and HTML parts, quoted-printable or
 * base64, UTF-8 encoded-word subjects), so the local mail fake can show messages as people read them.
 */
export interface ParsedMessage {
  headers: Map<string, string>;
  subject: string;
  text: string | null;
  html: string | null;
}

function splitHeaderBody(raw: string): { head: string; body: string } {
  const match = /\r?\n\r?\n/.exec(raw);
  if (!match) return { head: raw, body: '' };
  return { head: raw.slice(0, match.index), body: raw.slice(match.index + match[0].length) };
}

function parseHeaders(head: string): Map<string, string> {
  const headers = new Map<string, string>();
  const unfolded = head.replace(/\r?\n[ \t]+/g, ' ');
  for (const line of unfolded.split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon <= 0) continue;
    headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
  }
  return headers;
}

function headerParam(value: string, name: string): string | null {
  const match = new RegExp(`${name}\\s*=\\s*("([^"]*)"|[^;\\s]+)`, 'i').exec(value);
  return match ? (match[2] ?? match[1]) : null;
}

export function decodeQuotedPrintable(input: string): string {
  const softBreaksRemoved = input.replace(/=\r?\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < softBreaksRemoved.length; i++) {
    const ch = softBreaksRemoved[i];
    const hex = softBreaksRemoved.slice(i + 1, i + 3);
    if (ch === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(parseInt(hex, 16));
      i += 2;
    } else {
      for (const b of Buffer.from(ch, 'utf8')) bytes.push(b);
    }
  }
  return Buffer.from(bytes).toString('utf8');
}

function decodeBody(body: string, encoding: string | undefined): string {
  switch ((encoding ?? '7bit').toLowerCase()) {
    case 'quoted-printable':
      return decodeQuotedPrintable(body);
    case 'base64':
      return Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
    default:
      return body;
  }
}

/** RFC 2047 encoded words such as `=?UTF-8?Q?Caf=C3=A9?=`. */
export function decodeEncodedWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_all, _charset: string, kind: string, text: string) =>
      kind.toUpperCase() === 'B'
        ? Buffer.from(text, 'base64').toString('utf8')
        : decodeQuotedPrintable(text.replace(/_/g, ' ')),
    );
}

function walk(raw: string, out: { text: string | null; html: string | null }): Map<string, string> {
  const { head, body } = splitHeaderBody(raw);
  const headers = parseHeaders(head);
  const contentType = headers.get('content-type') ?? 'text/plain';
  const type = contentType.split(';')[0].trim().toLowerCase();
  if (type.startsWith('multipart/')) {
    const boundary = headerParam(contentType, 'boundary');
    if (!boundary) return headers;
    const parts = body.split(`--${boundary}`);
    for (const part of parts.slice(1)) {
      if (part.startsWith('--')) break;
      // The line break before each delimiter belongs to the delimiter (RFC 2046).
      walk(part.replace(/^\r?\n/, '').replace(/\r?\n$/, ''), out);
    }
    return headers;
  }
  const decoded = decodeBody(body, headers.get('content-transfer-encoding'));
  if (type === 'text/plain' && out.text === null) out.text = decoded.replace(/\r\n/g, '\n').trimEnd();
  if (type === 'text/html' && out.html === null) out.html = decoded;
  return headers;
}

export function parseMessage(raw: string): ParsedMessage {
  const out: { text: string | null; html: string | null } = { text: null, html: null };
  const headers = walk(raw, out);
  return { headers, subject: decodeEncodedWords(headers.get('subject') ?? ''), text: out.text, html: out.html };
}

/** Every http(s) link in a text, in order, without duplicates. */
export function extractLinks(text: string): string[] {
  const links = text.match(/https?:\/\/[^\s<>"')\]]+/g) ?? [];
  return [...new Set(links)];
}
