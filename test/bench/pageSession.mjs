// Shared by the browser benchmark (browser.mjs) and the profiler (trace.mjs): serving the app
// (production build through `vite preview`, or the development server), opening it in Debian's
// Chromium with a long-task observer, and dragging a slider with the pointer.
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { chromium } from '@playwright/test';
import { CHROMIUM_ARGS, CHROMIUM_EXECUTABLE } from '../../e2e/chromium.mjs';

/** The standard model's worked point and plane at 256 x 256 (the benchmark scenario). */
export const SCENARIO = {
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

export function hashOf(scenario) {
  return `#s=${Buffer.from(JSON.stringify(scenario)).toString('base64url')}`;
}

export function median(values) {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

async function waitForServer(url, timeoutMs, exited) {
  const end = Date.now() + timeoutMs;
  for (;;) {
    if (exited()) throw new Error(`${url}: the server exited before it answered`);
    try {
      const response = await fetch(url);
      if (response.ok) return;
    } catch {
      // not up yet
    }
    if (Date.now() > end) throw new Error(`${url} did not come up in ${timeoutMs / 1000} s`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/**
 * Serves the app on 127.0.0.1:`port`: `kind` 'preview' serves the production build in `outDir`
 * (built beforehand), 'dev' runs the development server. Returns its address and `stop()`.
 */
export async function startServer({ root, kind, port, outDir }) {
  const vite = join(root, 'node_modules', 'vite', 'bin', 'vite.js');
  const common = ['--host', '127.0.0.1', '--strictPort', '--port', String(port)];
  const args =
    kind === 'dev' ? [vite, ...common] : [vite, 'preview', '--outDir', outDir, ...common];
  const server = spawn(process.execPath, args, { cwd: root, stdio: 'ignore', detached: true });
  let exited = false;
  server.on('exit', () => (exited = true));
  const url = `http://127.0.0.1:${port}`;
  const stop = () => {
    try {
      process.kill(-server.pid);
    } catch {
      // already gone
    }
  };
  try {
    await waitForServer(url, 60000, () => exited);
  } catch (error) {
    stop();
    throw error;
  }
  return { url, stop };
}

export function launchBrowser() {
  return chromium.launch({ executablePath: CHROMIUM_EXECUTABLE, args: CHROMIUM_ARGS });
}

/** A fresh browser context (empty cache and storage) with the benchmark's window size. */
export function newContext(browser) {
  return browser.newContext({ viewport: { width: 1440, height: 1000 } });
}

/**
 * A page in `context` that records every main-thread long task (PerformanceObserver
 * `longtask`: tasks over 50 ms) into `window.__longTasks`. Navigation is left to the caller
 * (`gotoScenario`), so that tracing can start before it.
 */
export async function newObservedPage(context) {
  const page = await context.newPage();
  await page.addInitScript(() => {
    window.__longTasks = [];
    new PerformanceObserver((list) => {
      for (const e of list.getEntries())
        window.__longTasks.push({ start: e.startTime, duration: e.duration });
    }).observe({ type: 'longtask', buffered: true });
  });
  return page;
}

export async function gotoScenario(page, url, query = '', scenario = SCENARIO) {
  await page.goto(`${url}/${query}${hashOf(scenario)}`);
}

export async function mapDone(page, timeout) {
  await page.waitForSelector('[data-testid="map-status"][data-phase="done"]', { timeout });
}

/** The app's performance entries named `name`: job, duration and end time (ms). */
export async function measures(page, name) {
  return page.evaluate(
    (n) =>
      performance.getEntriesByName(n).map((e) => ({
        job: e.detail?.job,
        ms: e.duration,
        start: e.startTime,
        end: e.startTime + e.duration,
      })),
    name,
  );
}

/** Sets the Zeeman slider and returns the coarse and done times of the job it started. */
export async function sliderChange(page, value, timeout) {
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

/**
 * Drags the Zeeman slider's thumb with the pointer for about `seconds`: press on the thumb,
 * then one pointer move every 16 ms (as a 60 Hz pointer would report), sweeping the value from
 * `from` to `to` and back, release. A busy page plays the moves out late: the returned `seconds`
 * is the wall time from press to release as the page saw it. Counts the coarse frames
 * (`fourfold:coarse` measures that ended inside the drag) and the long tasks meanwhile.
 */
export async function dragSlider(page, { seconds = 3, from = 0.3, to = 1.5 } = {}) {
  const slider = page.getByTestId('zeeman');
  await slider.fill(String(from));
  await mapDone(page, 120000);
  const box = await slider.boundingBox();
  const min = Number(await slider.getAttribute('min'));
  const max = Number(await slider.getAttribute('max'));
  // A range input's thumb travels the track less its own width (about 16 px in Chromium).
  const thumb = 16;
  const xOf = (v) => box.x + thumb / 2 + ((v - min) / (max - min)) * (box.width - thumb);
  const y = box.y + box.height / 2;
  await page.evaluate(() => (window.__longTasks.length = 0));
  await page.mouse.move(xOf(from), y);
  const startedAt = await page.evaluate(() => performance.now());
  await page.mouse.down();
  const moves = Math.round((seconds * 1000) / 16);
  const wallStart = Date.now();
  for (let k = 1; k <= moves; k++) {
    const phase = k / moves;
    // There and back, so the drag ends near where it started and keeps moving all the time.
    const s = phase < 0.5 ? 2 * phase : 2 - 2 * phase;
    await page.mouse.move(xOf(from + s * (to - from)), y);
    const due = wallStart + k * 16;
    const wait = due - Date.now();
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
  }
  await page.mouse.up();
  const endedAt = await page.evaluate(() => performance.now());
  const coarse = (await measures(page, 'fourfold:coarse')).filter(
    (m) => m.end >= startedAt && m.end <= endedAt,
  );
  const longTasks = await page.evaluate(() => window.__longTasks.slice());
  await mapDone(page, 120000);
  const dragSeconds = (endedAt - startedAt) / 1000;
  return {
    seconds: dragSeconds,
    moves,
    frames: coarse.length,
    framesPerSecond: coarse.length / dragSeconds,
    longTasks: longTasks.length,
    longestTaskMs: longTasks.reduce((a, t) => Math.max(a, t.duration), 0),
  };
}
