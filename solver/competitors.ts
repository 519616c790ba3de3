import type { Couplings } from './couplings';
import { DEFAULT_DESCENT, descend } from './localMinimise';
import { groupMagnitudes } from './orderParameters';
import { seedLibrary } from './seeds';
import { symmetricEigen } from './linalg';
import { DescentWorkspace, frameEnergy, tangentDimension, tangentModel } from './tangentSpace';

/** A stationary point of the energy met from the seed library. */
export interface StationaryState {
  readonly frame: Float64Array;
  readonly energy: number;
  /** Negative Hessian eigenvalues (Morse index): 0 for a local minimum. */
  readonly unstable: number;
}

/**
 * Every local minimum reached from the whole seed library (structured states of each symmetry
 * family, canted states and Haar-random frames; seeds.ts), each descent run to convergence
 * without the early abandoning of the ground-state search: the runners-up a Probe lists. About
 * a hundred descents; too slow for every Map pixel, quick for one point. Only converged runs
 * (gradient at tolerance, Hessian positive semidefinite) are kept; duplicates are left to the
 * caller.
 */
export function localMinima(c: Couplings): { frame: Float64Array; energy: number }[] {
  const ws = new DescentWorkspace();
  const options = { ...DEFAULT_DESCENT, gradientTolerance: 1e-10 };
  const found: { frame: Float64Array; energy: number }[] = [];
  for (const seed of seedLibrary(c.nf)) {
    const frame = Float64Array.from(seed.frame);
    const result = descend(c, frame, options, ws);
    if (result.converged) found.push({ frame, energy: result.energy });
  }
  return found;
}

/**
 * The saddle points reached from the exact symmetric states of the seed library (F, CDW, KD, AF
 * and the other stabiliser states, and canted ones), with Newton's method kept at the critical
 * point instead of escaping it: where a state family is not a local minimum, its saddle still
 * tells how far above the ground state that family lies. Minima are left to `localMinima`.
 */
export function saddlePoints(c: Couplings): StationaryState[] {
  const ws = new DescentWorkspace();
  // A symmetric seed is a critical point already, or close to one: a few Newton steps settle it;
  // one that needs many is heading elsewhere and is dropped.
  const options = {
    ...DEFAULT_DESCENT,
    escapeSaddles: false,
    gradientTolerance: 1e-10,
    maxIterations: 30,
  };
  const found: StationaryState[] = [];
  const seen = new Set<string>();
  for (const seed of seedLibrary(c.nf)) {
    if (seed.exact === undefined) continue;
    const frame = Float64Array.from(seed.exact);
    const result = descend(c, frame, options, ws);
    if (result.converged || result.gradient > 1e-9 * c.scale) continue;
    // Symmetric states of one family land on the same saddle (equal energy and order-parameter
    // group sizes): one of them is enough.
    const groups = groupMagnitudes(ws.order);
    const key = [result.energy / c.scale, ...groups].map((x) => Math.round(x * 1e6)).join(',');
    if (seen.has(key)) continue;
    seen.add(key);
    const unstable = morseIndex(c, frame, ws);
    if (unstable === 0) continue;
    found.push({ frame, energy: result.energy, unstable });
  }
  return found;
}

/** Negative eigenvalues of the energy Hessian at a stationary frame (below -1e-9 x scale). */
function morseIndex(c: Couplings, frame: Float64Array, ws: DescentWorkspace): number {
  const d = tangentDimension(c.nf);
  frameEnergy(c, frame, ws, ws.order);
  tangentModel(c, frame, ws);
  const values = new Float64Array(d);
  symmetricEigen(
    Float64Array.from(ws.hessian.subarray(0, d * d)),
    d,
    values,
    new Float64Array(d * d),
  );
  return values.filter((h) => h < -1e-9 * c.scale).length;
}
