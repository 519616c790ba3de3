import type { PixelBlock } from './pixelBlock';

/**
 * A band of the Map (`computeMapRows`) while its cell tasks come back, held with little memory:
 * every pixel's numbers and label, but the frames (the states, 32 numbers: 256 of a pixel's 400
 * bytes) of only the pixels whose edges may need them.
 */

/** One pixel row's labels and frames (32 numbers per pixel): what its edges to a neighbour need. */
export interface EdgeRow {
  readonly j: number;
  readonly labels: readonly string[];
  readonly frames: Float64Array;
}

/**
 * A band's pixels, filled in as its cell tasks come back: every number the files hold, and the
 * frames (32 numbers, 256 of a pixel's 400 bytes) of only the pixels an edge may need.
 */
export interface Band {
  readonly j0: number;
  readonly rows: number;
  readonly labels: string[];
  readonly energy: Float64Array;
  readonly gap: Float64Array;
  readonly order: Float64Array;
  /** Frames of the pixels kept (see `placeBlock`), by band-local pixel index r nx + i. */
  readonly frames: Map<number, Float64Array>;
}

export function emptyBand(nx: number, j0: number, rows: number): Band {
  const count = nx * rows;
  return {
    j0,
    rows,
    labels: new Array<string>(count),
    energy: new Float64Array(count),
    gap: new Float64Array(count),
    order: new Float64Array(15 * count),
    frames: new Map(),
  };
}

/**
 * Copies a cell task's block into its band. Labels become one string per phase (`shared`), not
 * one per pixel as a worker's message brings them. Frames are kept only where an edge may need
 * them: along the block's outline (its neighbours there lie in other blocks, bands or shards) and
 * at both ends of each edge inside it whose labels differ; the rest go with the block.
 */
export function placeBlock(
  band: Band,
  block: PixelBlock,
  nx: number,
  shared: Map<string, string>,
): void {
  const { width, height } = block;
  const keep = new Uint8Array(width * height);
  let kept = 0;
  for (let r = 0; r < height; r++) {
    const n = r * width;
    const p = (block.j0 - band.j0 + r) * nx + block.i0;
    for (let c = 0; c < width; c++) {
      const label = block.labels[n + c]!;
      let one = shared.get(label);
      if (one === undefined) shared.set(label, (one = label));
      band.labels[p + c] = one;
      const m = n + c;
      if (r === 0 || r === height - 1 || c === 0 || c === width - 1) keep[m] = 1;
      if (c + 1 < width && label !== block.labels[m + 1]) keep[m] = keep[m + 1] = 1;
      if (r + 1 < height && label !== block.labels[m + width]) keep[m] = keep[m + width] = 1;
    }
    band.energy.set(block.energy.subarray(n, n + width), p);
    band.gap.set(block.gap.subarray(n, n + width), p);
    band.order.set(block.order.subarray(15 * n, 15 * (n + width)), 15 * p);
  }
  for (let m = 0; m < keep.length; m++) kept += keep[m]!;
  const frames = new Float64Array(32 * kept);
  let k = 0;
  for (let m = 0; m < keep.length; m++) {
    if (keep[m] === 0) continue;
    const r = Math.floor(m / width);
    const p = (block.j0 - band.j0 + r) * nx + block.i0 + (m - r * width);
    const frame = frames.subarray(32 * k, 32 * k + 32);
    frame.set(block.frames.subarray(32 * m, 32 * m + 32));
    band.frames.set(p, frame);
    k++;
  }
}

/** The kept frame of band pixel n (r nx + i). */
export function frameOf(band: Band, n: number): Float64Array {
  const frame = band.frames.get(n);
  if (frame === undefined) throw new Error(`mapBands: no frame kept for pixel ${n} of the band`);
  return frame;
}

/** Pixel row r of a band with the frames of all its pixels (a block's first and last rows are kept). */
export function bandRow(band: Band, nx: number, r: number): EdgeRow {
  const n = r * nx;
  const frames = new Float64Array(32 * nx);
  for (let i = 0; i < nx; i++) frames.set(frameOf(band, n + i), 32 * i);
  return { j: band.j0 + r, labels: band.labels.slice(n, n + nx), frames };
}
