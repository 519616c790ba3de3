import { energyOfOrder, type Couplings } from './couplings';
import { DEFAULT_DESCENT, DescentWorkspace, descend, type DescentResult } from './localMinimise';
import { seededRandom } from './random';
import { randomFrame, seedLibrary, type Seed } from './seeds';

/**
 * Global minimisation over Gr(Nf, 4): rank every library seed (and any warm starts) by its
 * energy, which costs one dot product per seed; then descend from the most promising ones and,
 * for safety, from a few seeded random frames, abandoning runs that clearly end above the best.
 */
export interface MinimiseOptions {
  /** Library seeds descended from, lowest energy first. */
  readonly rankedStarts: number;
  /** Extra Haar-random starts from the seeded stream. */
  readonly randomStarts: number;
  /** Seed of the random stream (results are deterministic for a given seed). */
  readonly seed: number;
}

export const DEFAULT_MINIMISE: MinimiseOptions = { rankedStarts: 4, randomStarts: 1, seed: 1 };

/** A local minimum met during the search. */
export interface LocalMinimum {
  readonly frame: Float64Array;
  readonly energy: number;
  readonly converged: boolean;
}

export interface MinimiseResult {
  /** Best frame found, occupied vectors first. */
  readonly frame: Float64Array;
  readonly energy: number;
  readonly converged: boolean;
  /** Every completed local descent (the ground state among them), in search order. */
  readonly minima: readonly LocalMinimum[];
  readonly descents: number;
}

/**
 * A cold-search descent is dropped once it cannot beat the best energy so far by more than this
 * (relative to the coupling scale): it heads for the same minimum or a higher one. Warm starts
 * are never dropped, so map bisection compares both branches exactly.
 */
export const ABANDON_MARGIN = 1e-8;

const workspaces: DescentWorkspace[] = [];
function workspace(): DescentWorkspace {
  let ws = workspaces[0];
  if (ws === undefined) {
    ws = new DescentWorkspace();
    workspaces.push(ws);
  }
  return ws;
}

const seedEnergies = new Float64Array(512);

/** Indices of the `count` library seeds of lowest energy, lowest first (ties by index). */
function lowestSeeds(c: Couplings, library: readonly Seed[], count: number): number[] {
  const n = library.length;
  for (let i = 0; i < n; i++) seedEnergies[i] = energyOfOrder(c, library[i]!.order);
  const chosen: number[] = [];
  for (let pick = 0; pick < Math.min(count, n); pick++) {
    let best = -1;
    for (let i = 0; i < n; i++) {
      if (chosen.includes(i)) continue;
      if (best < 0 || seedEnergies[i]! < seedEnergies[best]!) best = i;
    }
    chosen.push(best);
  }
  return chosen;
}

/** How to search: warm starts, cold library search, early abandonment, saddle escapes. */
export interface SearchPlan {
  /** Frames to descend from first (for example a neighbour's state on a map). */
  readonly warmStarts?: readonly Float64Array[];
  /** Also descend from the ranked library seeds and random frames (default true). */
  readonly coldSearch?: boolean;
  /** Let warm starts after the first stop once they cannot beat the best (default false). */
  readonly abandonWarm?: boolean;
  /** Leave saddle points along negative curvature (default true). */
  readonly escapeSaddles?: boolean;
  /** Newton steps after the gradient tolerance is met (default 1). */
  readonly polishSteps?: number;
}

/**
 * Finds the ground state: the lowest converged local minimum among all descents (a descent
 * stopped at a saddle only counts when no descent reached a minimum).
 */
export function minimiseEnergy(
  c: Couplings,
  options: MinimiseOptions = DEFAULT_MINIMISE,
  plan: SearchPlan = {},
): MinimiseResult {
  const ws = workspace();
  const minima: LocalMinimum[] = [];
  let best: LocalMinimum | undefined;
  let descents = 0;
  const descent = {
    ...DEFAULT_DESCENT,
    escapeSaddles: plan.escapeSaddles ?? true,
    polishSteps: plan.polishSteps ?? DEFAULT_DESCENT.polishSteps,
  };
  const better = (a: LocalMinimum, b: LocalMinimum | undefined): boolean =>
    b === undefined ||
    (a.converged && !b.converged) ||
    (a.converged === b.converged && a.energy < b.energy);
  const run = (start: Float64Array, abandon: boolean): DescentResult => {
    const frame = Float64Array.from(start);
    descent.abandonAbove =
      abandon && best?.converged ? best.energy - ABANDON_MARGIN * c.scale : Infinity;
    const result = descend(c, frame, descent, ws);
    descents++;
    if (!result.abandoned) {
      const found = { frame, energy: result.energy, converged: result.converged };
      minima.push(found);
      if (better(found, best)) best = found;
    }
    return result;
  };
  (plan.warmStarts ?? []).forEach((start, i) => run(start, i > 0 && (plan.abandonWarm ?? false)));
  if (plan.coldSearch ?? true) {
    const library = seedLibrary(c.nf);
    for (const index of lowestSeeds(c, library, options.rankedStarts)) {
      run(library[index]!.frame, true);
    }
    const random = seededRandom(options.seed);
    for (let i = 0; i < options.randomStarts; i++) run(randomFrame(random), true);
  }
  if (best === undefined) throw new Error('minimiseEnergy: no start given');
  return { frame: best.frame, energy: best.energy, converged: best.converged, minima, descents };
}
