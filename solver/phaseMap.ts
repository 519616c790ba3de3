import { joinBoundaries } from './boundaries';
import { computeMapRows, localStages, type MapStages } from './mapBands';
import type { PhaseMap } from './mapGrid';
import { axisValue, type MapInput } from './plane';

export { localStages, splitRange, type MapStages } from './mapBands';

/**
 * The whole Map in memory (labels, energies, gaps and order parameters of every pixel, not the
 * frames), from the banded run of `computeMapRows` with its stages spread over about `parts`
 * runners. The result does not depend on `parts` or on which runner computed which chunk. The
 * CLI streams large Maps to their files instead (its `map` command never holds a whole one).
 */
export async function computePhaseMap(
  input: MapInput,
  stages: MapStages = localStages,
  parts = 1,
): Promise<PhaseMap> {
  const [nx, ny] = input.plane.resolution;
  const total = nx * ny;
  const labels = new Array<string>(total).fill('');
  const energy = new Float64Array(total).fill(NaN);
  const order = new Float64Array(15 * total).fill(NaN);
  const gap = new Float64Array(total).fill(NaN);
  const { crossings } = await computeMapRows(input, stages, {
    parts,
    onRows: (block) => {
      const p = block.j0 * nx;
      for (let n = 0; n < block.labels.length; n++) labels[p + n] = block.labels[n]!;
      energy.set(block.energy, p);
      gap.set(block.gap, p);
      order.set(block.order, 15 * p);
    },
  });
  return {
    input,
    x: Float64Array.from({ length: nx }, (_, i) => axisValue(input.plane.x, nx, i)),
    y: Float64Array.from({ length: ny }, (_, j) => axisValue(input.plane.y, ny, j)),
    labels,
    energy,
    order,
    gap,
    boundaries: joinBoundaries(crossings, nx, ny),
    crossings,
  };
}
