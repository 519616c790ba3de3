#!/usr/bin/env node
// `npm run bench`: bundles the benchmark and the Map worker thread with esbuild (as fourfold.mjs
// bundles the CLI; on-the-fly transpilation would run the measured code several times slower),
// then runs it; then the in-browser part (test/bench/browser.mjs: the Map in Debian's Chromium).
// Options: --models N (generic models per filling, default 200), --node-only, --browser-only.
import { mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const outDir = join(root, 'node_modules', '.cache', 'fourfold-bench');

function parseModels(argv) {
  const k = argv.indexOf('--models');
  if (k < 0) return 200;
  const n = Number(argv[k + 1]);
  if (!Number.isInteger(n) || n < 1) {
    process.stderr.write(`bench: --models: expected a positive integer, got ${argv[k + 1]}\n`);
    process.exit(2);
  }
  return n;
}

const args = process.argv.slice(2);
const models = parseModels(args);
const nodePart = !args.includes('--browser-only');
const browserPart = !args.includes('--node-only');
if (nodePart) {
  const bundledAt = Date.now();
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
  await runBenchmark({
    root,
    workerUrl: pathToFileURL(join(outDir, 'mapThread.mjs')),
    workDir: outDir,
    models,
    bundledAt,
  });
}

if (browserPart) {
  const { runBrowserBenchmark, printBrowserReport } = await import('./browser.mjs');
  printBrowserReport(root, await runBrowserBenchmark({ root }));
}
