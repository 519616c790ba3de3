import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, test, type Download, type Page } from '@playwright/test';
import { modelToJson, parseMapInput } from '../solver/index';
import { FOCK_ONLY_SCENARIO } from '../test/scenarios';
import { failOnConsoleErrors } from './demoPage';

failOnConsoleErrors();

/**
 * An invented generic sample: H != F, a bare-number channel, a Fock target on a channel that is
 * not listed (its Hartree part follows the axis), a one-body term, E_X, a name, and an axis
 * that mixes a coupling with E_Z.
 */
const GENERIC = {
  name: 'an invented generic sample',
  filling: 0,
  channels: {
    x0: { hartree: -0.6, fock: -0.9 },
    y0: { hartree: -0.6, fock: -0.9 },
    z0: { hartree: 1.1, fock: 0.7 },
    zz: { hartree: 0.25, fock: -0.15 },
    xz: 0.2,
  },
  zeeman: 0.35,
  valleyZeeman: -0.05,
  oneBody: { zx: 0.03 },
  exchange: 0.8,
  plane: {
    x: {
      label: 'u_perp mix',
      from: -1.5,
      to: 1,
      targets: { 'x0.fock': 1, 'y0.fock': 1, '0z.fock': 0.3 },
    },
    y: { label: 'u_z and E_Z', from: -1.2, to: 1.2, targets: { 'z0.fock': 1, zeeman: 0.2 } },
    resolution: [96, 80],
  },
};

interface MapJson {
  x: number[];
  y: number[];
  phase: string[][];
  energy: number[][];
  model: unknown;
  plane: unknown;
}

/** The `map` JSON of `npm run --silent map` for a scenario file. */
function cliMap(scenario: object): MapJson {
  const dir = mkdtempSync(join(tmpdir(), 'fourfold-e2e-'));
  writeFileSync(join(dir, 'scenario.json'), JSON.stringify(scenario));
  execFileSync(
    'npm',
    [
      'run',
      '--silent',
      'map',
      '--',
      '--model',
      join(dir, 'scenario.json'),
      '--out',
      join(dir, 'map.json'),
    ],
    { encoding: 'utf8' },
  );
  return JSON.parse(readFileSync(join(dir, 'map.json'), 'utf8')) as MapJson;
}

/** Largest magnitude of a coupling, field or axis end in a scenario: the energy scale. */
function couplingScale(value: unknown): number {
  if (typeof value === 'number') return Math.abs(value);
  if (Array.isArray(value) || (typeof value === 'object' && value !== null)) {
    return Math.max(0, ...Object.values(value).map(couplingScale));
  }
  return 0;
}

/** Loads a scenario file through Load scenario and waits for its finished Map. */
async function loadAndMap(page: Page, name: string, scenario: { plane: object }): Promise<void> {
  await page.goto('/');
  await page.getByTestId('scenario-file').setInputFiles({
    name,
    mimeType: 'application/json',
    buffer: Buffer.from(JSON.stringify(scenario)),
  });
  await expect(page.getByTestId('notice')).toHaveText(`Loaded "${name}".`);
  const [nx, ny] = (scenario.plane as { resolution: [number, number] }).resolution;
  const status = page.getByTestId('map-status');
  await expect(status).toContainText(`${nx} × ${ny}`, { timeout: 120_000 });
  await expect(status).toHaveAttribute('data-phase', 'done', { timeout: 120_000 });
}

/** The Map as the figure bar exports it (every pixel solved first). */
async function exportedMap(page: Page): Promise<MapJson> {
  const [file] = await Promise.all([
    page.waitForEvent('download', { timeout: 120_000 }) as Promise<Download>,
    page.getByTestId('export-json').click(),
  ]);
  return JSON.parse(readFileSync((await file.path())!, 'utf8')) as MapJson;
}

/** Pixels where the labels differ or the energies differ by more than `tolerance`. */
function differences(browser: MapJson, cli: MapJson, tolerance: number): string[] {
  const out: string[] = [];
  cli.phase.forEach((row, j) =>
    row.forEach((label, i) => {
      const b = browser.phase[j]![i];
      const de = Math.abs(browser.energy[j]![i]! - cli.energy[j]![i]!);
      if (b !== label || !(de <= tolerance)) {
        out.push(
          `(i ${i}, j ${j}) at (${cli.x[i]}, ${cli.y[j]}): app ${b}, CLI ${label}, |dE| ${de}`,
        );
      }
    }),
  );
  return out;
}

for (const [name, scenario] of [
  ['fock-only-axes.json', FOCK_ONLY_SCENARIO],
  ['generic-sample.json', GENERIC],
] as const) {
  test(`Load scenario ${name}: the app maps and saves what npm run map maps`, async ({ page }) => {
    test.setTimeout(300_000);
    await loadAndMap(page, name, scenario);
    const cli = cliMap(scenario);

    // Save scenario writes the model and plane of the file, unchanged.
    const [saved] = await Promise.all([
      page.waitForEvent('download') as Promise<Download>,
      page.getByTestId('scenario-save').click(),
    ]);
    const savedJson = JSON.parse(readFileSync((await saved.path())!, 'utf8')) as unknown;
    expect(parseMapInput(savedJson)).toEqual(parseMapInput(scenario));
    expect(modelToJson(parseMapInput(savedJson).model)).toEqual(cli.model);

    const browser = await exportedMap(page);
    expect(browser.model).toEqual(cli.model);
    expect(browser.plane).toEqual(cli.plane);
    expect(browser.x).toEqual(cli.x);
    expect(browser.y).toEqual(cli.y);
    const tolerance = 1e-9 * couplingScale(scenario);
    const diff = differences(browser, cli, tolerance);
    expect(
      diff.slice(0, 20),
      `${diff.length} of ${cli.x.length * cli.y.length} pixels differ`,
    ).toEqual([]);
  });
}
