import type { Couplings } from './couplings';
import { symmetricEigen } from './linalg';
import { DescentWorkspace, frameEnergy, tangentDimension, tangentModel } from './tangentSpace';

/** q = 0 collective modes of a stationary state (public/notes.html#modes). */
export interface CollectiveModes {
  /** One frequency omega >= 0 per conjugate pair, ascending (energy units, hbar = 1). */
  readonly frequencies: number[];
  /** Pairs with omega below 1e-6 times the coupling scale. */
  readonly goldstone: number;
  /** Eigenvalues of the energy Hessian K in tangent coordinates, ascending. */
  readonly hessianEigenvalues: number[];
}

export const GOLDSTONE_TOLERANCE = 1e-6;

/** Hessian eigenvalues below this times the coupling scale are treated as exact zeros. */
export const HESSIAN_ZERO = 1e-11;

/**
 * Linearised time-dependent Hartree-Fock about `frame`: the tangent dynamics is
 * dq/dt = (1/2) J K q, with K the energy Hessian and J the symplectic form (derived here from
 * i dP/dt = [H_HF, P]; in the coordinates of localMinimise.ts, i dZ/dt = dE/d(conj Z), so
 * J = [[0, 1], [-1, 0]] on each (Re Z_ai, Im Z_ai)). Frequencies come from the antisymmetric,
 * well-conditioned A = (1/2) K^(1/2) J K^(1/2), whose eigenvalues are +-i omega.
 */
export function collectiveModes(c: Couplings, frame: Float64Array): CollectiveModes {
  const ws = new DescentWorkspace();
  const d = tangentDimension(c.nf);
  frameEnergy(c, frame, ws, ws.order);
  tangentModel(c, frame, ws);
  const k = Float64Array.from(ws.hessian.subarray(0, d * d));
  const values = new Float64Array(d);
  const vectors = new Float64Array(d * d);
  symmetricEigen(k, d, values, vectors);
  const hessianEigenvalues = Array.from(values);
  // K^(1/2) = Q sqrt(max(Lambda, 0)) Q^T
  const root = new Float64Array(d * d);
  // Hessian eigenvalues within rounding of zero are zero: a square root would otherwise turn
  // a 1e-16 residue into a spurious 1e-8 Goldstone frequency.
  const zero = HESSIAN_ZERO * c.scale;
  for (let m = 0; m < d; m++) {
    const s = values[m]! > zero ? Math.sqrt(values[m]!) : 0;
    if (s === 0) continue;
    for (let p = 0; p < d; p++) {
      const vp = vectors[p * d + m]! * s;
      for (let q = 0; q < d; q++) root[p * d + q] = root[p * d + q]! + vp * vectors[q * d + m]!;
    }
  }
  // J K^(1/2): rows (2n, 2n+1) of J K^(1/2) are (row 2n+1, -row 2n) of K^(1/2).
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
  // A is real antisymmetric, so iA is Hermitian with eigenvalues +-omega. Its real symmetric
  // embedding [[0, -A], [A, 0]] has each of them twice; diagonalising it (rather than A^T A)
  // keeps zero frequencies at rounding level instead of its square root.
  const n = 2 * d;
  const embedding = new Float64Array(n * n);
  for (let p = 0; p < d; p++) {
    for (let q = 0; q < d; q++) {
      embedding[p * n + (q + d)] = -a[p * d + q]!;
      embedding[(p + d) * n + q] = a[p * d + q]!;
    }
  }
  const spectrum = new Float64Array(n);
  symmetricEigen(embedding, n, spectrum, new Float64Array(n * n));
  // The upper half holds each omega >= 0 twice (once per copy), ascending.
  const frequencies: number[] = [];
  for (let m = d; m < n; m += 2) {
    frequencies.push(Math.max(0, (spectrum[m]! + spectrum[m + 1]!) / 2));
  }
  const threshold = GOLDSTONE_TOLERANCE * c.scale;
  const goldstone = frequencies.filter((w) => w < threshold).length;
  return { frequencies, goldstone, hessianEigenvalues };
}
