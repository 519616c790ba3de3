import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { BUSY_MACHINE_MS, DEMO, PIXEL, failOnConsoleErrors, mapDone, pointAt } from './demoPage';

failOnConsoleErrors();
test.describe.configure({ timeout: 480_000 });

async function readoutValue(page: Page, id: string): Promise<number> {
  return Number(await page.getByTestId(id).getAttribute('data-value'));
}

/** Pins plane point (x, y) by its typed coordinates. */
async function pinTyped(page: Page, x: number, y: number): Promise<void> {
  await page.getByTestId('pin-entry-x').fill(String(x));
  await page.getByTestId('pin-entry-y').fill(String(y));
  await page.getByTestId('pin-entry-submit').click();
}

test('the Map from the keyboard: Tab reaches it with a ring, arrows move the readout, Enter pins, Escape leaves a mode', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);

  // Tab reaches the plot (bounded: the page has well under 200 stops before it).
  const plot = page.getByTestId('map-plot');
  let reached = false;
  for (let k = 0; k < 200 && !reached; k++) {
    await page.keyboard.press('Tab');
    reached = await plot.evaluate((el) => el === document.activeElement);
  }
  expect(reached, 'the Map is reached by Tab').toBe(true);
  const ring = await plot.evaluate((el) => {
    const style = getComputedStyle(el);
    return { style: style.outlineStyle, width: parseFloat(style.outlineWidth) };
  });
  expect(ring.style).not.toBe('none');
  expect(ring.width).toBeGreaterThan(0);

  // Focus puts the crosshair at the centre pixel, and the readout shows the state there.
  await expect(page.getByTestId('readout-energy')).toBeVisible();
  const x0 = await readoutValue(page, 'readout-x');
  const y0 = await readoutValue(page, 'readout-y');
  expect(Math.abs(x0)).toBeLessThan(PIXEL);
  expect(Math.abs(y0)).toBeLessThan(PIXEL);
  // One pixel right, then ten up (Shift), then into the F region at the top right.
  await page.keyboard.press('ArrowRight');
  await expect.poll(() => readoutValue(page, 'readout-x')).toBeCloseTo(x0 + PIXEL, 12);
  await page.keyboard.press('Shift+ArrowUp');
  await expect.poll(() => readoutValue(page, 'readout-y')).toBeCloseTo(y0 + 10 * PIXEL, 12);
  for (let k = 0; k < 4; k++) await page.keyboard.press('Shift+ArrowUp');
  for (let k = 0; k < 3; k++) await page.keyboard.press('Shift+ArrowRight');
  const x = x0 + 31 * PIXEL;
  const y = y0 + 50 * PIXEL;
  await expect.poll(() => readoutValue(page, 'readout-x')).toBeCloseTo(x, 12);
  await expect.poll(() => readoutValue(page, 'readout-y')).toBeCloseTo(y, 12);
  await expect(page.getByTestId('readout-phase')).toHaveText('F');
  // F: E = -2 uPerp_F - uZ_F - E_Z (public/notes.html#closed-forms).
  expect(await readoutValue(page, 'readout-energy')).toBeCloseTo(-2 * x - y - DEMO.zeeman, 9);
  // The keyboard's crosshair stays when the pointer is elsewhere.
  await page.mouse.move(5, 5);
  await expect(page.getByTestId('readout-phase')).toHaveText('F');

  // Enter pins that point: the selected pin's essentials show its Probe beside the Map.
  await page.keyboard.press('Enter');
  await expect(page.getByTestId('pin-summary-phase')).toHaveText('F', {
    timeout: BUSY_MACHINE_MS,
  });
  expect(await readoutValue(page, 'pin-summary-energy')).toBeCloseTo(-2 * x - y - DEMO.zeeman, 9);
  await expect(page.locator('[data-testid^="map-pin-"]')).toHaveCount(1);

  // + zooms about the crosshair: the point under it stays where it is on the plot.
  await page.keyboard.press('+');
  await expect
    .poll(async () => Number(await plot.getAttribute('data-x-from')), { timeout: BUSY_MACHINE_MS })
    .toBeCloseTo(x + (-2 - x) * 0.8, 6);
  expect(Number(await plot.getAttribute('data-y-to'))).toBeCloseTo(y + (2 - y) * 0.8, 6);
  await mapDone(page);

  // Escape leaves the Cut drawing mode and the pan mode, the Map's focus or not.
  await page.getByTestId('map-mode-cut').click();
  await expect(page.getByTestId('map-drawing-note')).toBeVisible();
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('map-drawing-note')).toHaveCount(0);
  await expect(page.getByTestId('map-mode-pin')).toHaveAttribute('aria-pressed', 'true');
  await page.getByTestId('map-mode-pan').click();
  await expect(page.getByTestId('map-pan-note')).toBeVisible();
  await plot.focus();
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('map-pan-note')).toHaveCount(0);

  // A slider steps with the arrow and page keys.
  const slider = page.getByTestId('zeeman');
  await slider.focus();
  await page.keyboard.press('ArrowRight');
  const stepped = Number(await slider.inputValue());
  expect(stepped).toBeGreaterThan(DEMO.zeeman);
  await page.keyboard.press('PageUp');
  expect(Number(await slider.inputValue())).toBeGreaterThan(stepped);
  await page.screenshot({ path: 'test-results/screenshots/keyboard.png' });
});

