import { expect, test, type Page } from '@playwright/test';
import { DEMO_SETUP } from '../app/scenario/demo';
import { setupToScenario } from '../app/scenario/scenario';
import { scenarioHash } from '../app/scenario/urlState';
import { AUTOSAVE_VERSION, KEPT_KEY_PREFIX, STORAGE_KEY } from '../app/store/autosave';
import { DEMO, failOnConsoleErrors, mapDone, pointAt } from './demoPage';

failOnConsoleErrors();
// Each case loads the app afresh and waits for a Map, on a machine that may be busy.
test.describe.configure({ timeout: 240_000 });

/**
 * Puts `text` in the autosave before the app's first start in this context (later loads of
 * the page leave it alone), as an older tab, a crash or a hand edit might have left it.
 */
async function seedAutosave(page: Page, text: string): Promise<void> {
  await page.addInitScript(
    ([key, value]) => {
      if (sessionStorage.getItem('seeded') !== null) return;
      sessionStorage.setItem('seeded', '1');
      localStorage.setItem(key, value);
    },
    [STORAGE_KEY, text] as const,
  );
}

/** The copies of unusable autosaves, by key. */
async function keptAutosaves(page: Page): Promise<Record<string, string>> {
  return page.evaluate((prefix) => {
    const out: Record<string, string> = {};
    for (let k = 0; k < localStorage.length; k++) {
      const key = localStorage.key(k)!;
      if (key.startsWith(prefix)) out[key] = localStorage.getItem(key)!;
    }
    return out;
  }, KEPT_KEY_PREFIX);
}

/** The readout's energy at plane point (x, y) of the demo plane. */
async function energyAt(page: Page, x: number, y: number) {
  const [px, py] = await pointAt(page, x, y);
  await page.mouse.move(px, py);
  const r = page.getByTestId('readout');
  await expect(r.getByTestId('readout-phase')).toHaveText('F');
  const value = async (id: string) => Number(await r.getByTestId(id).getAttribute('data-value'));
  return {
    x: await value('readout-x'),
    y: await value('readout-y'),
    e: await value('readout-energy'),
  };
}

const demoWith = (zeeman: number) => scenarioHash({ ...DEMO_SETUP, zeeman }).replace(/^#/, '');

test('a reload right after an edit keeps the edit, in the setup and the Map', async ({ page }) => {
  test.setTimeout(480_000);
  await page.goto('/');
  await mapDone(page);
  // Typed key by key: every keystroke is a change, the last ones within the address's
  // write interval, and the reload comes at once.
  const entry = page.getByTestId('zeeman-entry');
  await entry.fill('');
  await entry.pressSequentially('0.95');
  await page.reload();
  await expect(page.getByTestId('zeeman')).toHaveValue('0.95');
  await expect(page.getByTestId('zeeman-entry')).toHaveValue('0.95');
  await mapDone(page);
  // The Map follows: in F the energy is -2 uPerp_F - uZ_F - E_Z (closed form, after Phys. Rev.
  // B 85, 155439 (2012)).
  const f = await energyAt(page, 0.5, 1.5);
  expect(f.e).toBeCloseTo(-2 * f.x - f.y - 0.95, 9);
  expect(page.url()).toContain('#s=');

  // A slider change and an immediate reload.
  await page.getByTestId('zeeman').fill('1.1');
  await page.reload();
  await expect(page.getByTestId('zeeman')).toHaveValue('1.1');
  await mapDone(page);
  const g = await energyAt(page, 0.5, 1.5);
  expect(g.e).toBeCloseTo(-2 * g.x - g.y - 1.1, 9);
  // And the autosave alone (no link) holds it too.
  await page.goto('/');
  await expect(page.getByTestId('zeeman')).toHaveValue('1.1');
  await mapDone(page);
});

for (const corrupt of ['not json {', '']) {
  test(`an autosave of ${JSON.stringify(corrupt)} is kept aside and reported; a valid link wins`, async ({
    page,
  }) => {
    await seedAutosave(page, corrupt);
    await page.goto(`/#${demoWith(0.9)}`);
    await expect(page.getByTestId('zeeman')).toHaveValue('0.9');
    const notice = page.getByTestId('notice');
    await expect(notice).toContainText('The autosave was not used');
    await expect(notice).toContainText(KEPT_KEY_PREFIX);
    expect(await notice.textContent()).not.toContain('\n');
    expect(Object.values(await keptAutosaves(page))).toEqual([corrupt]);
    await mapDone(page);
    // The autosave now holds the link's setup.
    const stored = await page.evaluate((key) => localStorage.getItem(key), STORAGE_KEY);
    expect(JSON.parse(stored!).state.setup.zeeman).toBe(0.9);
  });
}

test('an autosave of a newer format is kept aside and reported, and the demo starts', async ({
  page,
}) => {
  const future = JSON.stringify({
    state: { setup: setupToScenario({ ...DEMO_SETUP, zeeman: 1.7 }), cut: null },
    version: 99,
  });
  await seedAutosave(page, future);
  await page.goto('/');
  const notice = page.getByTestId('notice');
  await expect(notice).toContainText('newer version');
  await expect(notice).toContainText(KEPT_KEY_PREFIX);
  await expect(page.getByTestId('zeeman')).toHaveValue(String(DEMO.zeeman));
  expect(Object.values(await keptAutosaves(page))).toEqual([future]);
  await mapDone(page);
});

test('a grid of 2048 in the autosave is cut to 512, and the notice names the autosave', async ({
  page,
}) => {
  const big = JSON.stringify({
    state: { setup: setupToScenario({ ...DEMO_SETUP, resolution: [2048, 48] }), cut: null },
    version: AUTOSAVE_VERSION,
  });
  await seedAutosave(page, big);
  await page.goto('/');
  const notice = page.getByTestId('notice');
  await expect(notice).toHaveText(
    'Setup from the autosave: resolution 2048 × 48 reduced to 512 × 48, the most the browser maps (npm run map takes the full grid).',
  );
  await expect(page.getByTestId('resolution-nx')).toHaveValue('512');
  await expect(page.getByTestId('map-status')).toContainText('512 × 48', { timeout: 60_000 });
  await mapDone(page);
  expect(page.url()).toContain('#s=');
  expect(await keptAutosaves(page)).toEqual({});
});

test('a link with the largest grid of the command line (8192) is cut to 512; one of 8193 is refused in one line, and the setup stays', async ({
  page,
}) => {
  await page.goto(`/${scenarioHash({ ...DEMO_SETUP, zeeman: 0.9, resolution: [8192, 40] })}`);
  const notice = page.getByTestId('notice');
  await expect(notice).toHaveText(
    'Setup from the link: resolution 8192 × 40 reduced to 512 × 40, the most the browser maps (npm run map takes the full grid).',
  );
  await expect(page.getByTestId('resolution-nx')).toHaveValue('512');
  await mapDone(page);
  await page.goto(`/${scenarioHash({ ...DEMO_SETUP, zeeman: 0.3, resolution: [40, 8193] })}`);
  await expect(notice).toContainText(
    'plane.resolution[1]: expected an integer from 2 to 8192, got 8193. The setup is unchanged.',
  );
  expect(await notice.textContent()).not.toContain('\n');
  await expect(page.getByTestId('zeeman')).toHaveValue('0.9');
  await expect(page.getByTestId('resolution-nx')).toHaveValue('512');
  await mapDone(page);
});
