import { type Couplings } from './couplings';
import type { CoarseNodes } from './coarseNodes';
import { DEFAULT_DESCENT, descend, type DescentOptions } from './localMinimise';
import { DescentWorkspace } from './tangentSpace';
import { ABANDON_MARGIN } from './minimise';
import { presentGroupCount } from './orderParameters';
import { ORDER_TOLERANCE } from './phaseLabel';
import { axisValue, PlaneCouplings, type MapInput } from './plane';
import { PixelScratch, summarise } from './stateSummary';

/**
 * Per-pixel results for the pixel rectangle [i0, i0 + width) x [j0, j0 + height), row-major
 * inside the rectangle: pixel (i, j) at n = (j - j0) width + (i - i0).
 */
export interface PixelBlock {
  readonly i0: number;
  readonly j0: number;
  readonly width: number;
  readonly height: number;
  readonly energy: Float64Array;
  /** o_k, k = 1..15, at [15 n + k - 1]. */
  readonly order: Float64Array;
  readonly gap: Float64Array;
  /** Occupied frames, 32 numbers each. */
  readonly frames: Float64Array;
  readonly labels: string[];
}

/**
 * Pixel range [first, end) owned by coarse cell `a` along one side: from its own node up to the
 * next node, which belongs to the next cell, except after the last node (the grid's far edge).
 */
export function cellSpan(line: Int32Array, a: number, n: number): [number, number] {
  const end = line[a + 1]!;
  return [line[a]!, end === n - 1 ? n : end];
}

/** Whether the four corner nodes of cell (a, b) carry one label. */
export function cellIsUniform(coarse: CoarseNodes, a: number, b: number): boolean {
  const w = coarse.cols.length;
  const label = coarse.labels[b * w + a];
  return (
    coarse.labels[b * w + a + 1] === label &&
    coarse.labels[(b + 1) * w + a] === label &&
    coarse.labels[(b + 1) * w + a + 1] === label
  );
}

/**
 * Stage 2 for the coarse cells [a0, a1) x [b0, b1) (cell (a, b) spans nodes a, a + 1 and
 * b, b + 1 of `coarse`, whose cols and rows are pixel indices of the full grid). Adaptive:
 *
 * - a cell whose four corners share a label is inside one region: each pixel takes a single
 *   descent from its already-solved neighbour (left, or below at the start of a row), so it
 *   costs about one Newton step and still gets its own converged state;
 * - a cell with different corner labels holds a boundary: each pixel descends from a state of
 *   every phase present (its neighbour's first, then the latest pixel of each other phase in
 *   the cell, or the nearest corner of that phase) and keeps the lowest minimum.
 *
 * Every cell depends only on its own corners, so any grouping of cells into calls gives the same
 * numbers bit for bit.
 */
export function solveCells(
  input: MapInput,
  coarse: CoarseNodes,
  a0: number,
  b0: number,
  a1: number,
  b1: number,
): PixelBlock {
  const [nx, ny] = input.plane.resolution;
  const [i0, iEnd] = [cellSpan(coarse.cols, a0, nx)[0], cellSpan(coarse.cols, a1 - 1, nx)[1]];
  const [j0, jEnd] = [cellSpan(coarse.rows, b0, ny)[0], cellSpan(coarse.rows, b1 - 1, ny)[1]];
  const width = iEnd - i0;
  const height = jEnd - j0;
  const count = width * height;
  const block: PixelBlock = {
    i0,
    j0,
    width,
    height,
    energy: new Float64Array(count),
    order: new Float64Array(15 * count),
    gap: new Float64Array(count),
    frames: new Float64Array(32 * count),
    labels: new Array<string>(count),
  };
  const solver = new PixelSolver(input, coarse);
  for (let b = b0; b < b1; b++) {
    const [jFirst, jLast] = cellSpan(coarse.rows, b, ny);
    for (let a = a0; a < a1; a++) {
      const [iFirst, iLast] = cellSpan(coarse.cols, a, nx);
      const uniform = cellIsUniform(coarse, a, b);
      solver.startCell(uniform);
      for (let j = jFirst; j < jLast; j++) {
        for (let i = iFirst; i < iLast; i++) {
          const n = (j - j0) * width + (i - i0);
          // The neighbour solved just before: left, or below at the start of the cell's row
          // (the cell's first pixel is its corner node).
          const neighbour =
            i > iFirst
              ? block.frames.subarray(32 * (n - 1), 32 * n)
              : j > jFirst
                ? block.frames.subarray(32 * (n - width), 32 * (n - width) + 32)
                : coarse.frames.subarray(
                    32 * (b * coarse.cols.length + a),
                    32 * (b * coarse.cols.length + a) + 32,
                  );
          const neighbourLabel =
            i > iFirst
              ? block.labels[n - 1]!
              : j > jFirst
                ? block.labels[n - width]!
                : coarse.labels[b * coarse.cols.length + a]!;
          if (uniform) solver.fromNeighbour(i, j, neighbour);
          else solver.fromPhases(a, b, i, j, neighbour, neighbourLabel);
          solver.store(block, n);
        }
      }
    }
  }
  return block;
}

