import { parentPort } from 'node:worker_threads';
import { expose, transfer } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { locateCrossings, solveCoarseNodes, solvePixels } from '../../solver/index';
import type { CoarseNodes, Crossing, MapInput, PixelBlock } from '../../solver/index';

/** The Map stages, exposed to the CLI's thread pool; all logic lives in solver/. */
const mapThreadApi = {
  coarse(input: MapInput, first: number, count: number): Float64Array {
    const frames = solveCoarseNodes(input, first, count);
    return transfer(frames, [frames.buffer]);
  },
  pixels(input: MapInput, coarse: CoarseNodes, start: number, count: number): PixelBlock {
    const b = solvePixels(input, coarse, start, count);
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
};

export type MapThreadApi = typeof mapThreadApi;

if (parentPort === null) throw new Error('mapThread must run in a worker thread');
expose(mapThreadApi, nodeEndpoint(parentPort));
