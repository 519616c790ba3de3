import { G_COL, G_IM, G_RE, MATRIX_COUNT } from './channels';
import { energyOfOrder, type Couplings } from './couplings';
import { completeFrame, multiplyFrame, orthonormaliseFrame } from './linalg';
import { hartreeFockOfOrder, orderOfProjector, projectorOf } from './state';

/**
 * The tangent space of the Grassmannian Gr(Nf, 4) at a frame U, in the coordinates the Newton
 * descent uses: a complex (4 - Nf) x Nf block Z moves occupied vector i to
 * u_i + sum_a Z_ai u_(Nf+a), then the frame is re-orthonormalised (a second-order retraction is
 * not needed for Newton's quadratic convergence; Absil, Mahony and Sepulchre, Optimization
 * Algorithms on Matrix Manifolds, Princeton University Press (2008), chapter 4). Real
 * coordinates are ordered (Re Z_ai, Im Z_ai) with index 2 (a Nf + i).
 *
 * With M = U^dagger H_HF U and gamma^k_ai = u_a^dagger G_k u_i (derived here from the energy,
 * public/notes.html#energy):
 *   gradient  g = (2 Re M_ai, 2 Im M_ai),
 *   Hessian   K_kl = 2 Re[conj(alpha) beta (delta_ij M_ab - delta_ab M_ji)] + sum_k kappa_k w^k_k w^k_l,
 *   with w^k = (2 Re gamma^k_ai, 2 Im gamma^k_ai) and alpha, beta = 1 or i for the real or
 *   imaginary part of each coordinate.
 */

/**
 * Row r of G_k holds one entry g = +-1 or +-i, in column G_COL[4 k + r]; its product with
 * x = conj(u_a[r]) u_i[col] (stored re, im at 8 r + 2 col of a pair's outer products) has real
 * part RE_SIGN * (the entry at RE_AT) and imaginary part IM_SIGN * (the entry at IM_AT): for
 * real g, g Re x and g Im x; for g = i t, -t Im x and t Re x. Exactly the products
 * (g_re Re x - g_im Im x, g_re Im x + g_im Re x) with the zero term left out.
 */
const RE_AT = new Int32Array(4 * MATRIX_COUNT);
const IM_AT = new Int32Array(4 * MATRIX_COUNT);
const RE_SIGN = new Float64Array(4 * MATRIX_COUNT);
const IM_SIGN = new Float64Array(4 * MATRIX_COUNT);
for (let n = 0; n < 4 * MATRIX_COUNT; n++) {
  const at = 8 * (n & 3) + 2 * G_COL[n]!;
  const real = G_IM[n] === 0;
  RE_AT[n] = real ? at : at + 1;
  IM_AT[n] = real ? at + 1 : at;
  RE_SIGN[n] = real ? G_RE[n]! : -G_IM[n]!;
  IM_SIGN[n] = real ? G_RE[n]! : G_IM[n]!;
}

/** Scratch arrays for one descent; reuse one per thread to avoid allocation in hot loops. */
export class DescentWorkspace {
  readonly projector = new Float64Array(32);
  readonly order = new Float64Array(MATRIX_COUNT);
  readonly hamiltonian = new Float64Array(32);
  readonly hu = new Float64Array(32);
  readonly m = new Float64Array(32);
  readonly outer = new Float64Array(128);
  /** The vectors w^k of the channels with kappa_k != 0 (8 each) and those kappa_k. */
  readonly channelVectors = new Float64Array(8 * MATRIX_COUNT);
  readonly channelKappa = new Float64Array(MATRIX_COUNT);
  readonly gradient = new Float64Array(8);
  readonly hessian = new Float64Array(64);
  readonly step = new Float64Array(8);
  readonly rhs = new Float64Array(8);
  readonly chol = new Float64Array(64);
  readonly eigValues = new Float64Array(8);
  readonly eigVectors = new Float64Array(64);
  readonly eigScratch = new Float64Array(64);
  readonly trial = new Float64Array(32);
  readonly trialOrder = new Float64Array(MATRIX_COUNT);
  readonly scratch = new Float64Array(8);
}

/** Real dimension of Gr(nf, 4). */
export function tangentDimension(nf: number): number {
  return 2 * nf * (4 - nf);
}

/** Energy of a frame; fills ws.projector and the given order array. */
export function frameEnergy(
  c: Couplings,
  frame: Float64Array,
  ws: DescentWorkspace,
  order: Float64Array,
): number {
  projectorOf(frame, c.nf, ws.projector);
  orderOfProjector(ws.projector, order);
  return energyOfOrder(c, order);
}

