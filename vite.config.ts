import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

const repoRoot = fileURLToPath(new URL('.', import.meta.url));

export default defineConfig({
  root: 'app',
  publicDir: '../public',
  plugins: [react()],
  build: {
    outDir: '../dist',
    emptyOutDir: true,
  },
  worker: {
    format: 'es',
  },
  test: {
    // The page lives in app/, but unit tests live in test/ at the repository root.
    root: repoRoot,
    include: ['test/**/*.test.ts'],
    environment: 'node',
    testTimeout: 60000,
  },
});
