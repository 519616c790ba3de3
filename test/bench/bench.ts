import { availableParallelism } from 'node:os';
import { mapToJson, probeModel, type Model } from '../../solver/index';
import { cliMapRuns, solveTimes, type CliMapRuns } from './cli';
import { median } from './measure';
import {
  MAP_RESOLUTION,
  bfgsPerPoint,
  certificateCost,
  inProcessMap,
  naiveMapEstimate,
} from './map';
import { genericModels, standardModels, STANDARD_POINTS, NEIGHBOUR_STEP } from './models';
import {
  BATCH,
  MISS_TOLERANCE,
  REFERENCE_STARTS,
  coldPoints,
  countMisses,
  equalCorrectness,
  singleModelMicros,
  warmPoints,
  type ColdPoints,
} from './points';
import { formatDuration, formatMisses, formatTable, rowToJson, type BenchRow } from './report';

/**
 * The Node part of `npm run bench`: the command line end to end (the targets), and the solver
 * against a naive baseline measured in the same run (test/bench/naive.ts), with the miss rate of
 * each against a common reference (the detail). Run through test/bench/run.mjs, which bundles
 * this file with esbuild as the CLI is bundled.
 */
export interface BenchOptions {
  /** Repository root (for fourfold.mjs). */
  readonly root: string;
  /** Bundled workers/node/mapThread.ts. */
  readonly workerUrl: URL;
  /** Scratch directory for the CLI's model and output files. */
  readonly workDir: string;
  /** Generic models per filling. */
  readonly models: number;
  /** Skip the 2048 x 2048 map (minutes when it is slow). */
  readonly quick: boolean;
}

/** A row of the target table (test/bench/targetTable.mjs). */
export interface TargetRow {
  readonly key: string;
  readonly part: string;
  readonly measurement: string;
  readonly unit: 'ms' | 'us' | 'MB';
  readonly value: number | null;
  readonly outcome?: string;
  readonly baseline: number | null;
  readonly baselineLabel: string;
  readonly target: { on: 'value' | 'speedup' | 'growth'; op: '<=' | '>='; limit: number };
}

export interface NodeBenchResult {
  readonly targets: TargetRow[];
  /** The solver detail table and its notes. */
  readonly detail: string;
  readonly json: Record<string, unknown>;
}

/** Targets of the command line (issue 13). */
const SOLVE_TARGET_MS = 300;
const MAP_256_TARGET_MS = 750;
const MAP_2048_TARGET_MS = 20000;
const MAP_2048_MEMORY_MB = 1024;
const PER_POINT_SPEEDUP = 1000;
/** A 2048 x 2048 map that runs three times its target is stopped. */
const MAP_2048_TIMEOUT_MS = 3 * MAP_2048_TARGET_MS;
const SOLVE_RUNS = 9;
const CLI_MAP_RUNS = 3;
/** Seeded random maps (128 x 128) besides the standard one in the certificate's cost. */
const CERTIFICATE_RANDOM_MAPS = 6;

/** Haar-random starts per point of the naive baseline. */
export const NAIVE_STARTS = 32;
const POINT_TARGET_MICROS = 100;
const MAP_TARGET_MICROS = 2e6;
const MAP_RUNS = 3;

function log(message: string): void {
  process.stderr.write(`bench: ${message}\n`);
}

function coldRow(key: string, measurement: string, result: ColdPoints, target?: number): BenchRow {
  return {
    key,
    measurement,
    oursMicroseconds: median(result.oursMicros),
    baselineMicroseconds: 1000 * median(result.naiveMillis),
    oursMisses: result.oursMisses,
    baselineMisses: result.naiveMisses,
    targetMicroseconds: target,
  };
}

/** Median time of `probeModel` over the models, each timed once after one warm-up call. */
function probeMicrosOf(models: readonly { model: Model }[]): number {
  probeModel(models[0]!.model);
  return median(
    models.map(({ model }) => {
      const start = performance.now();
      probeModel(model);
      return 1000 * (performance.now() - start);
    }),
  );
}

