import { expect, test } from '@playwright/test';

const consoleErrors: string[] = [];

test.beforeEach(({ page }) => {
  consoleErrors.length = 0;
  page.on('console', (message) => {
    if (message.type() === 'error') consoleErrors.push(message.text());
  });
  page.on('pageerror', (error) => consoleErrors.push(error.message));
});

test.afterEach(() => {
  expect(consoleErrors, 'console errors on the page').toEqual([]);
});

test('solves the example model, then keeps that result when the input is bad', async ({ page }) => {
  await page.goto('/');
  await page.getByTestId('solve').click();

  // Closed form of model.md section 5 (canted antiferromagnet, after Phys. Rev. B 85, 155439
  // (2012)): uPerp = -1, uZ = 2, E_Z = 0.4 gives E = -uZ - E_Z^2 / (8 |uPerp|) = -2.02.
  const result = page.getByTestId('result');
  await expect(result.getByTestId('phase')).toHaveText('CAF');
  const energy = Number(await result.getByTestId('energy').textContent());
  expect(energy).toBeCloseTo(-2.02, 6);
  await expect(result.locator('td[data-channel]')).toHaveCount(15);
  await expect(page.getByTestId('error')).toHaveCount(0);

  await page.screenshot({ path: 'test-results/solve.png', fullPage: true });

  await page.getByTestId('model').fill('{ "filling": 0, "channels": ');
  await page.getByTestId('solve').click();
  const error = page.getByTestId('error');
  await expect(error).toContainText('not valid JSON');
  expect((await error.textContent())?.includes('\n')).toBe(false);
  await expect(result.getByTestId('phase')).toHaveText('CAF');
  expect(Number(await result.getByTestId('energy').textContent())).toBe(energy);

  await page.screenshot({ path: 'test-results/solve-error.png', fullPage: true });
});

test('names the bad field of an invalid model', async ({ page }) => {
  await page.goto('/');
  await page.getByTestId('model').fill('{ "filling": 0, "channels": { "qq": { "fock": 1 } } }');
  await page.getByTestId('solve').click();
  await expect(page.getByTestId('error')).toContainText('qq');
  await expect(page.getByTestId('result')).toHaveCount(0);
});
