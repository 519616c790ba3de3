import { DEFAULT_DESCENT, descend } from './localMinimise';
import { DescentWorkspace } from './tangentSpace';
import { DEFAULT_MINIMISE, minimiseEnergy, type MinimiseOptions } from './minimise';
import { phaseLabel } from './phaseLabel';
import { axisValue, PlaneCouplings, type MapInput } from './plane';
import { orderOfProjector, projectorOf } from './state';
import { modelSymmetry } from './symmetry';

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
 * Search at coarse nodes: lighter than a single point's DEFAULT_MINIMISE, because every pixel
 * then compares the states of its four corner nodes, so a node that missed the global minimum
 * is outvoted wherever a neighbour found it.
 */
export const COARSE_SEARCH: MinimiseOptions = {
  ...DEFAULT_MINIMISE,
  rankedStarts: 4,
  rankedStartsOddFilling: 4,
};

/** Coarse node spacing: about 32 nodes along the longer side, at least every 2nd pixel. */
export function coarseStride(nx: number, ny: number): number {
  return Math.max(2, Math.ceil(Math.max(nx, ny) / 32));
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

/** Stage 1 for coarse nodes `first .. first + count - 1` (row-major over the coarse grid). */
export function solveCoarseNodes(input: MapInput, first: number, count: number): Float64Array {
  const { cols, rows } = coarseLayout(input);
  const [nx, ny] = input.plane.resolution;
  const planeCouplings = new PlaneCouplings(input);
  const frames = new Float64Array(32 * count);
  const ws = new DescentWorkspace();
  for (let n = 0; n < count; n++) {
    const node = first + n;
    const a = node % cols.length;
    const b = Math.floor(node / cols.length);
    const c = planeCouplings.at(
      axisValue(input.plane.x, nx, cols[a]!),
      axisValue(input.plane.y, ny, rows[b]!),
    );
    // Polished to the last bit: pixels start from these frames and finish in fewer steps.
    const frame = minimiseEnergy(c, COARSE_SEARCH).frame;
    descend(c, frame, DEFAULT_DESCENT, ws);
    frames.set(frame, 32 * n);
  }
  return frames;
}

export function coarseNodes(input: MapInput, frames: Float64Array): CoarseNodes {
  const { cols, rows } = coarseLayout(input);
  const [nx, ny] = input.plane.resolution;
  const nf = input.model.filling + 2;
  const planeCouplings = new PlaneCouplings(input);
  const labels: string[] = [];
  const p = new Float64Array(32);
  const order = new Float64Array(16);
  for (let b = 0; b < rows.length; b++) {
    for (let a = 0; a < cols.length; a++) {
      const n = b * cols.length + a;
      const c = planeCouplings.at(
        axisValue(input.plane.x, nx, cols[a]!),
        axisValue(input.plane.y, ny, rows[b]!),
      );
      projectorOf(frames.subarray(32 * n, 32 * n + 32), nf, p);
      labels.push(phaseLabel(orderOfProjector(p, order), c, modelSymmetry(c)));
    }
  }
  return { cols, rows, frames, labels };
}
