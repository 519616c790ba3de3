import { coarseLayout, nodeRange, type CoarseBlock, type CoarseNodes } from './coarseNodes';
import { bandRow, emptyBand, frameOf, placeBlock, type Band, type EdgeRow } from './bandPixels';
import { cellSpan, type CellRange, type PixelBlock } from './pixelBlock';
import { locateCrossings, type Crossing } from './crossings';
import { solveCells } from './pixelBlock';
import { solveCoarseNodes } from './coarseNodes';
import type { MapInput } from './plane';

/**
 * The Map in bands of coarse-cell rows, with bounded memory: the coarse nodes a band needs are
 * solved first, then each band's cells; a band's finished pixel rows go out at once (without
 * their frames, which the files never hold), and only the last pixel row's frames are kept, for
 * the edges between it and the next band. While a band is being filled, it keeps the frames of
 * only the pixels its edges may need (`bandPixels.ts`). Every pixel and every crossing is the
 * number the whole-plane run gives: each cell depends only on its own four corner nodes and each
 * edge only on its two end pixels, so any grouping of cells into bands and tasks gives identical
 * numbers.
 */

/** Workers the three stages can be spread over; `localStages` runs them in this thread. */
export interface MapStages {
  coarse(input: MapInput, nodes: Int32Array): Promise<CoarseBlock>;
  cells(input: MapInput, coarse: CoarseNodes, cells: CellRange): Promise<PixelBlock>;
  crossings(
    input: MapInput,
    edges: Int32Array,
    endFrames: Float64Array,
    endLabels: string[],
    relativeTolerance?: number,
  ): Promise<Crossing[]>;
}

export const localStages: MapStages = {
  coarse: async (input, nodes) => solveCoarseNodes(input, nodes),
  cells: async (input, coarse, cells) => solveCells(input, coarse, cells),
  crossings: async (input, edges, frames, labels, tolerance) =>
    locateCrossings(input, edges, frames, labels, tolerance),
};

/** Splits `total` items into about `parts` consecutive [start, count] ranges. */
export function splitRange(total: number, parts: number): [number, number][] {
  const out: [number, number][] = [];
  const size = Math.ceil(total / Math.max(1, parts));
  for (let start = 0; start < total; start += size)
    out.push([start, Math.min(size, total - start)]);
  return out;
}

/** Finished pixel rows [j0, j0 + rows) of a Map, row-major (`values[(j - j0) nx + i]`). */
export interface MapRowBlock {
  readonly j0: number;
  readonly rows: number;
  readonly labels: readonly string[];
  readonly energy: Float64Array;
  readonly gap: Float64Array;
  /** o_k (k = 1..15) at [15 n + k - 1]. */
  readonly order: Float64Array;
}

export type { EdgeRow } from './bandPixels';

/** What stays of a run over some rows of coarse cells once its pixel rows have gone out. */
export interface MapRowsResult {
  /** Pixel rows [j0, j1) that were computed. */
  readonly j0: number;
  readonly j1: number;
  /**
   * Crossings on every edge with both ends in those rows, ascending by edge (several on one edge
   * in the order `locateCrossings` gives them), as the whole-plane run lists them.
   */
  readonly crossings: Crossing[];
  /** The first and last pixel rows' states, for the edges across the seams to other runs. */
  readonly first: EdgeRow;
  readonly last: EdgeRow;
}

export interface MapRowsOptions {
  /** Runners the stages are spread over (tasks are sized for about this many). */
  readonly parts?: number;
  /** Rows of coarse cells [b0, b1) to compute (default: all). */
  readonly cellRows?: readonly [number, number];
  /** Receives the finished pixel rows, band after band, in order. */
  readonly onRows: (block: MapRowBlock) => void;
  /** Fraction of the bands finished, after each band. */
  readonly progress?: (fraction: number) => void;
  /** Asked before each band: true stops the run (it then rejects with `MapRunStopped`). */
  readonly stopped?: () => boolean;
  /** Bisection tolerance of the crossings, relative to the axis span (default: the CLI's 1e-9). */
  readonly relativeTolerance?: number;
  /** Pixels per band at least (default BAND_PIXELS; whole rows of coarse cells). */
  readonly bandPixels?: number;
}

/** The rejection of a run whose `stopped` said so. */
export class MapRunStopped extends Error {
  constructor() {
    super('the Map was stopped');
  }
}

/** Pixels per band at least (several rows of coarse cells make one band on small grids). */
export const BAND_PIXELS = 1 << 16;
/** Cell tasks per runner and band, for an even load. */
const CELL_TASKS_PER_RUNNER = 4;
/**
 * Pixels per cell task at most (when whole cells allow): a task's block, frames included, is
 * then some 26 MB, whatever the width of the grid.
 */
const TASK_PIXELS = 1 << 16;
/** Edges per crossing task at least. */
const EDGES_PER_TASK = 24;
/** Bands in flight besides the one being taken apart. */
const BANDS_AHEAD = 1;

