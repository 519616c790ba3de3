import {
  PIXEL_SOLVED,
  modelToJson,
  type Boundary,
  type MapGrid,
  type PhaseMap,
} from '../../solver/index';
import { runSideTask } from '../sidePool';

/** Pixels per side task: small enough that the page and the Probe stay responsive. */
const CHUNK = 2048;

/**
 * Solves every pixel of `grid` not solved yet (the Map solves region pixels only on demand) on
 * the Map's worker pool, in chunks, and returns the finished Map for the data export.
 * `progress` gets the fraction done; `current` says whether the grid still shows the same job
 * (if not, the export stops with a message).
 */
export async function completeMap(
  grid: MapGrid,
  boundaries: readonly Boundary[],
  progress: (fraction: number) => void,
  current: () => boolean,
): Promise<PhaseMap> {
  const missing: number[] = [];
  for (let p = 0; p < grid.status.length; p++) if (grid.status[p] !== PIXEL_SOLVED) missing.push(p);
  if (missing.length > 0) {
    if (!grid.coarseComplete) throw new Error('the Map is not finished yet');
    const coarse = grid.coarseNodes();
    const json = JSON.stringify({ ...modelToJson(grid.input.model), plane: grid.input.plane });
    let done = 0;
    progress(0);
    const chunks: Int32Array[] = [];
    for (let k = 0; k < missing.length; k += CHUNK)
      chunks.push(Int32Array.from(missing.slice(k, k + CHUNK)));
    await Promise.all(
      chunks.map(async (pixels) => {
        const block = await runSideTask((api) => api.pixels(json, coarse, pixels));
        if (!current()) throw new Error('the Map changed while its data were being completed');
        grid.placePixelList(pixels, block);
        done += pixels.length;
        progress(done / missing.length);
      }),
    );
  }
  return {
    input: grid.input,
    x: grid.x,
    y: grid.y,
    labels: grid.labels,
    energy: grid.energy,
    order: grid.order,
    gap: grid.gap,
    boundaries: [...boundaries],
    crossings: [],
  };
}
