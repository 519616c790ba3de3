import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { scenarioToSetup } from '../app/scenario/scenario';
import { scenarioHash } from '../app/scenario/urlState';
import { BUSY_MACHINE_MS, failOnConsoleErrors, mapDone, pointAt } from './demoPage';

failOnConsoleErrors();
test.describe.configure({ timeout: 240_000 });

// The Observations panel (README, Physical units; public/notes.html#observations): rows typed as
// CSV are checked as `npm run fit` checks them and kept with the autosave and the link.

const ROWS = [
  'bPerp_T,tilt_deg,valleyZeeman_meV,kind,value,sigma,pair',
  '3,0,,phase,no spin moment,,',
  '6,,,transition_tilt,50.3,1.2,KD/CAF',
].join('\n');

test('rows typed as CSV are kept, survive a reload and ride in the link', async ({ page }) => {
  await page.goto('/');
  await mapDone(page);
  const panel = page.getByTestId('observations');
  await panel.scrollIntoViewIfNeeded();
  await expect(panel.getByTestId('observations-table').locator('caption')).toHaveText(
    'No observations kept',
  );
  await panel.getByTestId('observations-text').fill(ROWS);
  await panel.getByTestId('observations-keep').click();
  await expect(panel.getByTestId('observations-message')).toHaveText('2 rows kept.');
  await expect(panel.getByTestId('observation-2').locator('td')).toHaveText([
    '2',
    '6',
    '',
    '',
    'transition_tilt',
    '50.3',
    '1.2',
    'KD/CAF',
  ]);
  // The Map does not start again for observations: it stays done.
  await expect(page.getByTestId('map-status')).toHaveAttribute('data-phase', 'done');
  // The address holds the rows once its write interval has passed (the app's own update).
  await expect.poll(() => page.evaluate(() => location.hash), { timeout: 30_000 }).toMatch(/s=/);
  await expect
    .poll(async () => {
      const hash = await page.evaluate(() => location.hash);
      const code = new URLSearchParams(hash.slice(1)).get('s') ?? '';
      const json = Buffer.from(code.replace(/-/g, '+').replace(/_/g, '/'), 'base64').toString();
      return json.includes('"observations"') && json.includes('"KD/CAF"');
    })
    .toBe(true);

  await page.reload();
  await mapDone(page);
  const again = page.getByTestId('observations');
  await again.scrollIntoViewIfNeeded();
  await expect(again.getByTestId('observations-table').locator('caption')).toHaveText(
    '2 observations kept',
  );
  await expect(again.getByTestId('observation-1').locator('td').nth(5)).toHaveText(
    'no spin moment',
  );
  await expect(again.getByTestId('observations-text')).toHaveValue(/KD\/CAF/);
});

test('a bad row is named in one line, the text stays and the kept rows do not change', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  const panel = page.getByTestId('observations');
  await panel.scrollIntoViewIfNeeded();
  const bad = `${ROWS}\n6,,,transition_tilt,50.3,,KD/CAF`;
  await panel.getByTestId('observations-text').fill(bad);
  await panel.getByTestId('observations-keep').click();
  const message = panel.getByTestId('observations-message');
  await expect(message).toHaveAttribute('data-kind', 'error');
  await expect(message).toHaveText(
    'row 3 (line 4), column sigma: missing (the uncertainty, > 0); the rows kept are unchanged.',
  );
  await expect(panel.getByTestId('observations-text')).toHaveValue(bad);
  await expect(panel.getByTestId('observations-table').locator('caption')).toHaveText(
    'No observations kept',
  );
});

