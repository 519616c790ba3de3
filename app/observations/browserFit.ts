import {
  DEFAULT_FIT_OPTIONS,
  parseFitPlane,
  type FitProblem,
  type FitRunners,
} from '../../solver/index';
import { setupToScenario } from '../scenario/scenario';
import type { Setup } from '../scenario/setup';
import { runSideTask } from '../sidePool';

/**
 * Most pixels per side of the grid a fit in the page works on: each row's Map and each tilt
 * sweep field covers it, so a fit stays within seconds to a minute on a laptop (the command
 * line takes the plane's own resolution).
 */
export const PAGE_FIT_SIDE = 32;

/** The pieces of a fit as side tasks on the Map's worker pool. */
export const pageFitRunners: FitRunners = {
  conditionMap: (document) => runSideTask(async (api) => api.conditionMap(document)),
  sweeps: (document, gFactor, startDeg, points) =>
    runSideTask((api) => api.sweeps(document, gFactor, startDeg, points)),
  // One point per task, so that the points of one step spread over the workers.
  rows: (problem, points) =>
    Promise.all(
      points.map((p) => runSideTask((api) => api.rows(problem, [p])).then((out) => out[0]!)),
    ),
};

/**
 * The fit of the setup's observations over its plane, read per tesla of B_perp as `npm run fit`
 * reads a saved scenario (public/notes.html#observations), on a grid of at most PAGE_FIT_SIDE
 * pixels a side. Throws ModelError naming what the plane lacks (an axis that sets E_Z, ...).
 */
export function pageFitProblem(setup: Setup): FitProblem {
  const document = setupToScenario(setup);
  const plane = document.plane as { resolution: [number, number] };
  const resolution = plane.resolution.map((n) => Math.min(n, PAGE_FIT_SIDE));
  return {
    plane: parseFitPlane({ ...document, plane: { ...plane, resolution } }),
    rows: setup.observations?.rows ?? [],
    options: setup.observations?.options ?? DEFAULT_FIT_OPTIONS,
  };
}

/** A key naming a setup exactly (its scenario document), or '' where it has none. */
export function setupKey(setup: Setup): string {
  try {
    return JSON.stringify(setupToScenario(setup));
  } catch {
    return '';
  }
}
