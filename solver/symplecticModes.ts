import { symmetricEigen } from './linalg';
import { eigenvaluesOfReal } from './realEigenvalues';

/**
 * The normal modes of the linearised dynamics dx/dt = (1/2) J K x in real tangent coordinates
 * (K symmetric, the curvature of the energy; J = [[0, 1], [-1, 0]] on each (Re, Im) pair), as
 * public/notes.html#modes and #dispersion describe. Eigenvalues of (1/2) J K are -i omega; they
 * come in pairs +-omega, and one omega per pair is reported.
 */
export interface SymplecticModes {
  /** Re omega >= 0, one per pair, ascending. */
  readonly frequencies: number[];
  /** |Im omega| of the same modes: 0 for an oscillation, the growth rate of an instability. */
  readonly growth: number[];
  /**
   * Per mode, two real tangent vectors (d numbers each, concatenated) spanning its motion; null
   * where K is not positive semidefinite (no symmetric form to take them from).
   */
  readonly planes: (Float64Array | null)[];
  /** K positive semidefinite (within `zero`): no modulation lowers the energy. */
  readonly stable: boolean;
}

/**
 * Modes of K (d x d, row-major). Eigenvalues of K within `zero` of 0 count as 0. When K is
 * positive semidefinite, omega comes from the antisymmetric, well-conditioned
 * A = (1/2) K^(1/2) J K^(1/2) (eigenvalues +-i omega) through the real symmetric embedding
 * [[0, -A], [A, 0]], exactly as collectiveModes.ts does at q = 0, so that zero frequencies stay
 * at rounding level; the motion of a mode with eigenvector y = u + iv of iA is
 * x ~ J K^(1/2) y. Otherwise the eigenvalues of (1/2) J K are computed directly (realEigenvalues.ts):
 * complex omega are reported as they are, an instability as a growth rate.
 */
export function symplecticModes(k: Float64Array, d: number, zero: number): SymplecticModes {
  const values = new Float64Array(d);
  const vectors = new Float64Array(d * d);
  symmetricEigen(Float64Array.from(k.subarray(0, d * d)), d, values, vectors);
  if (values[0]! < -zero) return unstableModes(k, d);
  const { jr, spectrum, modes } = stableForm(values, vectors, d, zero);
  const n = 2 * d;
  const frequencies: number[] = [];
  const planes: Float64Array[] = [];
  for (let m = d; m < n; m += 2) {
    frequencies.push(Math.max(0, (spectrum[m]! + spectrum[m + 1]!) / 2));
    // Column m is (u; v) with y = u + iv an eigenvector of iA; the motion is J K^(1/2) y, or y
    // itself for a zero mode (K^(1/2) y = 0 there).
    const plane = new Float64Array(2 * d);
    for (let p = 0; p < d; p++) {
      plane[p] = modes[p * n + m]!;
      plane[d + p] = modes[(p + d) * n + m]!;
    }
    planes.push(frequencies[frequencies.length - 1]! > zero ? moved(jr, plane, d) : plane);
  }
  return { frequencies, growth: frequencies.map(() => 0), planes, stable: true };
}

/**
 * The stable form of the modes of K from its eigenvalues `values` and eigenvectors `vectors`
 * (columns, as symmetricEigen returns them): K^(1/2) = Q sqrt(max(Lambda, 0)) Q^T with
 * eigenvalues within `zero` of 0 taken as 0 (a square root would otherwise turn a 1e-16 residue
 * into a spurious 1e-8 frequency), jr = J K^(1/2), A = (1/2) K^(1/2) J K^(1/2), and the
 * spectrum and eigenvectors of the real symmetric embedding [[0, -A], [A, 0]] of iA. A is real
 * antisymmetric, so iA is Hermitian with eigenvalues +-omega; the embedding has each of them
 * twice, and diagonalising it (rather than A^T A) keeps zero frequencies at rounding level
 * instead of its square root. The upper half of `spectrum` (indices d to 2d - 1) holds each
 * omega >= 0 twice, ascending. Shared with collectiveModes.ts (q = 0).
 */
