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
  readonly block = new Float64Array(32);
  readonly eigenvectors = new Float64Array(32);
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
  return summariseOrder(c, frame, nf, s);
}

/** `summarise` of a frame whose order parameters are in `s.order` already. */
export function summariseOrder(
  c: Couplings,
  frame: Float64Array,
  nf: number,
  s: PixelScratch,
): { energy: number; gap: number; label: string } {
  let energy = c.c0 + c.eta[0]! * nf;
  for (let k = 1; k < 16; k++)
    energy += s.order[k]! * (c.eta[k]! + 0.5 * c.kappa[k]! * s.order[k]!);
  hartreeFockOfOrder(c, s.order, s.hamiltonian, false);
  const gap = fermiGap(frame, nf, s) + c.exchange;
  return { energy, gap, label: phaseLabel(s.order, c) };
}

/**
 * Lowest empty minus highest occupied Hartree-Fock level of a frame (H_HF in `s.hamiltonian`):
 * the eigenvalues of H_HF inside the occupied and inside the empty subspace, which at a
 * self-consistent state are its levels. Two levels degenerate at the Fermi level give 0 (not a
 * failed occupied/empty assignment).
 */
export function fermiGap(frame: Float64Array, nf: number, s: PixelScratch): number {
  const m = s.vectors;
  // M = U^dagger H U (all four frame vectors).
  const hu = s.projector;
  for (let b = 0; b < 4; b++) {
    for (let r = 0; r < 4; r++) {
      let re = 0;
      let im = 0;
      for (let col = 0; col < 4; col++) {
        const hr = s.hamiltonian[2 * (4 * r + col)]!;
        const hi = s.hamiltonian[2 * (4 * r + col) + 1]!;
        const ur = frame[8 * b + 2 * col]!;
        const ui = frame[8 * b + 2 * col + 1]!;
        re += hr * ur - hi * ui;
        im += hr * ui + hi * ur;
      }
      hu[8 * b + 2 * r] = re;
      hu[8 * b + 2 * r + 1] = im;
    }
  }
  // M_ab = u_a^dagger (H u_b), only inside the occupied block (a, b < nf) and inside the empty
  // block (a, b >= nf): the off-diagonal blocks vanish at a self-consistent state and are not
  // needed.
  let size = 0;
  for (let a = 0; a < 4; a++) {
    for (let b = 0; b < 4; b++) {
      if (a < nf !== b < nf) continue;
      let re = 0;
      let im = 0;
      for (let r = 0; r < 4; r++) {
        const ar = frame[8 * a + 2 * r]!;
        const ai = frame[8 * a + 2 * r + 1]!;
        const br = hu[8 * b + 2 * r]!;
        const bi = hu[8 * b + 2 * r + 1]!;
        re += ar * br + ai * bi;
        im += ar * bi - ai * br;
      }
      m[2 * (4 * a + b)] = re;
      m[2 * (4 * a + b) + 1] = im;
      size = Math.max(size, Math.abs(re), Math.abs(im));
    }
  }
  if (nf === 2) {
    // Two 2 x 2 Hermitian blocks: lambda = mean -+ sqrt(half-difference^2 + |offdiagonal|^2).
    const highestOccupied = (m[0]! + m[10]!) / 2 + Math.hypot((m[0]! - m[10]!) / 2, m[2]!, m[3]!);
    const lowestEmpty = (m[20]! + m[30]!) / 2 - Math.hypot((m[20]! - m[30]!) / 2, m[22]!, m[23]!);
    return lowestEmpty - highestOccupied;
  }
  // One 1 x 1 block and one 3 x 3 block; the latter padded far away in a 4 x 4 eigenproblem.
  const single = nf === 1 ? 0 : 3;
  const first = nf === 1 ? 1 : 0;
  const pad = (10 * size + 1) * (nf === 1 ? -1 : 1);
  const block = s.block;
  block.fill(0);
  for (let a = first; a < first + 3; a++) {
    for (let b = first; b < first + 3; b++) {
      block[2 * (4 * a + b)] = m[2 * (4 * a + b)]!;
      block[2 * (4 * a + b) + 1] = m[2 * (4 * a + b) + 1]!;
    }
  }
  block[10 * single] = pad;
  hermitianEigen4(block, s.values, s.eigenvectors);
  // nf = 1: the padding sorts first and the empty levels follow; nf = 3: it sorts last
  // (M_00 and M_33 are the diagonal entries 0 and 30).
  return nf === 1 ? s.values[1]! - m[0]! : m[30]! - s.values[2]!;
}
