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

/** Waits for the finished Map, allowing for a busy two-core machine. */
export async function mapDone(page: Page): Promise<void> {
  await expect(page.getByTestId('map-status')).toHaveAttribute('data-phase', 'done', {
    timeout: 120_000,
  });
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
