import { COMMUTATION_SIGN, G_COL, G_IM, G_RE, MATRIX_COUNT } from './channels';
import { channelChange } from './channelWavevector';
import { coulombExchangeLoss } from './coulombExchange';
import type { Couplings } from './couplings';
import { DescentWorkspace, frameEnergy, tangentDimension, tangentModel } from './tangentSpace';

/**
 * The curvature of the energy for particle-hole modulations of wavevector q about a uniform
 * stationary state, in the real tangent coordinates of tangentSpace.ts
 * (public/notes.html#dispersion; derived there and here):
 *
 *   K(q) = K(0) + 2 C [X_C(0) - X_C(q)] I + sum_k [kappa_k(q) - kappa_k(0)] w^k (w^k)^T,
 *   kappa_k(q) = D_k(q) - (1/4) sum_l X_l(q) s(l, k),
 *
 * K(0) the q = 0 Hessian of tangentModel, w^k = (2 Re, 2 Im) of u_a^dagger G_k u_i (empty a,
 * occupied i), D_l and X_l the direct and exchange parts of channel l at q (channelWavevector.ts),
 * s(l, k) = +-1 as G_l and G_k commute or anticommute, C the Coulomb scale e^2 / (eps l_B) and
 * X_C its exchange kernel in units of C (coulombExchange.ts; C X_C(0) = E_X). The Coulomb interaction has no direct part here:
 * every excitation of the level changes the flavour, and u_a^dagger u_i = 0. Its exchange enters
 * every kappa_k as -X_C / 4 and, through -E_X P in H_HF, the particle-hole energies as +E_X;
 * since sum_k w^k (w^k)^T = 8 I (the completeness of the 16 G_k), the two together give the
 * multiple of the identity above, which vanishes at q = 0. So K(0) is exactly the q = 0 Hessian,
 * and K(infinity) is the particle-hole part alone, shifted by E_X.
 */
export class WavevectorHessian {
  /** Real dimension of the tangent space. */
  readonly dimension: number;
  private readonly base: Float64Array;
  /** w^k for k = 1..15, d numbers each, at [(k - 1) d]. */
  private readonly w: Float64Array;

  constructor(
    private readonly c: Couplings,
    frame: Float64Array,
    private readonly coulomb: number,
    private readonly gateDistance?: number,
  ) {
    const d = tangentDimension(c.nf);
    this.dimension = d;
    const ws = new DescentWorkspace();
    frameEnergy(c, frame, ws, ws.order);
    tangentModel(c, frame, ws);
    this.base = Float64Array.from(ws.hessian.subarray(0, d * d));
    this.w = channelVectors(frame, c.nf);
  }

  /** K(q), d x d row-major (a new array). */
  at(q: number): Float64Array {
    const d = this.dimension;
    const k = Float64Array.from(this.base);
    if (q === 0) return k;
    const direct = new Float64Array(MATRIX_COUNT);
    const exchange = new Float64Array(MATRIX_COUNT);
    for (let l = 1; l < MATRIX_COUNT; l++) {
      const change = channelChange(this.c.hartree[l]!, this.c.fock[l]!, q);
      direct[l] = change.direct;
      exchange[l] = change.exchange;
    }
    for (let ch = 1; ch < MATRIX_COUNT; ch++) {
      let kappa = direct[ch]!;
      for (let l = 1; l < MATRIX_COUNT; l++) {
        kappa -= (exchange[l]! * COMMUTATION_SIGN[16 * l + ch]!) / 4;
      }
      if (kappa === 0) continue;
      const w = this.w.subarray((ch - 1) * d, ch * d);
      for (let p = 0; p < d; p++) {
        const wp = kappa * w[p]!;
        for (let r = 0; r < d; r++) k[p * d + r] = k[p * d + r]! + wp * w[r]!;
      }
    }
    const coulomb = 2 * this.coulomb * coulombExchangeLoss(q, this.gateDistance);
    for (let p = 0; p < d; p++) k[p * d + p] = k[p * d + p]! + coulomb;
    return k;
  }
}

/**
 * w^k = (2 Re gamma^k_ai, 2 Im gamma^k_ai), gamma^k_ai = u_a^dagger G_k u_i, at index
 * 2 (a Nf + i), for k = 1..15 (the vectors of the Hessian's interaction part in tangentSpace.ts).
 */
export function channelVectors(frame: Float64Array, nf: number): Float64Array {
  const ne = 4 - nf;
  const d = 2 * nf * ne;
  const out = new Float64Array((MATRIX_COUNT - 1) * d);
  for (let ch = 1; ch < MATRIX_COUNT; ch++) {
    for (let a = 0; a < ne; a++) {
      const oa = 8 * (nf + a);
      for (let i = 0; i < nf; i++) {
        let sr = 0;
        let si = 0;
        for (let r = 0; r < 4; r++) {
          // conj(u_a[r]) g_r u_i[col_r]
          const col = G_COL[4 * ch + r]!;
          const gr = G_RE[4 * ch + r]!;
          const gi = G_IM[4 * ch + r]!;
          const ur = frame[8 * i + 2 * col]!;
          const ui = frame[8 * i + 2 * col + 1]!;
          const vr = gr * ur - gi * ui;
          const vi = gr * ui + gi * ur;
          const ar = frame[oa + 2 * r]!;
          const ai = frame[oa + 2 * r + 1]!;
          sr += ar * vr + ai * vi;
          si += ar * vi - ai * vr;
        }
        const idx = (ch - 1) * d + 2 * (a * nf + i);
        out[idx] = 2 * sr;
        out[idx + 1] = 2 * si;
      }
    }
  }
  return out;
}
