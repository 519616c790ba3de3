import type { Couplings } from './couplings';
import { DEFAULT_DESCENT, descend } from './localMinimise';
import { seedLibrary } from './seeds';
import { DescentWorkspace } from './tangentSpace';

/**
 * Every local minimum reached from the whole seed library (structured states of each symmetry
 * family, canted states and Haar-random frames; seeds.ts), each descent run to convergence
 * without the early abandoning of the ground-state search: the runners-up a Probe lists. About
 * a hundred descents; too slow for every Map pixel, quick for one point. Only converged runs
 * (gradient at tolerance, Hessian positive semidefinite) are kept; duplicates are left to the
 * caller (describeState merges minima of equal energy and order-parameter groups).
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
