// `npm start`: builds the app into dist/ only when a source changed since the last build (the
// newest modification time of the files and folders the build reads, against a stamp written
// into dist/ after a successful build), so that starting again is instant. Node builtins only.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const repoRoot = join(dirname(fileURLToPath(import.meta.url)), '..');
const outDir = join(repoRoot, 'dist');
const stampFile = join(outDir, '.fourfold-build');
/** What `vite build` reads (app/ holds index.html); a removed file shows in its folder's time. */
const SOURCES = [
  'app',
  'solver',
  'workers',
  'public',
  'vite.config.ts',
  'tsconfig.json',
  'package.json',
  'package-lock.json',
];

function newest(path) {
  const s = statSync(path);
  if (!s.isDirectory()) return s.mtimeMs;
  let latest = s.mtimeMs;
  for (const entry of readdirSync(path)) latest = Math.max(latest, newest(join(path, entry)));
  return latest;
}

function builtAt() {
  try {
    return Number(readFileSync(stampFile, 'utf8'));
  } catch {
    return -Infinity;
  }
}

const sourcesAt = Math.max(
  ...SOURCES.map((s) => join(repoRoot, s))
    .filter(existsSync)
    .map(newest),
);
if (sourcesAt > builtAt() || !existsSync(join(outDir, 'index.html'))) {
  console.log('fresh-build: sources changed since the last build; building the app (vite build)');
  const vite = join(repoRoot, 'node_modules', 'vite', 'bin', 'vite.js');
  const outcome = spawnSync(process.execPath, [vite, 'build', '--logLevel', 'warn'], {
    cwd: repoRoot,
    stdio: 'inherit',
  });
  if (outcome.status !== 0) {
    console.error('fresh-build: vite build failed (see above); fix the sources and start again');
    process.exit(outcome.status ?? 1);
  }
  // The time of the sources the build read: a file saved during the build is newer, so the next
  // start builds again.
  writeFileSync(stampFile, String(sourcesAt));
}