test('pins side by side: values, differences against a chosen pin, CSV and JSON, and in the Probe JSON', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  // F at (0.5, 1.5) and CAF at (-0.5, 1.5) of the demo plane (public/notes.html#closed-forms):
  // E_F = -2 uPerp_F - uZ_F - E_Z, E_CAF = -uZ_F - E_Z^2 / (8 |uPerp_F|).
  const eF = -2 * 0.5 - 1.5 - DEMO.zeeman;
  const eCAF = -1.5 - DEMO.zeeman ** 2 / (8 * 0.5);
  await pinTyped(page, 0.5, 1.5);
  await expect(page.getByTestId('pin-compare')).toHaveCount(0);
  await pinTyped(page, -0.5, 1.5);
  const table = page.getByTestId('pin-compare');
  await expect(table).toBeVisible();
  await expect(page.getByTestId('compare-phase-1')).toHaveText('F', { timeout: BUSY_MACHINE_MS });
  await expect(page.getByTestId('compare-phase-2')).toHaveText('CAF', {
    timeout: BUSY_MACHINE_MS,
  });
  const value = async (id: string) => Number(await page.getByTestId(id).getAttribute('data-value'));
  expect(await value('compare-energy-1')).toBeCloseTo(eF, 9);
  expect(await value('compare-energy-2')).toBeCloseTo(eCAF, 9);
  // Against pin 1 (the first by default): pin 2's differences.
  await expect(table).toHaveAttribute('data-reference', '1');
  expect(await value('compare-diff-energy-2')).toBeCloseTo(eCAF - eF, 9);
  await expect(page.getByTestId('compare-diff-phase-2')).toHaveText('differs');
  // F has no Neel order in plane; CAF has, with its spins canted from the field by theta,
  // cos(theta) = E_Z / (4 |uPerp_F|) (public/notes.html#closed-forms); F's lie along it.
  expect(await value('compare-group-neelInPlane-2')).toBeGreaterThan(0.1);
  expect(await value('compare-group-neelInPlane-1')).toBeCloseTo(0, 9);
  const canting = (Math.acos(DEMO.zeeman / (4 * 0.5)) * 180) / Math.PI;
  expect(await value('compare-canting-2')).toBeCloseTo(canting, 4);
  expect(await value('compare-canting-1')).toBeCloseTo(0, 4);
  expect(await value('compare-diff-canting-2')).toBeCloseTo(canting, 4);
  // Every row is there for both pins.
  await expect(table.locator('tbody tr')).toHaveCount(
    await table.locator('tbody tr[data-row]').count(),
  );
  for (const row of ['phase', 'energy', 'gap', 'canting', 'goldstone', 'competitor']) {
    await expect(table.locator(`tr[data-row="${row}"]`)).toHaveCount(1);
  }

  // Against pin 2 instead.
  await page.getByTestId('compare-reference').selectOption('2');
  await expect(table).toHaveAttribute('data-reference', '2');
  expect(await value('compare-diff-energy-1')).toBeCloseTo(eF - eCAF, 9);
  await expect(page.getByTestId('compare-diff-energy-2')).toHaveCount(0);

  // The JSON file: the same values and differences.
  let download = page.waitForEvent('download');
  await page.getByTestId('compare-export-json').click();
  const json = JSON.parse(readFileSync((await (await download).path())!, 'utf8')) as {
    format: string;
    reference: number;
    pins: { id: number; x: number; y: number }[];
    rows: { key: string; values: (number | string | null)[]; differences: unknown[] }[];
  };
  expect(json.format).toBe('fourfold-pin-comparison');
  expect(json.reference).toBe(2);
  expect(json.pins.map((p) => [p.id, p.x, p.y])).toEqual([
    [1, 0.5, 1.5],
    [2, -0.5, 1.5],
  ]);
  const energy = json.rows.find((r) => r.key === 'energy')!;
  expect(energy.values[0] as number).toBeCloseTo(eF, 9);
  expect(energy.differences[0] as number).toBeCloseTo(eF - eCAF, 9);
  expect(energy.differences[1]).toBeNull();

  // The CSV file: a header with a value column per pin and a difference column.
  download = page.waitForEvent('download');
  await page.getByTestId('compare-export-csv').click();
  const csv = readFileSync((await (await download).path())!, 'utf8').split('\n');
  const header = csv.find((line) => !line.startsWith('#'))!;
  expect(header).toBe('quantity,unit,pin 1,pin 2,pin 1 - pin 2');
  const energyLine = csv.find((line) => line.startsWith('energy,'))!.split(',');
  expect(Number(energyLine[2])).toBeCloseTo(eF, 9);
  expect(Number(energyLine[4])).toBeCloseTo(eF - eCAF, 9);

  // The Probe's JSON carries the comparison.
  download = page.waitForEvent('download');
  await page.getByTestId('probe-export-json').click();
  const probe = JSON.parse(readFileSync((await (await download).path())!, 'utf8')) as {
    comparison: { reference: number; rows: { key: string }[] };
  };
  expect(probe.comparison.reference).toBe(2);
  expect(probe.comparison.rows.map((r) => r.key)).toContain('competitor');
  await table.screenshot({ path: 'test-results/screenshots/pin-compare.png' });
});

