import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import {
  BUSY_MACHINE_MS,
  DEMO,
  demoModelAt,
  failOnConsoleErrors,
  mapDone,
  pointAt,
} from './demoPage';

failOnConsoleErrors();

async function pinAt(page: Page, x: number, y: number): Promise<void> {
  const [px, py] = await pointAt(page, x, y);
  await page.mouse.click(px, py);
}

interface CliSolve {
  phase: string;
  energy: number;
  gap: number;
  modes: number[];
  goldstone: number;
  levels: number[];
  angles: { canting: number | null };
}

function cliSolve(model: object): CliSolve {
  const dir = mkdtempSync(join(tmpdir(), 'fourfold-e2e-'));
  writeFileSync(join(dir, 'point.json'), JSON.stringify(model));
  return JSON.parse(
    execFileSync('npm', ['run', '--silent', 'solve', '--', '--model', join(dir, 'point.json')], {
      encoding: 'utf8',
    }),
  ) as CliSolve;
}

test('a clicked point shows the same ground state as `npm run --silent solve`', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  // A CAF point of the demo: cos(theta) = E_Z / (4 |uPerp_F|) (public/notes.html#closed-forms).
  // Well inside CAF: its line to KD at u_z = 0.9 lies near uPerp = -0.69 and to F at -0.15, so
  // the pixel a click lands on is CAF whatever the size of the plot.
  await pinAt(page, -0.4, 0.9);
  const details = page.getByTestId('probe-details');
  await expect(details).toBeVisible({ timeout: BUSY_MACHINE_MS });
  const x = Number(await details.getAttribute('data-x'));
  const y = Number(await details.getAttribute('data-y'));
  expect(Math.abs(x - -0.4)).toBeLessThan(0.02);
  expect(Math.abs(y - 0.9)).toBeLessThan(0.02);

  const cli = cliSolve(demoModelAt(x, y));
  await expect(page.getByTestId('probe-phase')).toHaveText(cli.phase);
  expect(cli.phase).toBe('CAF');
  const value = async (id: string) => Number(await page.getByTestId(id).getAttribute('data-value'));
  expect(await value('probe-energy')).toBeCloseTo(cli.energy, 9);
  expect(await value('probe-gap')).toBeCloseTo(cli.gap, 6);
  expect(await value('probe-goldstone')).toBe(cli.goldstone);
  const modes = await page
    .getByTestId('probe-modes')
    .locator('li')
    .evaluateAll((items) => items.map((li) => Number(li.getAttribute('data-value'))));
  expect(modes).toHaveLength(cli.modes.length);
  modes.forEach((w, k) => expect(w).toBeCloseTo(cli.modes[k]!, 6));
  const levels = await page
    .getByTestId('probe-levels')
    .locator('li')
    .evaluateAll((items) => items.map((li) => Number(li.getAttribute('data-value'))));
  // Compared as numbers: a level such as -117/128 sits exactly on a rounding edge of toFixed(6).
  const sorted = [...levels].sort((a, b) => a - b);
  expect(sorted).toHaveLength(cli.levels.length);
  sorted.forEach((e, k) => expect(e).toBeCloseTo(cli.levels[k]!, 6));
  // Canting of both sublattice spins, against the CLI and the closed form.
  const cosA = Number(await page.getByTestId('probe-spin-a').getAttribute('data-cos'));
  const cosB = Number(await page.getByTestId('probe-spin-b').getAttribute('data-cos'));
  expect(cosA).toBeCloseTo(Math.cos(cli.angles.canting!), 6);
  expect(cosB).toBeCloseTo(cosA, 9);
  expect(cosA).toBeCloseTo(DEMO.zeeman / (4 * Math.abs(x)), 6);
  await expect(page.getByTestId('probe-modes')).toContainText('spin rotation about the field');
  await page.getByTestId('probe').screenshot({ path: 'test-results/screenshots/probe-caf.png' });
});

