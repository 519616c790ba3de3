#!/usr/bin/env node
// Command-line entry: runs the CLI bundle in node_modules/.cache/fourfold-cli/ (esbuild, built
// ahead of time by `npm ci` / `npm install` and before `npm test`; bundled code runs several
// times faster than on-the-fly transpilation). Each start checks that the bundle is current with
// one small read and a stat of every file that went into it (about 1 ms): an edited, added or
// removed source rebuilds it first, so the CLI never runs stale code.
//   node fourfold.mjs --bundle    build the bundle if it is not current, and exit
import { existsSync, mkdirSync, readdirSync, readFileSync, renameSync, rmSync } from 'node:fs';
import { statSync, writeFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = dirname(fileURLToPath(import.meta.url));
const cacheDir = join(root, 'node_modules', '.cache', 'fourfold-cli');
/** Names the current build's folder and lists its inputs with their size and time. */
const stampFile = join(cacheDir, 'stamp.json');
/** Builds kept besides the current one, for CLI runs still using them. */
const KEEP_BUILDS = 2;

/** [path from the root, mtimeMs, size] of a file, or null if it is gone. */
function fingerprint(path) {
  try {
    const s = statSync(join(root, path));
    return [path, s.mtimeMs, s.size];
  } catch {
    return null;
  }
}

/** The current build's folder, or null when the stamp is missing or any input changed. */
function currentBuild() {
  let stamp;
  try {
    stamp = JSON.parse(readFileSync(stampFile, 'utf8'));
  } catch {
    return null;
  }
  for (const [path, mtimeMs, size] of stamp.inputs) {
    const now = fingerprint(path);
    if (now === null || now[1] !== mtimeMs || now[2] !== size) return null;
  }
  const dir = join(cacheDir, stamp.build);
  return existsSync(join(dir, 'cli.mjs')) ? dir : null;
}

/**
 * Bundles cli.ts and the Map's worker thread into a fresh folder (shared code and the figure
 * code that only some commands load go into chunks of their own), then points the stamp at it.
 * Concurrent builds are harmless: each writes its own folder, the last stamp wins.
 */
async function build() {
  const { build: esbuild } = await import('esbuild');
  const id = `build-${Date.now()}-${process.pid}`;
  const dir = join(cacheDir, id);
  mkdirSync(dir, { recursive: true });
  const started = Date.now();
  const result = await esbuild({
    absWorkingDir: root,
    entryPoints: { cli: 'cli.ts', mapThread: 'workers/node/mapThread.ts' },
    outdir: dir,
    outExtension: { '.js': '.mjs' },
    bundle: true,
    splitting: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    metafile: true,
    logLevel: 'silent',
  });
  const inputs = Object.keys(result.metafile.inputs).map(fingerprint);
  if (inputs.some((f) => f === null || f[1] > started)) {
    // A source changed while it was read: leave no stamp, so that the next start rebuilds.
    return dir;
  }
  const temp = `${stampFile}.${process.pid}`;
  writeFileSync(temp, JSON.stringify({ build: id, inputs }));
  renameSync(temp, stampFile);
  const older = readdirSync(cacheDir)
    .filter((name) => name.startsWith('build-') && name !== id)
    .sort((a, b) => Number(b.split('-')[1]) - Number(a.split('-')[1]));
  for (const name of older.slice(KEEP_BUILDS)) {
    rmSync(join(cacheDir, name), { recursive: true, force: true });
  }
  return dir;
}

async function bundle() {
  const current = currentBuild();
  if (current !== null) return current;
  try {
    return await build();
  } catch (error) {
    process.stderr.write(
      `fourfold: cannot build the command-line tool in ${relative(root, cacheDir)} ` +
        `(${String(error).split('\n')[0]}); run npm install\n`,
    );
    process.exit(1);
  }
}

const dir = await bundle();
if (process.argv[2] !== '--bundle') {
  const { main } = await import(pathToFileURL(join(dir, 'cli.mjs')).href);
  process.exitCode = await main(process.argv.slice(2));
}
