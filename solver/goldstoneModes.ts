import { CHANNELS, G_COL, G_IM, G_RE, type Channel } from './channels';
import type { Couplings } from './couplings';

/** A continuous symmetry that the state breaks, and the gapless q = 0 mode it gives. */
export interface GaplessMode {
  /** Channels G_ab whose rotations exp(i theta G_ab) are symmetries broken by the state. */
  readonly generators: readonly Channel[];
  /**
   * 'single': one broken generator, one zero-frequency pair (its conjugate direction is not a
   * symmetry). 'paired': two broken generators whose orbit directions are canonically conjugate
   * share one zero-frequency pair (a ferromagnet at E_Z = 0 is the textbook case).
   */
  readonly kind: 'single' | 'paired';
}

/** Which of the 15 rotations exp(i theta G_ab) leave the energy invariant, and which the state breaks. */
export interface BrokenSymmetries {
  /** Generators that are symmetries of the model (channel names). */
  readonly symmetries: readonly Channel[];
  /** Of those, the ones whose orbit through the state has a non-zero tangent. */
  readonly broken: readonly Channel[];
  /** The gapless modes the broken generators account for. */
  readonly modes: readonly GaplessMode[];
}

/** Index 0..3 of the Pauli product sigma_i sigma_j (up to a phase), and whether they anticommute. */
function pauliProduct(i: number, j: number): { index: number; anticommute: boolean } {
  if (i === 0) return { index: j, anticommute: false };
  if (j === 0) return { index: i, anticommute: false };
  if (i === j) return { index: 0, anticommute: false };
  return { index: 6 - i - j, anticommute: true };
}

/**
 * Pairs (o_k, o_m) that exp(i theta G_g) turns into each other, per generator g: G_k
 * anticommutes with G_g and G_m ~ G_g G_k (each pair listed once per k). Built once.
 */
const ROTATED_PAIRS: readonly Int32Array[] = Array.from({ length: 16 }, (_, g) => {
  const out: number[] = [];
  if (g === 0) return Int32Array.from(out);
  for (let k = 1; k < 16; k++) {
    const a = pauliProduct(g >> 2, k >> 2);
    const b = pauliProduct(g & 3, k & 3);
    if (a.anticommute === b.anticommute) continue;
    out.push(k, 4 * a.index + b.index);
  }
  return Int32Array.from(out);
});

/**
 * Whether exp(i theta G_g) is a symmetry of the energy. In the diagonal form
 * E = c0 + eta.o + 1/2 sum kappa_k o_k^2 (couplings.ts), the rotation turns each pair
 * (o_k, o_m) with G_k anticommuting with G_g and G_m ~ G_g G_k, and leaves the other o_k alone;
 * so it is a symmetry when kappa_k = kappa_m and eta_k = eta_m = 0 for every such pair (derived
 * here from the energy of public/notes.html#energy).
 */
export function isSymmetry(c: Couplings, g: number): boolean {
  const tol = 1e-12 * c.scale;
  const pairs = ROTATED_PAIRS[g]!;
  for (let n = 0; n < pairs.length; n += 2) {
    const k = pairs[n]!;
    const m = pairs[n + 1]!;
    if (Math.abs(c.kappa[k]! - c.kappa[m]!) > tol) return false;
    if (Math.abs(c.eta[k]!) > tol || Math.abs(c.eta[m]!) > tol) return false;
  }
  return true;
}

/**
 * Tangent of the orbit exp(i theta G_g) U at theta = 0, in the coordinates of tangentSpace.ts:
 * Z_ai = u_a^dagger (i G_g) u_i for empty a and occupied i, real coordinates (Re, Im) at
 * 2 (a Nf + i). `frame` holds all four orthonormal vectors (occupied first).
 */