test('pins: several at once, each marked on the Map, removable, kept on reload and in the link; Probe JSON export', async ({
  page,
  browser,
}) => {
  await page.goto('/');
  await mapDone(page);
  await pinAt(page, -1.5, 1.5); // KD
  await expect(page.getByTestId('probe-details')).toHaveAttribute('data-phase', 'KD', {
    timeout: BUSY_MACHINE_MS,
  });
  await pinAt(page, 0.5, 1.5); // F
  await expect(page.getByTestId('probe-details')).toHaveAttribute('data-phase', 'F', {
    timeout: BUSY_MACHINE_MS,
  });
  await pinAt(page, -0.2, -1.7); // CDW
  await expect(page.getByTestId('probe-details')).toHaveAttribute('data-phase', 'CDW', {
    timeout: BUSY_MACHINE_MS,
  });
  await expect(page.locator('[data-testid^="map-pin-"]')).toHaveCount(3);

  // The lattice pictures differ: CDW sites are unequal, KD bonds are.
  const cdwSites = await page
    .getByTestId('probe-lattice')
    .locator('circle[data-sublattice]')
    .evaluateAll((cs) => [...new Set(cs.map((c) => c.getAttribute('r')))]);
  expect(cdwSites.length).toBe(2);
  await page.getByTestId('probe-pin-1').locator('.probe-pin-select').click();
  await expect(page.getByTestId('probe-details')).toHaveAttribute('data-phase', 'KD');
  const kdBondWidths = await page
    .getByTestId('probe-lattice')
    .locator('line[data-class]')
    .evaluateAll((ls) => [...new Set(ls.map((l) => l.getAttribute('stroke-width')))]);
  expect(kdBondWidths.length).toBe(2);

  // Probe JSON: the report with the point, the model's state and the version.
  const download = page.waitForEvent('download');
  await page.getByTestId('probe-export-json').click();
  const file = await (await download).path();
  const json = JSON.parse(readFileSync(file, 'utf8')) as {
    format: string;
    version: string;
    point: { x: number; y: number };
    state: { phase: string; energy: number; model: { filling: number } };
    caution: string;
  };
  expect(json.format).toBe('fourfold-probe');
  expect(json.state.phase).toBe('KD');
  expect(json.state.energy).toBeCloseTo(
    Number(await page.getByTestId('probe-energy').getAttribute('data-value')),
    12,
  );
  expect(json.caution).toMatch(/Mean-field/);

  await page.getByTestId('probe-remove-2').click();
  await expect(page.locator('[data-testid^="map-pin-"]')).toHaveCount(2);
  await page.reload();
  await mapDone(page);
  await expect(page.locator('[data-testid^="map-pin-"]')).toHaveCount(2);
  await expect(page.getByTestId('probe-details')).toHaveAttribute('data-phase', 'CDW', {
    timeout: BUSY_MACHINE_MS,
  });
  await page.screenshot({ path: 'test-results/screenshots/probe-pins.png', fullPage: true });

  // The link carries the pins: a fresh browser (no autosave) opened on it shows them.
  await expect(page).toHaveURL(/#s=/);
  const fresh = await browser.newContext();
  const other = await fresh.newPage();
  await other.goto(page.url());
  await mapDone(other);
  await expect(other.locator('[data-testid^="map-pin-"]')).toHaveCount(2);
  await expect(other.getByTestId('probe-details')).toHaveAttribute('data-phase', 'CDW', {
    timeout: BUSY_MACHINE_MS,
  });
  await fresh.close();
});

test('a point pinned by typed coordinates; bad entries are named and pin nothing', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  await page.getByTestId('pin-entry-x').fill('abc');
  await page.getByTestId('pin-entry-y').fill('1.5');
  await page.getByTestId('pin-entry-submit').click();
  await expect(page.getByTestId('pin-entry-problem')).toContainText('u_perp');
  await page.getByTestId('pin-entry-x').fill('NaN');
  await page.getByTestId('pin-entry-submit').click();
  await expect(page.getByTestId('pin-entry-problem')).toBeVisible();
  await expect(page.locator('[data-testid^="map-pin-"]')).toHaveCount(0);

  await page.getByTestId('pin-entry-x').fill('-1.5');
  await page.getByTestId('pin-entry-submit').click();
  await expect(page.getByTestId('pin-entry-problem')).toHaveCount(0);
  await expect(page.getByTestId('probe-details')).toHaveAttribute('data-phase', 'KD', {
    timeout: BUSY_MACHINE_MS,
  });
  // KD: E = 2 uPerp_H - uPerp_F with the demo's uPerp_H = 1.2 uPerp_F
  // (public/notes.html#closed-forms).
  const energy = Number(await page.getByTestId('probe-energy').getAttribute('data-value'));
  expect(energy).toBeCloseTo(2 * DEMO.ratioPerp * -1.5 - -1.5, 9);
});
