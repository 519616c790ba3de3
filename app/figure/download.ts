import { pngWithResolution } from './pngResolution';

/** Largest PNG side accepted, pixels (a double-column figure at 600 dpi is about 4200). */
export const MAX_PNG_SIDE = 8192;

/**
 * Rasterises an SVG figure (width and height in its viewBox, pt) at `dpi` pixels per inch with
 * the browser's own renderer, and marks the PNG with that resolution.
 */
export async function svgToPng(svg: string, dpi: number): Promise<Blob> {
  const box = /viewBox="0 0 ([\d.]+) ([\d.]+)"/.exec(svg);
  if (box === null) throw new Error('the figure has no viewBox');
  const width = Math.round((Number(box[1]) / 72) * dpi);
  const height = Math.round((Number(box[2]) / 72) * dpi);
  if (!(width > 0 && height > 0) || Math.max(width, height) > MAX_PNG_SIDE) {
    throw new Error(`${width} x ${height} pixels is too large; choose a lower resolution`);
  }
  const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
  try {
    const image = new Image(width, height);
    image.src = url;
    await image.decode();
    const canvas = document.createElement('canvas');
    canvas.width = width;
    canvas.height = height;
    const ctx = canvas.getContext('2d');
    if (ctx === null) throw new Error('no 2D canvas in this browser');
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, width, height);
    ctx.drawImage(image, 0, 0, width, height);
    const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
    if (blob === null) throw new Error('the browser could not encode the PNG');
    const bytes = pngWithResolution(new Uint8Array(await blob.arrayBuffer()), dpi);
    return new Blob([bytes], { type: 'image/png' });
  } finally {
    URL.revokeObjectURL(url);
  }
}
