import { expect, test, type Page } from '@playwright/test';
import { failOnConsoleErrors, mapDone } from './demoPage';

failOnConsoleErrors();
// Each test maps the demo plane several times (every navigation is a new Map).
test.describe.configure({ timeout: 600_000 });

type Extent = { x: [number, number]; y: [number, number] };

/** The limits the Map's plot shows (its data-x-from, -x-to, -y-from, -y-to). */
async function shownLimits(page: Page): Promise<Extent> {
  const plot = page.getByTestId('map-plot');
  const read = async (name: string) => Number(await plot.getAttribute(`data-${name}`));
  return {
    x: [await read('x-from'), await read('x-to')],
    y: [await read('y-from'), await read('y-to')],
  };
}

/** Waits until the plot shows `want` (within `tol` on every end). */
async function expectLimits(page: Page, want: Extent, tol: number): Promise<void> {
  await expect
    .poll(async () => {
      const got = await shownLimits(page);
      return Math.max(
        Math.abs(got.x[0] - want.x[0]),
        Math.abs(got.x[1] - want.x[1]),
        Math.abs(got.y[0] - want.y[0]),
        Math.abs(got.y[1] - want.y[1]),
      );
    })
    .toBeLessThan(tol);
}

/** The axis fields of the Setup agree with the plot's limits. */
async function expectFields(page: Page, want: Extent, tol: number): Promise<void> {
  for (const [id, value] of [
    ['plane-x-from', want.x[0]],
    ['plane-x-to', want.x[1]],
    ['plane-y-from', want.y[0]],
    ['plane-y-to', want.y[1]],
  ] as const) {
    await expect
      .poll(async () => Math.abs(Number(await page.getByTestId(id).inputValue()) - value))
      .toBeLessThan(tol);
  }
}

/** Page position of plot fractions (fx from the left edge, fy from the top edge). */
async function plotPoint(page: Page, fx: number, fy: number): Promise<[number, number]> {
  const box = (await page.getByTestId('map-plot').boundingBox())!;
  return [box.x + fx * box.width, box.y + fy * box.height];
}

/** One plot pixel of the screen in plane units for an extent of span `span`. */
async function screenPixel(page: Page, span: number): Promise<number> {
  const box = (await page.getByTestId('map-plot').boundingBox())!;
  return span / box.width;
}

const DEMO_EXTENT: Extent = { x: [-2, 2], y: [-2, 2] };

test('wheel, box and pan navigate the plane; each is a plane change in the fields, the link and the Map', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  await expectLimits(page, DEMO_EXTENT, 1e-12);
  const hashBefore = new URL(page.url()).hash;

  // The wheel zooms about the pointer: one notch (100 px) scales the extent by 0.8 about the
  // plane point under it, here (1, 1) of the demo plane [-2, 2]^2.
  const [wx, wy] = await plotPoint(page, 0.75, 0.25);
  await page.mouse.move(wx, wy);
  await page.mouse.wheel(0, -100);
  const afterWheel: Extent = { x: [-1.4, 1.8], y: [-1.4, 1.8] };
  const tolWheel = 2 * (await screenPixel(page, 4));
  await expectLimits(page, afterWheel, tolWheel);
  await expectFields(page, afterWheel, tolWheel);
  await expect.poll(() => new URL(page.url()).hash).not.toBe(hashBefore);
  await mapDone(page);
  const wheel = await shownLimits(page);
  // The zoom keeps the point under the pointer where it was, whatever the rounding of the mouse.
  expect((wheel.x[1] - wheel.x[0]) / 4).toBeCloseTo(0.8, 6);
  expect((wheel.y[1] - wheel.y[0]) / 4).toBeCloseTo(0.8, 6);

  // The Map is computed anew over the new extent: the readout at the plot's left edge reads its
  // x-from, not the demo's -2.
  const [lx, ly] = await plotPoint(page, 0.002, 0.5);
  await page.mouse.move(lx, ly);
  await expect
    .poll(async () => Number(await page.getByTestId('readout-x').getAttribute('data-value')))
    .toBeLessThan(wheel.x[0] + 0.02);
  expect(Number(await page.getByTestId('readout-x').getAttribute('data-value'))).toBeGreaterThan(
    wheel.x[0],
  );

  // A dragged box zooms to it: the middle half of each axis.
  const spanW = wheel.x[1] - wheel.x[0];
  const [b0x, b0y] = await plotPoint(page, 0.25, 0.25);
  const [b1x, b1y] = await plotPoint(page, 0.75, 0.75);
  await page.mouse.move(b0x, b0y);
  await page.mouse.down();
  await page.mouse.move((b0x + b1x) / 2, (b0y + b1y) / 2, { steps: 4 });
  await expect(page.getByTestId('map-zoom-box')).toBeVisible();
  await page.mouse.move(b1x, b1y, { steps: 4 });
  await page.mouse.up();
  const afterBox: Extent = {
    x: [wheel.x[0] + 0.25 * spanW, wheel.x[0] + 0.75 * spanW],
    y: [wheel.y[0] + 0.25 * spanW, wheel.y[0] + 0.75 * spanW],
  };
  const tolBox = 2 * (await screenPixel(page, spanW));
  await expectLimits(page, afterBox, tolBox);
  await expect(page.getByTestId('map-zoom-box')).toHaveCount(0);
  // The box pinned nothing.
  await expect(page.getByTestId('pin-summary')).toHaveCount(0);
  await mapDone(page);
  const box = await shownLimits(page);

  // Shift and drag pans: the plane moves with the pointer, a quarter of the plot to the left.
  const spanB = box.x[1] - box.x[0];
  const [p0x, p0y] = await plotPoint(page, 0.5, 0.5);
  const [p1x] = await plotPoint(page, 0.25, 0.5);
  await page.keyboard.down('Shift');
  await page.mouse.move(p0x, p0y);
  await page.mouse.down();
  await page.mouse.move(p1x, p0y, { steps: 6 });
  await page.mouse.up();
  await page.keyboard.up('Shift');
  const afterPan: Extent = {
    x: [box.x[0] + 0.25 * spanB, box.x[1] + 0.25 * spanB],
    y: box.y,
  };
  await expectLimits(page, afterPan, 2 * (await screenPixel(page, spanB)));
  await expect(page.getByTestId('pin-summary')).toHaveCount(0);
  await mapDone(page);
  const pan = await shownLimits(page);

  // Back to the previous extent: the box's, then the wheel's (it walks back, not to and fro).
  await page.getByTestId('map-extent-back').click();
  await expectLimits(page, box, 1e-9);
  await page.getByTestId('map-extent-back').click();
  await expectLimits(page, wheel, 1e-9);
  await mapDone(page);

  // The history names each step; the link and the autosave hold the extent shown.
  await page.getByTestId('history-toggle').click();
  const labels = await page.getByTestId('history-step').allTextContents();
  expect(labels.slice(1, 4)).toEqual(['Zoom in', 'Zoom to box', 'Pan']);
  expect(labels).toHaveLength(6);
  await page.reload();
  await mapDone(page);
  await expectLimits(page, wheel, 1e-9);
  await expectFields(page, wheel, 1e-9);
  expect(pan.x[0]).not.toBe(wheel.x[0]);
  await page.screenshot({ path: 'test-results/screenshots/navigate.png' });
});

