import { parentPort } from 'node:worker_threads';
import { expose, transfer } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { rowsAt, solveCells, solveCoarseNodes, sweepsAt } from '../../solver/index';
import type {
  CellRange,
  CoarseBlock,
  CoarseNodes,
  FitProblem,
  MapInput,
  PixelBlock,
  RowPrediction,
  TiltSweep,
} from '../../solver/index';

/** The pieces of a fit, exposed to the CLI's fit threads; all logic lives in solver/. */
const fitThreadApi = {
  coarse(input: MapInput, nodes: Int32Array): CoarseBlock {
    const b = solveCoarseNodes(input, nodes);
    return transfer(b, [b.frames.buffer, b.energy.buffer, b.order.buffer, b.gap.buffer]);
  },
  cells(input: MapInput, coarse: CoarseNodes, cells: CellRange): PixelBlock {
    const b = solveCells(input, coarse, cells);
    return transfer(b, [b.energy.buffer, b.order.buffer, b.gap.buffer, b.frames.buffer]);
  },
  sweeps(document: string, gFactor: number, startDeg: number, points: Float64Array): TiltSweep[] {
    return sweepsAt(document, gFactor, startDeg, points);
  },
  rows(problem: FitProblem, points: number[][]): RowPrediction[][] {
    return rowsAt(problem, points);
  },
};

export type FitThreadApi = typeof fitThreadApi;

if (parentPort === null) throw new Error('fitThread must run in a worker thread');
expose(fitThreadApi, nodeEndpoint(parentPort));
