import { solveCoarseNodes } from './coarseNodes';
import { computeConditionMap, type ConditionStages } from './conditionMap';
import type { FitRunners } from './fitRun';
import { solveCells } from './pixelBlock';
import { parseMapInput, type MapInput } from './plane';
import { predictRows, type FitProblem, type RowPrediction } from './rowPredictions';
import { tiltSweep, type TiltSweep } from './tiltSweep';

let lastDocument = '';
let lastInput: MapInput | undefined;

/** The parsed input of a per-tesla document, kept while the same text keeps arriving. */
function inputOf(document: string): MapInput {
  if (document !== lastDocument || lastInput === undefined) {
    lastInput = parseMapInput(JSON.parse(document));
    lastDocument = document;
  }
  return lastInput;
}

/** Tilt sweeps at the (x, y) pairs of `points` (a worker's task). */
export function sweepsAt(
  document: string,
  gFactor: number,
  startDeg: number,
  points: Float64Array,
): TiltSweep[] {
  const input = inputOf(document);
  const out: TiltSweep[] = [];
  for (let n = 0; n < points.length / 2; n++) {
    out.push(tiltSweep(input, points[2 * n]!, points[2 * n + 1]!, gFactor, startDeg));
  }
  return out;
}

/** Every row at each parameter point (a worker's task). */
export function rowsAt(
  problem: FitProblem,
  points: readonly (readonly number[])[],
): RowPrediction[][] {
  return points.map((p) => predictRows(problem, p));
}

/** The Map stages on the calling thread. */
export const localConditionStages: ConditionStages = {
  coarse: async (input, nodes) => solveCoarseNodes(input, nodes),
  cells: async (input, coarse, cells) => solveCells(input, coarse, cells),
};

/** Every piece of a fit on the calling thread (tests, and a last resort). */
export const localFitRunners: FitRunners = {
  conditionMap: async (document) => computeConditionMap(inputOf(document), localConditionStages),
  sweeps: async (document, gFactor, startDeg, points) =>
    sweepsAt(document, gFactor, startDeg, points),
  rows: async (problem, points) => rowsAt(problem, points),
};
