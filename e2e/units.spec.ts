import { expect, test, type Page } from '@playwright/test';
import { failOnConsoleErrors, mapDone } from './demoPage';

/** Where screenshots go (another checkout's run empties test-results/ when it starts). */
const SHOTS = process.env.FOURFOLD_E2E_SHOTS ?? 'test-results/screenshots';

failOnConsoleErrors();

// CODATA 2018 (E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)); e and h exact in the SI.
const E = 1.602176634e-19;
const HBAR = 6.62607015e-34 / (2 * Math.PI);
const MU_B = 9.2740100783e-24;

/** E_Z = g mu_B B_perp / cos(tilt) in meV (public/notes.html#units). */
const zeemanMeV = (b: number, tiltDeg: number, g = 2) =>
  (g * MU_B * b) / Math.cos((tiltDeg * Math.PI) / 180) / (E * 1e-3);
/** l_B = sqrt(hbar / (e B_perp)) in nm. */
const magneticLengthNm = (b: number) => Math.sqrt(HBAR / (E * b)) * 1e9;

async function valueOf(page: Page, testId: string): Promise<number> {
  return Number(await page.getByTestId(testId).getAttribute('data-value'));
}

async function regions(page: Page): Promise<string> {
  return page
    .getByTestId('map-plot')
    .evaluate((canvas) => (canvas as HTMLCanvasElement).toDataURL());
}

/** Moves the pointer over axis coordinates (x, y) of the demo plane [-2, 2]^2. */
async function hoverAt(page: Page, x: number, y: number): Promise<void> {
  const box = (await page.getByTestId('map-plot').boundingBox())!;
  await page.mouse.move(box.x + ((x + 2) / 4) * box.width, box.y + (1 - (y + 2) / 4) * box.height);
}

async function physicalUnits(page: Page): Promise<void> {
  await page.goto('/');
  await mapDone(page);
  await page.getByTestId('units-physical').check();
  await expect(page.getByTestId('physical-bperp')).toBeVisible();
}

test('physical units: E_Z and l_B follow the formulas, the Map follows E_Z, the tilt path is a ray', async ({
  page,
}) => {
  await physicalUnits(page);
  // Switching keeps the Map: B_perp is chosen so that E_Z stays exactly 0.6 (the demo's):
  // 0.6 meV / (2 x 0.0578838 meV/T) = 5.182796 T (CODATA 2018 mu_B).
  await expect(page.getByTestId('physical-bperp')).toHaveValue(/^5\.18279/);
  expect(await valueOf(page, 'derived-zeeman')).toBe(0.6);
  await mapDone(page);

  await page.getByTestId('physical-bperp').fill('9');
  await page.getByTestId('physical-tilt').fill('60');
  await expect.poll(() => valueOf(page, 'derived-zeeman')).toBeCloseTo(zeemanMeV(9, 60), 10);
  expect(await valueOf(page, 'derived-magnetic-length')).toBeCloseTo(magneticLengthNm(9), 10);
  // l_B = 25.6556 nm / sqrt(B / T) (public/notes.html#checks).
  expect(await valueOf(page, 'derived-magnetic-length')).toBeCloseTo(25.6556 / 3, 4);
  const exchange = await valueOf(page, 'derived-exchange');
  expect(exchange / (await valueOf(page, 'derived-coulomb'))).toBeCloseTo(
    Math.sqrt(Math.PI / 2),
    10,
  );
  // eps_r = 4: mixing 2.19 / 4 = 0.55, above the 0.3 threshold, so the caution shows.
  await expect(page.getByTestId('mixing-caution')).toBeVisible();
  await mapDone(page);

  // The Map solves E_Z in meV: in F, E = -2 uPerp_F - uZ_F - E_Z (public/notes.html#closed-forms).
  await hoverAt(page, 0.5, 1.5);
  const readout = page.getByTestId('readout');
  await expect(readout.getByTestId('readout-phase')).toHaveText('F');
  const x = Number(await readout.getByTestId('readout-x').getAttribute('data-value'));
  const y = Number(await readout.getByTestId('readout-y').getAttribute('data-value'));
  const energy = Number(await readout.getByTestId('readout-energy').getAttribute('data-value'));
  expect(energy).toBeCloseTo(-2 * x - y - zeemanMeV(9, 60), 8);

  // The sample's own couplings (meV/T) place its tilt path: a ray towards the origin through
  // (u, u_z) = (-0.1, 0.15) x 9 T, at (u, u_z) cos(theta) / cos(60°).
  await page.getByTestId('setup-uPerp-fock').fill('-0.1');
  await page.getByTestId('setup-uZ-fock').fill('0.15');
  const path = page.getByTestId('tilt-trajectory');
  await expect(path).toHaveAttribute('data-kind', 'scaled');
  await expect(path).toHaveAttribute('data-exact', 'true');
  const point = async (name: string) =>
    ((await path.getAttribute(`data-${name}`)) ?? '').split(',').map(Number);
  const current = await point('current');
  expect(current[0]).toBeCloseTo(-0.9, 10);
  expect(current[1]).toBeCloseTo(1.35, 10);
  const start = await point('start');
  expect(start[0]).toBeCloseTo(-0.9 / Math.cos(Math.PI / 3), 10);
  expect(start[1]).toBeCloseTo(1.35 / Math.cos(Math.PI / 3), 10);
  const end = await point('end');
  const shrink = Math.cos((80 * Math.PI) / 180) / Math.cos(Math.PI / 3);
  expect(end[0]).toBeCloseTo(-0.9 * shrink, 10);
  expect(end[1]).toBeCloseTo(1.35 * shrink, 10);
  await mapDone(page);
  await page.mouse.move(0, 0);
  await page.screenshot({ path: `${SHOTS}/units-physical.png`, fullPage: true });
  await page.getByTestId('units').screenshot({ path: `${SHOTS}/units-panel.png` });
  await page.getByTestId('map').screenshot({ path: `${SHOTS}/units-map.png` });
});

