import { joinBoundaries, type Boundary } from './boundaries';
import { coarseLayout, coarseNodes, solveCoarseNodes, type CoarseNodes } from './coarseNodes';
import { boundaryEdges, locateCrossings, type Crossing } from './crossings';
import { solvePixels, type PixelBlock } from './pixelBlock';
import { axisValue, type MapInput } from './plane';

/** A computed Map: grids are flat row-major arrays, `values[j nx + i]` at (x[i], y[j]). */
export interface PhaseMap {
  readonly input: MapInput;
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly labels: string[];
  readonly energy: Float64Array;
  /** o_k (k = 1..15) at [15 p + k - 1]. */
  readonly order: Float64Array;
  readonly gap: Float64Array;
  readonly boundaries: Boundary[];
  readonly crossings: Crossing[];
}

/** Workers the three stages can be spread over; the single-thread runner below is one. */
export interface MapStages {
  coarse(input: MapInput, first: number, count: number): Promise<Float64Array>;
  pixels(input: MapInput, coarse: CoarseNodes, start: number, count: number): Promise<PixelBlock>;
  crossings(
    input: MapInput,
    edges: Int32Array,
    endFrames: Float64Array,
    endLabels: string[],
  ): Promise<Crossing[]>;
}

export const localStages: MapStages = {
  coarse: async (input, first, count) => solveCoarseNodes(input, first, count),
  pixels: async (input, coarse, start, count) => solvePixels(input, coarse, start, count),
  crossings: async (input, edges, frames, labels) => locateCrossings(input, edges, frames, labels),
};

function split(total: number, parts: number): [number, number][] {
  const out: [number, number][] = [];
  const size = Math.ceil(total / Math.max(1, parts));
  for (let start = 0; start < total; start += size)
    out.push([start, Math.min(size, total - start)]);
  return out;
}

/**
 * Runs the three stages, each split into `parts` chunks handed to `stages` concurrently.
 * The result does not depend on `parts` or on which runner computed which chunk.
 */
export async function computePhaseMap(
  input: MapInput,
  stages: MapStages = localStages,
  parts = 1,
): Promise<PhaseMap> {
  const [nx, ny] = input.plane.resolution;
  const { cols, rows } = coarseLayout(input);
  const nodeCount = cols.length * rows.length;
  const coarseChunks = await Promise.all(
    split(nodeCount, parts * 8).map(([first, count]) => stages.coarse(input, first, count)),
  );
  const frames = new Float64Array(32 * nodeCount);
  let offset = 0;
  for (const chunk of coarseChunks) {
    frames.set(chunk, offset);
    offset += chunk.length;
  }
  const coarse = coarseNodes(input, frames);
  const total = nx * ny;
  const blocks = await Promise.all(
    split(total, parts * 16).map(([start, count]) => stages.pixels(input, coarse, start, count)),
  );
  const energy = new Float64Array(total);
  const order = new Float64Array(15 * total);
  const gap = new Float64Array(total);
  const pixelFrames = new Float64Array(32 * total);
  const labels: string[] = new Array<string>(total);
  for (const b of blocks) {
    energy.set(b.energy, b.start);
    order.set(b.order, 15 * b.start);
    gap.set(b.gap, b.start);
    pixelFrames.set(b.frames, 32 * b.start);
    for (let n = 0; n < b.count; n++) labels[b.start + n] = b.labels[n]!;
  }
  const edges = boundaryEdges(labels, nx, ny);
  const edgeChunks = split(edges.length, parts * 16).map(([start, count]) => {
    const ids = edges.slice(start, start + count);
    const endFrames = new Float64Array(64 * count);
    const endLabels: string[] = [];
    ids.forEach((edge, e) => {
      const p = edge >> 1;
      const q = (edge & 1) === 1 ? p + nx : p + 1;
      endFrames.set(pixelFrames.subarray(32 * p, 32 * p + 32), 64 * e);
      endFrames.set(pixelFrames.subarray(32 * q, 32 * q + 32), 64 * e + 32);
      endLabels.push(labels[p]!, labels[q]!);
    });
    return stages.crossings(input, ids, endFrames, endLabels);
  });
  const crossings = (await Promise.all(edgeChunks)).flat();
  return {
    input,
    x: Float64Array.from({ length: nx }, (_, i) => axisValue(input.plane.x, nx, i)),
    y: Float64Array.from({ length: ny }, (_, j) => axisValue(input.plane.y, ny, j)),
    labels,
    energy,
    order,
    gap,
    boundaries: joinBoundaries(crossings, nx, ny),
    crossings,
  };
}
