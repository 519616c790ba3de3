import type { Couplings } from './couplings';
import { symmetricEigen } from './linalg';
import { DescentWorkspace, frameEnergy, tangentDimension, tangentModel } from './localMinimise';

/** q = 0 collective modes of a stationary state (model.md section 8). */
export interface CollectiveModes {
  /** One frequency omega >= 0 per conjugate pair, ascending (energy units, hbar = 1). */
  readonly frequencies: number[];
  /** Pairs with omega below 1e-6 times the coupling scale. */
  readonly goldstone: number;
  /** Eigenvalues of the energy Hessian K in tangent coordinates, ascending. */
  readonly hessianEigenvalues: number[];
}

export const GOLDSTONE_TOLERANCE = 1e-6;

/**
 * Linearised time-dependent Hartree-Fock about `frame`: the tangent dynamics is
 * dq/dt = (1/2) J K q, with K the energy Hessian and J the symplectic form (derived here from
 * i dP/dt = [H_HF, P]; in the coordinates of localMinimise.ts, i dZ/dt = dE/d(conj Z), so
 * J = [[0, 1], [-1, 0]] on each (Re Z_ai, Im Z_ai)). Frequencies come from the antisymmetric,
 * well-conditioned A = (1/2) K^(1/2) J K^(1/2): the eigenvalues of A^T A are omega^2, each twice.
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
  for (let m = 0; m < d; m++) {
    const s = Math.sqrt(Math.max(values[m]!, 0));
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
  const ata = new Float64Array(d * d);
  for (let p = 0; p < d; p++) {
    for (let q = 0; q < d; q++) {
      let sum = 0;
      for (let m = 0; m < d; m++) sum += a[m * d + p]! * a[m * d + q]!;
      ata[p * d + q] = sum;
    }
  }
  const squares = new Float64Array(d);
  symmetricEigen(ata, d, squares, vectors);
  const frequencies: number[] = [];
  for (let m = 0; m < d; m += 2) {
    const w1 = Math.sqrt(Math.max(squares[m]!, 0));
    const w2 = Math.sqrt(Math.max(squares[m + 1]!, 0));
    frequencies.push((w1 + w2) / 2);
  }
  const threshold = GOLDSTONE_TOLERANCE * c.scale;
  const goldstone = frequencies.filter((w) => w < threshold).length;
  return { frequencies, goldstone, hessianEigenvalues };
}
