// Prepares a fresh machine for `npm start` / `npm test`: installs the locked dependencies when
// they are missing or stale and, with --browser, Debian's Chromium for the browser tests.
// Node builtins only: this runs before node_modules exists.
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const repoRoot = join(dirname(fileURLToPath(import.meta.url)), '..');
const wantBrowser = process.argv.includes('--browser');

function run(command, args, env = process.env) {
  const outcome = spawnSync(command, args, { cwd: repoRoot, stdio: 'inherit', env });
  if (outcome.error) {
    console.error(`ensure: could not run ${command}: ${outcome.error.message}`);
    process.exit(1);
  }
  if (outcome.status !== 0) {
    console.error(`ensure: ${command} ${args.join(' ')} failed`);
    process.exit(outcome.status ?? 1);
  }
}

function modifiedAt(path) {
  return existsSync(path) ? statSync(path).mtimeMs : -Infinity;
}

function dependenciesAreCurrent() {
  const modules = join(repoRoot, 'node_modules');
  if (!existsSync(modules)) return false;
  // npm rewrites node_modules/.package-lock.json on every install, even when no folder changes.
  const installedAt = Math.max(
    modifiedAt(modules),
    modifiedAt(join(modules, '.package-lock.json')),
  );
  return installedAt >= modifiedAt(join(repoRoot, 'package-lock.json'));
}

function ensureChromium() {
  const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
  if (existsSync(chromium)) return;
  if (process.env.CHROMIUM_PATH) {
    console.error(`ensure: CHROMIUM_PATH is set to ${chromium}, but no file is there.`);
    process.exit(1);
  }
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) {
    console.error(
      [
        'ensure: the browser tests need Chromium at /usr/bin/chromium, and it is missing.',
        'Install it as root (Debian/Ubuntu: `sudo apt-get install -y chromium`),',
        'or point CHROMIUM_PATH at an existing Chromium or Chrome binary.',
      ].join('\n'),
    );
    process.exit(1);
  }
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  console.log('ensure: installing Chromium with apt-get');
  run('apt-get', ['update'], env);
  run('apt-get', ['install', '-y', 'chromium'], env);
  if (!existsSync(chromium)) {
    console.error(`ensure: apt-get finished, but ${chromium} is still missing.`);
    process.exit(1);
  }
}

if (!dependenciesAreCurrent()) {
  console.log('ensure: installing dependencies with npm ci');
  run('npm', ['ci']);
}
if (wantBrowser) ensureChromium();
