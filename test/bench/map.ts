import { spawnSync } from 'node:child_process';
import { readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  PlaneCouplings,
  axisValue,
  computePhaseMap,
  mapToJson,
  parseMapInput,
  type PhaseMap,
} from '../../solver/index';
import { ThreadPool } from '../../workers/node/threadPool';
import { median, timed, timedAsync } from './measure';
import { standardMapDocument } from './models';
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

export interface CliMap {
  readonly millis: number;
  /** The CLI wrote the same JSON as mapToJson of the in-process map. */
  readonly sameAsInProcess: boolean;
  /** The CLI's sources changed after the benchmark was bundled (the two ran different code). */
  readonly sourcesChanged: boolean;
}

/** Sources the CLI bundles (as listed in fourfold.mjs). */
const CLI_SOURCES = ['cli.ts', 'solver', 'workers/node', 'app/figure'];

/** Latest modification time (ms since the epoch) of a file or of any file below a folder. */
function newestTime(path: string): number {
  const stat = statSync(path);
  if (!stat.isDirectory()) return stat.mtimeMs;
  return Math.max(0, ...readdirSync(path).map((name) => newestTime(join(path, name))));
}

/**
 * One end-to-end run of `node fourfold.mjs map --model F --out X.json` (process start, parse,
 * threads, JSON writing). The CLI's bundle is built by an untimed `--help` call first, so the
 * timed run measures the command as a user meets it on every run after the first.
 */
export function cliMap(
  root: string,
  workDir: string,
  inProcess: PhaseMap,
  bundledAt: number,
): CliMap {
  const modelFile = join(workDir, 'standard-map.json');
  const outFile = join(workDir, 'standard-map.out.json');
  writeFileSync(modelFile, JSON.stringify(standardMapDocument(MAP_RESOLUTION)));
  const cli = join(root, 'fourfold.mjs');
  spawnSync(process.execPath, [cli, '--help'], { cwd: root });
  const run = timed(() =>
    spawnSync(process.execPath, [cli, 'map', '--model', modelFile, '--out', outFile], {
      cwd: root,
      encoding: 'utf8',
    }),
  );
  if (run.value.status !== 0) {
    throw new Error(`fourfold map failed (${run.value.status}): ${run.value.stderr.trim()}`);
  }
  const written = readFileSync(outFile, 'utf8');
  return {
    millis: run.millis,
    sameAsInProcess: written === JSON.stringify(mapToJson(inProcess)),
    sourcesChanged: Math.max(...CLI_SOURCES.map((s) => newestTime(join(root, s)))) > bundledAt,
  };
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
