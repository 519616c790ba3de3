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
  /** Ranked seeds closer than this (max norm of o) to a chosen one are skipped. */
  readonly seedSpread?: number;
}

export const DEFAULT_MINIMISE: MinimiseOptions = {
  rankedStarts: 4,
  randomStarts: 1,
  seed: 1,
  seedSpread: 0,
};

/** A local minimum met during the search. */
export interface LocalMinimum {
  readonly frame: Float64Array;
  /** Its order parameters o_k, k = 0..15. */
  readonly order: Float64Array;
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

/**
 * Gradient tolerance of the search descents (relative to the coupling scale). The winner is
 * polished further by whoever reports it (`describeState` to 1e-12 plus a Newton step).
 */
export const SEARCH_TOLERANCE = 1e-10;

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

/**
 * Indices of `count` library seeds, lowest energy first, skipping seeds whose order parameters
 * lie within `spread` (max norm) of one already chosen: nearby seeds tend to share a basin, so
 * this spends the descents on different basins. Ties go to the lower index.
 */
function lowestSeeds(
  c: Couplings,
  library: readonly Seed[],
  count: number,
  spread: number,
): number[] {
  const n = library.length;
  for (let i = 0; i < n; i++) seedEnergies[i] = energyOfOrder(c, library[i]!.order);
  const chosen: number[] = [];
  const near = (i: number, j: number): boolean => {
    const a = library[i]!.order;
    const b = library[j]!.order;
    for (let k = 1; k < 16; k++) if (Math.abs(a[k]! - b[k]!) > spread) return false;
    return true;
  };
  for (let pick = 0; pick < Math.min(count, n); pick++) {
    let best = -1;
    for (let i = 0; i < n; i++) {
      if (chosen.includes(i) || chosen.some((j) => near(i, j))) continue;
      if (best < 0 || seedEnergies[i]! < seedEnergies[best]!) best = i;
    }
    if (best < 0) break;
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
  /** Newton steps after the gradient tolerance is met (default 0: callers polish the winner). */
  readonly polishSteps?: number;
  /** Gradient tolerance relative to the coupling scale (default 1e-10; Newton squares it). */
  readonly gradientTolerance?: number;
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
    polishSteps: plan.polishSteps ?? 0,
    gradientTolerance: plan.gradientTolerance ?? SEARCH_TOLERANCE,
  };
  const better = (a: LocalMinimum, b: LocalMinimum | undefined): boolean =>
    b === undefined ||
    (a.converged && !b.converged) ||
    (a.converged === b.converged && a.energy < b.energy);
  const run = (start: Float64Array, abandon: boolean): DescentResult => {
    const frame = Float64Array.from(start);
    descent.abandonAbove =
      abandon && best?.converged ? best.energy - ABANDON_MARGIN * c.scale : Infinity;
    descent.abandonNear = abandon && best?.converged ? best.order : undefined;
    const result = descend(c, frame, descent, ws);
    descents++;
    if (!result.abandoned) {
      const found = {
        frame,
        energy: result.energy,
        converged: result.converged,
        order: Float64Array.from(ws.order),
      };
      minima.push(found);
      if (better(found, best)) best = found;
    }
    return result;
  };
  (plan.warmStarts ?? []).forEach((start, i) => run(start, i > 0 && (plan.abandonWarm ?? false)));
  if (plan.coldSearch ?? true) {
    const library = seedLibrary(c.nf);
    for (const index of lowestSeeds(c, library, options.rankedStarts, options.seedSpread ?? 0)) {
      run(library[index]!.frame, true);
    }
    const random = seededRandom(options.seed);
    for (let i = 0; i < options.randomStarts; i++) run(randomFrame(random), true);
  }
  if (best === undefined) throw new Error('minimiseEnergy: no start given');
  return { frame: best.frame, energy: best.energy, converged: best.converged, minima, descents };
}
