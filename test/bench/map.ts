import {
  PlaneCouplings,
  axisValue,
  computePhaseMap,
  parseMapInput,
  type PhaseMap,
} from '../../solver/index';
import { ThreadPool } from '../../workers/node/threadPool';
import { median, timed, timedAsync } from './measure';
import { standardMapDocument } from './models';
import { BfgsWorkspace, bfgsSolve } from './bfgs';
import { NAIVE_DEFAULTS, NaiveWorkspace, naiveSolve } from './naive';

export const MAP_RESOLUTION = 256;

export interface InProcessMap {
  /** Wall milliseconds of each run, thread-pool start-up included. */
  readonly runsMillis: number[];
  readonly medianMillis: number;
  readonly threads: number;
  readonly map: PhaseMap;
}

/**
 * The standard model's map (standard plane) computed in this process on a thread pool of
 * `threads` workers, `runs` times; each run starts its own pool.
 */
export async function inProcessMap(
  workerUrl: URL,
  threads: number,
  runs: number,
): Promise<InProcessMap> {
  const document = standardMapDocument(MAP_RESOLUTION);
  const runsMillis: number[] = [];
  let map: PhaseMap | undefined;
  for (let run = 0; run < runs; run++) {
    const result = await timedAsync(async () => {
      const pool = new ThreadPool(workerUrl, threads);
      try {
        return await computePhaseMap(parseMapInput(document), pool.stages, pool.size);
      } finally {
        await pool.close();
      }
    });
    runsMillis.push(result.millis);
    map = result.value;
  }
  return { runsMillis, medianMillis: median(runsMillis), threads, map: map! };
}

export interface NaiveMapEstimate {
  readonly samplePixels: number;
  readonly sampleMillis: number;
  /** Sample time scaled to every pixel and divided by the thread count. */
  readonly extrapolatedMillis: number;
}

/**
 * The naive map: one independent naive solve per pixel, no adaptivity, no warm starts, no
 * boundary refinement. Only a 16 x 16 sample of pixels spread evenly over the plane is solved
 * (on this thread); the time is extrapolated to all pixels shared perfectly by `threads` cores.
 */
export function naiveMapEstimate(naiveStarts: number, threads: number): NaiveMapEstimate {
  const input = parseMapInput(standardMapDocument(MAP_RESOLUTION));
  const [nx, ny] = input.plane.resolution;
  const planeCouplings = new PlaneCouplings(input);
  const ws = new NaiveWorkspace();
  const options = { ...NAIVE_DEFAULTS, starts: naiveStarts };
  const side = 16;
  const pixelsAlong = (n: number) =>
    Array.from({ length: side }, (_, k) => Math.floor(((k + 0.5) * n) / side));
  const columns = pixelsAlong(nx);
  const rows = pixelsAlong(ny);
  const solvePixel = (i: number, j: number) =>
    naiveSolve(
      planeCouplings.at(axisValue(input.plane.x, nx, i), axisValue(input.plane.y, ny, j)),
      options,
      j * nx + i,
      ws,
    );
  for (let k = 0; k < 8; k++) solvePixel(columns[k]!, rows[k]!);
  const sample = timed(() => {
    for (const j of rows) for (const i of columns) solvePixel(i, j);
  });
  const samplePixels = side * side;
  return {
    samplePixels,
    sampleMillis: sample.millis,
    extrapolatedMillis: ((sample.millis / samplePixels) * nx * ny) / threads,
  };
}

/** Pixels spread evenly over a plane of n x n: `side` per axis. */
function spreadPixels(n: number, side: number): number[] {
  return Array.from({ length: side }, (_, k) => Math.floor(((k + 0.5) * n) / side));
}

export interface BfgsPerPoint {
  readonly points: number;
  /** Median microseconds of one point (all starts) on one thread. */
  readonly medianMicros: number;
}

/**
 * The notebook-style baseline per point (test/bench/bfgs.ts: BFGS with the analytic gradient
 * from 8 random starts) on `side` x `side` pixels spread over the standard plane, one thread.
 */
export function bfgsPerPoint(side = 8): BfgsPerPoint {
  const input = parseMapInput(standardMapDocument(MAP_RESOLUTION));
  const [nx, ny] = input.plane.resolution;
  const planeCouplings = new PlaneCouplings(input);
  const ws = new BfgsWorkspace();
  const columns = spreadPixels(nx, side);
  const rows = spreadPixels(ny, side);
  const solvePixel = (i: number, j: number) =>
    bfgsSolve(
      planeCouplings.at(axisValue(input.plane.x, nx, i), axisValue(input.plane.y, ny, j)),
      j * nx + i,
      ws,
    );
  for (let k = 0; k < side; k++) solvePixel(columns[k]!, rows[k]!);
  const micros: number[] = [];
  for (const j of rows) {
    for (const i of columns) micros.push(1000 * timed(() => solvePixel(i, j)).millis);
  }
  return { points: micros.length, medianMicros: median(micros) };
}
