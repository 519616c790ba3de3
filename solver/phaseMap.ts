import { nodeRange, solveCoarseNodes, type CoarseBlock, type CoarseNodes } from './coarseNodes';
import { locateCrossings, type Crossing } from './crossings';
import { MapGrid, type PhaseMap } from './mapGrid';
import { solveCells, type CellRange, type PixelBlock } from './pixelBlock';
import type { MapInput } from './plane';

/** Workers the three stages can be spread over; the single-thread runner below is one. */
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

/**
 * Runs the three stages, each split into chunks handed to `stages` concurrently (about `parts`
 * per runner). The result does not depend on `parts` or on which runner computed which chunk.
 */
export async function computePhaseMap(
  input: MapInput,
  stages: MapStages = localStages,
  parts = 1,
): Promise<PhaseMap> {
  const grid = new MapGrid(input);
  const coarseBlocks = await Promise.all(
    splitRange(grid.nodeCount, parts * 8).map(([first, count]) =>
      stages.coarse(input, nodeRange(first, count)),
    ),
  );
  for (const block of coarseBlocks) grid.placeCoarse(block);
  const coarse = grid.coarseNodes();
  const cellCols = grid.cols.length - 1;
  const cellRows = grid.rows.length - 1;
  const pixelBlocks = await Promise.all(
    splitRange(cellRows, parts * 16).map(([b0, count]) =>
      stages.cells(input, coarse, { a0: 0, b0, a1: cellCols, b1: b0 + count }),
    ),
  );
  for (const block of pixelBlocks) grid.placePixels(block);
  const edges = grid.boundaryEdges();
  const crossingChunks = await Promise.all(
    splitRange(edges.length, parts * 16).map(([start, count]) => {
      const ids = edges.slice(start, start + count);
      const { endFrames, endLabels } = grid.edgeEnds(ids);
      return stages.crossings(input, ids, endFrames, endLabels);
    }),
  );
  return grid.phaseMap(crossingChunks.flat());
}
