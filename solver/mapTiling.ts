import { type Couplings } from './couplings';
import { hermitianEigen4 } from './linalg';
import { DEFAULT_DESCENT, DescentWorkspace, descend } from './localMinimise';
import { ABANDON_MARGIN, DEFAULT_MINIMISE, minimiseEnergy } from './minimise';
import { presentGroupCount } from './orderParameters';
import { ORDER_TOLERANCE, phaseLabel } from './phaseLabel';
import { axisValue, PlaneCouplings, type MapInput } from './plane';
import { hartreeFockOfOrder, orderOfProjector, projectorOf } from './state';
import { modelSymmetry } from './symmetry';

/**
 * The Map in three stages, each a pure function of its inputs so that any split of the work
 * between threads gives the same numbers bit for bit:
 *
 * 1. coarse nodes (every `stride`-th pixel and the last row and column): full global search;
 * 2. every pixel: descents warm-started from the four coarse nodes around it (both sides of any
 *    boundary that crosses the coarse cell), the lowest kept;
 * 3. every pixel edge whose ends carry different labels: bisection of the transition along the
 *    edge to 1e-9 of the axis span, warm-started from both ends, and typed first order (the order
 *    parameters jump) or continuous.
 */

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
    const frame = minimiseEnergy(c, DEFAULT_MINIMISE).frame;
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

/** Per-pixel results of stage 2 for pixels `start .. start + count - 1` (row-major). */
export interface PixelBlock {
  readonly start: number;
  readonly count: number;
  readonly energy: Float64Array;
  /** o_k, k = 1..15, at [15 n + k - 1]. */
  readonly order: Float64Array;
  readonly gap: Float64Array;
  readonly frames: Float64Array;
  readonly labels: string[];
}

function interval(line: Int32Array, i: number): number {
  let a = 0;
  while (a < line.length - 2 && line[a + 1]! <= i) a++;
  return a;
}

/**
 * Candidate warm starts for pixel (i, j): the corner nodes, nearest first, one per phase.
 * Writes node indices into `out` and returns how many.
 */
function cornerCandidates(coarse: CoarseNodes, i: number, j: number, out: Int32Array): number {
  const a = interval(coarse.cols, i);
  const b = interval(coarse.rows, j);
  const width = coarse.cols.length;
  let count = 0;
  // Corners ordered by distance (ties by node index): at most four, sorted by insertion.
  const nodes = [0, 0, 0, 0];
  const distances = [0, 0, 0, 0];
  for (let corner = 0; corner < 4; corner++) {
    const da = corner & 1;
    const db = corner >> 1;
    const node = (b + db) * width + a + da;
    const d = (coarse.cols[a + da]! - i) ** 2 + (coarse.rows[b + db]! - j) ** 2;
    let slot = corner;
    while (
      slot > 0 &&
      (distances[slot - 1]! > d || (distances[slot - 1] === d && nodes[slot - 1]! > node))
    ) {
      nodes[slot] = nodes[slot - 1]!;
      distances[slot] = distances[slot - 1]!;
      slot--;
    }
    nodes[slot] = node;
    distances[slot] = d;
  }
  // The nearest node of each distinct phase: one start inside a region, one per side of a
  // boundary that crosses the coarse cell.
  for (const node of nodes) {
    let seen = false;
    for (let k = 0; k < count; k++) if (coarse.labels[out[k]!] === coarse.labels[node]) seen = true;
    if (!seen) out[count++] = node;
  }
  return count;
}

