import { insertPngChunks, pngFigureEntries, pngPhysChunk, pngTextChunk, type FigureMetadata } from '@fieldbound/shared';

/** Largest PNG side we draw (browsers refuse canvases much above 16 384 px per side or ~268 M pixels). */
export const PNG_MAX_SIDE = 12000;

/** Pixel size of a PNG of the printed size at the resolution; throws with a clear message when too large. */
export function pngPixelSize(widthMm: number, heightMm: number, dpi: number): { width: number; height: number } {
  const width = Math.round((widthMm / 25.4) * dpi);
  const height = Math.round((heightMm / 25.4) * dpi);
  if (!(width >= 1 && height >= 1)) throw new Error('the PNG would have no pixels: choose a larger size or resolution');
  if (width > PNG_MAX_SIDE || height > PNG_MAX_SIDE) {
    throw new Error(`a PNG of ${widthMm} × ${heightMm} mm at ${dpi} dpi would be ${width} × ${height} pixels, above the limit of ${PNG_MAX_SIDE} pixels per side; lower the resolution or the size`);
  }
  return { width, height };
}

/**
 * Draws figure SVG text onto a canvas of the given pixel size (white background), encodes it as PNG and
 * adds the figure record (text chunks: title, software, creation time, caveat, engine version,
 * fingerprint, setup JSON) and the resolution (pHYs).
 */
export async function figurePng(svgText: string, size: { width: number; height: number }, dpi: number, meta: FigureMetadata): Promise<Uint8Array> {
  const url = URL.createObjectURL(new Blob([svgText], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.decoding = 'sync';
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error('the browser could not draw the figure as an image'));
      img.src = url;
    });
    const canvas = document.createElement('canvas');
    canvas.width = size.width;
    canvas.height = size.height;
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('this browser gives no 2D canvas for drawing the PNG');
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, size.width, size.height);
    ctx.drawImage(img, 0, 0, size.width, size.height);
    const blob = await new Promise<Blob>((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('the browser could not encode the PNG'))), 'image/png'));
    const png = new Uint8Array(await blob.arrayBuffer());
    return insertPngChunks(png, [pngPhysChunk(dpi), ...pngFigureEntries(meta).map((e) => pngTextChunk(e))]);
  } finally {
    URL.revokeObjectURL(url);
  }
}
