/** Saves bytes or text as a file through a temporary object URL and a clicked link. */
export function downloadBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.rel = 'noopener';
  a.style.display = 'none';
  document.body.appendChild(a);
  a.click();
  a.remove();
  // Give the browser time to start reading the blob before it is released.
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

/**
 * Collects text chunks from a generator into a Blob (UTF-8), yielding to the event loop between
 * chunks so the page stays responsive, and reporting the characters written so far.
 */
export async function blobFromChunks(chunks: Iterable<string>, type: string, onProgress?: (chars: number) => void, signal?: { aborted: boolean }): Promise<Blob> {
  const encoder = new TextEncoder();
  const parts: Uint8Array[] = [];
  let chars = 0;
  let sinceYield = 0;
  for (const c of chunks) {
    if (signal?.aborted) throw new DOMException('export cancelled', 'AbortError');
    parts.push(encoder.encode(c));
    chars += c.length;
    sinceYield += c.length;
    if (sinceYield > 4_000_000) {
      sinceYield = 0;
      onProgress?.(chars);
      await new Promise((r) => setTimeout(r, 0));
    }
  }
  onProgress?.(chars);
  return new Blob(parts as BlobPart[], { type });
}

/** A file name from a title: letters, digits, dots, dashes; spaces become dashes. */
export function fileNameFrom(title: string, extension: string): string {
  const base = title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9.-]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 80);
  return `${base || 'fieldbound-map'}.${extension}`;
}
