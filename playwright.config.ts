import { defineConfig } from '@playwright/test';
import { CHROMIUM_ARGS, CHROMIUM_EXECUTABLE } from './e2e/chromium.mjs';

const port = 4317;
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
    command: `npx vite build && npx vite preview --host 127.0.0.1 --strictPort --port ${port}`,
    url: baseURL,
    reuseExistingServer: !process.env.CI,
    timeout: 120_000,
  },
});
