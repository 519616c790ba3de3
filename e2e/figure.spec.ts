import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { DOMParser } from '@xmldom/xmldom';
import { expect, test, type Download, type Page } from '@playwright/test';
import { pngResolution } from '../app/figure/pngResolution';
import { SOFTWARE_VERSION } from '../solver/index';
import { BUSY_MACHINE_MS, failOnConsoleErrors, mapDone } from './demoPage';

failOnConsoleErrors();

/** Clicks `testId` and returns the downloaded file's name and bytes. */
async function download(page: Page, testId: string, timeout = BUSY_MACHINE_MS) {
  const [file] = await Promise.all([
    page.waitForEvent('download', { timeout }) as Promise<Download>,
    page.getByTestId(testId).click(),
  ]);
  return { name: file.suggestedFilename(), bytes: readFileSync((await file.path())!) };
}

test('export-svg downloads a vector figure of the demo Map, and Chromium renders it', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  // Pin a point (a click on the Map) so the figure carries a numbered marker.
  const box = (await page.getByTestId('map-plot').boundingBox())!;
  await page.mouse.click(box.x + 0.25 * box.width, box.y + 0.3 * box.height);
  await page.getByTestId('figure-title').fill('Demo, E_Z = 0.6');

  const { name, bytes } = await download(page, 'export-svg');
  expect(name).toBe('fourfold-map.svg');
  const svg = bytes.toString('utf8');
  const errors: string[] = [];
  const doc = new DOMParser({
    onError: (level, message) => {
      if (level !== 'warning') errors.push(message);
    },
  }).parseFromString(svg, 'image/svg+xml');
  expect(errors).toEqual([]);
  const root = doc.documentElement!;
  expect(root.getAttribute('version')).toBe('1.1');
  expect(root.getAttribute('width')).toBe('8.6cm');
  expect(doc.getElementsByTagName('image')).toHaveLength(0);
  expect(svg).not.toContain('data:image');
  // One filled region path per label of the demo (six regions, one of them striped).
  const groups = Array.from(doc.getElementsByTagName('g'));
  const regions = groups.find((g) => g.getAttribute('id') === 'regions')!;
  const paths = Array.from(regions.getElementsByTagName('path'));
  const labels = paths.map((p) => p.getElementsByTagName('title')[0]!.textContent);
  expect(new Set(labels)).toEqual(new Set(['F', 'CAF', 'KD', 'CDW', 'SBxy', 'CDW+SBxy']));
  expect(paths.some((p) => p.getAttribute('fill')!.startsWith('url(#'))).toBe(true);
  const boundaries = groups.find((g) => g.getAttribute('id') === 'boundaries')!;
  expect(boundaries.getElementsByTagName('path').length).toBeGreaterThan(4);
  const texts = Array.from(doc.getElementsByTagName('text')).map((t) => t.textContent);
  expect(texts).toContain('u\u22a5');
  expect(texts).toContain('Demo, EZ = 0.6');
  expect(texts).toContain('CDW+SBxy');
  const pins = groups.find((g) => g.getAttribute('id') === 'pins')!;
  expect(Array.from(pins.getElementsByTagName('text')).map((t) => t.textContent)).toContain('1');

  // Render the downloaded file in Chromium and keep the picture for a look.
  mkdirSync('test-results/screenshots', { recursive: true });
  await page.setViewportSize({ width: 760, height: 1100 });
  await page.setContent(
    `<html><head><link rel="icon" href="data:,"></head><body style="margin:0;background:#fff"><img id="figure" style="width:740px" src="data:image/svg+xml;base64,${bytes.toString('base64')}"></body></html>`,
  );
  const image = page.locator('#figure');
  await expect
    .poll(() => image.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth))
    .toBeGreaterThan(0);
  await image.screenshot({ path: 'test-results/screenshots/figure-map.png' });
  await page.goto('/');
  await mapDone(page);
  await page
    .getByTestId('figure-bar')
    .screenshot({ path: 'test-results/screenshots/figure-bar.png' });
});

test('PNG at the chosen resolution, CSV of every grid point and JSON with the model', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);

  await page.getByTestId('export-dpi').selectOption('300');
  const png = await download(page, 'export-png');
  expect(png.name).toBe('fourfold-map.png');
  expect([...png.bytes.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
  // Single column, 8.6 cm = 3.386 in, at 300 dpi: 1016 pixels wide, marked 300 dpi.
  expect(png.bytes.readUInt32BE(16)).toBe(1016);
  expect(pngResolution(new Uint8Array(png.bytes))).toBeCloseTo(300, 0);
  mkdirSync('test-results/screenshots', { recursive: true });
  writeFileSync('test-results/screenshots/figure-map-300dpi.png', png.bytes);

  const csv = await download(page, 'export-csv', 2 * BUSY_MACHINE_MS);
  expect(csv.name).toBe('fourfold-map.csv');
  const lines = csv.bytes.toString('utf8').trimEnd().split('\n');
  expect(lines[0]).toMatch(/^# Mean-field/);
  expect(lines[2]).toMatch(/^# plane \{/);
  const header = lines[3]!.split(',');
  expect(header.slice(0, 5)).toEqual(['u_perp', 'u_z', 'phase', 'energy', 'gap']);
  expect(header).toHaveLength(20);
  const rows = lines.slice(4);
  expect(rows).toHaveLength(256 * 256);
  // Every pixel solved: no empty label, no NaN.
  for (const row of rows) {
    const cells = row.split(',');
    if (cells.length !== 20 || cells[2] === '' || cells.some((c) => c === 'NaN')) {
      throw new Error(`incomplete CSV row: ${row}`);
    }
  }

  const json = await download(page, 'export-json', 2 * BUSY_MACHINE_MS);
  expect(json.name).toBe('fourfold-map.json');
  const doc = JSON.parse(json.bytes.toString('utf8')) as Record<string, unknown>;
  expect(doc.version).toBe(SOFTWARE_VERSION);
  expect(String(doc.caution)).toMatch(/^Mean-field/);
  expect(doc.model).toMatchObject({ filling: 0, zeeman: 0.6 });
  expect(doc.plane).toMatchObject({ resolution: [256, 256] });
  expect((doc.phase as string[][]).length).toBe(256);
  expect((doc.boundaries as unknown[]).length).toBeGreaterThan(4);
});
