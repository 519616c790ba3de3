import { energyOfOrder, type Couplings } from './couplings';
import { DEGENERACY_TOLERANCE, representative, softDirections } from './degeneracy';
import { DEFAULT_DESCENT, descend } from './localMinimise';
import { seedLibrary } from './seeds';
import { DescentWorkspace, frameEnergy } from './tangentSpace';
import { DEFAULT_MINIMISE, type MinimiseOptions } from './minimise';
import { searchGroundState } from './groundSearch';
import { modelSymmetry } from './symmetry';
import { PixelScratch, summarise } from './stateSummary';
import { axisValue, PlaneCouplings, type MapInput } from './plane';

/**
 * The Map in three stages, each a pure function of its inputs so that any split of the work
 * between threads gives the same numbers bit for bit:
 *
 * 1. coarse nodes (this file; every `stride`-th pixel and the last row and column): full global
 *    search;
 * 2. every pixel (`pixelBlock.ts`): descents warm-started from the four coarse nodes around it
 *    (both sides of any boundary that crosses the coarse cell), the lowest kept;
 * 3. every pixel edge whose ends carry different labels (`crossings.ts`): bisection of the
 *    transition along the edge to 1e-9 of the axis span, warm-started from both ends, and typed
 *    first order (the order parameters jump) or continuous.
 */

/**
 * Search at coarse nodes: the search of a single point (`solve`), so that every node is the
 * single-point ground state and the pixels continued from the nodes start from it.
 */
export const COARSE_SEARCH: MinimiseOptions = DEFAULT_MINIMISE;

/**
 * Largest coarse node spacing: a cell is at most 128 x 128 pixels, as on a 2048 x 2048 grid.
 * A cell is solved whole (its branches continued over all its pixels), and a band is a row of
 * cells, so beyond 2048 per side a grid gets more nodes rather than larger cells, and the memory
 * of a cell and of a band grows with the grid's width alone.
 */
export const MAX_COARSE_STRIDE = 128;

/**
 * Coarse node spacing: about 16 nodes along the longer side (up to 2048 pixels; every 128th
 * pixel beyond), at least every 2nd pixel. Every pixel between them is certified on its own (see
 * `solveCells`), so the nodes need not be dense; fewer nodes are fewer full searches.
 */
export function coarseStride(nx: number, ny: number): number {
  return Math.min(MAX_COARSE_STRIDE, Math.max(2, Math.ceil(Math.max(nx, ny) / 16)));
}

/** Pixel indices of coarse nodes along one side: 0, s, 2s, ... and n - 1. */
export function coarseLine(n: number, stride: number): Int32Array {
  const out: number[] = [];
  for (let i = 0; i < n; i += stride) out.push(i);
  if (out[out.length - 1] !== n - 1) out.push(n - 1);
  return Int32Array.from(out);
}

export interface CoarseNodes {
  readonly cols: Int32Array;
  readonly rows: Int32Array;
  /** Frames (32 numbers) of node (a, b) at [32 (b cols.length + a)]. */
  readonly frames: Float64Array;
  readonly labels: string[];
}

export function coarseLayout(input: MapInput): { cols: Int32Array; rows: Int32Array } {
  const [nx, ny] = input.plane.resolution;
  const stride = coarseStride(nx, ny);
  return { cols: coarseLine(nx, stride), rows: coarseLine(ny, stride) };
}

/** Stage 1 results for a list of coarse nodes (same layout as a PixelBlock, one entry per node). */
export interface CoarseBlock {
  /** Node indices, row-major over the coarse grid. */
  readonly nodes: Int32Array;
  readonly frames: Float64Array;
  readonly energy: Float64Array;
  /** o_k, k = 1..15, at [15 n + k - 1]. */
  readonly order: Float64Array;
  readonly gap: Float64Array;
  readonly labels: string[];
  /** Nodes of a preview (`previewFrames`) that failed its check and got the search. */
  searched: number;
}

/**
 * A lighter search for a quick first look when a good warm start is at hand (the same node's
 * state just before a small change of the setup): two ranked seeds instead of four.
 */
export const QUICK_SEARCH: MinimiseOptions = {
  ...COARSE_SEARCH,
  rankedStarts: 2,
  rankedStartsOddFilling: 2,
};

/**
 * Stage 1 for the given coarse nodes (indices row-major over the coarse grid). `warm`, when
 * given, holds a frame per node (32 numbers each) to descend from besides the search's seeds.
 * `preview`, when given (`previewFrames`), makes a first look after a small change of the
 * setup: each node continues its own previous state and its neighbours' (`continuedNode`) and
 * gets the search only when that fails its check. A preview is always followed by the full
 * search of every node.
 */
