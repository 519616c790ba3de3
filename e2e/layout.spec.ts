import { expect, test, type Locator, type Page } from '@playwright/test';
import { failOnConsoleErrors, mapDone } from './demoPage';

/** Where screenshots go (another checkout's run empties test-results/ when it starts). */
const SHOTS = process.env.FOURFOLD_E2E_SHOTS ?? 'test-results/screenshots';

failOnConsoleErrors();

/**
 * Elements under `root` that stick out of the box they sit in: each element's border box against
 * the padding box of the nearest ancestor that has a box of its own (display: contents and
 * hidden elements have none), to half a pixel.
 */
async function overflowing(root: Locator): Promise<string[]> {
  return root.evaluate((top) => {
    const describe = (el: Element): string => {
      const id = el.getAttribute('data-testid') ?? el.id;
      const cls = typeof el.className === 'string' ? el.className : '';
      return `${el.tagName.toLowerCase()}${id ? `#${id}` : ''}${cls ? `.${cls.split(' ').join('.')}` : ''}`;
    };
    const out: string[] = [];
    for (const el of top.querySelectorAll('*')) {
      if (el.closest('svg') !== null && el.tagName.toLowerCase() !== 'svg') continue;
      const r = el.getBoundingClientRect();
      if (r.width === 0 && r.height === 0) continue;
      let box: Element | null = el.parentElement;
      while (box !== null && box.getBoundingClientRect().width === 0) box = box.parentElement;
      if (box === null) continue;
      const b = box.getBoundingClientRect();
      const left = b.left + box.clientLeft;
      const right = left + (box.clientWidth || b.width);
      if (r.left < left - 0.5 || r.right > right + 0.5) {
        out.push(
          `${describe(el)} [${r.left.toFixed(1)}, ${r.right.toFixed(1)}] in ${describe(box)} [${left.toFixed(1)}, ${right.toFixed(1)}]`,
        );
      }
    }
    return out;
  });
}

async function openSetupDetails(page: Page): Promise<void> {
  const closed = page.locator('.setup-column details:not([open]) > summary');
  while ((await closed.count()) > 0) await closed.first().click();
  await expect(page.locator('.channel-table')).toBeVisible();
  await expect(page.locator('.channel-table tbody tr[data-channel]')).toHaveCount(15);
}

for (const width of [1280, 1600]) {
  test(`at ${width} px every Setup element fits its box, in both unit modes, with all 15 channels open`, async ({
    page,
  }) => {
    await page.setViewportSize({ width, height: 1000 });
    await page.goto('/');
    await mapDone(page);
    await openSetupDetails(page);
    const setup = page.locator('.setup-column');
    const mapColumn = page.locator('.map-column');

    for (const units of ['dimensionless', 'physical'] as const) {
      await page.getByTestId(`units-${units}`).check();
      await mapDone(page);
      if (units === 'physical') {
        // A sample coupling with many digits: the entry and the derived Hartree part must fit.
        await page.getByTestId('setup-uPerp-fock').fill('-0.123456');
        await page.getByTestId('setup-uZ-fock').fill('0.15');
        await mapDone(page);
      }
      expect(await overflowing(setup), `overflow in ${units} units`).toEqual([]);
      // The Setup column ends before the Map column starts.
      const s = (await setup.boundingBox())!;
      const m = (await mapColumn.boundingBox())!;
      expect(s.x + s.width).toBeLessThanOrEqual(m.x);
      // The channel table stays inside the Setup column (it was 304 px in a 270 px box).
      const table = (await page.locator('.channel-table').boundingBox())!;
      expect(table.x + table.width).toBeLessThanOrEqual(s.x + s.width);
      await setup.screenshot({ path: `${SHOTS}/layout-setup-${width}-${units}.png` });
    }

    // A "not a number" message sits on its own line: the slider keeps its width.
    await page.getByTestId('units-dimensionless').check();
    const slider = page.getByTestId('zeeman');
    const before = (await slider.boundingBox())!.width;
    await page.getByTestId('zeeman-entry').fill('abc');
    await expect(page.locator('#setup-zeeman-entry-error')).toHaveText('not a number');
    expect((await slider.boundingBox())!.width).toBeGreaterThan(0.9 * before);
    expect(await overflowing(setup)).toEqual([]);
    await page
      .getByRole('group', { name: 'Fields' })
      .screenshot({ path: `${SHOTS}/layout-fields-not-a-number-${width}.png` });
  });
}

test('pin entry: axis names keep their subscripts on their letters; the message goes once the fields are edited', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  const form = page.locator('.pin-entry');
  // "u" and its subscript sit side by side on one line, not spread out as separate items.
  const gap = await form
    .locator('label')
    .first()
    .evaluate((label) => {
      const sub = label.querySelector('sub')!;
      const letter = document.createRange();
      letter.selectNodeContents(sub.previousSibling ?? sub.parentElement!.firstChild!);
      const l = letter.getBoundingClientRect();
      const s = sub.getBoundingClientRect();
      return { between: s.left - l.right, letterBottom: l.bottom, subBottom: s.bottom };
    });
  expect(gap.between).toBeGreaterThanOrEqual(-0.5);
  expect(gap.between).toBeLessThan(2);
  // A subscript hangs below its letter's baseline, not above it.
  expect(gap.subBottom).toBeGreaterThan(gap.letterBottom - 4);
  expect(await overflowing(form)).toEqual([]);

  await page.getByTestId('pin-entry-x').fill('abc');
  await page.getByTestId('pin-entry-submit').click();
  await expect(page.getByTestId('pin-entry-problem')).toContainText('not a number');
  await form.screenshot({ path: `${SHOTS}/layout-pin-entry-problem.png` });
  await page.getByTestId('pin-entry-x').fill('');
  await expect(page.getByTestId('pin-entry-problem')).toHaveCount(0);
  await form.screenshot({ path: `${SHOTS}/layout-pin-entry-cleared.png` });
  await expect(page.locator('[data-testid^="map-pin-"]')).toHaveCount(0);
});

test('the filling hint counts the electrons of the n = 0 level in words', async ({ page }) => {
  await page.goto('/');
  await mapDone(page);
  const hint = page.getByTestId('filling-electrons');
  await expect(hint).toContainText('two electrons per flux quantum');
  await page.getByTestId('filling--1').check();
  await expect(hint).toContainText('one electron per flux quantum');
  await expect(hint).not.toContainText('electrons');
  await mapDone(page);
});