/** The command line's rows: `solve` of one point, the 256 and 2048 maps, the per-point time. */
function cliTargets(
  solve: ReturnType<typeof solveTimes>,
  map256: CliMapRuns,
  map2048: CliMapRuns | null,
  naivePixelMillis: number,
  cores: number,
  bfgsMicros: number,
): TargetRow[] {
  const outcome = (m: CliMapRuns | null) =>
    m === null ? 'skipped (--quick)' : (m.runs.find((r) => r.outcome !== 'ok')?.outcome ?? 'ok');
  const pixels = (n: number) => n * n;
  return [
    {
      key: 'cli-solve',
      part: 'CLI',
      measurement: `solve, one point, process start to exit (median of ${SOLVE_RUNS})`,
      unit: 'ms',
      value: median(solve.fourfold),
      baseline: median(solve.tsx),
      baselineLabel: 'cli.ts transpiled on the fly (tsx), no bundle',
      target: { on: 'value', op: '<=', limit: SOLVE_TARGET_MS },
    },
    {
      key: 'cli-map-256',
      part: 'CLI',
      measurement: `map 256 x 256 to JSON, start-up included (median of ${CLI_MAP_RUNS})`,
      unit: 'ms',
      value: Number.isFinite(map256.medianMillis) ? map256.medianMillis : null,
      outcome: outcome(map256),
      baseline: (naivePixelMillis * pixels(256)) / cores,
      baselineLabel: 'naive search per pixel, extrapolated',
      target: { on: 'value', op: '<=', limit: MAP_256_TARGET_MS },
    },
    {
      key: 'cli-map-2048',
      part: 'CLI',
      measurement: `map 2048 x 2048 to SVG, start-up included (one run, stopped after ${MAP_2048_TIMEOUT_MS / 1000} s)`,
      unit: 'ms',
      value: map2048 && Number.isFinite(map2048.medianMillis) ? map2048.medianMillis : null,
      outcome: outcome(map2048),
      baseline: (naivePixelMillis * pixels(2048)) / cores,
      baselineLabel: 'naive search per pixel, extrapolated',
      target: { on: 'value', op: '<=', limit: MAP_2048_TARGET_MS },
    },
    {
      key: 'cli-map-2048-memory',
      part: 'CLI',
      measurement: 'map 2048 x 2048, peak memory (resident, threads included)',
      unit: 'MB',
      value: map2048?.runs[0]?.outcome === 'ok' ? map2048.peakMegabytes : null,
      outcome: outcome(map2048),
      baseline: map256.peakMegabytes,
      baselineLabel: 'the 256 x 256 map',
      target: { on: 'value', op: '<=', limit: MAP_2048_MEMORY_MB },
    },
    {
      key: 'per-point',
      part: 'CLI',
      measurement: 'time per point: map 256 x 256 wall / 65,536 points',
      unit: 'us',
      value: Number.isFinite(map256.medianMillis)
        ? (1000 * map256.medianMillis) / pixels(256)
        : null,
      outcome: outcome(map256),
      baseline: bfgsMicros,
      baselineLabel: 'notebook-style BFGS, 8 starts, one thread',
      target: { on: 'speedup', op: '>=', limit: PER_POINT_SPEEDUP },
    },
  ];
}

