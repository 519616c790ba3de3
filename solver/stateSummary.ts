import type { Couplings } from './couplings';
import { hermitianEigen4 } from './linalg';
import { phaseLabel } from './phaseLabel';
import { hartreeFockOfOrder, orderOfProjector, projectorOf } from './state';

/** Scratch arrays for `summarise`, reused across pixels. */
export class PixelScratch {
  readonly projector = new Float64Array(32);
  readonly order = new Float64Array(16);
  readonly hamiltonian = new Float64Array(32);
  readonly values = new Float64Array(4);
  readonly vectors = new Float64Array(32);
}

/**
 * Energy, label and quasiparticle gap of a frame (gap without E_X unless the model sets it);
 * leaves the order parameters in `s.order`.
 */
export function summarise(
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
  return { energy, gap, label: phaseLabel(s.order, c) };
}
