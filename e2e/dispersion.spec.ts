import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { parseCsvStrictly, parseXmlStrictly, textsOf } from '../test/strictParsers';
import { coulombScaleMeV } from '../solver/index';
import { BUSY_MACHINE_MS, failOnConsoleErrors, mapDone, pointAt } from './demoPage';

failOnConsoleErrors();

async function download(page: Page, testId: string): Promise<string> {
  const event = page.waitForEvent('download');
  await page.getByTestId(testId).click();
  return readFileSync(await (await event).path(), 'utf8');
}

test('the dispersion of a pinned point: q = 0 equals the Probe, exports as SVG, CSV and JSON', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  // A CAF point of the demo, well inside CAF (as in probe.spec.ts).
  const [px, py] = await pointAt(page, -0.4, 0.9);
  await page.mouse.click(px, py);
  await expect(page.getByTestId('probe-details')).toBeVisible({ timeout: BUSY_MACHINE_MS });
  const modes = await page
    .getByTestId('probe-modes')
    .locator('li')
    .evaluateAll((items) => items.map((li) => Number(li.getAttribute('data-value'))));
  expect(modes).toHaveLength(4);

  const panel = page.getByTestId('dispersion');
  await panel.locator('summary').click();
  const status = page.getByTestId('dispersion-status');
  // The demo is dimensionless and sets no Coulomb scale: the panel asks for one.
  await expect(status).toHaveAttribute('data-status', 'waiting');
  await page.getByTestId('dispersion-coulomb').fill('-1');
  await expect(panel.getByRole('alert')).toContainText('Coulomb scale');
  await page.getByTestId('dispersion-coulomb').fill('4');
  await page.getByTestId('dispersion-coulomb').press('Enter');
  await expect(status).toHaveAttribute('data-status', 'done', { timeout: BUSY_MACHINE_MS });
  await expect(page.getByTestId('dispersion-chart')).toBeVisible();
  await expect(page.getByTestId('dispersion-chart')).toHaveAttribute('data-branches', '4');

  // The Probe is computed again for the new scenario (it now carries the Coulomb scale); its
  // q = 0 modes and the dispersion's gaps are the same numbers.
  await expect(page.getByTestId('probe-details')).toBeVisible({ timeout: BUSY_MACHINE_MS });
  const again = await page
    .getByTestId('probe-modes')
    .locator('li')
    .evaluateAll((items) => items.map((li) => Number(li.getAttribute('data-value'))));
  const gaps = await page
    .getByTestId('dispersion-table')
    .locator('tbody tr')
    .evaluateAll((rows) => rows.map((r) => Number(r.getAttribute('data-gap'))));
  expect(gaps).toHaveLength(4);
  gaps.forEach((g, k) => {
    expect(Math.abs(g - again[k]!)).toBeLessThan(1e-12);
    expect(Math.abs(g - modes[k]!)).toBeLessThan(1e-12);
  });
  // CAF: one Goldstone branch (spin rotation about the field), marked on the chart.
  await expect(page.getByTestId('dispersion-goldstone-mark')).toHaveCount(1);
  // The colours' legend names the spin rotation about the field first; the open panel is two
  // columns wide, so the chart keeps its own size (460 px).
  await expect(page.getByTestId('dispersion-legend').locator('li').first()).toHaveText(
    'σz: spin about the field',
  );
  expect((await page.getByTestId('dispersion-chart').boundingBox())!.width).toBeGreaterThan(455);
  await expect(page.getByTestId('dispersion-chart')).toContainText('ω (model unit)');

  const svg = await download(page, 'dispersion-export-svg');
  const doc = parseXmlStrictly(svg);
  expect(doc.documentElement!.getAttribute('width')).toBe('8.6cm');
  expect(textsOf(doc).join(' ')).toContain('spin about the field');

  const csv = parseCsvStrictly(await download(page, 'dispersion-export-csv'));
  expect(csv.header.slice(0, 5)).toEqual(['q', 'omega_1', 'omega_2', 'omega_3', 'omega_4']);
  expect(csv.rows).toHaveLength(61);
  expect(Number(csv.rows[0]![1])).toBe(gaps[0]);

  const json = JSON.parse(await download(page, 'dispersion-export-json')) as {
    format: string;
    q: number[];
    branches: number[][];
    goldstone: boolean[];
    velocities: (number | null)[];
    coulomb: number;
    model: { coulomb: number };
    caution: string;
  };
  expect(json.format).toBe('fourfold-modes');
  expect(json.q).toHaveLength(61);
  expect(json.branches.map((b) => b[0])).toEqual(gaps);
  expect(json.goldstone).toEqual([true, false, false, false]);
  expect(json.velocities[0]).toBeGreaterThan(0);
  expect(json.coulomb).toBe(4);
  expect(json.model.coulomb).toBe(4);
  expect(json.caution).toContain('Landau-level mixing');

  // The scale is kept in the scenario: a reload shows it again.
  await page.reload();
  await expect(page.getByTestId('probe-details')).toBeVisible({ timeout: BUSY_MACHINE_MS });
  await page.getByTestId('dispersion').locator('summary').click();
  await expect(page.getByTestId('dispersion-coulomb')).toHaveValue('4');
  await expect(page.getByTestId('dispersion-status')).toHaveAttribute('data-status', 'done', {
    timeout: BUSY_MACHINE_MS,
  });
});

test('in physical units the scale follows from B_perp and eps_r, q is in 1/nm and energies in meV', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  await page.getByTestId('units-physical').check();
  await expect(page.getByTestId('physical-bperp')).toBeVisible();
  await mapDone(page);
  const [px, py] = await pointAt(page, -0.7, 0.9);
  await page.mouse.click(px, py);
  await expect(page.getByTestId('probe-details')).toBeVisible({ timeout: BUSY_MACHINE_MS });
  await page.getByTestId('dispersion').locator('summary').click();
  await expect(page.getByTestId('dispersion-status')).toHaveAttribute('data-status', 'done', {
    timeout: BUSY_MACHINE_MS,
  });
  // e^2/(4 pi eps0 eps_r l_B) at the Setup's B_perp and eps_r (CODATA 2018, solver/units.ts).
  const bPerp = Number(await page.getByTestId('physical-bperp').inputValue());
  const epsilonR = Number(await page.getByTestId('physical-epsilon').inputValue());
  const derived = Number(
    await page.getByTestId('dispersion-coulomb-derived').getAttribute('data-value'),
  );
  expect(derived).toBeCloseTo(coulombScaleMeV(bPerp, epsilonR), 10);
  const chart = page.getByTestId('dispersion-chart');
  await expect(chart).toContainText('q (1/nm)');
  await expect(chart).toContainText('ω (meV)');
  await expect(page.getByTestId('dispersion-table').locator('th').nth(1)).toHaveText('Gap (meV)');
  await expect(page.getByTestId('dispersion-branch-0')).toContainText('meV nm');
});
