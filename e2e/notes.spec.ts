import { expect, test } from '@playwright/test';
import { failOnConsoleErrors, mapDone } from './demoPage';

failOnConsoleErrors();

test('the header links the model notes, served with the app and opened in a new tab', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);
  const link = page.getByTestId('notes-link');
  await expect(link).toBeVisible();
  await expect(link).toHaveAttribute('target', '_blank');

  const response = await page.request.get((await link.getAttribute('href'))!);
  expect(response.status()).toBe(200);
  expect(response.headers()['content-type']).toMatch(/^text\/html/);

  const [notes] = await Promise.all([page.context().waitForEvent('page'), link.click()]);
  await notes.waitForLoadState();
  expect(new URL(notes.url()).pathname).toBe('/notes.html');
  await expect(notes).toHaveTitle('Fourfold model notes');
  await expect(notes.locator('h2#closed-forms')).toBeVisible();
  await notes.screenshot({ path: 'test-results/screenshots/notes.png' });
  await notes.close();

  // A heading the code and the README cite opens at that heading.
  const section = await page.context().newPage();
  const opened = await section.goto('/notes.html#order-parameters');
  expect(opened!.status()).toBe(200);
  await expect(section.locator('h2#order-parameters')).toBeInViewport();
  const symbols = section.locator('section:has(#labels) table td:first-child code');
  await expect(symbols).toContainText(['F', 'Fxy', 'AF', 'CAF', 'CDW', 'KD', 'SB', 'SBxy', 'sym']);
});
