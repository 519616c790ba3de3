import type { CoarseBlock, CoarseNodes } from './coarseNodes';
import { MapGrid } from './mapGrid';
import { groupMagnitudes } from './orderParameters';
import type { CellRange, PixelBlock } from './pixelBlock';
import { splitRange } from './phaseMap';
import type { MapInput } from './plane';

/** The state at every pixel of a row condition's Map, as the consistency grid reads it. */
export interface ConditionMap {
  readonly labels: readonly string[];
  /** Order-parameter group magnitudes, 8 per pixel (ORDER_GROUPS order). */
  readonly groups: Float64Array;
  /** Quasiparticle gap per pixel, in the per-tesla unit (meV/T). */
  readonly gap: Float64Array;
}

/** The first two Map stages (coarse nodes, every cell), wherever they run. */
export interface ConditionStages {
  coarse(input: MapInput, nodes: Int32Array): Promise<CoarseBlock>;
  cells(input: MapInput, coarse: CoarseNodes, cells: CellRange): Promise<PixelBlock>;
}

/**
 * The Map of one row condition, every pixel solved: the Map's coarse nodes and cells
 * (`computePhaseMap` without its boundaries, which the consistency grid does not need), split
 * into about `parts` chunks per runner. `cancelled` is asked between chunks.
 */
export async function computeConditionMap(
  input: MapInput,
  stages: ConditionStages,
  parts = 1,
  cancelled: () => boolean = () => false,
): Promise<ConditionMap> {
  const grid = new MapGrid(input);
  const nodes = splitRange(grid.nodeCount, parts * 8);
  const blocks = await Promise.all(
    nodes.map(async ([first, count]) =>
      cancelled()
        ? null
        : stages.coarse(
            input,
            Int32Array.from({ length: count }, (_, n) => first + n),
          ),
    ),
  );
  if (cancelled()) throw new FitCancelled();
  for (const block of blocks) grid.placeCoarse(block!);
  const coarse = grid.coarseNodes();
  const cellCols = grid.cols.length - 1;
  const pixelBlocks = await Promise.all(
    splitRange(grid.rows.length - 1, parts * 16).map(async ([b0, count]) =>
      cancelled() ? null : stages.cells(input, coarse, { a0: 0, b0, a1: cellCols, b1: b0 + count }),
    ),
  );
  if (cancelled()) throw new FitCancelled();
  for (const block of pixelBlocks) grid.placePixels(block!);
  const total = grid.nx * grid.ny;
  const groups = new Float64Array(8 * total);
  const order = new Float64Array(16);
  for (let p = 0; p < total; p++) {
    order.set(grid.order.subarray(15 * p, 15 * p + 15), 1);
    groups.set(groupMagnitudes(order), 8 * p);
  }
  return { labels: [...grid.labels], groups, gap: Float64Array.from(grid.gap) };
}

/** A fit stopped by its caller (a newer request, or Cancel). */
export class FitCancelled extends Error {
  constructor() {
    super('the fit was cancelled');
    this.name = 'FitCancelled';
  }
}
