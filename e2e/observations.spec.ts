import { expect, test } from '@playwright/test';
import { failOnConsoleErrors, mapDone } from './demoPage';

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
