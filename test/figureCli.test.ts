import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, expect, test } from 'vitest';
import { mapFigureSvg } from '../app/figure/mapFigure';
import { computePhaseMap, parseMapInput } from '../solver/index';
import { INTERFACES_EXAMPLE, standardPlane } from './fixtures';

// `map --out X.svg` draws with the same function as the app's export button.

const repoRoot = resolve(fileURLToPath(new URL('.', import.meta.url)), '..');
const dir = mkdtempSync(join(tmpdir(), 'fourfold-figure-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const scenario = { ...INTERFACES_EXAMPLE, plane: standardPlane(16, 16) };

function fourfold(...args: string[]) {
  return spawnSync(process.execPath, ['fourfold.mjs', ...args], {
    cwd: repoRoot,
    encoding: 'utf8',
  });
}

test('map --out X.svg --column double --title T is mapFigureSvg of the same Map', async () => {
  const model = join(dir, 'model.json');
  const out = join(dir, 'map.svg');
  writeFileSync(model, JSON.stringify(scenario));
  const run = fourfold(
    'map',
    '--model',
    model,
    '--out',
    out,
    '--column',
    'double',
    '--title',
    'E_Z = 0.4',
  );
  expect(run.stderr).toBe('');
  expect(run.status).toBe(0);
  const svg = readFileSync(out, 'utf8');
  expect(svg).toContain('width="17.8cm"');
  // The Map is the same bit for bit whatever the thread count (README), so is the figure.
  const map = await computePhaseMap(parseMapInput(scenario));
  expect(svg).toBe(mapFigureSvg(map, { column: 'double', title: 'E_Z = 0.4' }));
}, 60_000);

test('a bad --column is refused in one line with exit code 2', () => {
  const run = fourfold('map', '--model', 'x.json', '--out', 'x.svg', '--column', 'wide');
  expect(run.status).toBe(2);
  expect(run.stderr).toBe('fourfold: --column: expected single or double, got "wide"\n');
});
