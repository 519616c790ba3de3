import js from '@eslint/js';
import { defineConfig } from 'eslint/config';
import tseslint from 'typescript-eslint';

const nodeBuiltins = ['fs', 'path', 'os', 'worker_threads', 'child_process', 'url', 'process'];

// solver/ is pure numbers: it must run unchanged in a browser worker, in Node and in tests,
// so it may not reach for the UI, the store, the worker transport, drawing or the host system.
const solverBoundary = {
  paths: ['react', 'react-dom', 'zustand', 'comlink', 'd3', ...nodeBuiltins].map((name) => ({
    name,
    message: 'solver/ is pure numbers: no UI, store, worker transport, drawing or Node modules.',
  })),
  patterns: [
    {
      group: [
        'react/*',
        'react-dom/*',
        'zustand/*',
        'comlink/*',
        'd3/*',
        'd3-*',
        'node:*',
        ...nodeBuiltins.map((name) => `${name}/*`),
      ],
      message: 'solver/ is pure numbers: no UI, store, worker transport, drawing or Node modules.',
    },
    {
      group: ['**/app', '**/app/**', '**/workers', '**/workers/**'],
      message: 'solver/ sits below workers/ and app/ and may not import from them.',
    },
  ],
};

export default defineConfig(
  {
    ignores: ['dist/', 'dist-*/', 'node_modules/', 'playwright-report/', 'test-results/', '.look/'],
  },
  {
    linterOptions: { reportUnusedDisableDirectives: 'error' },
  },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    files: ['**/*.{js,mjs}'],
    languageOptions: {
      globals: { console: 'readonly', process: 'readonly', URL: 'readonly' },
    },
  },
  {
    // Node code that also hands functions to the page through Playwright.
    files: ['test/bench/*.mjs'],
    languageOptions: {
      globals: Object.fromEntries(
        [
          'Buffer',
          'fetch',
          'setTimeout',
          'performance',
          'window',
          'navigator',
          'PerformanceObserver',
          'document',
          'HTMLInputElement',
          'Event',
        ].map((name) => [name, 'readonly']),
      ),
    },
  },
  {
    files: ['solver/**'],
    rules: {
      'no-restricted-imports': ['error', solverBoundary],
    },
  },
);
