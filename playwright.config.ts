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
    timeout: 120_000,
  },
});
