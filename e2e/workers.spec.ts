import { expect, test, type Page } from '@playwright/test';
import { failOnConsoleErrors } from './demoPage';

failOnConsoleErrors();

/** A map on a busy 2-core machine: allow for load and other work. */
const MAP_TIMEOUT = 120_000;

async function mapFinished(page: Page): Promise<void> {
  await expect(page.getByTestId('map-status')).toHaveAttribute('data-phase', 'done', {
    timeout: MAP_TIMEOUT,
  });
}

/**
 * Sets the E_Z slider `count` times through `input` events, one per animation frame (as a drag
 * does), cycling through `count` different values from `from` up in slider steps of 0.01.
 */
async function dragZeeman(page: Page, from: number, count: number): Promise<void> {
  await page.getByTestId('zeeman').evaluate(
    async (slider, { from, count }) => {
      const input = slider as HTMLInputElement;
      const setValue = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!;
      for (let k = 0; k < count; k++) {
        setValue.call(input, (from + 0.01 * (k % 100)).toFixed(2));
        input.dispatchEvent(new Event('input', { bubbles: true }));
        await new Promise((next) => requestAnimationFrame(next));
      }
    },
    { from, count },
  );
}

/** Phases of the map status line, in order, as the page shows them (recorded on the page). */
async function recordPhases(page: Page): Promise<() => Promise<string[]>> {
  await page.getByTestId('map-status').evaluate((status) => {
    const seen: string[] = [];
    (window as unknown as { phasesSeen: string[] }).phasesSeen = seen;
    new MutationObserver(() => {
      const phase = status.getAttribute('data-phase')!;
      if (seen.at(-1) !== phase) seen.push(phase);
    }).observe(status, { attributes: true, attributeFilter: ['data-phase'] });
  });
  return () => page.evaluate(() => (window as unknown as { phasesSeen: string[] }).phasesSeen);
}

test('a map worker stopped silently mid-map is replaced within seconds; the map finishes', async ({
  page,
}) => {
  test.setTimeout(240_000);
  await page.goto('/?test-hooks');
  await mapFinished(page);
  const phases = await recordPhases(page);
  // One slider step starts a job, and worker 0 is stopped while that job's tasks are in flight.
  const killed = await page.getByTestId('zeeman').evaluate((slider) => {
    const input = slider as HTMLInputElement;
    Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!.call(input, '1.1');
    input.dispatchEvent(new Event('input', { bubbles: true }));
    return window.__fourfoldTest!.killWorker(0);
  });
  expect(killed).toBe(true);
  const killedAt = Date.now();
  // Noticed and reported in a few seconds (before, nothing was said for 30 s).
  await expect(page.getByTestId('map-workers')).toHaveText(
    /^A map worker was replaced \(the worker stopped without an error\); its tasks were run again\.$/,
    { timeout: 10_000 },
  );
  const noticedMs = Date.now() - killedAt;
  await mapFinished(page);
  console.log(`worker replaced ${noticedMs} ms after it was stopped`);
  await expect(page.getByTestId('map-problem')).toHaveCount(0);
  await expect(page.getByTestId('zeeman')).toHaveValue('1.1');
  // The status of the job only moved forward (a short stage may pass between two redraws).
  const order = ['coarse', 'refining', 'boundaries', 'done'];
  const seen = await phases();
  expect(seen[0]).toBe('coarse');
  expect(seen.at(-1)).toBe('done');
  expect(seen.map((phase) => order.indexOf(phase))).toEqual(
    [...seen.map((phase) => order.indexOf(phase))].sort((a, b) => a - b),
  );
  expect(seen).toContain('refining');
  // The notice stays under this map and goes with the next finished one.
  await page.getByTestId('zeeman').fill('1.2');
  await mapFinished(page);
  await expect(page.getByTestId('map-workers')).toHaveCount(0);
});

test('1,000 slider events leave the garbage-collected heap flat', async ({ page }) => {
  test.setTimeout(300_000);
  await page.goto('/');
  await mapFinished(page);
  const cdp = await page.context().newCDPSession(page);
  const heaps: number[] = [];
  for (let round = 0; round < 10; round++) {
    await dragZeeman(page, 0.3 + 0.5 * (round % 2), 100);
    await mapFinished(page);
    await cdp.send('HeapProfiler.collectGarbage');
    const { usedSize } = await cdp.send('Runtime.getHeapUsage');
    heaps.push(usedSize);
  }
  console.log(
    `heap after each round (MB): ${heaps.map((h) => (h / 2 ** 20).toFixed(3)).join(' ')}`,
  );
  expect(Math.abs(heaps[9]! - heaps[0]!) / heaps[0]!).toBeLessThan(0.05);
});
