import { transfer } from 'comlink';
import {
  COARSE_SEARCH,
  DEFAULT_MINIMISE,
  QUICK_SEARCH,
  computeCut,
  couplingsOf,
  localFitRunners,
  locateCrossings,
  minimiseEnergy,
  modelAtPoint,
  modelDispersion,
  parseMapInput,
  parseModel,
  probeModel,
  solveCells,
  solveCoarseNodes,
  solvePixelList,
  solveRowsCold,
  sweepsAt,
  rowsAt,
  type CellRange,
  type ConditionMap,
  type CoarseBlock,
  type CoarseNodes,
  type Crossing,
  type CutPath,
  type CutResult,
  type FitProblem,
  type MapInput,
  type ModelDispersion,
  type PixelBlock,
  type ProbeReport,
  type RowPrediction,
  type TiltSweep,
} from '../solver/index';

let lastJson = '';
let lastInput: MapInput | undefined;

/** The parsed input of a scenario document, kept while the same text keeps arriving. */
function inputOf(json: string): MapInput {
  if (json !== lastJson || lastInput === undefined) {
    lastInput = parseMapInput(JSON.parse(json));
    lastJson = json;
  }
  return lastInput;
}

function pixelTransfer(b: PixelBlock): PixelBlock {
  return transfer(b, [
    b.energy.buffer,
    b.order.buffer,
    b.gap.buffer,
    b.frames.buffer,
    b.searched.buffer,
  ]);
}

/**
 * The Map stages as a worker runs them: inputs arrive as the scenario document's JSON text,
 * results leave as transferable typed arrays. Pure calls into solver/.
 */
export const mapStagesApi = {
  /**
   * Builds the solver's seed library and compiles the hot paths before the first map: for the
   * given filling only (the first map's; another filling builds its library when first asked),
   * or for all three.
   */
  warmUp(only?: -1 | 0 | 1): void {
    for (const filling of only === undefined ? ([-1, 0, 1] as const) : [only]) {
      const model = parseModel({ filling, channels: { x0: -1, y0: -1, z0: 2 }, zeeman: 0.4 });
      minimiseEnergy(couplingsOf(model), DEFAULT_MINIMISE);
    }
  },
  /**
   * Coarse nodes; `quick` with `warm` frames (one per node) for a first look after a change,
   * and `preview` frames (`previewFrames`) for a first look by continuation.
   */
  coarse(
    json: string,
    nodes: Int32Array,
    quick = false,
    warm?: Float64Array,
    preview?: Float64Array,
  ): CoarseBlock {
    const b = solveCoarseNodes(
      inputOf(json),
      nodes,
      quick ? QUICK_SEARCH : COARSE_SEARCH,
      warm,
      preview,
    );
    return transfer(b, [b.frames.buffer, b.energy.buffer, b.order.buffer, b.gap.buffer]);
  },
  cells(json: string, coarse: CoarseNodes, cells: CellRange): PixelBlock {
    return pixelTransfer(solveCells(inputOf(json), coarse, cells));
  },
  /** Single pixels inside regions (the ends of boundary edges there). */
  pixels(json: string, coarse: CoarseNodes, pixels: Int32Array): PixelBlock {
    return pixelTransfer(solvePixelList(inputOf(json), coarse, pixels));
  },
  crossings(
    json: string,
    edges: Int32Array,
    endFrames: Float64Array,
    endLabels: string[],
    relativeTolerance: number,
  ): Crossing[] {
    return locateCrossings(inputOf(json), edges, endFrames, endLabels, relativeTolerance);
  },
  /** The Probe of the plane point (x, y): ground state, competitors and derived numbers. */
  probe(json: string, x: number, y: number): ProbeReport {
    return probeModel(modelAtPoint(inputOf(json), x, y));
  },
  /**
   * The collective modes along q (1/l_B) of the plane point (x, y), with the scenario model's
   * Coulomb scale and an optional gate (l_B): a side task of the Probe.
   */
  modes(json: string, x: number, y: number, q: number[], gateDistance?: number): ModelDispersion {
    const model = modelAtPoint(inputOf(json), x, y);
    return modelDispersion(model, q, gateDistance === undefined ? {} : { gateDistance });
  },
  /** A Cut through the scenario's plane (a side task: the user waits on it). */
  cut(json: string, path: CutPath, n: number): CutResult {
    const c = computeCut(inputOf(json), path, n);
    const arrays = [c.t, c.s, c.x, c.y, c.energy, c.slope, c.groups, c.canting, c.gap];
    return transfer(
      c,
      arrays.map((a) => a.buffer),
    );
  },
  /** A fit's Map of one field condition, every pixel solved (`computeConditionMap`). */
  conditionMap(document: string): Promise<ConditionMap> {
    return localFitRunners.conditionMap(document);
  },
  /** A fit's tilt sweeps at the (x, y) pairs of `points` (`tiltSweep`). */
  sweeps(document: string, gFactor: number, startDeg: number, points: Float64Array): TiltSweep[] {
    return sweepsAt(document, gFactor, startDeg, points);
  },
  /** Every observation row at each parameter point (`predictRows`). */
  rows(problem: FitProblem, points: number[][]): RowPrediction[][] {
    return rowsAt(problem, points);
  },
  /** The baseline: a full cold search at every pixel of rows [j0, j0 + rows). */
  coldRows(json: string, j0: number, rows: number): PixelBlock {
    return pixelTransfer(solveRowsCold(inputOf(json), j0, rows));
  },
};

export type MapStagesApi = typeof mapStagesApi;

/** What a caller of the stages sees: every call asynchronous (a worker, or a stand-in). */
export type AsyncMapStages = {
  [K in keyof MapStagesApi]: (
    ...args: Parameters<MapStagesApi[K]>
  ) => Promise<ReturnType<MapStagesApi[K]>>;
};
