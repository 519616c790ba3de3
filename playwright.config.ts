import { defineConfig } from '@playwright/test';
import { CHROMIUM_ARGS, CHROMIUM_EXECUTABLE } from './e2e/chromium.mjs';

// Several checkouts can run their browser tests at once on one machine: each picks its own port
// and build directory (defaults for CI).
const port = Number(process.env.FOURFOLD_E2E_PORT ?? 4317);
const outDir = process.env.FOURFOLD_E2E_DIST ?? '../dist';
const baseURL = `http://127.0.0.1:${port}`;

export default defineConfig({
  testDir: 'e2e',
  reporter: 'list',
  workers: 1,
  forbidOnly: !!process.env.CI,
  // The tests wait on the app's own status (a Map done, a Cut done, a download), never on a
  // clock, with the waits of e2e/demoPage.ts (BUSY_MACHINE_MS, 2 minutes per long task). A test
  // maps the 256 x 256 demo plane up to five times, which takes minutes on a busy 2-core machine
  // (a few seconds each when idle): allow six minutes per test, and 30 s for a quick assertion.
  timeout: 360_000,
  expect: { timeout: 30_000 },
  use: {
    baseURL,
  },
  projects: [
    {
      name: 'chromium',
      use: {
        browserName: 'chromium',
        launchOptions: {
          executablePath: CHROMIUM_EXECUTABLE,
          args: CHROMIUM_ARGS,
        },
      },
    },
  ],
  webServer: {
    command: `npx vite build --outDir ${outDir} && npx vite preview --outDir ${outDir} --host 127.0.0.1 --strictPort --port ${port}`,
    url: baseURL,
    reuseExistingServer: !process.env.CI,
    // Building and starting the server, on a machine that may be busy.
    timeout: 300_000,
  },
});
