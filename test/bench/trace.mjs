#!/usr/bin/env node
// Where the browser's main thread spends its time: opens the app in Chromium (production build,
// or the development server with --dev), records a Chromium trace and a JavaScript CPU profile
// through Playwright's DevTools-protocol session, first for the page load (navigation to the
// finished map), then for a 3-s pointer drag of the Zeeman slider, and prints the top entries.
// The production build is built unminified, so that the profile names functions.
// The raw files go to test-results/trace/ (open the .json in Chromium's Performance panel).
//   node test/bench/trace.mjs [--dev] [--port N] [--dist DIR] [--root DIR --label NAME: another
//   checkout, its files named NAME-...]
import { execFileSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  dragSlider,
  gotoScenario,
  launchBrowser,
  mapDone,
  measures,
  newContext,
  newObservedPage,
  startServer,
} from './pageSession.mjs';
import { summariseCpuProfile, summariseTrace } from './profileSummary.mjs';

const CATEGORIES = [
  'devtools.timeline',
  'disabled-by-default-devtools.timeline',
  'disabled-by-default-devtools.timeline.frame',
  'blink.user_timing',
  'v8.execute',
  'disabled-by-default-v8.gc',
  'toplevel',
  'input',
].join(',');

function option(args, name, fallback) {
  const k = args.indexOf(name);
  return k < 0 ? fallback : args[k + 1];
}

/** Records a trace and a CPU profile of the page around `action`; returns both. */
async function recorded(browser, page, session, action) {
  await session.send('Profiler.enable');
  await session.send('Profiler.setSamplingInterval', { interval: 200 });
  await session.send('Profiler.start');
  await browser.startTracing(page, { categories: CATEGORIES.split(',') });
  const result = await action();
  const trace = JSON.parse((await browser.stopTracing()).toString('utf8'));
  const { profile } = await session.send('Profiler.stop');
  return { result, trace, profile };
}

export async function traceSession({ root, dev, port, dist, label }) {
  if (!dev) {
    execFileSync(
      process.execPath,
      [
        join(root, 'node_modules/vite/bin/vite.js'),
        'build',
        '--outDir',
        dist,
        '--minify',
        'false',
        '--logLevel',
        'warn',
      ],
      {
        cwd: root,
        stdio: 'inherit',
      },
    );
  }
  const server = await startServer({ root, kind: dev ? 'dev' : 'preview', port, outDir: dist });
  const browser = await launchBrowser();
  const kind = `${label ? `${label}-` : ''}${dev ? 'dev' : 'prod'}`;
  const outDir = join(import.meta.dirname, '..', '..', 'test-results', 'trace');
  mkdirSync(outDir, { recursive: true });
  const report = [];
  try {
    const page = await newObservedPage(await newContext(browser));
    const session = await page.context().newCDPSession(page);
    const load = await recorded(browser, page, session, async () => {
      await gotoScenario(page, server.url);
      await mapDone(page, 120000);
      const coarse = (await measures(page, 'fourfold:coarse'))[0];
      const done = (await measures(page, 'fourfold:done'))[0];
      return { firstCoarseMs: coarse?.end, doneMs: done?.end };
    });
    const drag = await recorded(browser, page, session, () => dragSlider(page));
    for (const [name, part] of [
      ['load', load],
      ['drag', drag],
    ]) {
      writeFileSync(join(outDir, `${kind}-${name}.json`), JSON.stringify(part.trace));
      writeFileSync(join(outDir, `${kind}-${name}.cpuprofile`), JSON.stringify(part.profile));
      report.push(
        `=== ${kind} ${name}: ${JSON.stringify(part.result)}`,
        summariseTrace(part.trace.traceEvents),
        summariseCpuProfile(part.profile, 20),
        '',
      );
    }
  } finally {
    await browser.close();
    server.stop();
  }
  return report.join('\n');
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const args = process.argv.slice(2);
  const root = option(args, '--root', join(import.meta.dirname, '..', '..'));
  const text = await traceSession({
    root,
    dev: args.includes('--dev'),
    port: Number(option(args, '--port', process.env.FOURFOLD_E2E_PORT ?? 4318)),
    dist: option(args, '--dist', process.env.FOURFOLD_E2E_DIST ?? '../dist'),
    label: option(args, '--label', ''),
  });
  process.stdout.write(text + '\n');
}