test('bad physical entries are flagged beside the field and the Map keeps its last state', async ({
  page,
}) => {
  await physicalUnits(page);
  await page.getByTestId('physical-bperp').fill('9');
  await mapDone(page);
  const zeemanBefore = await valueOf(page, 'derived-zeeman');
  const before = await regions(page);

  const field = page.getByTestId('physical-bperp');
  for (const [text, message] of [
    ['abc', 'not a number'],
    ['NaN', 'must be a finite number'],
    ['-2', 'a positive field'],
    ['', 'enter a number'],
  ] as const) {
    await field.fill(text);
    await expect(field).toHaveAttribute('aria-invalid', 'true');
    await expect(page.locator('#setup-physical-bperp-error')).toContainText(message);
  }
  const tilt = page.getByTestId('physical-tilt');
  await tilt.fill('90');
  await expect(tilt).toHaveAttribute('aria-invalid', 'true');
  await expect(page.locator('#setup-physical-tilt-error')).toContainText('below 90°');
  await page.screenshot({ path: `${SHOTS}/units-bad-entry.png`, fullPage: true });
  await page.getByTestId('units').screenshot({ path: `${SHOTS}/units-bad-entry-panel.png` });

  expect(await valueOf(page, 'derived-zeeman')).toBe(zeemanBefore);
  await expect(page.getByTestId('map-status')).toHaveAttribute('data-phase', 'done');
  expect(await regions(page)).toBe(before);

  // Escape puts the stored value back; a reload keeps physical units (URL and autosave).
  await field.press('Escape');
  await expect(field).toHaveValue('9');
  await tilt.fill('30');
  await mapDone(page);
  await page.reload();
  await expect(page.getByTestId('units-physical')).toBeChecked();
  await expect(page.getByTestId('physical-bperp')).toHaveValue('9');
  await expect(page.getByTestId('physical-tilt')).toHaveValue('30');
  expect(await valueOf(page, 'derived-zeeman')).toBeCloseTo(zeemanMeV(9, 30), 10);
  await mapDone(page);
  // Without the link, the local autosave restores it.
  await page.goto('/');
  await expect(page.getByTestId('units-physical')).toBeChecked();
  await expect(page.getByTestId('physical-tilt')).toHaveValue('30');
  await mapDone(page);
});

test('interaction range: F/H of a Gaussian range follows 1/(1 + a^2/l_B^2) and the Map follows', async ({
  page,
}) => {
  await physicalUnits(page);
  await page.getByTestId('physical-bperp').fill('9');
  await mapDone(page);
  const before = await regions(page);

  await page.getByTestId('range').locator('summary').click();
  await page.getByTestId('range-enabled').check();
  await page.getByTestId('range-profile').selectOption('gaussian');
  await page.getByTestId('range-strength').fill('-0.1');
  await page.getByTestId('range-length').fill('10');
  const l = magneticLengthNm(9);
  // Closed form of public/notes.html#interaction-range (derived there).
  await expect.poll(() => valueOf(page, 'range-ratio')).toBeCloseTo(1 / (1 + (10 / l) ** 2), 10);
  expect(await valueOf(page, 'range-hartree')).toBeCloseTo(-0.1, 12);
  const chart = page.getByTestId('range-chart');
  await expect(chart).toHaveAttribute('data-current', '9');
  expect(Number(await chart.getAttribute('data-ratio'))).toBeCloseTo(1 / (1 + (10 / l) ** 2), 10);
  // The range sets u_perp's Hartree/Fock ratio, which the u_perp axis uses: the Map changes.
  await mapDone(page);
  expect(await regions(page)).not.toBe(before);

  // A stronger field shortens l_B, so F/H falls.
  await page.getByTestId('physical-bperp').fill('25');
  await expect
    .poll(() => valueOf(page, 'range-ratio'))
    .toBeCloseTo(1 / (1 + (10 / magneticLengthNm(25)) ** 2), 10);
  await mapDone(page);
  await page.getByTestId('range').scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${SHOTS}/units-range.png`, fullPage: true });
  await page.getByTestId('range').screenshot({ path: `${SHOTS}/units-range-panel.png` });

  // Back to dimensionless units: H and F stay (now plain numbers), a becomes a / l_B.
  const ratio = await valueOf(page, 'range-ratio');
  await page.getByTestId('units-dimensionless').check();
  await expect.poll(() => valueOf(page, 'range-hartree')).toBeCloseTo(-0.1 * 25, 10);
  expect(await valueOf(page, 'range-ratio')).toBeCloseTo(ratio, 10);
  const current = Number(await page.getByTestId('range-chart').getAttribute('data-current'));
  expect(current).toBeCloseTo(10 / magneticLengthNm(25), 10);
  await mapDone(page);
  await page.getByTestId('range').screenshot({ path: `${SHOTS}/units-range-dimensionless.png` });
});
