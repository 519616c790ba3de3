#!/usr/bin/env node
// `npm run bench`: one table of every target (measured value, its baseline measured in the same
// run, the target, met or not), then the details. The Node part (test/bench/bench.ts, bundled
// with esbuild as the CLI is, since on-the-fly transpilation would run the measured code several
// times slower) times the command line end to end and the solver against naive baselines; the
// browser part (test/bench/browser.mjs) drives the Map in Debian's Chromium. Results also go to
// test-results/bench.json.
// Options: --models N (generic models per filling, default 200), --node-only, --browser-only,
// --quick (skips the 2048 x 2048 map), --port N (browser part's server, default 4318).
import { execFileSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { arch, availableParallelism, cpus, loadavg, platform } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { formatTargetTable, targetRowsToJson } from './targetTable.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const outDir = join(root, 'node_modules', '.cache', 'fourfold-bench');

function integerOption(argv, name, fallback, min) {
  const k = argv.indexOf(name);
  if (k < 0) return fallback;
  const n = Number(argv[k + 1]);
  if (!Number.isInteger(n) || n < min) {
    process.stderr.write(`bench: ${name}: expected an integer >= ${min}, got ${argv[k + 1]}\n`);
    process.exit(2);
  }
  return n;
}

const args = process.argv.slice(2);
const models = integerOption(args, '--models', 200, 1);
const port = integerOption(args, '--port', 4318, 1024);
const quick = args.includes('--quick');
const nodePart = !args.includes('--browser-only');
const browserPart = !args.includes('--node-only');

const started = Date.now();
const loadAtStart = loadavg()[0];
const targets = [];
const details = [];
const json = {};

if (nodePart) {
  // The CLI's own bundle, so that no timed run builds it.
  execFileSync(process.execPath, [join(root, 'fourfold.mjs'), '--bundle'], { stdio: 'inherit' });
  const { build } = await import('esbuild');
  mkdirSync(outDir, { recursive: true });
  await build({
    entryPoints: {
      bench: join(root, 'test/bench/bench.ts'),
      mapThread: join(root, 'workers/node/mapThread.ts'),
    },
    outdir: outDir,
    outExtension: { '.js': '.mjs' },
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    logLevel: 'warning',
  });
  const { runBenchmark } = await import(pathToFileURL(join(outDir, 'bench.mjs')).href);
  const node = await runBenchmark({
    root,
    workerUrl: pathToFileURL(join(outDir, 'mapThread.mjs')),
    workDir: outDir,
    models,
    quick,
  });
  targets.push(...node.targets);
  details.push(`Solver detail (ours against a naive baseline in the same run):\n\n${node.detail}`);
  json.node = node.json;
}

if (browserPart) {
  const { runBrowserBenchmark } = await import('./browser.mjs');
  const browser = await runBrowserBenchmark({ root, port });
  // Browser rows first: the Map is what the benchmark is mostly about.
  targets.unshift(...browser.rows);
  details.unshift(`In Chromium:\n${browser.details.text}`);
  json.browser = browser.details.json;
}

const loadAtEnd = loadavg()[0];
const machine = {
  cores: availableParallelism(),
  cpu: cpus()[0]?.model ?? 'unknown',
  node: process.version,
  platform: `${platform()} ${arch()}`,
  loadAverageAtStart: loadAtStart,
  loadAverageAtEnd: loadAtEnd,
};
const date = new Date().toISOString();
const met = targets.filter((row) => targetRowsToJson([row])[0].met).length;
// Other processes on the machine inflate wall times: show the 1-minute load around the run.
process.stdout.write(
  [
    `Fourfold benchmark, ${date}`,
    `machine: ${machine.cores} cores (${machine.cpu}), node ${machine.node}, ${machine.platform}; ` +
      `load average ${loadAtStart.toFixed(2)} at start, ${loadAtEnd.toFixed(2)} at end`,
    '',
    formatTargetTable(targets),
    '',
    `${met} of ${targets.length} targets met.`,
    '',
    ...details.flatMap((d) => [d, '']),
    `benchmark took ${((Date.now() - started) / 1000).toFixed(0)} s`,
  ].join('\n') + '\n',
);

mkdirSync(join(root, 'test-results'), { recursive: true });
writeFileSync(
  join(root, 'test-results', 'bench.json'),
  JSON.stringify({ date, machine, targets: targetRowsToJson(targets), ...json }, null, 2) + '\n',
);
process.stderr.write(`bench: wrote ${join('test-results', 'bench.json')}\n`);
