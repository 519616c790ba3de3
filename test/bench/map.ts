import {
  CHANNELS,
  MapGrid,
  PlaneCouplings,
  axisValue,
  computePhaseMap,
  nodeRange,
  parseMapInput,
  seededRandom,
  solveCells,
  solveCoarseNodes,
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

export interface CertificateCost {
  readonly name: string;
  readonly pixels: number;
  /** Pixels the certificate sent to a full single-point search. */
  readonly searched: number;
  /** Median milliseconds of the pixel stage (one thread, the same coarse nodes) with and without. */
  readonly withMillis: number;
  readonly withoutMillis: number;
}

/**
 * What the per-pixel certificate costs: the pixel stage of the standard map and of seeded random
 * maps (2 to 15 channels, H != F, a field on an axis) timed with and without it on one thread
 * from the same coarse nodes, and how many pixels it sent to a full search.
 */
export function certificateCost(randomMaps: number, runs = 3): CertificateCost[] {
  const documents: { name: string; document: Record<string, unknown> }[] = [
    {
      name: `standard ${MAP_RESOLUTION}x${MAP_RESOLUTION}`,
      document: standardMapDocument(MAP_RESOLUTION),
    },
  ];
  const random = seededRandom(7);
  const uniform = (from: number, to: number): number => from + (to - from) * random();
  for (let m = 0; m < randomMaps; m++) {
    const names = [...CHANNELS].filter(() => random() < 0.3).slice(0, 15);
    if (names.length < 2) names.push('x0', 'z0');
    const channels: Record<string, { hartree: number; fock: number }> = {};
    for (const name of names) channels[name] = { hartree: uniform(-1, 1), fock: uniform(-1, 1) };
    const [xName, yName] = [names[0]!, names[1]!];
    const filling = ([-1, 0, 1] as const)[m % 3];
    documents.push({
      name: `random #${m + 1} (nu=${filling}, ${names.length} channels) 128x128`,
      document: {
        filling,
        channels,
        zeeman: uniform(0, 0.5),
        valleyZeeman: uniform(-0.2, 0.2),
        plane: {
          x: {
            from: -1.5,
            to: 1.5,
            targets: { [`${xName}.fock`]: 1, [`${xName}.hartree`]: uniform(-1.5, 1.5) },
          },
          y:
            m % 2 === 0
              ? { from: 0, to: 1, targets: { zeeman: 1 } }
              : { from: -1.5, to: 1.5, targets: { [`${yName}.fock`]: 1 } },
          resolution: [128, 128],
        },
      },
    });
  }
  return documents.map(({ name, document }) => {
    const input = parseMapInput(document);
    const grid = new MapGrid(input);
    grid.placeCoarse(solveCoarseNodes(input, nodeRange(0, grid.nodeCount)));
    const coarse = grid.coarseNodes();
    const cells = { a0: 0, b0: 0, a1: grid.cols.length - 1, b1: grid.rows.length - 1 };
    let searched = 0;
    const timesWith: number[] = [];
    const timesWithout: number[] = [];
    for (let run = 0; run < runs; run++) {
      timesWith.push(
        timed(() => (searched = solveCells(input, coarse, cells).searched[0]!)).millis,
      );
      timesWithout.push(
        timed(() => solveCells(input, coarse, cells, { certificate: false })).millis,
      );
    }
    const [nx, ny] = input.plane.resolution;
    return {
      name,
      pixels: nx * ny,
      searched,
      withMillis: median(timesWith),
      withoutMillis: median(timesWithout),
    };
  });
}
