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

/**
 * Row r of G_k holds one entry g = +-1 or +-i in column c = G_COL[4 k + r], so
 * Re(g P_cr) = TRACE_SIGN * p[TRACE_AT] with p interleaved re/im: g Re P_cr for real g, and
 * -t Im P_cr for g = i t.
 */
const TRACE_AT = new Int32Array(4 * MATRIX_COUNT);
const TRACE_SIGN = new Float64Array(4 * MATRIX_COUNT);
for (let n = 0; n < 4 * MATRIX_COUNT; n++) {
  const idx = 2 * (4 * G_COL[n]! + (n & 3));
  const real = G_IM[n] === 0;
  TRACE_AT[n] = real ? idx : idx + 1;
  TRACE_SIGN[n] = real ? G_RE[n]! : -G_IM[n]!;
}

/**
 * Where row r of G_k puts its one entry in a dense interleaved matrix (its real or imaginary
 * slot), and the entry's value there.
 */
const HF_AT = new Int32Array(4 * MATRIX_COUNT);
const HF_VALUE = new Float64Array(4 * MATRIX_COUNT);
for (let n = 0; n < 4 * MATRIX_COUNT; n++) {
  const idx = 2 * (4 * (n & 3) + G_COL[n]!);
  const real = G_IM[n] === 0;
  HF_AT[n] = real ? idx : idx + 1;
  HF_VALUE[n] = real ? G_RE[n]! : G_IM[n]!;
}

/** o_k = tr(G_k P) for k = 0..15 (o_0 = tr P). */
export function orderOfProjector(p: Float64Array, out: Float64Array): Float64Array {
  for (let k = 0; k < MATRIX_COUNT; k++) {
    const n = 4 * k;
    // sum_r Re(g_rc P_cr)
    let sum = TRACE_SIGN[n]! * p[TRACE_AT[n]!]!;
    sum += TRACE_SIGN[n + 1]! * p[TRACE_AT[n + 1]!]!;
    sum += TRACE_SIGN[n + 2]! * p[TRACE_AT[n + 2]!]!;
    sum += TRACE_SIGN[n + 3]! * p[TRACE_AT[n + 3]!]!;
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
    // Each row's one entry is real or imaginary: the other part would only add a zero.
    for (let n = 4 * k; n < 4 * k + 4; n++) out[HF_AT[n]!] = out[HF_AT[n]!]! + mu * HF_VALUE[n]!;
  }
  if (withIdentity) for (let r = 0; r < 4; r++) out[10 * r] = out[10 * r]! + c.identityShift;
  return out;
}
