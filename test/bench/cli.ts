import { spawnSync } from 'node:child_process';
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { median } from './measure';
import { standardMapDocument } from './models';

/** One run of a command line, timed from process start to exit. */
export interface ProcessRun {
  readonly millis: number;
  readonly outcome: 'ok' | 'failed' | 'timeout';
  /** Peak resident set size of the process (worker threads included), MB; null if unknown. */
  readonly peakMegabytes: number | null;
  /** First line of stderr when it failed. */
  readonly problem: string;
}

/**
 * Runs `node [nodeArgs] args` in `root` and times it end to end (spawn to exit, as a shell
 * would). With `peakFile`, test/bench/peakMemory.mjs records the peak memory there.
 */
export function timedProcess(
  root: string,
  args: readonly string[],
  options: { timeoutMs?: number; peakFile?: string; command?: string } = {},
): ProcessRun {
  const command = options.command ?? process.execPath;
  const nodeArgs = options.peakFile
    ? ['--import', join(root, 'test', 'bench', 'peakMemory.mjs')]
    : [];
  if (options.peakFile) rmSync(options.peakFile, { force: true });
  const start = performance.now();
  const run = spawnSync(command, [...nodeArgs, ...args], {
    cwd: root,
    encoding: 'utf8',
    maxBuffer: 1 << 26,
    timeout: options.timeoutMs,
    killSignal: 'SIGKILL',
    env: options.peakFile
      ? { ...process.env, FOURFOLD_BENCH_PEAK_FILE: options.peakFile }
      : process.env,
  });
  const millis = performance.now() - start;
  const timedOut = (run.error as NodeJS.ErrnoException | undefined)?.code === 'ETIMEDOUT';
  let peakMegabytes: number | null = null;
  if (options.peakFile) {
    try {
      peakMegabytes = Number(readFileSync(options.peakFile, 'utf8')) / 1024;
    } catch {
      // killed before exit
    }
  }
  return {
    millis,
    outcome: timedOut ? 'timeout' : run.status === 0 ? 'ok' : 'failed',
    peakMegabytes,
    problem: timedOut ? '' : (run.stderr ?? '').split('\n')[0]!,
  };
}

const SAMPLE = join('public', 'examples', 'sample.json');

export interface SolveTimes {
  /** `node fourfold.mjs solve --model public/examples/sample.json`, ms per run. */
  readonly fourfold: number[];
  /** The same through `npm run --silent solve` (npm's own start-up included). */
  readonly npm: number[];
  /** The baseline: cli.ts transpiled on the fly (tsx), no bundle. */
  readonly tsx: number[];
}

/** `solve` of one point end to end, `runs` times each way (after one untimed run). */
export function solveTimes(root: string, runs: number): SolveTimes {
  const fourfold = ['fourfold.mjs', 'solve', '--model', SAMPLE];
  const tsx = [
    '--import',
    'tsx',
    '--input-type=module',
    '-e',
    "import { main } from './cli.ts'; process.exitCode = await main(process.argv.slice(1));",
    'solve',
    '--model',
    SAMPLE,
  ];
  const npm = ['run', '--silent', 'solve', '--', '--model', SAMPLE];
  const times = (args: string[], command?: string) => {
    timedProcess(root, args, { command });
    return Array.from({ length: runs }, () => {
      const run = timedProcess(root, args, { command });
      if (run.outcome !== 'ok') throw new Error(`solve failed: ${run.problem}`);
      return run.millis;
    });
  };
  return {
    fourfold: times(fourfold),
    npm: times(npm, 'npm'),
    tsx: times(tsx).slice(0, Math.max(3, Math.ceil(runs / 3))),
  };
}

export interface CliMapRuns {
  readonly resolution: number;
  readonly runs: ProcessRun[];
  /** Median wall time of the runs that finished; NaN if none did. */
  readonly medianMillis: number;
  /** Highest peak memory over the runs, MB. */
  readonly peakMegabytes: number | null;
  /** The output of the first run (JSON output only). */
  readonly firstOutput: string | null;
}

/**
 * `node fourfold.mjs map --model F --out X` on the standard model's plane at `resolution`,
 * `runs` times, each with a timeout; `format` is the output's ending (json, csv or svg).
 */
export function cliMapRuns(
  root: string,
  workDir: string,
  resolution: number,
  runs: number,
  format: 'json' | 'svg',
  timeoutMs: number,
): CliMapRuns {
  const modelFile = join(workDir, `standard-map-${resolution}.json`);
  const outFile = join(workDir, `standard-map-${resolution}.out.${format}`);
  const peakFile = join(workDir, 'peak-memory.txt');
  writeFileSync(modelFile, JSON.stringify(standardMapDocument(resolution)));
  const list: ProcessRun[] = [];
  let firstOutput: string | null = null;
  for (let k = 0; k < runs; k++) {
    rmSync(outFile, { force: true });
    const run = timedProcess(
      root,
      ['fourfold.mjs', 'map', '--model', modelFile, '--out', outFile],
      {
        timeoutMs,
        peakFile,
      },
    );
    list.push(run);
    if (k === 0 && run.outcome === 'ok' && format === 'json') {
      firstOutput = readFileSync(outFile, 'utf8');
    }
    if (run.outcome !== 'ok') break;
  }
  rmSync(outFile, { force: true });
  const finished = list.filter((r) => r.outcome === 'ok').map((r) => r.millis);
  const peaks = list.map((r) => r.peakMegabytes).filter((m): m is number => m !== null);
  return {
    resolution,
    runs: list,
    medianMillis: finished.length ? median(finished) : NaN,
    peakMegabytes: peaks.length ? Math.max(...peaks) : null,
    firstOutput,
  };
}
