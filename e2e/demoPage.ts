import { expect, test, type Page } from '@playwright/test';

/** The demo scenario (app/scenario/demo.ts): Hartree per Fock 1.2 for uPerp, 0.7 for uZ. */
export const DEMO = { ratioPerp: 1.2, ratioZ: 0.7, zeeman: 0.6 };
/** One pixel of the demo plane: 4 / 256. */
export const PIXEL = 4 / 256;

/** Fails the test on any console error or uncaught exception of the page. */
export function failOnConsoleErrors(): void {
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
}

/**
 * How long a test waits for the app's own status of a long task (a Map, a Cut, a Probe, an
 * export): the 256 x 256 demo Map takes a few seconds on an idle 2-core machine, and several
 * times that while other work runs on it, so the waits allow for a busy machine.
 */
export const BUSY_MACHINE_MS = 120_000;

/** Waits until the Map's status says it is finished (`map-status` data-phase = done). */
export async function mapDone(page: Page): Promise<void> {
  await expect(page.getByTestId('map-status')).toHaveAttribute('data-phase', 'done', {
    timeout: BUSY_MACHINE_MS,
  });
}

/** Waits until the Cut's status says it is finished (`cut-status` data-status = done). */
export async function cutDone(page: Page): Promise<void> {
  await expect(page.getByTestId('cut-status')).toHaveAttribute('data-status', 'done', {
    timeout: BUSY_MACHINE_MS,
  });
}

/** Types a Cut's line into its four end fields, from (x, y) to (x, y) in plane coordinates. */
export async function typeCutLine(
  page: Page,
  [fromX, fromY]: readonly [string, string],
  [toX, toY]: readonly [string, string],
): Promise<void> {
  const cut = page.getByTestId('cut');
  await cut.getByTestId('cut-from-x').fill(fromX);
  await cut.getByTestId('cut-from-y').fill(fromY);
  await cut.getByTestId('cut-to-x').fill(toX);
  await cut.getByTestId('cut-to-y').fill(toY);
}

/** Page position of axis coordinates (x, y) of the plot (the demo plane is [-2, 2]^2). */
export async function pointAt(page: Page, x: number, y: number): Promise<[number, number]> {
  const box = (await page.getByTestId('map-plot').boundingBox())!;
  const [from, to] = [-2, 2];
  return [
    box.x + ((x - from) / (to - from)) * box.width,
    box.y + (1 - (y - from) / (to - from)) * box.height,
  ];
}

/** The demo model at a plane point, as a model file for `npm run solve`. */
export function demoModelAt(x: number, y: number) {
  return {
    filling: 0,
    channels: {
      x0: { hartree: DEMO.ratioPerp * x, fock: x },
      y0: { hartree: DEMO.ratioPerp * x, fock: x },
      z0: { hartree: DEMO.ratioZ * y, fock: y },
    },
    zeeman: DEMO.zeeman,
    valleyZeeman: 0,
  };
}