export async function runBenchmark(options: BenchOptions): Promise<NodeBenchResult> {
  const started = performance.now();
  const cores = availableParallelism();
  const n = options.models;

  log(`CLI: solve of one point, ${SOLVE_RUNS} runs each way`);
  const solve = solveTimes(options.root, SOLVE_RUNS);
  log(`CLI: map 256 x 256, ${CLI_MAP_RUNS} runs`);
  const map256 = cliMapRuns(options.root, options.workDir, 256, CLI_MAP_RUNS, 'json', 120000);
  let map2048: CliMapRuns | null = null;
  if (!options.quick) {
    log(`CLI: map 2048 x 2048 (stopped after ${MAP_2048_TIMEOUT_MS / 1000} s)`);
    map2048 = cliMapRuns(options.root, options.workDir, 2048, 1, 'svg', MAP_2048_TIMEOUT_MS);
  }
  log('notebook-style baseline: BFGS from 8 starts per point');
  const bfgs = bfgsPerPoint();

  log(`cold points, nu = 0, ${n} generic models`);
  const generic0 = genericModels(n, 0, 1);
  const cold0 = coldPoints(generic0, NAIVE_STARTS, 1);
  log('standard model and variants');
  const standard = standardModels();
  const coldStandard = coldPoints(standard, NAIVE_STARTS, 2, 5);
  const standardSingle = singleModelMicros(standard[0]!, 25);
  log('Probe of one point');
  const probeMicros = probeMicrosOf(standard);
  log('warm-started points');
  const warm0 = warmPoints(generic0, cold0.reference);
  const warmStandard = warmPoints(standard, coldStandard.reference);
  log(`cold points, nu = -1 and +1, ${n} generic models each`);
  const genericMinus = genericModels(n, -1, 3);
  const genericPlus = genericModels(n, 1, 4);
  const coldMinus = coldPoints(genericMinus, NAIVE_STARTS, 3);
  const coldPlus = coldPoints(genericPlus, NAIVE_STARTS, 4);
  log(`map ${MAP_RESOLUTION} x ${MAP_RESOLUTION}, in process, ${MAP_RUNS} runs`);
  const mapInProcess = await inProcessMap(options.workerUrl, cores, MAP_RUNS);
  const cliSameAsInProcess = map256.firstOutput === JSON.stringify(mapToJson(mapInProcess.map));
  log('certificate cost: pixel stage with and without it');
  const certificate = certificateCost(CERTIFICATE_RANDOM_MAPS);
  log('naive map sample');
  const naiveMap = naiveMapEstimate(NAIVE_STARTS, cores);

  const standardNaiveMicros = 1000 * coldStandard.naiveMillis[0]!;
  const rows: BenchRow[] = [
    coldRow(
      'cold-nu0-generic',
      `cold point, nu=0, ${n} generic models (median)`,
      cold0,
      POINT_TARGET_MICROS,
    ),
    {
      key: 'cold-standard',
      measurement: 'cold point, standard model uPerp=-1 uZ=2',
      oursMicroseconds: standardSingle,
      baselineMicroseconds: standardNaiveMicros,
      oursMisses: countMisses(coldStandard.oursEnergy, coldStandard.reference, [0]),
      baselineMisses: countMisses(coldStandard.naiveEnergy, coldStandard.reference, [0]),
      targetMicroseconds: POINT_TARGET_MICROS,
    },
    {
      key: 'probe-standard-variants',
      measurement: `Probe of one point (search, competitors, modes), standard model, ${standard.length} (uPerp, uZ) (median)`,
      oursMicroseconds: probeMicros,
      baselineMicroseconds: 1000 * median(coldStandard.naiveMillis),
    },
    coldRow(
      'cold-standard-variants',
      `cold point, standard model, ${standard.length} (uPerp, uZ) (median)`,
      coldStandard,
      POINT_TARGET_MICROS,
    ),
    {
      key: 'warm-nu0-generic',
      measurement: `warm point, nu=0, ${n} generic models (median)`,
      oursMicroseconds: median(warm0.oursMicros),
      baselineMicroseconds: 1000 * median(cold0.naiveMillis),
      oursMisses: warm0.oursMisses,
      baselineMisses: cold0.naiveMisses,
    },
    {
      key: 'warm-standard-variants',
      measurement: `warm point, standard model, ${standard.length} (uPerp, uZ) (median)`,
      oursMicroseconds: median(warmStandard.oursMicros),
      baselineMicroseconds: 1000 * median(coldStandard.naiveMillis),
      oursMisses: warmStandard.oursMisses,
      baselineMisses: coldStandard.naiveMisses,
    },
    {
      key: 'map-in-process',
      measurement: `map ${MAP_RESOLUTION}x${MAP_RESOLUTION}, in process, ${cores} threads (median of ${MAP_RUNS})`,
      oursMicroseconds: 1000 * mapInProcess.medianMillis,
      baselineMicroseconds: 1000 * naiveMap.extrapolatedMillis,
      baselineNote: 'extrapolated',
      targetMicroseconds: MAP_TARGET_MICROS,
    },
    coldRow('cold-nu-1-generic', `cold point, nu=-1, ${n} generic models (median)`, coldMinus),
    coldRow('cold-nu+1-generic', `cold point, nu=+1, ${n} generic models (median)`, coldPlus),
  ];

  const labels = new Set(mapInProcess.map.labels);
  log('naive at equal correctness');
  const sets = [
    { name: 'nu=0 generic', result: cold0, pairs: generic0, seed: 1 },
    { name: 'nu=-1 generic', result: coldMinus, pairs: genericMinus, seed: 3 },
    { name: 'nu=+1 generic', result: coldPlus, pairs: genericPlus, seed: 4 },
    { name: 'standard', result: coldStandard, pairs: standard, seed: 2 },
  ].map((set) => ({ ...set, equal: equalCorrectness(set.pairs, set.result, set.seed) }));
  const notes = [
    `naive = multi-start Riemannian steepest descent with Armijo backtracking from ${NAIVE_STARTS} Haar-random`,
    `  frames per point (test/bench/naive.ts); each start stops at gradient < 1e-8 * scale, 2000 iterations,`,
    `  or when no step gives a decrease resolvable in double precision.`,
    `ours: minimiseEnergy(couplingsOf(model)) (cold) or with the neighbour's ground state as the only start`,
    `  (warm; neighbour couplings moved by up to ${NEIGHBOUR_STEP} each); microseconds per call timed over`,
    `  batches of ${BATCH} calls after a warm-up; median over models. naive: one timed solve per model`,
    `  (median of 5 for the standard models); warm rows compare with the same naive cold solve.`,
    `  A warm miss is a start that stayed on a metastable branch across a first-order transition.`,
    `miss = energy above the reference by more than ${MISS_TOLERANCE} * scale; reference = lowest of ours, a`,
    `  wider search of ours and ${REFERENCE_STARTS} naive starts.`,
    `naive misses by number of starts (prefixes of the ${REFERENCE_STARTS}-start run, which is part of the reference):`,
    ...sets.map(
      ({ name, result }) =>
        `  ${name.padEnd(14)} ` +
        result.naiveMissesByStarts
          .map(({ starts, misses }) => `${starts}: ${formatMisses(misses)}`)
          .join(', '),
    ),
    `naive at equal correctness (fewest starts with no more misses than ours, timed on the same models):`,
    ...sets.map(({ name, result, equal }) => {
      const ours = median(result.oursMicros);
      return equal === undefined
        ? `  ${name.padEnd(14)} none up to ${REFERENCE_STARTS} starts`
        : `  ${name.padEnd(14)} ${equal.starts} start${equal.starts === 1 ? '' : 's'}, ${formatMisses(equal.misses)} misses, ` +
            `${formatDuration(1000 * equal.medianMillis)} median, ${((1000 * equal.medianMillis) / ours).toPrecision(3)}x ours`;
    }),
    `worst miss / scale: ` +
      sets
        .map(
          ({ name, result }) =>
            `${name} ours ${result.oursMisses.worst.toPrecision(2)}, naive ${result.naiveMisses.worst.toPrecision(2)}`,
        )
        .join('; '),
    `naive starts: ` +
      sets
        .map(
          ({ name, result }) =>
            `${name} ${result.reference.naiveIterations.toFixed(0)} iterations on average, ` +
            `${(100 * result.reference.naiveUnconverged).toFixed(1)}% unconverged`,
        )
        .join('; '),
    `standard variants (uPerp, uZ): ${STANDARD_POINTS.map((p) => `${p.name} (${p.uPerp}, ${p.uZ})`).join(', ')}; zeeman 0.4.`,
    `map: standard model on the (u_perp, u_z) plane, per-pixel data and refined boundaries; in-process runs ` +
      mapInProcess.runsMillis.map((ms) => `${(ms / 1000).toFixed(2)} s`).join(', ') +
      ` (thread-pool start-up included); ${labels.size} phases (${[...labels].join(', ')}), ` +
      `${mapInProcess.map.boundaries.length} boundary polylines, ${mapInProcess.map.crossings.length} crossings.`,
    `map CLI (target rows): node fourfold.mjs map --model F --out X.json; output ` +
      (cliSameAsInProcess ? 'identical to' : 'DIFFERENT FROM') +
      ' the in-process map.',
    `solve CLI (target row): node fourfold.mjs solve, median ${median(solve.fourfold).toFixed(0)} ms; ` +
      `through npm run --silent solve (npm's start-up included) ${median(solve.npm).toFixed(0)} ms; ` +
      `tsx baseline ${median(solve.tsx).toFixed(0)} ms.`,
    `notebook-style baseline: BFGS with the analytic gradient from 8 random starts (test/bench/bfgs.ts), ` +
      `${bfgs.points} pixels spread over the plane, median ${bfgs.medianMicros.toFixed(0)} us per point.`,
    `certificate (every pixel's check that no fixed state lies below it, the full search it calls,`,
    `  the settling of degenerate pixels): pixel stage on one thread from the same coarse nodes,`,
    `  median of 3, with / without it; pixels sent to a full search:`,
    ...certificate.map(
      (c) =>
        `  ${c.name}: ${c.withMillis.toFixed(0)} ms / ${c.withoutMillis.toFixed(0)} ms ` +
        `(x${(c.withMillis / c.withoutMillis).toFixed(2)}); searched ${c.searched} of ${c.pixels} ` +
        `(${((100 * c.searched) / c.pixels).toFixed(3)} %)`,
    ),
    `naive map: one naive solve per pixel, no warm start, no adaptivity, no boundary refinement;`,
    `  ${naiveMap.samplePixels} pixels spread over the plane took ${(naiveMap.sampleMillis / 1000).toFixed(2)} s on one thread,`,
    `  extrapolated to ${MAP_RESOLUTION * MAP_RESOLUTION} pixels / ${cores} cores.`,
  ];

  const elapsed = (performance.now() - started) / 1000;
  const detail = `${formatTable(rows)}\n\n${notes.join('\n')}\n\nNode part took ${elapsed.toFixed(0)} s`;
  const targets = cliTargets(
    solve,
    map256,
    map2048,
    naiveMap.sampleMillis / naiveMap.samplePixels,
    cores,
    bfgs.medianMicros,
  );
  const json = {
    naiveStarts: NAIVE_STARTS,
    missTolerance: MISS_TOLERANCE,
    referenceStarts: REFERENCE_STARTS,
    rows: rows.map(rowToJson),
    naiveMissesByStarts: Object.fromEntries(
      sets.map(({ name, result }) => [name, result.naiveMissesByStarts]),
    ),
    naiveAtEqualCorrectness: Object.fromEntries(
      sets.map(({ name, equal }) => [name, equal ?? null]),
    ),
    naiveStartStatistics: Object.fromEntries(
      sets.map(({ name, result }) => [
        name,
        {
          meanIterations: result.reference.naiveIterations,
          unconvergedFraction: result.reference.naiveUnconverged,
        },
      ]),
    ),
    map: {
      resolution: MAP_RESOLUTION,
      threads: mapInProcess.threads,
      inProcessRunsMilliseconds: mapInProcess.runsMillis,
      cliOutputSameAsInProcess: cliSameAsInProcess,
      phases: [...labels],
      boundaries: mapInProcess.map.boundaries.length,
      crossings: mapInProcess.map.crossings.length,
      naiveSamplePixels: naiveMap.samplePixels,
      naiveSampleMilliseconds: naiveMap.sampleMillis,
      naiveExtrapolatedMilliseconds: naiveMap.extrapolatedMillis,
    },
    certificate,
    cli: {
      solveMilliseconds: solve,
      map256: { ...map256, firstOutput: undefined },
      map2048: map2048 && { ...map2048, firstOutput: undefined },
      bfgsPerPoint: bfgs,
    },
    elapsedSeconds: elapsed,
  };
  return { targets, detail, json };
}
