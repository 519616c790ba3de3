import { mkdirSync, writeFileSync } from 'node:fs';
import { arch, availableParallelism, cpus, loadavg, platform } from 'node:os';
import { join } from 'node:path';
import { probeModel, type Model } from '../../solver/index';
import { median } from './measure';
import { MAP_RESOLUTION, cliMap, inProcessMap, naiveMapEstimate } from './map';
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
 * `npm run bench`: speed of our solver against a naive baseline measured in the same run
 * (test/bench/naive.ts), with the miss rate of each against a common reference. Run through
 * test/bench/run.mjs, which bundles this file with esbuild as the CLI is bundled.
 */
export interface BenchOptions {
  /** Repository root (for fourfold.mjs and test-results/). */
  readonly root: string;
  /** Bundled workers/node/mapThread.ts. */
  readonly workerUrl: URL;
  /** Scratch directory for the CLI's model and output files. */
  readonly workDir: string;
  /** Generic models per filling. */
  readonly models: number;
  /** When the benchmark was bundled (ms since the epoch), to notice sources edited since. */
  readonly bundledAt: number;
}

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

export async function runBenchmark(options: BenchOptions): Promise<void> {
  const started = performance.now();
  const cores = availableParallelism();
  const machine = {
    cores,
    cpu: cpus()[0]?.model ?? 'unknown',
    node: process.version,
    platform: `${platform()} ${arch()}`,
    loadAverageAtStart: loadavg()[0]!,
  };
  const date = new Date().toISOString();
  const n = options.models;

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
  log('map through the CLI');
  const mapCli = cliMap(options.root, options.workDir, mapInProcess.map, options.bundledAt);
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
    {
      key: 'map-cli',
      measurement: `map ${MAP_RESOLUTION}x${MAP_RESOLUTION}, CLI end to end (one run)`,
      oursMicroseconds: 1000 * mapCli.millis,
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
    `map CLI: node fourfold.mjs map --model F --out X.json, bundle prebuilt; output ` +
      (mapCli.sameAsInProcess ? 'identical to' : 'DIFFERENT FROM') +
      ' the in-process map' +
      (mapCli.sourcesChanged
        ? ' (the CLI sources were edited during the run: the CLI ran newer code).'
        : '.'),
    `naive map: one naive solve per pixel, no warm start, no adaptivity, no boundary refinement;`,
    `  ${naiveMap.samplePixels} pixels spread over the plane took ${(naiveMap.sampleMillis / 1000).toFixed(2)} s on one thread,`,
    `  extrapolated to ${MAP_RESOLUTION * MAP_RESOLUTION} pixels / ${cores} cores.`,
  ];

  // Other processes on the machine inflate wall times: show the 1-minute load around the run.
  const loadAtEnd = loadavg()[0]!;
  const title =
    `Fourfold benchmark, ${date}\n` +
    `machine: ${machine.cores} cores (${machine.cpu}), node ${machine.node}, ${machine.platform}; ` +
    `load average ${machine.loadAverageAtStart.toFixed(2)} at start, ${loadAtEnd.toFixed(2)} at end`;
  const elapsed = (performance.now() - started) / 1000;
  process.stdout.write(
    `${title}\n\n${formatTable(rows)}\n\n${notes.join('\n')}\n\nbenchmark took ${elapsed.toFixed(0)} s\n`,
  );

  const resultsDir = join(options.root, 'test-results');
  mkdirSync(resultsDir, { recursive: true });
  const json = {
    date,
    machine: { ...machine, loadAverageAtEnd: loadAtEnd },
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
      cliMilliseconds: mapCli.millis,
      cliOutputSameAsInProcess: mapCli.sameAsInProcess,
      cliSourcesEditedDuringRun: mapCli.sourcesChanged,
      phases: [...labels],
      boundaries: mapInProcess.map.boundaries.length,
      crossings: mapInProcess.map.crossings.length,
      naiveSamplePixels: naiveMap.samplePixels,
      naiveSampleMilliseconds: naiveMap.sampleMillis,
      naiveExtrapolatedMilliseconds: naiveMap.extrapolatedMillis,
    },
    elapsedSeconds: elapsed,
  };
  writeFileSync(join(resultsDir, 'bench.json'), JSON.stringify(json, null, 2) + '\n');
  log(`wrote ${join('test-results', 'bench.json')}`);
}