/**
 * The gradient alone in tangent coordinates at `frame` (ws.gradient), given its order
 * parameters in ws.order: g = (2 Re M_ai, 2 Im M_ai) with M_ai = u_a^dagger H_HF u_i for empty a
 * and occupied i; about a quarter of the work of `tangentModel`. Returns the largest absolute
 * component.
 */
export function tangentGradient(c: Couplings, frame: Float64Array, ws: DescentWorkspace): number {
  const nf = c.nf;
  const { hamiltonian: h, hu, gradient: g } = ws;
  hartreeFockOfOrder(c, ws.order, h, false);
  multiplyFrame(h, frame, nf, hu);
  let largest = 0;
  for (let a = 0; a < 4 - nf; a++) {
    const oa = 8 * (nf + a);
    for (let i = 0; i < nf; i++) {
      let sr = 0;
      let si = 0;
      for (let r = 0; r < 8; r += 2) {
        const ur = frame[oa + r]!;
        const ui = frame[oa + r + 1]!;
        const vr = hu[8 * i + r]!;
        const vi = hu[8 * i + r + 1]!;
        sr += ur * vr + ui * vi;
        si += ur * vi - ui * vr;
      }
      const idx = 2 * (a * nf + i);
      g[idx] = 2 * sr;
      g[idx + 1] = 2 * si;
      largest = Math.max(largest, Math.abs(2 * sr), Math.abs(2 * si));
    }
  }
  return largest;
}

/**
 * Gradient and Hessian in tangent coordinates at `frame` (ws.gradient, ws.hessian), given its
 * order parameters in ws.order. Also leaves M = U^dagger H_HF U in ws.m, without the identity
 * part of H_HF.
 */
