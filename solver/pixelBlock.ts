import { type Couplings } from './couplings';
import type { CoarseNodes } from './coarseNodes';
import { hermitianEigen4 } from './linalg';
import { DEFAULT_DESCENT, descend } from './localMinimise';
import { DescentWorkspace } from './tangentSpace';
import { ABANDON_MARGIN } from './minimise';
import { presentGroupCount } from './orderParameters';
import { ORDER_TOLERANCE, phaseLabel } from './phaseLabel';
import { axisValue, PlaneCouplings, type MapInput } from './plane';
import { hartreeFockOfOrder, orderOfProjector, projectorOf } from './state';
import { modelSymmetry } from './symmetry';

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
