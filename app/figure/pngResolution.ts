/** CRC-32 of PNG chunks (ISO 3309 polynomial, as the PNG specification, section 5.5, uses). */
function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const b of bytes) {
    c ^= b;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  }
  return (c ^ 0xffffffff) >>> 0;
}

const SIGNATURE = [137, 80, 78, 71, 13, 10, 26, 10];

/**
 * A PNG with its resolution set: a pHYs chunk (pixels per metre, PNG specification section
 * 11.3.5.3) right after IHDR, replacing any there was, so editors place the image at its physical
 * size. `dpi` is pixels per inch (1 in = 0.0254 m). Throws on bytes that are not a PNG.
 */
export function pngWithResolution(png: Uint8Array, dpi: number): Uint8Array<ArrayBuffer> {
  if (png.length < 33 || SIGNATURE.some((b, k) => png[k] !== b)) {
    throw new Error('not a PNG file');
  }
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  const chunks: Uint8Array[] = [png.subarray(0, 8)];
  let at = 8;
  while (at + 12 <= png.length) {
    const length = view.getUint32(at);
    const type = String.fromCharCode(...png.subarray(at + 4, at + 8));
    const end = at + 12 + length;
    if (type !== 'pHYs') chunks.push(png.subarray(at, end));
    if (type === 'IHDR') chunks.push(physChunk(dpi));
    at = end;
  }
  const out = new Uint8Array(chunks.reduce((n, c) => n + c.length, 0));
  let o = 0;
  for (const c of chunks) {
    out.set(c, o);
    o += c.length;
  }
  return out;
}

function physChunk(dpi: number): Uint8Array {
  const perMetre = Math.round(dpi / 0.0254);
  const chunk = new Uint8Array(21);
  const view = new DataView(chunk.buffer);
  view.setUint32(0, 9);
  chunk.set([112, 72, 89, 115], 4); // 'pHYs'
  view.setUint32(8, perMetre);
  view.setUint32(12, perMetre);
  chunk[16] = 1; // unit: metre
  view.setUint32(17, crc32(chunk.subarray(4, 17)));
  return chunk;
}

/** Pixels per inch from a PNG's pHYs chunk, or null when it has none (or not in metres). */
export function pngResolution(png: Uint8Array): number | null {
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  let at = 8;
  while (at + 12 <= png.length) {
    const length = view.getUint32(at);
    const type = String.fromCharCode(...png.subarray(at + 4, at + 8));
    if (type === 'pHYs' && png[at + 16] === 1) return view.getUint32(at + 8) * 0.0254;
    at += 12 + length;
  }
  return null;
}