/** The allocation-free per-pixel work of stage 2. */
class PixelSolver {
  private readonly nf: number;
  private readonly planeCouplings: PlaneCouplings;
  private readonly ws = new DescentWorkspace();
  private readonly trial = new Float64Array(32);
  private readonly best = new Float64Array(32);
  private readonly bestOrder = new Float64Array(16);
  private readonly options: DescentOptions = { ...DEFAULT_DESCENT, polishSteps: 0 };
  private readonly scratch = new PixelScratch();
  private couplings: Couplings | undefined;
  /** Latest solved frame of each phase in the current cell. */
  private readonly latest = new Map<string, Float64Array>();
  private tracking = false;

  constructor(
    private readonly input: MapInput,
    private readonly coarse: CoarseNodes,
  ) {
    this.nf = input.model.filling + 2;
    this.planeCouplings = new PlaneCouplings(input);
  }

  private at(i: number, j: number): Couplings {
    const [nx, ny] = this.input.plane.resolution;
    this.couplings = this.planeCouplings.at(
      axisValue(this.input.plane.x, nx, i),
      axisValue(this.input.plane.y, ny, j),
    );
    return this.couplings;
  }

  fromNeighbour(i: number, j: number, from: Float64Array): void {
    const c = this.at(i, j);
    this.best.set(from);
    this.options.abandonAbove = Infinity;
    this.options.abandonNear = undefined;
    descend(c, this.best, this.options, this.ws);
  }

  /** Starts a cell; the latest state of each phase is tracked in cells that hold a boundary. */
  startCell(uniform: boolean): void {
    this.latest.clear();
    this.tracking = !uniform;
  }

  /**
   * Descends from `neighbour`, then from one state of every other phase at the cell's corners or
   * met in the cell so far (the latest pixel of that phase, else its nearest corner); later
   * descents stop once they cannot beat the best. Keeps the lowest minimum.
   */
  fromPhases(
    a: number,
    b: number,
    i: number,
    j: number,
    neighbour: Float64Array,
    neighbourLabel: string,
  ): void {
    const c = this.at(i, j);
    const { coarse, ws, trial, best, bestOrder, options, latest } = this;
    const width = coarse.cols.length;
    const starts: Float64Array[] = [neighbour];
    const labels: string[] = [neighbourLabel];
    const consider = (label: string, frame: () => Float64Array): void => {
      if (labels.includes(label)) return;
      labels.push(label);
      starts.push(latest.get(label) ?? frame());
    };
    // Corners nearest first.
    const corners = [0, 1, 2, 3]
      .map((corner) => {
        const node = (b + (corner >> 1)) * width + a + (corner & 1);
        const d =
          (coarse.cols[a + (corner & 1)]! - i) ** 2 + (coarse.rows[b + (corner >> 1)]! - j) ** 2;
        return { node, d };
      })
      .sort((p, q) => p.d - q.d || p.node - q.node);
    for (const { node } of corners)
      consider(coarse.labels[node]!, () => coarse.frames.subarray(32 * node, 32 * node + 32));
    for (const [label, frame] of latest) consider(label, () => frame);
    let bestEnergy = Infinity;
    let bestConverged = false;
    for (let k = 0; k < starts.length; k++) {
      trial.set(starts[k]!);
      const guard = k > 0 && bestConverged;
      options.abandonAbove = guard ? bestEnergy - ABANDON_MARGIN * c.scale : Infinity;
      options.abandonNear = guard ? bestOrder : undefined;
      const r = descend(c, trial, options, ws);
      if (r.abandoned) continue;
      // Among states degenerate to rounding (on lines of extra symmetry) keep the simplest.
      const tie =
        r.converged === bestConverged &&
        Math.abs(r.energy - bestEnergy) <= 1e-12 * c.scale &&
        presentGroupCount(ws.order, ORDER_TOLERANCE) <
          presentGroupCount(bestOrder, ORDER_TOLERANCE);
      if (
        k === 0 ||
        (r.converged && !bestConverged) ||
        (r.converged === bestConverged && r.energy < bestEnergy - 1e-12 * c.scale) ||
        tie
      ) {
        best.set(trial);
        bestOrder.set(ws.order);
        bestEnergy = r.energy;
        bestConverged = r.converged;
      }
    }
  }

  /** Writes the state just solved into slot n of the block. */
  store(block: PixelBlock, n: number): void {
    const s = this.scratch;
    const summary = summarise(this.couplings!, this.best, this.nf, s);
    block.frames.set(this.best, 32 * n);
    block.energy[n] = summary.energy;
    block.gap[n] = summary.gap;
    block.order.set(s.order.subarray(1, 16), 15 * n);
    block.labels[n] = summary.label;
    if (this.tracking) {
      const kept = this.latest.get(summary.label);
      if (kept) kept.set(this.best);
      else this.latest.set(summary.label, Float64Array.from(this.best));
    }
  }
}