for (const [width, height] of [
  [1280, 800],
  [1600, 900],
] as const) {
  test(`at ${width} x ${height} the Map, its readout and the selected pin's essentials are on screen together`, async ({
    page,
  }) => {
    await page.setViewportSize({ width, height });
    await page.goto('/');
    await mapDone(page);
    const [px, py] = await pointAt(page, 0.5, 1.5);
    await page.mouse.click(px, py);
    await expect(page.getByTestId('pin-summary-phase')).toHaveText('F', {
      timeout: BUSY_MACHINE_MS,
    });
    const [hx, hy] = await pointAt(page, -0.1, -1.7);
    await page.mouse.move(hx, hy);
    await expect(page.getByTestId('readout-phase')).toHaveText('CDW');
    expect(await page.evaluate(() => window.scrollY)).toBe(0);
    for (const id of [
      'map-plot',
      'map-status',
      'readout-phase',
      'readout-energy',
      'readout-gap',
      'pin-summary-phase',
      'pin-summary-energy',
      'pin-summary-gap',
      'pin-summary-goldstone',
      'pin-summary-competitor',
    ]) {
      const box = (await page.getByTestId(id).boundingBox())!;
      expect(box, id).not.toBeNull();
      expect(box.x, `${id} left`).toBeGreaterThanOrEqual(0);
      expect(box.y, `${id} top`).toBeGreaterThanOrEqual(0);
      expect(box.x + box.width, `${id} right`).toBeLessThanOrEqual(width);
      expect(box.y + box.height, `${id} bottom`).toBeLessThanOrEqual(height);
    }
    // The plot is no thumbnail: at least 400 px on a side.
    const plot = (await page.getByTestId('map-plot').boundingBox())!;
    expect(plot.width).toBeGreaterThanOrEqual(400);
    // The masthead keeps its one-line tagline, whole (not cut short), clear of the tools.
    const tagline = page.getByTestId('tagline');
    await expect(tagline).toHaveText(
      'Hartree-Fock ground states of graphene\u2019s zero-energy Landau level',
    );
    const line = (await tagline.boundingBox())!;
    expect(line.height).toBeGreaterThan(8);
    expect(line.height).toBeLessThan(22);
    expect(await tagline.evaluate((el) => el.scrollWidth <= el.clientWidth)).toBe(true);
    const tools = (await page.locator('.masthead-tools').boundingBox())!;
    expect(line.x + line.width).toBeLessThanOrEqual(tools.x);
    await page.screenshot({ path: `test-results/screenshots/layout-${width}.png` });
  });
}