test('the kept rows are fitted on the Map\u2019s workers: phase rows alone give intervals', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  const panel = page.getByTestId('observations');
  await panel.scrollIntoViewIfNeeded();
  await panel
    .getByTestId('observations-text')
    .fill(['bPerp_T,tilt_deg,valleyZeeman_meV,kind,value,sigma', '3,0,,phase,CAF,'].join('\n'));
  await panel.getByTestId('observations-keep').click();
  await panel.getByTestId('observations-fit').click();
  const status = panel.getByTestId('observations-fit-status');
  await expect(status).toHaveAttribute('data-phase', 'done', { timeout: BUSY_MACHINE_MS });
  const x = panel.getByTestId('fit-parameter-0');
  await expect(x).toHaveAttribute('data-sigma', 'null');
  await expect(x.locator('td').nth(1)).toHaveText('not constrained');
  // The demo's couplings read per tesla: CAF at zero tilt needs 4 |u_perp,F| > g mu_B (E_Z per
  // tesla, g = 2, mu_B from CODATA 2018: E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)).
  const hi = Number(await x.locator('td').nth(3).getAttribute('data-hi'));
  console.log(`fit in the page: u_perp up to ${hi}`);
  expect(Math.abs(hi - -(2 * 5.788381806e-2) / 4)).toBeLessThan(1e-4);
  await expect(panel.getByTestId('fit-row-1').locator('td').nth(5)).toHaveText('yes');
  await expect(panel.getByTestId('fit-caution')).toContainText('Mean-field');
  // The consistent pixels are hatched on the Map: CAF holds on part of the demo plane only.
  const layer = page.getByTestId('consistency-layer');
  await expect(layer).toHaveAttribute('data-pixels', String(32 * 32));
  const consistent = Number(await layer.getAttribute('data-consistent'));
  expect(consistent).toBeGreaterThan(0);
  expect(consistent).toBeLessThan(32 * 32);
  await expect(layer.locator('rect')).toHaveCount(consistent);
  // The Figure export hatches the same pixels.
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByTestId('export-svg').click(),
  ]);
  const svg = readFileSync(await download.path(), 'utf8');
  const hatched = /<g id="consistent"[^>]*>([\s\S]*?)<\/g>/.exec(svg)![1]!;
  expect(hatched.match(/<rect /g)).toHaveLength(consistent);
  expect(svg).toContain('every observation holds (1 row)');
  // The readout says how many rows hold under the pointer.
  await page.getByTestId('map-plot').scrollIntoViewIfNeeded();
  for (const [x, y, held] of [
    [-0.3, 1.6, '1'],
    [1.5, 1.5, '0'],
  ] as const) {
    const [px, py] = await pointAt(page, x, y);
    await page.mouse.move(px, py);
    await expect(page.getByTestId('readout-observations')).toHaveAttribute('data-held', held);
  }
  // The fitted point becomes a Probe pin in one click.
  await panel.getByTestId('fit-pin').click();
  await expect(page.getByTestId('probe-pin-1')).toHaveCount(1);
  // A change of the setup makes the result out of date.
  await panel
    .getByTestId('observations-text')
    .fill(['bPerp_T,tilt_deg,valleyZeeman_meV,kind,value,sigma', '3,0,,phase,F,'].join('\n'));
  await panel.getByTestId('observations-keep').click();
  await expect(status).toHaveAttribute('data-phase', 'stale');
  await expect(layer).toHaveCount(0);
});

test('a transition row: the fit recovers u_perp and predicts the tilt at another field', async ({
  page,
}) => {
  // A contact-model plane near the F/CAF transition, read per tesla, with one transition row.
  const setup = scenarioToSetup({
    filling: 0,
    channels: {},
    zeeman: 0.1,
    valleyZeeman: 0,
    plane: {
      x: {
        label: 'u_perp',
        from: -0.12,
        to: -0.02,
        targets: { 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': 1, 'y0.hartree': 1 },
      },
      y: { label: 'u_z', from: 0.15, to: 0.4, targets: { 'z0.fock': 1, 'z0.hartree': 1 } },
      resolution: [16, 16],
    },
    fourfold: {
      observations: {
        rows: [
          {
            bPerp_T: 2,
            tilt_deg: null,
            valleyZeeman_meV: null,
            kind: 'transition_tilt',
            value: 60,
            sigma: 1,
            pair: 'CAF/F',
          },
        ],
      },
    },
  });
  await page.goto(`/${scenarioHash(setup)}`);
  await mapDone(page);
  const panel = page.getByTestId('observations');
  await panel.scrollIntoViewIfNeeded();
  await panel.getByTestId('observations-fit').click();
  await expect(panel.getByTestId('observations-fit-status')).toHaveAttribute('data-phase', 'done', {
    timeout: BUSY_MACHINE_MS,
  });
  // u_perp per tesla = -g mu_B / (4 cos 60 deg) (Phys. Rev. B 85, 155439 (2012); mu_B CODATA
  // 2018, E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)).
  const x = panel.getByTestId('fit-parameter-0');
  const estimate = Number(await x.locator('td').nth(1).textContent());
  expect(Math.abs(estimate - -(2 * 5.788381806e-2) / 2)).toBeLessThan(1e-4);
  await panel.getByTestId('fit-predict-field').fill('9');
  await panel.getByTestId('fit-predict').click();
  const prediction = panel.getByTestId('fit-prediction-1');
  await expect(prediction).toContainText('CAF to F at 9 T: 60');
  await expect(prediction).toContainText('\u00b1');
  expect(Math.abs(Number(await prediction.getAttribute('data-tilt')) - 60)).toBeLessThan(1e-6);
});
