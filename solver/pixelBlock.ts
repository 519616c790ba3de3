import { energyOfOrder, type Couplings } from './couplings';
import {
  DEGENERACY_TOLERANCE,
  representative,
  sameRepresentative,
  sameState,
  settleDegenerate,
  softDirections,
  weakFields,
} from './degeneracy';
import { FrozenStates, MAX_CELL_STATES } from './frozenStates';
import { searchGroundState } from './groundSearch';
import { orderOfProjector, projectorOf } from './state';
import type { CoarseNodes } from './coarseNodes';
import { DEFAULT_DESCENT, descend, type DescentOptions } from './localMinimise';
import {
  DescentWorkspace,
  frameEnergy,
  tangentDimension,
  tangentGradient,
  tangentModel,
} from './tangentSpace';
import { DEFAULT_MINIMISE, minimiseEnergy } from './minimise';
import { choleskySolve, completeFrame, orthonormaliseFrame } from './linalg';
import { presentGroupCount } from './orderParameters';
import { ORDER_TOLERANCE } from './phaseLabel';
import { modelSymmetry } from './symmetry';
import { axisValue, PlaneCouplings, type MapInput } from './plane';
import { PixelScratch, summarise, summariseOrder } from './stateSummary';

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
  /** [0]: pixels that failed the certificate and got a full search. */
  readonly searched: Int32Array;
}

