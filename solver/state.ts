import { G_COL, G_IM, G_RE, MATRIX_COUNT } from './channels';
import type { Couplings } from './couplings';

/**
 * A state is a unitary frame U (see linalg.ts for the layout) whose first Nf vectors span the
 * occupied subspace; its projector is P = sum_{i < Nf} u_i u_i^dagger.
 */

/** P = sum_{i < nf} u_i u_i^dagger as a 4x4 complex matrix (row-major, interleaved). */
export function projectorOf(frame: Float64Array, nf: number, out: Float64Array): Float64Array {
  out.fill(0);
  for (let i = 0; i < nf; i++) {
    const o = 8 * i;
    for (let r = 0; r < 4; r++) {
      const ar = frame[o + 2 * r]!;
      const ai = frame[o + 2 * r + 1]!;
      for (let c = 0; c < 4; c++) {
        const br = frame[o + 2 * c]!;
        const bi = frame[o + 2 * c + 1]!;
        const idx = 2 * (4 * r + c);
        // u_r conj(u_c)
        out[idx] = out[idx]! + ar * br + ai * bi;
        out[idx + 1] = out[idx + 1]! + ai * br - ar * bi;
      }
    }
  }
  return out;
}

/** o_k = tr(G_k P) for k = 0..15 (o_0 = tr P). */
export function orderOfProjector(p: Float64Array, out: Float64Array): Float64Array {
  for (let k = 0; k < MATRIX_COUNT; k++) {
    let sum = 0;
    for (let r = 0; r < 4; r++) {
      const c = G_COL[4 * k + r]!;
      const idx = 2 * (4 * c + r);
      // Re(g_rc P_cr)
      sum += G_RE[4 * k + r]! * p[idx]! - G_IM[4 * k + r]! * p[idx + 1]!;
    }
    out[k] = sum;
  }
  return out;
}

/**
 * H_HF[P] of public/notes.html#gap from the order parameters, without the -E_X P term:
 * sum_k (eta_k + kappa_k o_k) G_k + identityShift.
 */
export function hartreeFockOfOrder(
  c: Couplings,
  order: Float64Array,
  out: Float64Array,
  withIdentity = true,
): Float64Array {
  out.fill(0);
  for (let k = 1; k < MATRIX_COUNT; k++) {
    const mu = c.eta[k]! + c.kappa[k]! * order[k]!;
    if (mu === 0) continue;
    for (let r = 0; r < 4; r++) {
      const idx = 2 * (4 * r + G_COL[4 * k + r]!);
      out[idx] = out[idx]! + mu * G_RE[4 * k + r]!;
      out[idx + 1] = out[idx + 1]! + mu * G_IM[4 * k + r]!;
    }
  }
  if (withIdentity) for (let r = 0; r < 4; r++) out[10 * r] = out[10 * r]! + c.identityShift;
  return out;
}
