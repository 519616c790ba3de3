import type { Couplings } from './couplings';
import {
  DEGENERACY_TOLERANCE,
  representative,
  sameRepresentative,
  sameState,
  selectRepresentative,
  type Selection,
} from './degeneracy';
import { modelSymmetry } from './symmetry';
import {
  DEFAULT_MINIMISE,
  minimiseEnergy,
  type LocalMinimum,
  type MinimiseOptions,
  type SearchPlan,
} from './minimise';

/** The global minimum of one point, with the degenerate family's representative chosen. */
export interface GroundSearch {
  readonly frame: Float64Array;
  readonly energy: number;
  /** Every completed local descent of the search, in search order. */
  readonly minima: readonly LocalMinimum[];
  readonly selection: Selection;
}

/**
 * The global search of one point (`minimiseEnergy`), then the choice of one member where the
 * ground state is degenerate (`selectRepresentative`): what `solve`, the Map's full searches
 * and the Cut's searched samples all use, so that they agree state for state.
 */
export function searchGroundState(
  c: Couplings,
  options: MinimiseOptions = DEFAULT_MINIMISE,
  plan: SearchPlan = {},
): GroundSearch {
  const search = minimiseEnergy(c, options, plan);
  const tolerance = DEGENERACY_TOLERANCE * c.scale;
  const symmetry = modelSymmetry(c);
  const others: Float64Array[] = [];
  for (const m of search.minima) {
    if (!m.converged || m.energy > search.energy + tolerance) continue;
    if (sameState(m.frame, search.frame, c.nf, 1e-5)) continue;
    if (others.some((o) => sameState(o, m.frame, c.nf, 1e-5))) continue;
    // Another point of the state's orbit, or a mirror image of it: `representative` below
    // picks among those without a search under the probes.
    if (sameState(m.frame, search.frame, c.nf, 1e-5, symmetry)) continue;
    if (sameRepresentative(c, m.frame, search.frame, 1e-5, symmetry)) continue;
    others.push(m.frame);
  }
  const selection = selectRepresentative(c, search.frame, search.energy, others);
  // A mirror image of the member (another isolated minimum at the same energy, which the search
  // may not have visited): the one the vanishing fields select.
  const frame = Float64Array.from(selection.frame);
  representative(c, frame, symmetry);
  return { frame, energy: search.energy, minima: search.minima, selection };
}