export function stableForm(
  values: Float64Array,
  vectors: Float64Array,
  d: number,
  zero: number,
): { jr: Float64Array; spectrum: Float64Array; modes: Float64Array } {
  const root = new Float64Array(d * d);
  for (let m = 0; m < d; m++) {
    const s = values[m]! > zero ? Math.sqrt(values[m]!) : 0;
    if (s === 0) continue;
    for (let p = 0; p < d; p++) {
      const vp = vectors[p * d + m]! * s;
      for (let q = 0; q < d; q++) root[p * d + q] = root[p * d + q]! + vp * vectors[q * d + m]!;
    }
  }
  // Rows (2n, 2n+1) of J K^(1/2) are (row 2n+1, -row 2n) of K^(1/2).
  const jr = new Float64Array(d * d);
  for (let n = 0; n < d; n += 2) {
    for (let q = 0; q < d; q++) {
      jr[n * d + q] = root[(n + 1) * d + q]!;
      jr[(n + 1) * d + q] = -root[n * d + q]!;
    }
  }
  const a = new Float64Array(d * d);
  for (let p = 0; p < d; p++) {
    for (let q = 0; q < d; q++) {
      let sum = 0;
      for (let m = 0; m < d; m++) sum += root[p * d + m]! * jr[m * d + q]!;
      a[p * d + q] = 0.5 * sum;
    }
  }
  const n = 2 * d;
  const embedding = new Float64Array(n * n);
  for (let p = 0; p < d; p++) {
    for (let q = 0; q < d; q++) {
      embedding[p * n + (q + d)] = -a[p * d + q]!;
      embedding[(p + d) * n + q] = a[p * d + q]!;
    }
  }
  const spectrum = new Float64Array(n);
  const modes = new Float64Array(n * n);
  symmetricEigen(embedding, n, spectrum, modes);
  return { jr, spectrum, modes };
}

/** (J K^(1/2) u, J K^(1/2) v) for the plane (u, v), given jr = J K^(1/2). */
function moved(jr: Float64Array, plane: Float64Array, d: number): Float64Array {
  const out = new Float64Array(2 * d);
  for (let half = 0; half < 2; half++) {
    for (let p = 0; p < d; p++) {
      let s = 0;
      for (let q = 0; q < d; q++) s += jr[p * d + q]! * plane[half * d + q]!;
      out[half * d + p] = s;
    }
  }
  return out;
}

/**
 * Modes of an indefinite K from the eigenvalues lambda of (1/2) J K, omega = i lambda: those
 * with Re omega > 0 first, then, among the ones on the imaginary axis, those that grow, one per
 * pair. A Goldstone pair is a defective eigenvalue there, found only to about the square root of
 * rounding (1e-8 of the scale).
 */
function unstableModes(k: Float64Array, d: number): SymplecticModes {
  const jk = new Float64Array(d * d);
  for (let p = 0; p < d; p += 2) {
    for (let q = 0; q < d; q++) {
      jk[p * d + q] = 0.5 * k[(p + 1) * d + q]!;
      jk[(p + 1) * d + q] = -0.5 * k[p * d + q]!;
    }
  }
  const { re, im } = eigenvaluesOfReal(jk, d);
  let largest = 0;
  for (let m = 0; m < d; m++) largest = Math.max(largest, Math.hypot(re[m]!, im[m]!));
  const tol = 1e-7 * Math.max(largest, 1e-300);
  // omega = i lambda = -Im(lambda) + i Re(lambda)
  const omegas = re.map((r, m) => ({ real: -im[m]!, imag: r }));
  const oscillating = omegas.filter((w) => w.real > tol).slice(0, d / 2);
  const axis = omegas
    .filter((w) => Math.abs(w.real) <= tol)
    .sort((x, y) => y.imag - x.imag)
    .slice(0, d / 2 - oscillating.length);
  const chosen = [...axis.map((w) => ({ real: 0, imag: w.imag })), ...oscillating]
    .map((w) => ({ frequency: w.real, growth: Math.abs(w.imag) <= tol ? 0 : Math.abs(w.imag) }))
    .sort((x, y) => x.frequency - y.frequency || y.growth - x.growth);
  return {
    frequencies: chosen.map((w) => w.frequency),
    growth: chosen.map((w) => w.growth),
    planes: chosen.map(() => null),
    stable: false,
  };
}
