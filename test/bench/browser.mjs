// In-browser part of `npm run bench`: builds the app, serves it with `vite preview`, drives
// Debian's Chromium through Playwright and reads the app's performance measures
// (`fourfold:coarse`, `fourfold:done`: from the setup change to the first full coarse frame and
// to the finished map) and long tasks on the page's main thread. The baseline runs in the same
// session: the same page with `?baseline=cold` (a full cold search per pixel, no coarse grid,
// no warm starts, no adaptivity, no boundary refinement).
import { execFileSync, spawn } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { chromium } from '@playwright/test';
import { CHROMIUM_ARGS, CHROMIUM_EXECUTABLE } from '../../e2e/chromium.mjs';

const PORT = 4318;
const BASE = `http://127.0.0.1:${PORT}`;

/** The standard model's worked point and plane at 256 x 256 (the benchmark scenario). */
const SCENARIO = {
  filling: 0,
  channels: {
    x0: { hartree: -1, fock: -1 },
    y0: { hartree: -1, fock: -1 },
    z0: { hartree: 2, fock: 2 },
  },
  zeeman: 0.4,
  valleyZeeman: 0,
  plane: {
    x: {
      label: 'u_perp',
      from: -2,
      to: 2,
      targets: { 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': 1, 'y0.hartree': 1 },
    },
    y: { label: 'u_z', from: -2, to: 2, targets: { 'z0.fock': 1, 'z0.hartree': 1 } },
    resolution: [256, 256],
  },
};

function hashOf(scenario) {
  return `#s=${Buffer.from(JSON.stringify(scenario)).toString('base64url')}`;
}

async function waitForServer(url, timeoutMs) {
  const end = Date.now() + timeoutMs;
  for (;;) {
    try {
      const response = await fetch(url);
      if (response.ok) return;
    } catch {
      // not up yet
    }
    if (Date.now() > end) throw new Error(`bench: ${url} did not come up`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

function median(values) {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

async function mapDone(page, timeout) {
  await page.waitForSelector('[data-testid="map-status"][data-phase="done"]', { timeout });
}

/** Durations (ms) of the app's measures named `name`, for jobs after `afterJob`. */
async function measures(page, name) {
  return page.evaluate(
    (n) => performance.getEntriesByName(n).map((e) => ({ job: e.detail.job, ms: e.duration })),
    name,
  );
}

/** Sets the Zeeman slider and returns the coarse and done times of the job it started. */
async function sliderChange(page, value, timeout) {
  const before = (await measures(page, 'fourfold:done')).length;
  await page.getByTestId('zeeman').fill(String(value));
  await page.waitForFunction(
    (count) => performance.getEntriesByName('fourfold:done').length > count,
    before,
    { timeout },
  );
  const done = (await measures(page, 'fourfold:done')).at(-1);
  const coarse = (await measures(page, 'fourfold:coarse')).find((m) => m.job === done.job);
  return { coarseMs: coarse?.ms ?? NaN, doneMs: done.ms };
}

async function openPage(browser, query) {
  const page = await browser.newPage({ viewport: { width: 1440, height: 1000 } });
  await page.addInitScript(() => {
    window.__longTasks = [];
    new PerformanceObserver((list) => {
      for (const e of list.getEntries()) window.__longTasks.push(e.duration);
    }).observe({ type: 'longtask', buffered: true });
  });
  await page.goto(`${BASE}/${query}${hashOf(SCENARIO)}`);
  return page;
}

/**
 * Runs the browser measurements; returns rows for the report. `repeats` slider changes are
 * timed for ours, one for the baseline (it takes seconds).
 */
export async function runBrowserBenchmark({ root, repeats = 9 }) {
  execFileSync('npx', ['vite', 'build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
  const server = spawn(
    'npx',
    ['vite', 'preview', '--host', '127.0.0.1', '--strictPort', '--port', String(PORT)],
    { cwd: root, stdio: 'ignore', detached: true },
  );
  let browser;
  try {
    await waitForServer(BASE, 30000);
    browser = await chromium.launch({
      executablePath: CHROMIUM_EXECUTABLE,
      args: CHROMIUM_ARGS,
    });
    const page = await openPage(browser, '');
    await mapDone(page, 60000);
    const cores = await page.evaluate(() => navigator.hardwareConcurrency);
    const ours = [];
    for (let k = 0; k < repeats; k++) ours.push(await sliderChange(page, 0.45 + 0.03 * k, 30000));

    // Continuous drag: one keyboard step (0.01) every 20 ms for 3 s.
    await page.evaluate(() => (window.__longTasks.length = 0));
    const coarseBefore = (await measures(page, 'fourfold:coarse')).length;
    await page.getByTestId('zeeman').focus();
    const dragStart = Date.now();
    let steps = 0;
    while (Date.now() - dragStart < 3000) {
      await page.keyboard.press('ArrowRight');
      steps++;
      await page.waitForTimeout(20);
    }
    const dragSeconds = (Date.now() - dragStart) / 1000;
    const framesDuringDrag = (await measures(page, 'fourfold:coarse')).length - coarseBefore;
    const longTasks = await page.evaluate(() => window.__longTasks.slice());
    await mapDone(page, 30000);
    await page.close();

    const coldPage = await openPage(browser, '?baseline=cold');
    await mapDone(coldPage, 300000);
    const cold = await sliderChange(coldPage, 0.45, 300000);
    await coldPage.close();

    const coarseMs = median(ours.map((o) => o.coarseMs));
    const doneMs = median(ours.map((o) => o.doneMs));
    return {
      cores,
      samples: ours,
      cold,
      drag: {
        seconds: dragSeconds,
        steps,
        frames: framesDuringDrag,
        longestTaskMs: longTasks.length ? Math.max(...longTasks) : 0,
        longTasks: longTasks.length,
      },
      rows: [
        {
          key: 'browserCoarse',
          measurement: `browser: slider change -> first full coarse frame, 256x256 (median of ${repeats})`,
          oursMicroseconds: coarseMs * 1000,
          baselineMicroseconds: cold.doneMs * 1000,
          baselineNote: 'its first frame is the whole map',
          targetMicroseconds: 100e3,
        },
        {
          key: 'browserRefined',
          measurement: `browser: slider change -> refined 256x256 map with boundaries (median of ${repeats})`,
          oursMicroseconds: doneMs * 1000,
          baselineMicroseconds: cold.doneMs * 1000,
          targetMicroseconds: 1e6,
        },
      ],
    };
  } finally {
    await browser?.close();
    try {
      process.kill(-server.pid);
    } catch {
      // already gone
    }
  }
}

function ms(value) {
  return `${value.toFixed(0)} ms`;
}

/** Prints the browser table and writes test-results/bench-browser.json. */
export function printBrowserReport(root, result) {
  const header = [
    'measurement (in Chromium, production build)',
    'ours',
    'baseline',
    'baseline/ours',
    'target',
  ];
  const lines = result.rows.map((row) => {
    const ours = row.oursMicroseconds / 1000;
    const base = row.baselineMicroseconds / 1000;
    const target = row.targetMicroseconds / 1000;
    return [
      row.measurement,
      ms(ours),
      Number.isFinite(base)
        ? `${ms(base)}${row.baselineNote ? ` (${row.baselineNote})` : ''}`
        : '-',
      Number.isFinite(base) ? `${(base / ours).toFixed(1)}x` : '-',
      `<= ${ms(target)}: ${ours <= target ? 'met' : 'NOT MET'}`,
    ];
  });
  const widths = header.map((h, k) => Math.max(h.length, ...lines.map((l) => l[k].length)));
  const format = (cells) =>
    cells.map((c, k) => (k === 0 ? c.padEnd(widths[k]) : c.padStart(widths[k]))).join('  ');
  const { drag } = result;
  const text = [
    `Fourfold in the browser: ${result.cores} workers, scenario = standard model and (u_perp, u_z) plane at 256 x 256`,
    '',
    format(header),
    widths.map((w) => '-'.repeat(w)).join('  '),
    ...lines.map(format),
    '',
    `ours, each slider change (coarse / refined): ${result.samples.map((s) => `${ms(s.coarseMs)} / ${ms(s.doneMs)}`).join(', ')}`,
    `baseline (?baseline=cold: full cold search at every pixel, no coarse grid, no warm start, no adaptivity, no boundary refinement): ${ms(result.cold.doneMs)}`,
    `drag: ${drag.steps} slider steps in ${drag.seconds.toFixed(1)} s -> ${drag.frames} coarse frames drawn (${(drag.frames / drag.seconds).toFixed(1)} per s); ` +
      `main-thread long tasks: ${drag.longTasks}, longest ${ms(drag.longestTaskMs)} (target <= 50 ms: ${drag.longestTaskMs <= 50 ? 'met' : 'NOT MET'})`,
  ].join('\n');
  process.stdout.write(`\n${text}\n`);
  mkdirSync(join(root, 'test-results'), { recursive: true });
  writeFileSync(
    join(root, 'test-results', 'bench-browser.json'),
    JSON.stringify(result, null, 2) + '\n',
  );
}

/** Standalone: `node test/bench/browser.mjs` runs the browser part only. */
if (import.meta.url === `file://${process.argv[1]}`) {
  const root = join(import.meta.dirname, '..', '..');
  printBrowserReport(root, await runBrowserBenchmark({ root }));
}