export function tangentModel(c: Couplings, frame: Float64Array, ws: DescentWorkspace): void {
  const nf = c.nf;
  const ne = 4 - nf;
  const d = 2 * nf * ne;
  const { hamiltonian: h, hu, m, gradient: g, hessian: k } = ws;
  // The identity part of H_HF drops out of the gradient and the Hessian; left out, it adds no
  // rounding noise to them (it can be several times the coupling scale).
  hartreeFockOfOrder(c, ws.order, h, false);
  multiplyFrame(h, frame, 4, hu);
  // m[2 (4 a + b)] = u_a^dagger H u_b
  for (let a = 0; a < 4; a++) {
    for (let b = 0; b < 4; b++) {
      let sr = 0;
      let si = 0;
      for (let r = 0; r < 8; r += 2) {
        const ur = frame[8 * a + r]!;
        const ui = frame[8 * a + r + 1]!;
        const vr = hu[8 * b + r]!;
        const vi = hu[8 * b + r + 1]!;
        sr += ur * vr + ui * vi;
        si += ur * vi - ui * vr;
      }
      m[2 * (4 * a + b)] = sr;
      m[2 * (4 * a + b) + 1] = si;
    }
  }
  for (let a = 0; a < ne; a++) {
    for (let i = 0; i < nf; i++) {
      const idx = 2 * (a * nf + i);
      const mi = 2 * (4 * (nf + a) + i);
      g[idx] = 2 * m[mi]!;
      g[idx + 1] = 2 * m[mi + 1]!;
    }
  }
  // Outer products conj(u_a[r]) u_i[c] for every (empty a, occupied i) pair: then
  // gamma^k_ai = sum_r g^k_r conj(u_a[r]) u_i[col^k_r] costs four products per channel.
  const outer = ws.outer;
  for (let a = 0; a < ne; a++) {
    const oa = 8 * (nf + a);
    for (let i = 0; i < nf; i++) {
      const base = 32 * (a * nf + i);
      for (let r = 0; r < 4; r++) {
        const ar = frame[oa + 2 * r]!;
        const ai = frame[oa + 2 * r + 1]!;
        for (let col = 0; col < 4; col++) {
          const br = frame[8 * i + 2 * col]!;
          const bi = frame[8 * i + 2 * col + 1]!;
          outer[base + 8 * r + 2 * col] = ar * br + ai * bi;
          outer[base + 8 * r + 2 * col + 1] = ar * bi - ai * br;
        }
      }
    }
  }
  const pairs = nf * ne;
  const vectors = ws.channelVectors;
  const kappas = ws.channelKappa;
  let channels = 0;
  for (let ch = 1; ch < MATRIX_COUNT; ch++) {
    const kappa = c.kappa[ch]!;
    if (kappa === 0) continue;
    const g = 4 * ch;
    const r0 = RE_AT[g]!;
    const r1 = RE_AT[g + 1]!;
    const r2 = RE_AT[g + 2]!;
    const r3 = RE_AT[g + 3]!;
    const i0 = IM_AT[g]!;
    const i1 = IM_AT[g + 1]!;
    const i2 = IM_AT[g + 2]!;
    const i3 = IM_AT[g + 3]!;
    const s0 = RE_SIGN[g]!;
    const s1 = RE_SIGN[g + 1]!;
    const s2 = RE_SIGN[g + 2]!;
    const s3 = RE_SIGN[g + 3]!;
    const t0 = IM_SIGN[g]!;
    const t1 = IM_SIGN[g + 1]!;
    const t2 = IM_SIGN[g + 2]!;
    const t3 = IM_SIGN[g + 3]!;
    for (let pair = 0; pair < pairs; pair++) {
      const base = 32 * pair;
      // Row by row, as sum_r g_r conj(u_a[r]) u_i[col_r] with g_r = +-1 or +-i.
      let sr = s0 * outer[base + r0]!;
      let si = t0 * outer[base + i0]!;
      sr += s1 * outer[base + r1]!;
      si += t1 * outer[base + i1]!;
      sr += s2 * outer[base + r2]!;
      si += t2 * outer[base + i2]!;
      sr += s3 * outer[base + r3]!;
      si += t3 * outer[base + i3]!;
      vectors[8 * channels + 2 * pair] = 2 * sr;
      vectors[8 * channels + 2 * pair + 1] = 2 * si;
    }
    kappas[channels++] = kappa;
  }
  // K_pq = sum_k kappa_k w^k_p w^k_q, a row at a time in registers (channels in the same
  // order for every entry). Entries past d (d = 6) are never stored; the lower triangle is
  // overwritten by the upper one below.
  for (let p = 0; p < d; p++) {
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    let s4 = 0;
    let s5 = 0;
    let s6 = 0;
    let s7 = 0;
    for (let t = 0; t < channels; t++) {
      const o = 8 * t;
      const wp = kappas[t]! * vectors[o + p]!;
      s0 += wp * vectors[o]!;
      s1 += wp * vectors[o + 1]!;
      s2 += wp * vectors[o + 2]!;
      s3 += wp * vectors[o + 3]!;
      s4 += wp * vectors[o + 4]!;
      s5 += wp * vectors[o + 5]!;
      s6 += wp * vectors[o + 6]!;
      s7 += wp * vectors[o + 7]!;
    }
    const row = p * d;
    k[row] = s0;
    k[row + 1] = s1;
    k[row + 2] = s2;
    k[row + 3] = s3;
    k[row + 4] = s4;
    k[row + 5] = s5;
    if (d === 8) {
      k[row + 6] = s6;
      k[row + 7] = s7;
    }
  }
  for (let a = 0; a < ne; a++) {
    for (let i = 0; i < nf; i++) {
      for (let b = 0; b < ne; b++) {
        for (let j = 0; j < nf; j++) {
          let xr = 0;
          let xi = 0;
          if (i === j) {
            xr += m[2 * (4 * (nf + a) + nf + b)]!;
            xi += m[2 * (4 * (nf + a) + nf + b) + 1]!;
          }
          if (a === b) {
            xr -= m[2 * (4 * j + i)]!;
            xi -= m[2 * (4 * j + i) + 1]!;
          }
          const p = 2 * (a * nf + i);
          const q = 2 * (b * nf + j);
          if (q >= p) {
            k[p * d + q] = k[p * d + q]! + 2 * xr;
            k[(p + 1) * d + q + 1] = k[(p + 1) * d + q + 1]! + 2 * xr;
            k[p * d + q + 1] = k[p * d + q + 1]! - 2 * xi;
            if (q > p) k[(p + 1) * d + q] = k[(p + 1) * d + q]! + 2 * xi;
          }
        }
      }
    }
  }
  for (let p = 0; p < d; p++) for (let q = 0; q < p; q++) k[p * d + q] = k[q * d + p]!;
}

/** Moves `frame` along tangent coordinates `z` into `out` (orthonormalised, completed). */
export function retract(
  nf: number,
  frame: Float64Array,
  z: Float64Array,
  out: Float64Array,
  scratch: Float64Array,
): void {
  out.set(frame);
  const ne = 4 - nf;
  for (let i = 0; i < nf; i++) {
    for (let a = 0; a < ne; a++) {
      const zr = z[2 * (a * nf + i)]!;
      const zi = z[2 * (a * nf + i) + 1]!;
      const oa = 8 * (nf + a);
      for (let r = 0; r < 8; r += 2) {
        const ur = frame[oa + r]!;
        const ui = frame[oa + r + 1]!;
        out[8 * i + r] = out[8 * i + r]! + zr * ur - zi * ui;
        out[8 * i + r + 1] = out[8 * i + r + 1]! + zr * ui + zi * ur;
      }
    }
  }
  orthonormaliseFrame(out, nf);
  completeFrame(out, nf, scratch);
}
