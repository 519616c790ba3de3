import { MAX_RESOLUTION, MAX_WHOLE_RESOLUTION, ModelError } from '../../solver/index';
import { physicalProblem, rangeProblem } from './physical';
import { setupToMapInput } from './scenario';
import type { Setup } from './setup';

/**
 * Largest grid side the browser maps. Each pixel keeps its state (about 400 bytes) in two grids
 * used in turn, so 512 x 512 takes about 200 MB of the page's memory; the command line
 * (`npm run map`) goes up to the solver's MAX_RESOLUTION (MAX_WHOLE_RESOLUTION for a figure).
 */
export const APP_MAX_RESOLUTION = 512;

/** Why a grid side is refused in the app, or null (short, for beside the field). */
export function resolutionProblem(side: number): string | null {
  if (!Number.isInteger(side)) return 'must be a whole number';
  if (side < 2) return 'at least 2 points per side';
  if (side > APP_MAX_RESOLUTION) {
    return `at most ${APP_MAX_RESOLUTION} in the browser (a larger map would not fit in a page's memory); npm run map takes up to ${MAX_RESOLUTION} (${MAX_WHOLE_RESOLUTION} for a figure)`;
  }
  return null;
}

/**
 * Why the setup cannot be mapped in the app, as one line that names the field (the solver's
 * own validation of the scenario document, plus the app's grid limit), or null when it can.
 */
export function checkSetup(setup: Setup): string | null {
  for (const k of [0, 1] as const) {
    const problem = resolutionProblem(setup.resolution[k]);
    if (problem !== null) return `plane.resolution[${k}]: ${problem}`;
  }
  if (setup.physical) {
    const problem = physicalProblem(setup.physical);
    if (problem !== null) return problem;
  }
  for (const [ch, range] of Object.entries(setup.ranges ?? {})) {
    const problem = rangeProblem(range, `ranges.${ch}`);
    if (problem !== null) return problem;
  }
  try {
    setupToMapInput(setup);
  } catch (error) {
    if (error instanceof ModelError) return error.message;
    throw error;
  }
  return null;
}

/**
 * A loaded setup made mappable in the browser: grid sides above APP_MAX_RESOLUTION are reduced
 * to it. `note` says what changed (null when nothing did).
 */
export function fitSetupToApp(setup: Setup): { setup: Setup; note: string | null } {
  const [nx, ny] = setup.resolution;
  if (nx <= APP_MAX_RESOLUTION && ny <= APP_MAX_RESOLUTION) return { setup, note: null };
  const fitted: [number, number] = [
    Math.min(nx, APP_MAX_RESOLUTION),
    Math.min(ny, APP_MAX_RESOLUTION),
  ];
  return {
    setup: { ...setup, resolution: fitted },
    note: `resolution ${nx} × ${ny} reduced to ${fitted[0]} × ${fitted[1]}, the most the browser maps (npm run map takes the full grid)`,
  };
}