/** Rows of coarse cells of the input's grid. */
export function cellRowCount(input: MapInput): number {
  return coarseLayout(input).rows.length - 1;
}

/** Pixel rows [j0, j1) that the rows of coarse cells [b0, b1) cover. */
export function cellRowPixels(
  input: MapInput,
  [b0, b1]: readonly [number, number],
): [number, number] {
  const { rows } = coarseLayout(input);
  const ny = input.plane.resolution[1];
  return [cellSpan(rows, b0, ny)[0], cellSpan(rows, b1 - 1, ny)[1]];
}

/**
 * Rows of coarse cells of shard `k` (1 to `n`) of the Map: the cell rows split into n runs as
 * even as whole rows allow. Needs n <= cellRowCount(input).
 */
export function shardCellRows(input: MapInput, k: number, n: number): [number, number] {
  const count = cellRowCount(input);
  return [Math.floor(((k - 1) * count) / n), Math.floor((k * count) / n)];
}

/**
 * The edges across the seam between two pixel rows (`lower.j + 1 === upper.j`) whose end labels
 * differ, with their end states, as `locateCrossings` takes them.
 */
export function seamEdges(
  lower: EdgeRow,
  upper: EdgeRow,
  nx: number,
): { edges: Int32Array; endFrames: Float64Array; endLabels: string[] } {
  const edges: number[] = [];
  const endLabels: string[] = [];
  const ends: number[] = [];
  for (let i = 0; i < nx; i++) {
    if (lower.labels[i] === upper.labels[i]) continue;
    edges.push(2 * (lower.j * nx + i) + 1);
    endLabels.push(lower.labels[i]!, upper.labels[i]!);
    ends.push(i);
  }
  const endFrames = new Float64Array(64 * ends.length);
  ends.forEach((i, e) => {
    endFrames.set(lower.frames.subarray(32 * i, 32 * i + 32), 64 * e);
    endFrames.set(upper.frames.subarray(32 * i, 32 * i + 32), 64 * e + 32);
  });
  return { edges: Int32Array.from(edges), endFrames, endLabels };
}

/**
 * The edges of a band whose end labels differ, ascending: the vertical edges from the row above
 * it (`previous`, the last row of the band before) into it, then every edge of its rows except
 * the vertical ones out of its last row (they wait for the next band, or a seam).
 */
function bandEdges(
  band: Band,
  previous: EdgeRow | undefined,
  nx: number,
): { edges: Int32Array; endFrames: Float64Array; endLabels: string[] } {
  const edges: number[] = [];
  /** Band-local pixel index of each end; -1 - i for pixel i of `previous`. */
  const ends: number[] = [];
  if (previous !== undefined) {
    for (let i = 0; i < nx; i++) {
      if (previous.labels[i] === band.labels[i]) continue;
      edges.push(2 * (previous.j * nx + i) + 1);
      ends.push(-1 - i, i);
    }
  }
  for (let r = 0; r < band.rows; r++) {
    for (let i = 0; i < nx; i++) {
      const n = r * nx + i;
      const p = (band.j0 + r) * nx + i;
      if (i + 1 < nx && band.labels[n] !== band.labels[n + 1]) {
        edges.push(2 * p);
        ends.push(n, n + 1);
      }
      if (r + 1 < band.rows && band.labels[n] !== band.labels[n + nx]) {
        edges.push(2 * p + 1);
        ends.push(n, n + nx);
      }
    }
  }
  const endFrames = new Float64Array(32 * ends.length);
  const endLabels: string[] = [];
  ends.forEach((n, k) => {
    if (n < 0) {
      const i = -1 - n;
      endFrames.set(previous!.frames.subarray(32 * i, 32 * i + 32), 32 * k);
      endLabels.push(previous!.labels[i]!);
    } else {
      endFrames.set(frameOf(band, n), 32 * k);
      endLabels.push(band.labels[n]!);
    }
  });
  return { edges: Int32Array.from(edges), endFrames, endLabels };
}

/**
 * Computes the rows of coarse cells `cellRows` (default all) of the Map: their coarse nodes, every
 * pixel (handed to `onRows` band by band, in order) and the crossings on every edge between two
 * of their pixels. Memory stays at a few bands whatever the grid size. The numbers do not depend
 * on `parts`, on the runners, or on how the rows are split between runs.
 */