export function solveCoarseNodes(
  input: MapInput,
  nodes: ArrayLike<number>,
  search: MinimiseOptions = COARSE_SEARCH,
  warm?: Float64Array,
  preview?: Float64Array,
): CoarseBlock {
  const { cols, rows } = coarseLayout(input);
  const [nx, ny] = input.plane.resolution;
  const nf = input.model.filling + 2;
  const planeCouplings = new PlaneCouplings(input);
  const count = nodes.length;
  const block: CoarseBlock = {
    nodes: Int32Array.from(nodes),
    frames: new Float64Array(32 * count),
    energy: new Float64Array(count),
    order: new Float64Array(15 * count),
    gap: new Float64Array(count),
    labels: [],
    searched: 0,
  };
  const ws = new DescentWorkspace();
  const scratch = new PixelScratch();
  for (let n = 0; n < count; n++) {
    const node = nodes[n]!;
    const a = node % cols.length;
    const b = Math.floor(node / cols.length);
    const c = planeCouplings.at(
      axisValue(input.plane.x, nx, cols[a]!),
      axisValue(input.plane.y, ny, rows[b]!),
    );
    // Polished to the last bit: pixels start from these frames and finish in fewer steps.
    const warmStarts = warm ? [warm.subarray(32 * n, 32 * n + 32)] : undefined;
    const continued =
      preview === undefined
        ? undefined
        : continuedNode(
            c,
            preview.subarray(PREVIEW_FRAMES * 32 * n, PREVIEW_FRAMES * 32 * (n + 1)),
            ws,
          );
    const frame = continued ?? searchGroundState(c, search, { warmStarts }).frame;
    if (preview !== undefined && continued === undefined) block.searched++;
    descend(c, frame, DEFAULT_DESCENT, ws);
    // The member the single-point search reports (its mirror image and orbit point): nodes of
    // one region then hold the same state where it does not change (a bond-ordered state's
    // phase would otherwise differ from node to node), which lets their cells skip descents.
    representative(c, frame, modelSymmetry(c));
    descend(c, frame, DEFAULT_DESCENT, ws);
    block.frames.set(frame, 32 * n);
    const summary = summarise(c, frame, nf, scratch);
    block.energy[n] = summary.energy;
    block.gap[n] = summary.gap;
    block.order.set(scratch.order.subarray(1, 16), 15 * n);
    block.labels.push(summary.label);
  }
  return block;
}

/** Node indices first .. first + count - 1. */
export function nodeRange(first: number, count: number): Int32Array {
  return Int32Array.from({ length: count }, (_, n) => first + n);
}

/** The coarse grid from all nodes' frames and labels (row-major over the coarse grid). */
export function coarseNodes(input: MapInput, frames: Float64Array, labels: string[]): CoarseNodes {
  const { cols, rows } = coarseLayout(input);
  return { cols, rows, frames, labels };
}

/** Frames per node of a preview: the node's own previous state and its four neighbours'. */
export const PREVIEW_FRAMES = 5;

/**
 * For `solveCoarseNodes`' preview: per node, PREVIEW_FRAMES frames (32 numbers each) from the
 * previous map of the same coarse layout (`previous`, all its nodes): the node's own and those of
 * its left, right, lower and upper neighbours (its own again at the grid's edge).
 */
export function previewFrames(
  layout: { cols: ArrayLike<number>; rows: ArrayLike<number> },
  previous: Float64Array,
  nodes: ArrayLike<number>,
): Float64Array {
  const width = layout.cols.length;
  const height = layout.rows.length;
  const out = new Float64Array(PREVIEW_FRAMES * 32 * nodes.length);
  for (let n = 0; n < nodes.length; n++) {
    const node = nodes[n]!;
    const a = node % width;
    const b = Math.floor(node / width);
    const around = [
      node,
      a > 0 ? node - 1 : node,
      a < width - 1 ? node + 1 : node,
      b > 0 ? node - width : node,
      b < height - 1 ? node + width : node,
    ];
    around.forEach((m, k) =>
      out.set(previous.subarray(32 * m, 32 * m + 32), 32 * (PREVIEW_FRAMES * n + k)),
    );
  }
  return out;
}

const previewOrder = new Float64Array(16);
const previewTrial = new Float64Array(32);

/**
 * A node of a preview: the lowest local minimum reached by descents from its own previous state
 * and its neighbours' (where a boundary moved across the node, a neighbour holds the state of the
 * other side), accepted only when it converged, has no soft direction (a degenerate family needs
 * the search's choice of member) and no exact state of the seed library lies below it here (a
 * phase that appeared between the nodes). Otherwise undefined: the node needs the search.
 */
function continuedNode(
  c: Couplings,
  frames: Float64Array,
  ws: DescentWorkspace,
): Float64Array | undefined {
  const tolerance = DEGENERACY_TOLERANCE * c.scale;
  let best: Float64Array | undefined;
  let bestEnergy = Infinity;
  for (let k = 0; k < PREVIEW_FRAMES; k++) {
    const start = frames.subarray(32 * k, 32 * k + 32);
    let repeated = false;
    for (let m = 0; m < k && !repeated; m++) {
      repeated = start.every((value, r) => value === frames[32 * m + r]);
    }
    if (repeated) continue;
    previewTrial.set(start);
    // A neighbour's state that lies far above, unrelaxed, is not worth a descent.
    if (
      best !== undefined &&
      frameEnergy(c, previewTrial, ws, previewOrder) > bestEnergy + 0.05 * c.scale
    ) {
      continue;
    }
    const result = descend(c, previewTrial, DEFAULT_DESCENT, ws);
    if (!result.converged) return undefined;
    if (result.energy < bestEnergy - tolerance) {
      best = Float64Array.from(previewTrial);
      bestEnergy = result.energy;
    }
  }
  if (best === undefined || softDirections(c, best, ws) > 0) return undefined;
  for (const seed of seedLibrary(c.nf)) {
    if (energyOfOrder(c, seed.exactOrder) < bestEnergy - tolerance) return undefined;
  }
  return best;
}
