import type { Couplings } from './couplings';
import { symmetricEigen } from './linalg';
import { stableForm } from './symplecticModes';
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
  // Hessian eigenvalues within rounding of zero are zero (symplecticModes.ts, stableForm).
  const { spectrum } = stableForm(values, vectors, d, HESSIAN_ZERO * c.scale);
  const n = 2 * d;
  const frequencies: number[] = [];
  for (let m = d; m < n; m += 2) {
    frequencies.push(Math.max(0, (spectrum[m]! + spectrum[m + 1]!) / 2));
  }
  const threshold = GOLDSTONE_TOLERANCE * c.scale;
  const goldstone = frequencies.filter((w) => w < threshold).length;
  return { frequencies, goldstone, hessianEigenvalues };
}