/** Stage 2 for a block of pixels. */
export function solvePixels(
  input: MapInput,
  coarse: CoarseNodes,
  start: number,
  count: number,
): PixelBlock {
  const [nx, ny] = input.plane.resolution;
  const nf = input.model.filling + 2;
  const planeCouplings = new PlaneCouplings(input);
  const block: PixelBlock = {
    start,
    count,
    energy: new Float64Array(count),
    order: new Float64Array(15 * count),
    gap: new Float64Array(count),
    frames: new Float64Array(32 * count),
    labels: [],
  };
  const scratch = new PixelScratch();
  const ws = new DescentWorkspace();
  const candidates = new Int32Array(4);
  const trial = new Float64Array(32);
  const best = new Float64Array(32);
  const bestOrder = new Float64Array(16);
  const options = { ...DEFAULT_DESCENT, polishSteps: 0 };
  for (let n = 0; n < count; n++) {
    const pixel = start + n;
    const i = pixel % nx;
    const j = Math.floor(pixel / nx);
    const c = planeCouplings.at(axisValue(input.plane.x, nx, i), axisValue(input.plane.y, ny, j));
    // Descend from each candidate; later ones stop once they cannot beat the best.
    const m = cornerCandidates(coarse, i, j, candidates);
    let bestEnergy = Infinity;
    let bestConverged = false;
    for (let k = 0; k < m; k++) {
      const offset = 32 * candidates[k]!;
      for (let q = 0; q < 32; q++) trial[q] = coarse.frames[offset + q]!;
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
    block.frames.set(best, 32 * n);
    const summary = summarise(c, best, nf, scratch);
    block.energy[n] = summary.energy;
    block.gap[n] = summary.gap;
    block.order.set(scratch.order.subarray(1, 16), 15 * n);
    block.labels.push(summary.label);
  }
  return block;
}

class PixelScratch {
  readonly projector = new Float64Array(32);
  readonly order = new Float64Array(16);
  readonly hamiltonian = new Float64Array(32);
  readonly values = new Float64Array(4);
  readonly vectors = new Float64Array(32);
}

/** Energy, label and quasiparticle gap of a frame (gap without E_X unless the model sets it). */
function summarise(
  c: Couplings,
  frame: Float64Array,
  nf: number,
  s: PixelScratch,
): { energy: number; gap: number; label: string } {
  projectorOf(frame, nf, s.projector);
  orderOfProjector(s.projector, s.order);
  let energy = c.c0 + c.eta[0]! * nf;
  for (let k = 1; k < 16; k++)
    energy += s.order[k]! * (c.eta[k]! + 0.5 * c.kappa[k]! * s.order[k]!);
  hartreeFockOfOrder(c, s.order, s.hamiltonian);
  hermitianEigen4(s.hamiltonian, s.values, s.vectors);
  // Classify eigenvectors as occupied (v^dagger P v near 1) or empty.
  let highestOccupied = -Infinity;
  let lowestEmpty = Infinity;
  for (let k = 0; k < 4; k++) {
    let weight = 0;
    for (let r = 0; r < 4; r++) {
      for (let col = 0; col < 4; col++) {
        const vr = s.vectors[8 * k + 2 * r]!;
        const vi = s.vectors[8 * k + 2 * r + 1]!;
        const wr = s.vectors[8 * k + 2 * col]!;
        const wi = s.vectors[8 * k + 2 * col + 1]!;
        const pr = s.projector[2 * (4 * r + col)]!;
        const pi = s.projector[2 * (4 * r + col) + 1]!;
        // conj(v_r) P_rc w_c, real part
        const ar = vr * pr + vi * pi;
        const ai = vr * pi - vi * pr;
        weight += ar * wr - ai * wi;
      }
    }
    if (weight > 0.5) highestOccupied = Math.max(highestOccupied, s.values[k]!);
    else lowestEmpty = Math.min(lowestEmpty, s.values[k]!);
  }
  const gap = lowestEmpty - highestOccupied + c.exchange;
  return { energy, gap, label: phaseLabel(s.order, c, modelSymmetry(c)) };
}

/** A located transition on one pixel edge. */
export interface Crossing {
  /** Edge id: 2 p for the edge from pixel p to p + 1, 2 p + 1 from p to p + nx. */
  readonly edge: number;
  readonly x: number;
  readonly y: number;
  /** Labels on the near (p) and far side of the crossing. */
  readonly near: string;
  readonly far: string;
  readonly order: 'first' | 'continuous';
}

/** Order-parameter jump above which a transition counts as first order. */
export const FIRST_ORDER_JUMP = 1e-2;

/** Relative bracket width (of the axis span) at which bisection stops. */
export const BISECTION_TOLERANCE = 1e-9;

/**
 * Stage 3: locate the transitions on the given edges. `endFrames` holds, per edge, the frames of
 * its near and far pixel (64 numbers); `endLabels` their labels.
 */
export function locateCrossings(
  input: MapInput,
  edges: Int32Array,
  endFrames: Float64Array,
  endLabels: readonly string[],
): Crossing[] {
  const [nx, ny] = input.plane.resolution;
  const nf = input.model.filling + 2;
  const planeCouplings = new PlaneCouplings(input);
  const out: Crossing[] = [];
  const p = new Float64Array(32);
  const orderNear = new Float64Array(16);
  const orderFar = new Float64Array(16);
  const ws = new DescentWorkspace();
  const branchNear = new Float64Array(32);
  const branchFar = new Float64Array(32);
  const orderA = new Float64Array(16);
  // Branches are continued without leaving saddles (a branch that has become a saddle is not
  // the ground state), converged tightly and polished so that soft modes near a continuous
  // transition do not blur the labels.
  const branch = { ...DEFAULT_DESCENT, escapeSaddles: false, polishSteps: 1 };
  for (let e = 0; e < edges.length; e++) {
    const edge = edges[e]!;
    const pixel = edge >> 1;
    const vertical = (edge & 1) === 1;
    const i = pixel % nx;
    const j = Math.floor(pixel / nx);
    const x0 = axisValue(input.plane.x, nx, i);
    const y0 = axisValue(input.plane.y, ny, j);
    const x1 = vertical ? x0 : axisValue(input.plane.x, nx, i + 1);
    const y1 = vertical ? axisValue(input.plane.y, ny, j + 1) : y0;
    const tolerance = BISECTION_TOLERANCE * (vertical ? ny : nx);
    const near = endLabels[2 * e]!;
    const far = endLabels[2 * e + 1]!;
    let lo = 0;
    let hi = 1;
    let frameNear: Float64Array = endFrames.slice(64 * e, 64 * e + 32);
    let frameFar: Float64Array = endFrames.slice(64 * e + 32, 64 * e + 64);
    // Energy difference of the two branches (near minus far) at the bracket ends, when both
    // are distinct local minima there: a first-order transition is its root.
    let gapLo: number | undefined;
    let gapHi: number | undefined;
    const probe = (t: number): void => {
      const c = planeCouplings.at(x0 + t * (x1 - x0), y0 + t * (y1 - y0));
      branchNear.set(frameNear);
      branchFar.set(frameFar);
      const a = descend(c, branchNear, branch, ws);
      orderA.set(ws.order);
      const b = descend(c, branchFar, branch, ws);
      let frame: Float64Array;
      let difference: number | undefined;
      if (a.converged && b.converged) {
        let distance = 0;
        for (let k = 1; k < 16; k++)
          distance = Math.max(distance, Math.abs(orderA[k]! - ws.order[k]!));
        if (distance > FIRST_ORDER_JUMP) difference = a.energy - b.energy;
        frame = a.energy <= b.energy ? branchNear : branchFar;
      } else if (a.converged) frame = branchNear;
      else if (b.converged) frame = branchFar;
      else {
        frame = minimiseEnergy(c, DEFAULT_MINIMISE, {
          warmStarts: [frameNear, frameFar],
          gradientTolerance: 1e-12,
          polishSteps: 1,
        }).frame;
      }
      orderOfProjector(projectorOf(frame, nf, p), orderNear);
      let label = phaseLabel(orderNear, c, modelSymmetry(c));
      if (label !== near && label !== far) {
        // Within rounding of a line where the two end states are degenerate (for H = F,
        // uZ = uPerp joins KD and CDW by a valley rotation) a descent may stop part-way along
        // the flat direction: the state belongs to the end it is closer to. (A genuine third
        // phase narrower than one pixel edge is not resolved.)
        label = closerEnd(orderNear, frameNear, frameFar, nf) ? near : far;
      }
      if (label === near) {
        lo = t;
        frameNear = Float64Array.from(frame);
        gapLo = difference !== undefined && difference < 0 ? difference : undefined;
      } else {
        hi = t;
        frameFar = Float64Array.from(frame);
        gapHi = difference !== undefined && difference > 0 ? difference : undefined;
      }
    };
    for (let guard = 0; hi - lo > tolerance && guard < 200; guard++) {
      if (gapLo !== undefined && gapHi !== undefined) {
        // Regula falsi on the branch energy difference, then two probes just either side of
        // the estimate to close the bracket; fall back to bisection if it did not halve.
        const width = hi - lo;
        const estimate = lo + (width * gapLo) / (gapLo - gapHi);
        const margin = 0.01 * tolerance;
        probe(Math.min(hi - margin, Math.max(lo + margin, estimate - 0.4 * tolerance)));
        if (hi - lo > tolerance) {
          const second = Math.min(hi - margin, Math.max(lo + margin, estimate + 0.4 * tolerance));
          if (second > lo && second < hi) probe(second);
        }
        if (hi - lo > width / 2) probe((lo + hi) / 2);
      } else {
        probe((lo + hi) / 2);
      }
    }
    orderOfProjector(projectorOf(frameNear, nf, p), orderNear);
    orderOfProjector(projectorOf(frameFar, nf, p), orderFar);
    let jump = 0;
    for (let k = 1; k < 16; k++) jump = Math.max(jump, Math.abs(orderNear[k]! - orderFar[k]!));
    const t = (lo + hi) / 2;
    out.push({
      edge,
      x: x0 + t * (x1 - x0),
      y: y0 + t * (y1 - y0),
      near,
      far,
      order: jump > FIRST_ORDER_JUMP ? 'first' : 'continuous',
    });
  }
  return out;
}

/** Whether `order` lies closer (max norm) to the state of frame `a` than to that of `b`. */
function closerEnd(order: Float64Array, a: Float64Array, b: Float64Array, nf: number): boolean {
  const p = new Float64Array(32);
  const oa = orderOfProjector(projectorOf(a, nf, p), new Float64Array(16));
  const ob = orderOfProjector(projectorOf(b, nf, p), new Float64Array(16));
  let da = 0;
  let db = 0;
  for (let k = 1; k < 16; k++) {
    da = Math.max(da, Math.abs(order[k]! - oa[k]!));
    db = Math.max(db, Math.abs(order[k]! - ob[k]!));
  }
  return da <= db;
}

/** Edges (ids as in Crossing) between differently labelled neighbours, ascending. */
export function boundaryEdges(labels: readonly string[], nx: number, ny: number): Int32Array {
  const out: number[] = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const p = j * nx + i;
      if (i + 1 < nx && labels[p] !== labels[p + 1]) out.push(2 * p);
      if (j + 1 < ny && labels[p] !== labels[p + nx]) out.push(2 * p + 1);
    }
  }
  return Int32Array.from(out);
}

export { ORDER_TOLERANCE };
