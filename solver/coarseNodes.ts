import { DEFAULT_DESCENT, descend } from './localMinimise';
import { DescentWorkspace } from './tangentSpace';
import { DEFAULT_MINIMISE, type MinimiseOptions } from './minimise';
import { searchGroundState } from './groundSearch';
import { canonicaliseOrbit } from './orbitGauge';
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
 * Coarse node spacing: about 16 nodes along the longer side, at least every 2nd pixel. Every
 * pixel between them is certified on its own (see `solveCells`), so the nodes need not be
 * dense; fewer nodes are fewer full searches.
 */
export function coarseStride(nx: number, ny: number): number {
  return Math.max(2, Math.ceil(Math.max(nx, ny) / 16));
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
 */
export function solveCoarseNodes(
  input: MapInput,
  nodes: ArrayLike<number>,
  search: MinimiseOptions = COARSE_SEARCH,
  warm?: Float64Array,
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
    const frame = searchGroundState(c, search, { warmStarts }).frame;
    descend(c, frame, DEFAULT_DESCENT, ws);
    // The canonical point of the orbit of rotations about the field and about tau_z: nodes of
    // one region then hold the same state where it does not change (a bond-ordered state's
    // phase would otherwise differ from node to node), which lets their cells skip descents.
    canonicaliseOrbit(frame, nf, modelSymmetry(c));
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
