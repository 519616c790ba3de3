import { parentPort } from 'node:worker_threads';
import { expose, transfer } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import {
  locateCrossings,
  rowsAt,
  solveCells,
  solveCoarseNodes,
  sweepsAt,
} from '../../solver/index';
import type {
  CellRange,
  CoarseBlock,
  CoarseNodes,
  Crossing,
  FitProblem,
  MapInput,
  PixelBlock,
  RowPrediction,
  TiltSweep,
} from '../../solver/index';

/**
 * The Map stages and the fit's tilt sweeps and row evaluations, exposed to the CLI's thread
 * pool; all logic lives in solver/.
 */
const mapThreadApi = {
  coarse(input: MapInput, nodes: Int32Array): CoarseBlock {
    const b = solveCoarseNodes(input, nodes);
    return transfer(b, [b.frames.buffer, b.energy.buffer, b.order.buffer, b.gap.buffer]);
  },
  cells(input: MapInput, coarse: CoarseNodes, cells: CellRange): PixelBlock {
    const b = solveCells(input, coarse, cells);
    return transfer(b, [b.energy.buffer, b.order.buffer, b.gap.buffer, b.frames.buffer]);
  },
  crossings(
    input: MapInput,
    edges: Int32Array,
    endFrames: Float64Array,
    endLabels: string[],
  ): Crossing[] {
    return locateCrossings(input, edges, endFrames, endLabels);
  },
  sweeps(document: string, gFactor: number, startDeg: number, points: Float64Array): TiltSweep[] {
    return sweepsAt(document, gFactor, startDeg, points);
  },
  rows(problem: FitProblem, points: number[][]): RowPrediction[][] {
    return rowsAt(problem, points);
  },
};

export type MapThreadApi = typeof mapThreadApi;

if (parentPort === null) throw new Error('mapThread must run in a worker thread');
expose(mapThreadApi, nodeEndpoint(parentPort));