export function orbitTangent(
  frame: Float64Array,
  nf: number,
  g: number,
  t: Float64Array = new Float64Array(2 * nf * (4 - nf)),
): Float64Array {
  const ne = 4 - nf;
  for (let a = 0; a < ne; a++) {
    for (let i = 0; i < nf; i++) {
      let re = 0;
      let im = 0;
      for (let r = 0; r < 4; r++) {
        // (G u_i)_r = G[r][col] u_i[col]
        const col = G_COL[4 * g + r]!;
        const gr = G_RE[4 * g + r]!;
        const gi = G_IM[4 * g + r]!;
        const ur = frame[8 * i + 2 * col]!;
        const ui = frame[8 * i + 2 * col + 1]!;
        const vr = gr * ur - gi * ui;
        const vi = gr * ui + gi * ur;
        // conj(u_a[r]) * i * v
        const ar = frame[8 * (nf + a) + 2 * r]!;
        const ai = frame[8 * (nf + a) + 2 * r + 1]!;
        const pr = ar * vr + ai * vi;
        const pi = ar * vi - ai * vr;
        re += -pi;
        im += pr;
      }
      t[2 * (a * nf + i)] = re;
      t[2 * (a * nf + i) + 1] = im;
    }
  }
  return t;
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let k = 0; k < a.length; k++) s += a[k]! * b[k]!;
  return s;
}

/**
 * a^T J b with J = [[0, 1], [-1, 0]] on each (Re, Im) pair (the symplectic form of
 * public/notes.html#modes).
 */
function symplectic(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let k = 0; k < a.length; k += 2) s += a[k]! * b[k + 1]! - a[k + 1]! * b[k]!;
  return s;
}

/** Order in which generators are tried: spin about the field, valley about tau_z, then the rest. */
const PREFERENCE: readonly number[] = [
  3,
  12,
  ...Array.from({ length: 15 }, (_, k) => k + 1),
].filter((g, n, all) => all.indexOf(g) === n);

/**
 * The model's symmetries among the 15 rotations exp(i theta G_ab), the ones the state breaks, and
 * the gapless modes they account for. Broken generators are taken in a fixed order (spin about
 * the field, valley about tau_z, then channel order); one whose orbit direction lies in the span
 * of earlier ones adds no mode, one canonically conjugate to an earlier single mode joins it
 * (one zero-frequency pair for two generators, public/notes.html#modes), any other starts a new
 * mode. Only the 15 basis generators are tried: a symmetry generated by a combination of them alone
 * would go unnamed (the caller compares the count with the Goldstone count).
 */
export function brokenSymmetries(c: Couplings, frame: Float64Array): BrokenSymmetries {
  const nf = c.nf;
  const symmetries: Channel[] = [];
  const broken: Channel[] = [];
  const basis: Float64Array[] = [];
  const modes: { generators: Channel[]; tangent: Float64Array; kind: 'single' | 'paired' }[] = [];
  const tol = 1e-6;
  for (const g of PREFERENCE) {
    if (!isSymmetry(c, g)) continue;
    const name = CHANNELS[g - 1]!;
    symmetries.push(name);
    const t = orbitTangent(frame, nf, g);
    const norm = Math.sqrt(dot(t, t));
    if (norm <= tol) continue;
    broken.push(name);
    const unit = t.map((x) => x / norm);
    const residual = Float64Array.from(unit);
    for (const b of basis) {
      const p = dot(residual, b);
      for (let k = 0; k < residual.length; k++) residual[k] = residual[k]! - p * b[k]!;
    }
    const rest = Math.sqrt(dot(residual, residual));
    if (rest <= tol) {
      // In the span of earlier generators: same modes (e.g. a rotation that equals a
      // combination of others on this state).
      continue;
    }
    basis.push(residual.map((x) => x / rest));
    const partner = modes.find(
      (m) => m.kind === 'single' && Math.abs(symplectic(unit, m.tangent)) > 1e-3,
    );
    if (partner) {
      partner.generators.push(name);
      partner.kind = 'paired';
    } else {
      modes.push({ generators: [name], tangent: unit, kind: 'single' });
    }
  }
  return {
    symmetries,
    broken,
    modes: modes.map(({ generators, kind }) => ({ generators, kind })),
  };
}