test('undo and redo of setup and plane changes: keys, buttons and the list, after a reload too', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  await expect(page.getByTestId('history-undo')).toBeDisabled();

  // A setup change, then a plane change.
  await page.getByTestId('zeeman-entry').fill('0.9');
  await page.getByTestId('zeeman-entry').press('Enter');
  await expect(page.getByTestId('history-undo')).toBeEnabled();
  await mapDone(page);
  await page.getByTestId('map-zoom-in').click();
  // The buttons zoom about the centre by 0.8.
  const zoomed: Extent = { x: [-1.6, 1.6], y: [-1.6, 1.6] };
  await expectLimits(page, zoomed, 1e-9);
  await mapDone(page);

  // Ctrl+Z undoes the zoom, then the Zeeman energy (focus off any text field).
  await page.getByTestId('map-plot').focus();
  await page.keyboard.press('Control+z');
  await expectLimits(page, DEMO_EXTENT, 1e-9);
  await expect(page.getByTestId('zeeman-entry')).toHaveValue('0.9');
  await page.keyboard.press('Control+z');
  await expect(page.getByTestId('zeeman-entry')).toHaveValue('0.6');
  await expect(page.getByTestId('history-undo')).toBeDisabled();
  // Ctrl+Shift+Z redoes the Zeeman energy; the redo button the zoom.
  await page.keyboard.press('Control+Shift+z');
  await expect(page.getByTestId('zeeman-entry')).toHaveValue('0.9');
  await expectLimits(page, DEMO_EXTENT, 1e-9);
  await page.getByTestId('history-redo').click();
  await expectLimits(page, zoomed, 1e-9);
  await expect(page.getByTestId('history-redo')).toBeDisabled();
  await mapDone(page);

  // The undo button, then a reload: the history and its place in it survive.
  await page.getByTestId('history-undo').click();
  await expectLimits(page, DEMO_EXTENT, 1e-9);
  await mapDone(page);
  await page.reload();
  await mapDone(page);
  await expect(page.getByTestId('zeeman-entry')).toHaveValue('0.9');
  await page.getByTestId('history-toggle').click();
  const steps = page.getByTestId('history-step');
  await expect(steps).toHaveCount(3);
  await expect(steps.nth(2)).toHaveClass(/history-undone/);
  await expect(steps.nth(2)).toHaveText('Zoom in');
  await expect(steps.nth(1)).toContainText('0.9');
  // Redo after the reload; then a click on the first step goes back to the start.
  await page.getByTestId('history-redo').click();
  await expectLimits(page, zoomed, 1e-9);
  await steps.nth(0).getByRole('button').click();
  await expect(page.getByTestId('zeeman-entry')).toHaveValue('0.6');
  await expectLimits(page, DEMO_EXTENT, 1e-9);
  await mapDone(page);
  // A new change after undoing drops the steps undone.
  await page.getByTestId('zeeman-entry').fill('0.3');
  await page.getByTestId('zeeman-entry').press('Enter');
  await expect(steps).toHaveCount(2);
  await expect(page.getByTestId('history-redo')).toBeDisabled();
  await mapDone(page);
});
