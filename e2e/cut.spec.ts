import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import {
  BUSY_MACHINE_MS,
  cutDone,
  DEMO,
  failOnConsoleErrors,
  mapDone,
  pointAt,
  typeCutLine,
} from './demoPage';

failOnConsoleErrors();

// The demo's F/CAF boundary: CAF exists while E_Z < 4 |uPerp_F| and merges continuously into F
// at E_Z = 4 |uPerp_F| (public/notes.html#closed-forms; Phys. Rev. B 85, 155439 (2012), whose
// Zeeman symbol differs from our full splitting by a factor): uPerp = -E_Z / 4 = -0.15 at E_Z =
// 0.6, whatever uZ is and whatever the Hartree ratios are (the CAF and F energies hold only Fock
// couplings).
const BOUNDARY_X = -DEMO.zeeman / 4;

async function transitions(page: Page) {
  const items = page.getByTestId('cut').getByTestId('cut-transition');
  const out: { t: number; s: number; x: number; y: number; order: string; between: string }[] = [];
  for (const item of await items.all()) {
    const attr = async (name: string) => (await item.getAttribute(name))!;
    out.push({
      t: Number(await attr('data-t')),
      s: Number(await attr('data-s')),
      x: Number(await attr('data-x')),
      y: Number(await attr('data-y')),
      order: await attr('data-order'),
      between: await attr('data-between'),
    });
  }
  return out;
}

test('a Cut dragged across the F/CAF boundary finds it at uPerp = -E_Z / 4, continuous', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  await page.getByTestId('cut-draw').click();
  await expect(page.getByTestId('cut-draw')).toHaveAttribute('aria-pressed', 'true');
  // The button sits below the Map: bring the Map back into view before dragging on it. The Map
  // says beside it that a press draws now.
  await page.getByTestId('map-plot').scrollIntoViewIfNeeded();
  await expect(page.getByTestId('map-drawing-note')).toBeVisible();
  const [x0, y0] = await pointAt(page, -1, 1.5);
  const [x1, y1] = await pointAt(page, 1, 1.2);
  await page.mouse.move(x0, y0);
  await page.mouse.down();
  await page.mouse.move((x0 + x1) / 2, (y0 + y1) / 2, { steps: 4 });
  await expect(page.getByTestId('map-cut-draft')).toBeVisible();
  await page.mouse.move(x1, y1, { steps: 4 });
  await page.mouse.up();
  // One line per press of the button: the Map is back to pinning, and the release pinned nothing.
  await expect(page.getByTestId('cut-draw')).toHaveAttribute('aria-pressed', 'false');
  await expect(page.getByTestId('map-drawing-note')).toHaveCount(0);
  await expect(page.locator('[data-testid^="map-pin-"]')).toHaveCount(0);
  await cutDone(page);
  await expect(page.getByTestId('map-cut-line')).toBeVisible();
  const found = await transitions(page);
  expect(found).toHaveLength(1);
  const [transition] = found;
  expect(transition!.between).toBe('CAF|F');
  expect(transition!.order).toBe('continuous');
  // Located to 1e-9 of the cut (length about 2 here).
  expect(Math.abs(transition!.x - BOUNDARY_X)).toBeLessThan(3e-9);
  await expect(page.getByTestId('map-cut-mark')).toHaveCount(1);
  await expect(page.getByTestId('cut-marker')).toHaveCount(1);
  await expect(page.getByTestId('cut-marker')).toHaveAttribute('data-order', 'continuous');
  // Hover over the charts reads the sample's values.
  const chart = page.getByTestId('cut-panel-energy');
  await chart.scrollIntoViewIfNeeded();
  const box = (await chart.boundingBox())!;
  await page.mouse.move(box.x + box.width * 0.2, box.y + box.height / 2);
  await expect(page.getByTestId('cut-readout-phase')).toHaveText('CAF');
  await page.getByTestId('cut').scrollIntoViewIfNeeded();
  await page.screenshot({ path: 'test-results/screenshots/cut-drawn.png', fullPage: true });
  await page.getByTestId('cut').screenshot({ path: 'test-results/screenshots/cut-panel.png' });
  await page.getByTestId('map').screenshot({ path: 'test-results/screenshots/cut-on-map.png' });
  // The figure export is the CLI's SVG: one dashed (continuous) transition line.
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByTestId('cut-export-svg').click(),
  ]);
  const svg = readFileSync(await download.path(), 'utf8');
  expect(svg).toContain('<svg xmlns="http://www.w3.org/2000/svg"');
  const lines = /<g class="transitions"[^>]*>([\s\S]*?)<\/g>/.exec(svg)![1]!;
  expect(lines.match(/stroke-dasharray/g)).toHaveLength(1);

  // Escape leaves the drawing mode without a line; a click on the Map then pins a point.
  const drawn = await page.getByTestId('cut-status').getAttribute('data-path');
  expect(drawn).toMatch(/^line:/);
  await page.getByTestId('cut-draw').click();
  await expect(page.getByTestId('map-drawing-note')).toBeVisible();
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('cut-draw')).toHaveAttribute('aria-pressed', 'false');
  await expect(page.getByTestId('map-drawing-note')).toHaveCount(0);
  await page.getByTestId('map-plot').scrollIntoViewIfNeeded();
  const [px, py] = await pointAt(page, 0.5, 1.5);
  await page.mouse.click(px, py);
  await expect(page.getByTestId('map-pin-1')).toBeVisible();
  await expect(page.getByTestId('cut-status')).toHaveAttribute('data-path', drawn!);
});