/** A block of the given rectangle with room for every pixel's results. */
function emptyBlock(i0: number, j0: number, width: number, height: number): PixelBlock {
  const count = width * height;
  return {
    i0,
    j0,
    width,
    height,
    energy: new Float64Array(count),
    order: new Float64Array(15 * count),
    gap: new Float64Array(count),
    frames: new Float64Array(32 * count),
    labels: new Array<string>(count),
    searched: new Int32Array(1),
  };
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

/** Coarse cells [a0, a1) x [b0, b1): cell (a, b) lies between nodes a, a + 1 and b, b + 1. */
export interface CellRange {
  readonly a0: number;
  readonly b0: number;
  readonly a1: number;
  readonly b1: number;
}

/**
 * Stage 2 for the coarse cells [a0, a1) x [b0, b1) (cell (a, b) spans nodes a, a + 1 and
 * b, b + 1 of `coarse`, whose cols and rows are pixel indices of the full grid). Adaptive:
 *
 * - the corner states are sorted into branches: corners with different labels, or with the same
 *   label whose states are not continued into each other by one descent across the cell (two
 *   bond-ordered states along x0 and along y0 share a label, not an energy), are different
 *   branches;
 * - a cell with one branch is inside one region: each pixel takes a single descent from its
 *   already-solved neighbour (left, or below at the start of a row), about one Newton step;
 * - a cell with several branches holds a boundary: each branch is continued over the whole cell
 *   and every pixel keeps the lowest minimum;
 * - every pixel then passes a certificate (`FrozenStates`): no exact state of the seed library
 *   and no corner state may lie below it. A pixel that fails gets the full global search of a
 *   single point (with its continued state as a warm start), and its neighbours continue from
 *   that state.
 *
 * Every cell depends only on its own corners, so any grouping of cells into calls gives the same
 * numbers bit for bit.
 */
export function solveCells(
  input: MapInput,
  coarse: CoarseNodes,
  cells: CellRange,
  options: PixelOptions = {},
): PixelBlock {
  const { a0, b0, a1, b1 } = cells;
  const [nx, ny] = input.plane.resolution;
  const [i0, iEnd] = [cellSpan(coarse.cols, a0, nx)[0], cellSpan(coarse.cols, a1 - 1, nx)[1]];
  const [j0, jEnd] = [cellSpan(coarse.rows, b0, ny)[0], cellSpan(coarse.rows, b1 - 1, ny)[1]];
  const width = iEnd - i0;
  const height = jEnd - j0;
  const block = emptyBlock(i0, j0, width, height);
  const solver = new PixelSolver(input, coarse, options.certificate ?? true);
  for (let b = b0; b < b1; b++) {
    const [jFirst, jLast] = cellSpan(coarse.rows, b, ny);
    for (let a = a0; a < a1; a++) {
      const [iFirst, iLast] = cellSpan(coarse.cols, a, nx);
      solver.prepareCell(a, b, iFirst, iLast, jFirst, jLast);
      if (solver.rigidCell(a, b)) {
        const node = solver.nodeFrame(b * coarse.cols.length + a);
        const order = solver.nodeOrder(b * coarse.cols.length + a);
        // The certificate of every pixel at once where no fixed state comes near (see
        // `FrozenStates.noneBelowOverCell`): a rigid pixel that passes it needs nothing more.
        const certified = solver.rigidCertified(order);
        for (let j = jFirst; j < jLast; j++) {
          for (let i = iFirst; i < iLast; i++) {
            solver.fromRigid(i, j, node, order);
            if (!certified) solver.certify(i, j, block);
            solver.store(block, (j - j0) * width + (i - i0));
          }
        }
        continue;
      }
      const branches = solver.branchCorners(a, b);
      if (branches.length > 1) {
        solver.solveBranches(block, a, b, branches, iFirst, iLast, jFirst, jLast);
        continue;
      }
      for (let j = jFirst; j < jLast; j++) {
        for (let i = iFirst; i < iLast; i++) {
          const n = (j - j0) * width + (i - i0);
          // The neighbour solved just before: left, or below at the start of the cell's row
          // (the cell's first pixel is its corner node).
          const step = i > iFirst ? 1 : j > jFirst ? width : 0;
          const neighbour =
            step > 0
              ? block.frames.subarray(32 * (n - step), 32 * (n - step) + 32)
              : solver.nodeFrame(b * coarse.cols.length + a);
          // The pixel before that along the same line, for the predictor (see `predictFrame`).
          const before =
            (step === 1 && i > iFirst + 1) || (step === width && j > jFirst + 1)
              ? block.frames.subarray(32 * (n - 2 * step), 32 * (n - 2 * step) + 32)
              : undefined;
          solver.fromNeighbour(i, j, neighbour, before);
          // The other solved neighbour (below, when the state came from the left): two branches
          // of one label can meet between pixels, and this one may continue the lower.
          if (i > iFirst && j > jFirst) solver.tryNeighbour(i, j, block, n - width);
          solver.certify(i, j, block);
          solver.store(block, n);
        }
      }
    }
  }
  return block;
}

/**
 * Gradient tolerance of a pixel's descent (relative to the coupling scale): its energy is then
 * exact to rounding (the error is of order gradient^2 / curvature) and its order parameters to
 * far below the label tolerance, except within about 1e-6 of the scale of a continuous
 * transition. The same as the global search's.
 */
const PIXEL_TOLERANCE = 1e-10;

/**
 * A pixel continued from a neighbour stops after one Newton step shorter than this (see
 * `DescentOptions.singleStep`): its energy is then exact to about 1e-11 of the scale.
 */
const PIXEL_SINGLE_STEP = 2e-3;

/**
 * A solved neighbour's state within this (max norm of the order parameters) of a pixel's own
 * converged state is in its basin (as `SAME_BASIN` of the descent): no second descent from it.
 */
const SAME_BRANCH = 1e-2;

/** Fixed models a branch may hold (its corner state's and states it settles into). */
const MAX_FIXED_MODELS = 4;
/** Tries per branch to make a settled state a fixed model (see `solveBranches`). */
const MAX_FIXED_ATTEMPTS = 4;

/**
 * A branch's continued state whose order parameters lie this close (max norm) to its fixed
 * corner state has returned to it (a canted state whose canting closed at a continuous
 * transition): the next pixel tests the fixed state again (`FixedBranch.holds`) rather than
 * descending from a copy of it that differs by rounding.
 */
const NEAR_FIXED = 1e-8;

/** Branch states whose order parameters agree to this (max norm) are one state, not a tie. */
const TIE_DISTANCE = 1e-5;

/** Corner order parameters that agree to this hold one state (see `rigidCell`). */
const RIGID_ORDER = 1e-12;

/** Per-pixel results of every branch of a cell (slot = branch * pixels + pixel). */
interface BranchStore {
  frames: Float64Array;
  energy: Float64Array;
  converged: Uint8Array;
  groups: Uint8Array;
  /**
   * 1 + m where the slot holds the state of its branch's fixed model m (`FixedBranch`), or a
   * descent ended within `NEAR_FIXED` of it; 0 elsewhere.
   */
  fixed: Uint8Array;
  /** 1 where the slot's descent ended where it started (no step taken). */
  still: Uint8Array;
  /** Order parameters of each slot's state (16 per slot). */
  orders: Float64Array;
  /**
   * The Hessian each slot's descent ended with (64 per slot; for a fixed slot its interpolated
   * one): whether the picked state is soft then needs no second model.
   */
  hessians: Float64Array;
}

/**
 * A branch corner's state, unchanged, over a cell: its gradient and Hessian in tangent
 * coordinates are affine in the couplings (the Hartree-Fock matrix is), hence in the pixel
 * indices, so three corners of the cell give them at every pixel. Where the state is still a
 * minimum there (the gradient below the descent's tolerance, the Hessian passing its test), a
 * descent from it would stop at once: the pixel keeps it without one.
 */
class FixedBranch {
  /** Gradients (8 each) and Hessians (64 each) at pixels (i0, j0), (i1, j0), (i0, j1). */
  readonly gradient = new Float64Array(24);
  readonly hessian = new Float64Array(192);
  readonly frame = new Float64Array(32);
  readonly order = new Float64Array(16);
  readonly g = new Float64Array(8);
  readonly k = new Float64Array(64);
  readonly step = new Float64Array(8);
  readonly chol = new Float64Array(64);
  groups = 0;
  d = 0;
  i0 = 0;
  j0 = 0;
  di = 0;
  dj = 0;

  /** Whether the state at pixel (i, j), couplings `c`, is a minimum a descent would keep. */
  holds(i: number, j: number, c: Couplings): boolean {
    const { d, g, k, gradient, hessian } = this;
    const wi = this.di > 0 ? (i - this.i0) / this.di : 0;
    const wj = this.dj > 0 ? (j - this.j0) / this.dj : 0;
    let largest = 0;
    for (let p = 0; p < d; p++) {
      const a = gradient[p]!;
      g[p] = a + wi * (gradient[8 + p]! - a) + wj * (gradient[16 + p]! - a);
      largest = Math.max(largest, Math.abs(g[p]!));
    }
    if (largest > PIXEL_TOLERANCE * c.scale) return false;
    for (let p = 0; p < d * d; p++) {
      const a = hessian[p]!;
      k[p] = a + wi * (hessian[64 + p]! - a) + wj * (hessian[128 + p]! - a);
    }
    // The minimum test of `descend` (Goldstone zeros pass the tiny shift).
    return choleskySolve(k, d, 1e-11 * c.scale, g, this.step, this.chol, 0);
  }

  /** Whether order parameters `order` are those of the fixed state, to `NEAR_FIXED`. */
  near(order: Float64Array): boolean {
    for (let k = 1; k < 16; k++) {
      if (!(Math.abs(order[k]! - this.order[k]!) <= NEAR_FIXED)) return false;
    }
    return true;
  }
}

/** Whether the order parameters at offsets `a` and `b` of `orders` agree to `tolerance`. */
function ordersWithin(orders: Float64Array, a: number, b: number, tolerance: number): boolean {
  for (let k = 1; k < 16; k++)
    if (Math.abs(orders[a + k]! - orders[b + k]!) > tolerance) return false;
  return true;
}

/**
 * Largest change of any occupied-vector component between two neighbouring pixels for which
 * their states are extrapolated (`predictFrame`); a larger change is no smooth continuation (a
 * jump to another state, or another gauge of one).
 */
const PREDICT_LIMIT = 0.05;

/**
 * The predictor step of numerical continuation (Allgower and Georg, Introduction to Numerical
 * Continuation Methods, SIAM (2003), chapter 2): the occupied vectors of the last two states on
 * a line of pixels, `last` and `before`, extrapolated linearly to the next pixel into `out`
 * (orthonormalised, completed). A branch that moves smoothly then starts its descent second-order
 * close to its minimum rather than first-order, and needs one Newton step fewer. The descent
 * still decides where it ends. False, with `out` left alone, when the two states are equal or
 * not close (see `PREDICT_LIMIT`).
 */
function predictFrame(
  out: Float64Array,
  last: Float64Array,
  before: Float64Array,
  nf: number,
  scratch: Float64Array,
): boolean {
  const n = 8 * nf;
  let change = 0;
  for (let m = 0; m < n; m++) change = Math.max(change, Math.abs(last[m]! - before[m]!));
  if (!(change > 0 && change < PREDICT_LIMIT)) return false;
  out.set(last);
  for (let m = 0; m < n; m++) out[m] = 2 * last[m]! - before[m]!;
  orthonormaliseFrame(out, nf);
  completeFrame(out, nf, scratch);
  return true;
}

export interface PixelOptions {
  /**
   * false skips every pixel's certificate (the fixed-state bound, the search it can call and the
   * settling of degenerate pixels): pixels are then only continued from their neighbours. For
   * measuring what the certificate costs (`npm run bench`); never for a map that is shown.
   */
  readonly certificate?: boolean;
}

/** The allocation-free per-pixel work of stage 2. */
class PixelSolver {
  private readonly nf: number;
  private readonly planeCouplings: PlaneCouplings;
  private readonly frozen: FrozenStates;
  private readonly ws = new DescentWorkspace();
  private readonly best = new Float64Array(32);
  private readonly trial = new Float64Array(32);
  private readonly neighbourOrder = new Float64Array(16);
  private readonly options: DescentOptions = {
    ...DEFAULT_DESCENT,
    polishSteps: 0,
    gradientTolerance: PIXEL_TOLERANCE,
    singleStep: PIXEL_SINGLE_STEP,
  };
  private readonly continuation: DescentOptions = {
    ...DEFAULT_DESCENT,
    polishSteps: 0,
    gradientTolerance: PIXEL_TOLERANCE,
    escapeSaddles: false,
  };
  private readonly scratch = new PixelScratch();
  private readonly nodeOrders: Float64Array;
  private couplings: Couplings | undefined;
  private energy = 0;
  /** How much the last continued state relaxed from its neighbour's (the energy it lost). */
  private relaxation = 0;
  private converged = false;
  /** Whether `ws` holds the Hessian of `best` at this pixel (its descent just converged). */
  private fresh = false;
  /** Whether `best` comes from a rigid cell (no soft direction anywhere in it). */
  private rigid = false;
  /** The order parameters of `best` while it is a rigid cell's state. */
  private rigidOrder: Float64Array = new Float64Array(16);
  private branchBuffers: BranchStore | undefined;
  /**
   * A branch's fixed models: its corner state's (when fixed), then states it settles into on its
   * way (see `solveBranches`).
   */
  private readonly fixedModels = Array.from({ length: MAX_FIXED_MODELS }, () => new FixedBranch());
  private readonly affine = new Float64Array(3);
  /** Axis values of the pixel columns and rows (`axisValue`). */
  private readonly xs: Float64Array;
  private readonly ys: Float64Array;

  constructor(
    private readonly input: MapInput,
    private readonly coarse: CoarseNodes,
    private readonly certificate: boolean,
  ) {
    this.nf = input.model.filling + 2;
    this.planeCouplings = new PlaneCouplings(input);
    const [nx, ny] = input.plane.resolution;
    this.xs = Float64Array.from({ length: nx }, (_, i) => axisValue(input.plane.x, nx, i));
    this.ys = Float64Array.from({ length: ny }, (_, j) => axisValue(input.plane.y, ny, j));
    this.frozen = new FrozenStates(this.planeCouplings);
    const nodes = coarse.labels.length;
    this.nodeOrders = new Float64Array(16 * nodes);
    const p = new Float64Array(32);
    for (let node = 0; node < nodes; node++) {
      orderOfProjector(
        projectorOf(coarse.frames.subarray(32 * node, 32 * node + 32), this.nf, p),
        this.nodeOrders.subarray(16 * node, 16 * node + 16),
      );
    }
  }

  nodeFrame(node: number): Float64Array {
    return this.coarse.frames.subarray(32 * node, 32 * node + 32);
  }

  private at(i: number, j: number): Couplings {
    this.couplings = this.planeCouplings.at(this.xs[i]!, this.ys[j]!);
    return this.couplings;
  }

  /**
   * Sets up the certificate for cell (a, b) covering pixels [iFirst, iLast) x [jFirst, jLast):
   * its corner states, and the seed states that are lowest at the cell's corners, side
   * midpoints and centre (exact and nudged, the two rankings of the global search), each
   * relaxed there. A phase too small for any coarse node
   * to see, but whose seed leads the ranking somewhere in the cell, then shows up in the check.
   */
  prepareCell(a: number, b: number, iFirst: number, iLast: number, jFirst: number, jLast: number) {
    const { plane } = this.input;
    const [nx, ny] = plane.resolution;
    const width = this.coarse.cols.length;
    const orders: Float64Array[] = [];
    const frames: Float64Array[] = [];
    for (let corner = 0; corner < 4; corner++) {
      const node = (b + (corner >> 1)) * width + a + (corner & 1);
      orders.push(this.nodeOrders.subarray(16 * node, 16 * node + 16));
      frames.push(this.nodeFrame(node));
    }
    const xa = axisValue(plane.x, nx, iFirst);
    const xb = axisValue(plane.x, nx, iLast - 1);
    const ya = axisValue(plane.y, ny, jFirst);
    const yb = axisValue(plane.y, ny, jLast - 1);
    const seeds: number[] = [];
    const points: [number, number][] = [];
    for (const y of [ya, (ya + yb) / 2, yb])
      for (const x of [xa, (xa + xb) / 2, xb]) points.push([x, y]);
    for (const [x, y, nudged] of points.flatMap(([x, y]) => [
      [x, y, false] as const,
      [x, y, true] as const,
    ])) {
      const s = this.frozen.lowestSeed(x, y, nudged);
      if (seeds.includes(s) || orders.length >= MAX_CELL_STATES) continue;
      seeds.push(s);
      const c = this.planeCouplings.at(x, y);
      const frame = Float64Array.from(this.frozen.seedFrame(s));
      const result = descend(c, frame, this.options, this.ws);
      if (!result.converged) continue;
      const order = Float64Array.from(this.ws.order);
      const known = orders.some((o) => {
        for (let k = 1; k < 16; k++) if (Math.abs(o[k]! - order[k]!) > 1e-6) return false;
        return true;
      });
      if (!known) {
        orders.push(order);
        frames.push(frame);
      }
    }
    this.frozen.forCell(
      Math.min(xa, xb),
      Math.max(xa, xb),
      Math.min(ya, yb),
      Math.max(ya, yb),
      orders,
      frames,
    );
  }

  /**
   * Corners of cell (a, b) that start a branch of their own. In a cell holding a boundary, the
   * first corner of each label. In a cell of one label, the first corner and any corner whose
   * state the first one does not continue into (one descent from the first corner's state at
   * this corner's couplings ends above this corner's energy): two bond-ordered states along x0
   * and along y0 share a label, not an energy.
   */
  branchCorners(a: number, b: number): number[] {
    const { coarse } = this;
    const width = coarse.cols.length;
    const [nx, ny] = this.input.plane.resolution;
    const out: number[] = [];
    const node = (corner: number): number => (b + (corner >> 1)) * width + a + (corner & 1);
    const labels = new Set([0, 1, 2, 3].map((k) => coarse.labels[node(k)]));
    if (labels.size > 1) {
      // One branch per label (more are started where one dies: see `solveBranches`).
      for (let corner = 0; corner < 4; corner++) {
        if (!out.some((k) => coarse.labels[node(k)] === coarse.labels[node(corner)])) {
          out.push(corner);
        }
      }
      return out;
    }
    for (let corner = 0; corner < 4; corner++) {
      const here = node(corner);
      const label = coarse.labels[here]!;
      const first = out.find((k) => coarse.labels[node(k)] === label);
      if (first === undefined) {
        out.push(corner);
        continue;
      }
      const c = this.planeCouplings.at(
        axisValue(this.input.plane.x, nx, coarse.cols[a + (corner & 1)]!),
        axisValue(this.input.plane.y, ny, coarse.rows[b + (corner >> 1)]!),
      );
      const cornerEnergy = energyOfOrder(c, this.nodeOrders.subarray(16 * here, 16 * here + 16));
      this.best.set(this.nodeFrame(node(first)));
      const r = descend(c, this.best, this.continuation, this.ws);
      if (!r.converged || r.energy > cornerEnergy + DEGENERACY_TOLERANCE * c.scale) {
        out.push(corner);
      }
    }
    return out;
  }

  /**
   * Whether the four corners of cell (a, b) hold one and the same state that is a minimum
   * with no soft direction at each. At a fixed state the gradient and the Hessian are linear in
   * the couplings (the Hartree-Fock matrix is), hence affine over the cell: zero gradients at
   * the corners give zero gradients inside, and positive definite Hessians at the corners give
   * positive definite ones inside (a convex combination). The state is then a local minimum at
   * every pixel without a descent; the certificate still compares it with the fixed states.
   */
  rigidCell(a: number, b: number): boolean {
    const width = this.coarse.cols.length;
    const [nx, ny] = this.input.plane.resolution;
    const first = b * width + a;
    const reference = this.nodeOrders.subarray(16 * first, 16 * first + 16);
    for (let corner = 1; corner < 4; corner++) {
      const node = (b + (corner >> 1)) * width + a + (corner & 1);
      for (let k = 1; k < 16; k++) {
        if (Math.abs(this.nodeOrders[16 * node + k]! - reference[k]!) > RIGID_ORDER) return false;
      }
    }
    for (let corner = 0; corner < 4; corner++) {
      const c = this.planeCouplings.at(
        axisValue(this.input.plane.x, nx, this.coarse.cols[a + (corner & 1)]!),
        axisValue(this.input.plane.y, ny, this.coarse.rows[b + (corner >> 1)]!),
      );
      const frame = this.nodeFrame(first);
      frameEnergy(c, frame, this.ws, this.ws.order);
      if (tangentGradient(c, frame, this.ws) > PIXEL_TOLERANCE * c.scale) return false;
      if (softDirections(c, frame, this.ws) > 0) return false;
    }
    return true;
  }

  /**
   * Sets up `fm` for the state of `frame` over pixels [iFirst, iLast) x [jFirst, jLast); false
   * when the state is no critical point at three corners of the cell (it moves over the cell, as
   * a canted state does): then every pixel of the branch descends.
   */
  private fixedBranch(
    fm: FixedBranch,
    frame: Float64Array,
    iFirst: number,
    iLast: number,
    jFirst: number,
    jLast: number,
  ): boolean {
    const { ws } = this;
    const d = tangentDimension(this.nf);
    const corners: [number, number][] = [
      [iFirst, jFirst],
      [iLast - 1, jFirst],
      [iFirst, jLast - 1],
    ];
    for (let q = 0; q < 3; q++) {
      const c = this.at(corners[q]![0], corners[q]![1]);
      frameEnergy(c, frame, ws, ws.order);
      tangentModel(c, frame, ws);
      let largest = 0;
      for (let p = 0; p < d; p++) largest = Math.max(largest, Math.abs(ws.gradient[p]!));
      if (largest > PIXEL_TOLERANCE * c.scale) return false;
      fm.gradient.set(ws.gradient.subarray(0, d), 8 * q);
      fm.hessian.set(ws.hessian.subarray(0, d * d), 64 * q);
    }
    fm.frame.set(frame);
    fm.order.set(ws.order);
    fm.groups = presentGroupCount(ws.order, ORDER_TOLERANCE);
    fm.d = d;
    fm.i0 = iFirst;
    fm.j0 = jFirst;
    fm.di = iLast - 1 - iFirst;
    fm.dj = jLast - 1 - jFirst;
    return true;
  }

  /**
   * Whether the certificate of every pixel of the current (rigid) cell passes at once: no
   * fixed state lies below the cell's state, of order parameters `order`, anywhere in it.
   */
  rigidCertified(order: Float64Array): boolean {
    if (!this.certificate) return true;
    return this.frozen.noneBelowOverCell(this.planeCouplings.affineEnergy(order, this.affine));
  }

  /** Order parameters of a coarse node's state (o_0 .. o_15). */
  nodeOrder(node: number): Float64Array {
    return this.nodeOrders.subarray(16 * node, 16 * node + 16);
  }

  /**
   * Pixel (i, j) of a rigid cell: the corners' state (`frame`, its order parameters `order`), a
   * minimum here (see `rigidCell`).
   */
  fromRigid(i: number, j: number, frame: Float64Array, order: Float64Array): void {
    const c = this.at(i, j);
    this.best.set(frame);
    this.rigidOrder = order;
    this.energy = energyOfOrder(c, order);
    this.converged = true;
    this.fresh = false;
    this.rigid = true;
  }

  /**
   * Pixel (i, j) by one descent from a solved neighbour's state `from`; `before`, the pixel
   * before that on the same line, lets the descent start from the two states' extrapolation
   * (see `predictFrame`).
   */
  fromNeighbour(i: number, j: number, from: Float64Array, before?: Float64Array): void {
    this.rigid = false;
    const c = this.at(i, j);
    this.best.set(from);
    this.options.abandonAbove = Infinity;
    this.options.abandonNear = undefined;
    // How much the neighbour's own state relaxes here (for `tryNeighbour`), not the prediction.
    const start = frameEnergy(c, this.best, this.ws, this.ws.order);
    if (before !== undefined && predictFrame(this.best, from, before, this.nf, this.ws.scratch)) {
      frameEnergy(c, this.best, this.ws, this.ws.order);
    }
    const result = descend(c, this.best, this.options, this.ws);
    this.energy = result.energy;
    this.converged = result.converged;
    this.fresh = result.converged;
    this.relaxation = Math.max(0, start - result.energy);
  }

  /**
   * Pixel (i, j), whose state is in `best`, against the state of an already solved pixel of the
   * same cell (slot `n` of the block): when that state, unchanged, lies lower here, a descent
   * from it may reach a lower branch; the lower result is kept.
   */
  tryNeighbour(i: number, j: number, block: PixelBlock, n: number): void {
    const c = this.at(i, j);
    const order = this.neighbourOrder;
    order.set(block.order.subarray(15 * n, 15 * n + 15), 1);
    // The neighbour's state relaxes here by about as much as the left one did: allow for that
    // (twice over) before deciding that it cannot end lower.
    const reach = energyOfOrder(c, order) - 2 * this.relaxation;
    if (reach >= this.energy - DEGENERACY_TOLERANCE * c.scale) return;
    if (this.fresh) {
      // The pixel's own descent just converged (its order parameters are in the workspace): a
      // neighbour whose state lies this close is in the same basin, and descends to the same
      // minimum; another branch of the label is a different state.
      let distance = 0;
      for (let k = 1; k < 16; k++) {
        distance = Math.max(distance, Math.abs(order[k]! - this.ws.order[k]!));
      }
      if (distance < SAME_BRANCH) return;
    }
    const frame = this.trial;
    frame.set(block.frames.subarray(32 * n, 32 * n + 32));
    const result = descend(c, frame, this.options, this.ws);
    // The workspace now holds the trial's Hessian, not the pixel's.
    this.fresh = false;
    if (result.converged && result.energy < this.energy - DEGENERACY_TOLERANCE * c.scale) {
      this.best.set(frame);
      this.energy = result.energy;
      this.converged = true;
      this.fresh = true;
    }
  }

  /**
   * The certificate of pixel (i, j), whose state is in `best`: when the state is not a
   * converged minimum or a fixed state lies below it, the pixel gets the full search of a
   * single point instead (counted in the block). `knownSoft`, when given, says whether `best`
   * has soft directions (a boundary cell's branch knows it from its descent).
   */
  certify(
    i: number,
    j: number,
    block: PixelBlock,
    ties: readonly Float64Array[] = [],
    orbitTie = false,
    knownSoft?: boolean,
  ): void {
    if (!this.certificate) return;
    const c = this.at(i, j);
    const lower = this.frozen.below(this.xs[i]!, this.ys[j]!, this.energy, c.scale);
    if (lower === undefined && this.converged) {
      // A tie between branches (two states at one energy), or a state in a soft family: the
      // member the vanishing fields select, as the single-point search reports it. Every soft
      // pixel is settled, not only those whose label moved away from the neighbour they were
      // continued from: where a weak field splits two families by less than the pixel
      // tolerance (E_Z = 1e-6 near the KD/CAF line, energies 3e-13 apart), a continued KD
      // keeps its label while the search's representative is CAF.
      const soft =
        !this.rigid && (knownSoft ?? softDirections(c, this.best, this.ws, this.fresh) > 0);
      if (ties.length > 0 || soft || (orbitTie && weakFields(c))) {
        this.best.set(settleDegenerate(c, [this.best, ...ties], this.energy, this.ws));
        this.at(i, j);
      }
      return;
    }
    const warmStarts: Float64Array[] = [Float64Array.from(this.best)];
    if (lower !== undefined) warmStarts.push(lower);
    const search = searchGroundState(c, DEFAULT_MINIMISE, { warmStarts });
    this.best.set(search.frame);
    this.rigid = false;
    // The search polishes its winner only to the search tolerance; bring it to the same
    // convergence as a continued pixel.
    this.at(i, j);
    const polished = descend(this.couplings!, this.best, this.options, this.ws);
    this.energy = polished.energy;
    this.converged = polished.converged;
    block.searched[0] = block.searched[0]! + 1;
  }

  /**
   * A cell that holds a boundary: the state of each branch at its corners is continued over the
   * whole cell, pixel by pixel outwards from that corner (each step one warm descent, so a
   * metastable branch costs little), and each pixel keeps the lowest branch that converged.
   * Among branches degenerate to rounding (lines of extra symmetry) the simplest state wins.
   */
  solveBranches(
    block: PixelBlock,
    a: number,
    b: number,
    branchCorners: readonly number[],
    iFirst: number,
    iLast: number,
    jFirst: number,
    jLast: number,
  ): void {
    const { coarse, ws, options } = this;
    const width = coarse.cols.length;
    const w = iLast - iFirst;
    const h = jLast - jFirst;
    const size = w * h;
    // A branch that stops being a minimum somewhere on its way across the cell is continued
    // again from the other corners that hold its label: from there it may reach pixels it could
    // not reach from its first corner.
    const starts = [...branchCorners];
    const labelOf = (corner: number): string =>
      coarse.labels[(b + (corner >> 1)) * width + a + (corner & 1)]!;
    const store = this.branchStore(4 * size);
    const dd = tangentDimension(this.nf) ** 2;
    options.abandonAbove = Infinity;
    options.abandonNear = undefined;
    for (let k = 0; k < starts.length; k++) {
      const corner = starts[k]!;
      const node = (b + (corner >> 1)) * width + a + (corner & 1);
      let died = false;
      const models = this.fixedModels;
      let modelCount = this.fixedBranch(
        models[0]!,
        this.nodeFrame(node),
        iFirst,
        iLast,
        jFirst,
        jLast,
      )
        ? 1
        : 0;
      let attempts = 0;
      // Scan away from the branch's corner: rows nearest it first, each row from its side.
      const right = (corner & 1) === 1;
      const top = corner >> 1 === 1;
      for (let r = 0; r < h; r++) {
        const j = top ? jLast - 1 - r : jFirst + r;
        for (let q = 0; q < w; q++) {
          const i = right ? iLast - 1 - q : iFirst + q;
          const slot = k * size + (j - jFirst) * w + (i - iFirst);
          const frame = store.frames.subarray(32 * slot, 32 * slot + 32);
          // Slot steps in the scan's directions: along its row, and from row to row.
          const along = right ? -1 : 1;
          const across = top ? -w : w;
          const previous = q > 0 ? slot - along : r > 0 ? slot - across : -1;
          let from =
            previous >= 0
              ? store.frames.subarray(32 * previous, 32 * previous + 32)
              : this.nodeFrame(node);
          const c = this.at(i, j);
          // The fixed model the previous pixel holds (the corner's, at the corner).
          const held = previous >= 0 ? store.fixed[previous]! - 1 : modelCount > 0 ? 0 : -1;
          if (held >= 0) {
            const fm = models[held]!;
            if (fm.holds(i, j, c)) {
              frame.set(fm.frame);
              store.energy[slot] = energyOfOrder(c, fm.order);
              store.converged[slot] = 1;
              store.groups[slot] = fm.groups;
              store.fixed[slot] = held + 1;
              store.still[slot] = 1;
              store.orders.set(fm.order, 16 * slot);
              store.hessians.set(fm.k.subarray(0, dd), 64 * slot);
              continue;
            }
          }
          store.fixed[slot] = 0;
          // Where a fixed state stops being a minimum along a row, the pixel below (one row
          // nearer the corner) already holds the state the branch moved into: a closer start
          // than the saddle the fixed state has become.
          let origin = previous;
          if (
            q > 0 &&
            r > 0 &&
            store.fixed[previous] !== 0 &&
            store.fixed[slot - across] === 0 &&
            store.converged[slot - across] === 1
          ) {
            origin = slot - across;
            from = store.frames.subarray(32 * origin, 32 * origin + 32);
          }
          frame.set(from);
          // Two converged pixels of the branch before this one on the same line: start from
          // their extrapolation (see `predictFrame`).
          const step = origin === previous && q > 0 ? along : across;
          const before = origin - step;
          if (
            origin >= 0 &&
            (step === along ? q > 1 : r > 1) &&
            store.converged[origin] === 1 &&
            store.converged[before] === 1
          ) {
            predictFrame(
              frame,
              from,
              store.frames.subarray(32 * before, 32 * before + 32),
              this.nf,
              ws.scratch,
            );
          }
          const result = descend(c, frame, options, ws);
          store.energy[slot] = result.energy;
          store.converged[slot] = result.converged ? 1 : 0;
          store.groups[slot] = presentGroupCount(ws.order, ORDER_TOLERANCE);
          store.orders.set(ws.order, 16 * slot);
          store.hessians.set(ws.hessian.subarray(0, dd), 64 * slot);
          store.still[slot] = result.converged && result.iterations === 0 ? 1 : 0;
          if (result.converged) {
            // Back at a fixed model's state (a canted state whose canting closed): the next
            // pixel may take it again without a descent.
            for (let m = 0; m < modelCount && store.fixed[slot] === 0; m++) {
              if (models[m]!.near(ws.order)) store.fixed[slot] = m + 1;
            }
            // A state that stayed where it was for two pixels in a row has settled into a fixed
            // state (a branch that fell from its corner state into another one's): when it is a
            // critical point over the whole cell, the rest of the branch tests it as a fixed
            // model instead of descending from it at every pixel.
            if (
              store.fixed[slot] === 0 &&
              store.still[slot] === 1 &&
              origin >= 0 &&
              store.still[origin] === 1 &&
              modelCount < MAX_FIXED_MODELS &&
              attempts < MAX_FIXED_ATTEMPTS
            ) {
              attempts++;
              if (this.fixedBranch(models[modelCount]!, frame, iFirst, iLast, jFirst, jLast)) {
                store.fixed[slot] = ++modelCount;
              }
              // The models' corner evaluations moved the couplings and the workspace.
              this.at(i, j);
            }
          }
          if (!result.converged) died = true;
        }
      }
      if (died) {
        for (let other = 0; other < 4; other++) {
          if (!starts.includes(other) && labelOf(other) === labelOf(corner)) starts.push(other);
        }
      }
    }
    const branches = starts.length;
    const blockWidth = block.width;
    for (let j = jFirst; j < jLast; j++) {
      for (let i = iFirst; i < iLast; i++) {
        const local = (j - jFirst) * w + (i - iFirst);
        // Couplings of this pixel, also used by `store` below.
        const scale = this.at(i, j).scale;
        let pick = local;
        for (let k = 1; k < branches; k++) {
          const slot = k * size + local;
          const better =
            store.converged[slot]! > store.converged[pick]! ||
            (store.converged[slot] === store.converged[pick] &&
              (store.energy[slot]! < store.energy[pick]! - 1e-12 * scale ||
                (Math.abs(store.energy[slot]! - store.energy[pick]!) <= 1e-12 * scale &&
                  store.groups[slot]! < store.groups[pick]!)));
          if (better) pick = slot;
        }
        this.best.set(store.frames.subarray(32 * pick, 32 * pick + 32));
        this.energy = store.energy[pick]!;
        this.converged = store.converged[pick] === 1;
        this.fresh = false;
        this.rigid = false;
        const ties: Float64Array[] = [];
        let orbitTie = false;
        for (let k = 0; k < branches; k++) {
          const slot = k * size + local;
          if (
            slot === pick ||
            store.converged[slot] !== 1 ||
            store.energy[slot]! > this.energy + DEGENERACY_TOLERANCE * scale
          ) {
            continue;
          }
          const other = store.frames.subarray(32 * slot, 32 * slot + 32);
          // Branches that reached one state are no tie, nor are two members of one orbit of the
          // model's exact rotations or two mirror images of one state: `store` puts every pixel
          // at the member the single-point search reports, and where the orbit meets another family at one
          // energy, the state has a soft direction and `certify` settles it. Under fields weaker
          // than the probes, another family can lie within the probes' reach without a soft
          // direction (E_Z = 1e-6 near the KD/CAF line), so there the pixel is still settled,
          // once, from its own state. Any other state at the same energy is a tie and is
          // settled with it.
          if (ordersWithin(store.orders, 16 * slot, 16 * pick, TIE_DISTANCE)) continue;
          const symmetry = modelSymmetry(this.couplings!);
          if (
            sameState(other, this.best, this.nf, TIE_DISTANCE, symmetry) ||
            sameRepresentative(this.couplings!, other, this.best, TIE_DISTANCE, symmetry)
          ) {
            orbitTie = true;
          } else {
            ties.push(other);
          }
        }
        // The picked state's Hessian, as its descent left it: whether it is soft.
        ws.hessian.set(store.hessians.subarray(64 * pick, 64 * pick + dd));
        const soft =
          store.converged[pick] === 1 && softDirections(this.couplings!, this.best, ws, true) > 0;
        this.certify(i, j, block, ties, orbitTie, soft);
        this.store(block, (j - block.j0) * blockWidth + (i - block.i0));
      }
    }
  }

  private branchStore(count: number): BranchStore {
    if (this.branchBuffers === undefined || this.branchBuffers.energy.length < count) {
      this.branchBuffers = {
        frames: new Float64Array(32 * count),
        energy: new Float64Array(count),
        converged: new Uint8Array(count),
        groups: new Uint8Array(count),
        fixed: new Uint8Array(count),
        still: new Uint8Array(count),
        orders: new Float64Array(16 * count),
        hessians: new Float64Array(64 * count),
      };
    }
    return this.branchBuffers;
  }

  /**
   * Writes the state just solved into slot n of the block, at the member of its degenerate
   * family the single-point search reports: the mirror image the vanishing fields select
   * (`discreteRepresentative`) and the canonical point of its orbit (`canonicaliseOrbit`), as
   * `searchGroundState` and the coarse nodes do. A rigid cell's pixels hold its corner node's
   * state, which is there already.
   */
  store(block: PixelBlock, n: number): void {
    const s = this.scratch;
    let summary;
    if (this.rigid) {
      s.order.set(this.rigidOrder);
      summary = summariseOrder(this.couplings!, this.best, this.nf, s);
    } else {
      representative(this.couplings!, this.best, modelSymmetry(this.couplings!));
      summary = summarise(this.couplings!, this.best, this.nf, s);
    }
    block.frames.set(this.best, 32 * n);
    block.energy[n] = summary.energy;
    block.gap[n] = summary.gap;
    block.order.set(s.order.subarray(1, 16), 15 * n);
    block.labels[n] = summary.label;
  }
}

/**
 * Rows [j0, j0 + rows) with a full cold search at every pixel: no coarse grid, no warm starts,
 * no adaptivity. The baseline that the Map's staged computation is measured against.
 */
export function solveRowsCold(input: MapInput, j0: number, rows: number): PixelBlock {
  const [nx, ny] = input.plane.resolution;
  const nf = input.model.filling + 2;
  const planeCouplings = new PlaneCouplings(input);
  const count = nx * rows;
  const block = emptyBlock(0, j0, nx, rows);
  const scratch = new PixelScratch();
  for (let n = 0; n < count; n++) {
    const i = n % nx;
    const j = j0 + Math.floor(n / nx);
    const c = planeCouplings.at(axisValue(input.plane.x, nx, i), axisValue(input.plane.y, ny, j));
    const frame = minimiseEnergy(c, DEFAULT_MINIMISE).frame;
    const summary = summarise(c, frame, nf, scratch);
    block.frames.set(frame, 32 * n);
    block.energy[n] = summary.energy;
    block.gap[n] = summary.gap;
    block.order.set(scratch.order.subarray(1, 16), 15 * n);
    block.labels[n] = summary.label;
  }
  return block;
}

/** Index of the coarse cell that owns pixel index `i` along one side. */
export function cellOf(line: Int32Array, i: number, n: number): number {
  let a = 0;
  while (a < line.length - 2 && cellSpan(line, a, n)[1] <= i) a++;
  return a;
}

/**
 * The listed pixels (indices p = j nx + i), each by one descent from the nearest corner node of
 * its cell, or in a rigid cell as `solveCells` takes it (the corners' state): the state of a
 * pixel inside a region, on demand (hover, the ends of a boundary edge) rather than for every
 * pixel. Results in list order, as a block of width `pixels.length`.
 */
export function solvePixelList(
  input: MapInput,
  coarse: CoarseNodes,
  pixels: Int32Array,
): PixelBlock {
  const [nx, ny] = input.plane.resolution;
  const count = pixels.length;
  const block = emptyBlock(0, 0, count, 1);
  const solver = new PixelSolver(input, coarse, true);
  const width = coarse.cols.length;
  // The cell whose certificate is set up (pixels in one cell, as sorted lists bring them, share
  // it: `prepareCell` relaxes up to eighteen seed states).
  let prepared = -1;
  let rigid = false;
  let certified = false;
  // Taken cell by cell (a pixel's result does not depend on the order), so that each cell's
  // set-up is made once.
  const cellIndex = Array.from(pixels, (p) => {
    const a = cellOf(coarse.cols, p % nx, nx);
    const b = cellOf(coarse.rows, Math.floor(p / nx), ny);
    return b * width + a;
  });
  const visit = Array.from({ length: count }, (_, n) => n).sort(
    (m, n) => cellIndex[m]! - cellIndex[n]! || m - n,
  );
  for (const n of visit) {
    const i = pixels[n]! % nx;
    const j = Math.floor(pixels[n]! / nx);
    const a = cellIndex[n]! % width;
    const b = Math.floor(cellIndex[n]! / width);
    let nearest = b * width + a;
    let distance = Infinity;
    for (let corner = 0; corner < 4; corner++) {
      const node = (b + (corner >> 1)) * width + a + (corner & 1);
      const d =
        (coarse.cols[a + (corner & 1)]! - i) ** 2 + (coarse.rows[b + (corner >> 1)]! - j) ** 2;
      if (d < distance) {
        distance = d;
        nearest = node;
      }
    }
    const [iFirst, iLast] = cellSpan(coarse.cols, a, nx);
    const [jFirst, jLast] = cellSpan(coarse.rows, b, ny);
    const cell = b * width + a;
    if (prepared !== cell) {
      solver.prepareCell(a, b, iFirst, iLast, jFirst, jLast);
      rigid = solver.rigidCell(a, b);
      certified = rigid && solver.rigidCertified(solver.nodeOrder(cell));
      prepared = cell;
    }
    if (rigid) {
      // As `solveCells` solves a pixel of a rigid cell: the corners' state, a minimum here.
      solver.fromRigid(i, j, solver.nodeFrame(cell), solver.nodeOrder(cell));
      if (!certified) solver.certify(i, j, block);
    } else {
      solver.fromNeighbour(i, j, coarse.frames.subarray(32 * nearest, 32 * nearest + 32));
      solver.certify(i, j, block);
    }
    solver.store(block, n);
  }
  return block;
}