export async function computeMapRows(
  input: MapInput,
  stages: MapStages,
  options: MapRowsOptions,
): Promise<MapRowsResult> {
  const parts = Math.max(1, options.parts ?? 1);
  const [nx] = input.plane.resolution;
  const { cols, rows } = coarseLayout(input);
  const width = cols.length;
  const [b0, b1] = options.cellRows ?? [0, rows.length - 1];
  const stopped = options.stopped ?? (() => false);
  if (stopped()) throw new MapRunStopped();

  // Stage 1: the coarse nodes of node rows b0..b1.
  const nodeCount = (b1 - b0 + 1) * width;
  const nodeFrames = new Float64Array(32 * nodeCount);
  const nodeLabels = new Array<string>(nodeCount);
  const coarseBlocks = await Promise.all(
    splitRange(nodeCount, parts * 8).map(([first, count]) =>
      stages.coarse(input, nodeRange(b0 * width + first, count)),
    ),
  );
  for (const block of coarseBlocks) {
    block.nodes.forEach((node, n) => {
      const local = node - b0 * width;
      nodeFrames.set(block.frames.subarray(32 * n, 32 * n + 32), 32 * local);
      nodeLabels[local] = block.labels[n]!;
    });
  }
  /** The coarse grid cells [a0, a1) of cell row b need, as a grid of its own. */
  const window = (b: number, a0: number, a1: number): CoarseNodes => {
    const span = a1 - a0 + 1;
    const frames = new Float64Array(64 * span);
    const labels: string[] = [];
    for (let r = 0; r < 2; r++) {
      const node = (b - b0 + r) * width + a0;
      frames.set(nodeFrames.subarray(32 * node, 32 * (node + span)), 32 * r * span);
      labels.push(...nodeLabels.slice(node, node + span));
    }
    return { cols: cols.slice(a0, a1 + 1), rows: rows.slice(b, b + 2), frames, labels };
  };

  // Bands: consecutive rows of cells with about BAND_PIXELS pixels.
  const cellRowPixelCount = (b: number) => nx * (cellRowPixels(input, [b, b + 1])[1] - rows[b]!);
  const bands: [number, number][] = [];
  for (let b = b0; b < b1;) {
    let end = b + 1;
    let pixels = cellRowPixelCount(b);
    while (end < b1 && pixels < (options.bandPixels ?? BAND_PIXELS)) {
      pixels += cellRowPixelCount(end++);
    }
    bands.push([b, end]);
    b = end;
  }
  const cellCols = width - 1;
  /** One string per label, whichever task brought it. */
  const shared = new Map<string, string>();
  const submitBand = ([bFirst, bEnd]: [number, number]): Promise<Band> => {
    const [bandJ0, bandJ1] = cellRowPixels(input, [bFirst, bEnd]);
    const band = emptyBand(nx, bandJ0, bandJ1 - bandJ0);
    const tasks: Promise<void>[] = [];
    for (let b = bFirst; b < bEnd; b++) {
      const groups = Math.min(
        cellCols,
        Math.max(
          1,
          Math.ceil((parts * CELL_TASKS_PER_RUNNER) / (bEnd - bFirst)),
          Math.ceil(cellRowPixelCount(b) / TASK_PIXELS),
        ),
      );
      for (const [a0, count] of splitRange(cellCols, groups)) {
        tasks.push(
          stages
            .cells(input, window(b, a0, a0 + count), { a0: 0, b0: 0, a1: count, b1: 1 })
            .then((block) => placeBlock(band, block, nx, shared)),
        );
      }
    }
    return Promise.all(tasks).then(() => band);
  };

  // Stages 2 and 3, band after band, with the next bands' cells already queued.
  const inFlight: Promise<Band>[] = [];
  let next = 0;
  const crossingTasks: Promise<Crossing[]>[] = [];
  const tolerance = options.relativeTolerance;
  let previous: EdgeRow | undefined;
  let first: EdgeRow | undefined;
  const [j0, j1] = cellRowPixels(input, [b0, b1]);
  for (let t = 0; t < bands.length; t++) {
    while (next < bands.length && next <= t + BANDS_AHEAD) {
      if (stopped()) throw new MapRunStopped();
      const pending = submitBand(bands[next++]!);
      // Rejections are taken when the band's turn comes.
      pending.catch(() => undefined);
      inFlight.push(pending);
    }
    const band = await inFlight.shift()!;
    if (stopped()) throw new MapRunStopped();
    options.onRows({
      j0: band.j0,
      rows: band.rows,
      labels: band.labels,
      energy: band.energy,
      gap: band.gap,
      order: band.order,
    });
    const { edges, endFrames, endLabels } = bandEdges(band, previous, nx);
    const chunks = Math.min(parts * 4, Math.ceil(edges.length / EDGES_PER_TASK));
    for (const [start, count] of splitRange(edges.length, chunks)) {
      const task = stages.crossings(
        input,
        edges.slice(start, start + count),
        endFrames.slice(64 * start, 64 * (start + count)),
        endLabels.slice(2 * start, 2 * (start + count)),
        tolerance,
      );
      task.catch(() => undefined);
      crossingTasks.push(task);
    }
    if (first === undefined) first = bandRow(band, nx, 0);
    previous = bandRow(band, nx, band.rows - 1);
    options.progress?.((t + 1) / bands.length);
  }
  // Ascending by edge: a row's vertical edges were sent a band after its horizontal ones (the
  // sort is stable, so the crossings of one edge keep their order).
  const crossings = (await Promise.all(crossingTasks)).flat().sort((a, b) => a.edge - b.edge);
  return { j0, j1, crossings, first: first!, last: previous! };
}