test('a Cut typed end to end, then a tilt sweep at a pin, read their transitions', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  const cut = page.getByTestId('cut');
  // A horizontal line at uZ = 1.5 from uPerp = -1 to 1: CAF, then F.
  await typeCutLine(page, ['-1', '1.5'], ['1', '1.5']);
  await cutDone(page);
  await expect(cut.getByTestId('cut-transition')).toHaveCount(1);
  const [line] = await transitions(page);
  expect(line!.between).toBe('CAF|F');
  expect(Math.abs(line!.x - BOUNDARY_X)).toBeLessThan(2e-9);
  expect(line!.y).toBe(1.5);
  expect(Math.abs(line!.t - (BOUNDARY_X + 1) / 2)).toBeLessThan(1e-9);

  // A bad entry is refused in one line and the Cut stays.
  await cut.getByTestId('cut-to-x').fill('NaN');
  await expect(cut.getByRole('alert').first()).toContainText('finite');
  await expect(cut.getByTestId('cut-transition')).toHaveCount(1);
  await cut.getByTestId('cut-to-x').fill('1');

  // Pin a CAF point, then sweep the tilt there: E_Z = E_Z_perp / cos(theta) reaches
  // 4 |uPerp_F| at cos(theta) = E_Z_perp / (4 |uPerp_F|) (public/notes.html#closed-forms and
  // public/notes.html#units).
  await page.getByTestId('map-plot').scrollIntoViewIfNeeded();
  const [px, py] = await pointAt(page, -1, 1.5);
  await page.mouse.click(px, py);
  await expect(page.getByTestId('map-pin-1')).toBeVisible();
  await cut.getByTestId('cut-mode-sweep').check();
  await cut.getByTestId('cut-sweep-kind').selectOption('tilt');
  await cut.getByTestId('cut-start-sweep').click();
  await cut.getByTestId('cut-sweep-to').fill('85');
  await expect(cut.getByTestId('cut-status')).toHaveAttribute('data-path', 'tilt:0:85', {
    timeout: BUSY_MACHINE_MS,
  });
  await cutDone(page);
  await expect(cut.getByTestId('cut-transition')).toHaveCount(1);
  const [tilt] = await transitions(page);
  const pinX = tilt!.x;
  expect(Math.abs(pinX - -1)).toBeLessThan(4 / 256);
  const critical = (Math.acos(DEMO.zeeman / (4 * Math.abs(pinX))) * 180) / Math.PI;
  expect(tilt!.between).toBe('CAF|F');
  expect(tilt!.order).toBe('continuous');
  expect(Math.abs(tilt!.s - critical)).toBeLessThan(1e-9 * 85);
  await cut.scrollIntoViewIfNeeded();
  await page.screenshot({ path: 'test-results/screenshots/cut-tilt.png', fullPage: true });
  const timing = await page.evaluate(() =>
    performance.getEntriesByName('fourfold:cut').map((e) => e.duration),
  );
  expect(timing.length).toBeGreaterThan(0);
  console.log(`Cut timings in the page (ms): ${timing.map((t) => t.toFixed(0)).join(', ')}`);
});
