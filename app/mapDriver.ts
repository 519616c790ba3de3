import { ModelError, parseMapInput, type MapInput, errorLine } from '../solver/index';
import { createMapScheduler } from '../workers/mapClient';
import { provideSidePool, sidePoolFailed } from './sidePool';
import type { MapMode, MapScheduler } from '../workers/mapScheduler';
import { setupToScenario } from './scenario/scenario';
import { workerNotice } from './status/workerNotice';
import type { PoolEvent } from '../workers/workerPool';
import type { Setup } from './scenario/setup';
import { laterPhase } from './store/mapSlice';
import { useFourfold, type FourfoldState } from './store/index';

/** Performance-timeline names (read by the benchmark through Playwright). */
export const MARK_COARSE = 'fourfold:coarse';
export const MARK_DONE = 'fourfold:done';
/** A mark (time since navigation) when the page first shows a complete coarse frame. */
export const MARK_FIRST_COARSE = 'fourfold:first-coarse';

/** Progressive redraws while a map refines, at most one per this many milliseconds. */
const REDRAW_MS = 100;

/** Runs `then` once the next frame's drawing (requestAnimationFrame callbacks) is done. */
function afterPaint(then: () => void): void {
  requestAnimationFrame(() => setTimeout(then, 0));
}

type MapPatch = Parameters<FourfoldState['setMap']>[0];

/**
 * Keeps the Map in step with the Setup: every setup change that validates starts a new job (the
 * old one is dropped); one that does not is reported and the last valid map stays. While a job
 * has not yet shown its first coarse frame, a newer change waits for it (only the latest waits),
 * so dragging a slider keeps the map moving instead of restarting it on every input event.
 * Returns a function that stops the driver.
 */
export function startMapDriver(mode: MapMode = 'staged'): () => void {
  const store = useFourfold;
  let scheduler: MapScheduler | null = null;
  let stopped = false;
  let awaitingCoarse = false;
  let pending: { setup: Setup; changedAt: number } | null = null;
  // News of the workers stays under the Map until a job started after it is done (a worker
  // replaced), or for good (none could start).
  let replacedSoFar = 0;
  let workersNoticeJob = 0;
  let workersNoticeStays = false;
  const onPoolEvent = (event: PoolEvent): void => {
    if (event.kind === 'replaced') replacedSoFar++;
    workersNoticeJob = scheduler?.current ?? 0;
    workersNoticeStays ||= event.kind !== 'replaced';
    store.getState().setMap({ workers: workerNotice(event, replacedSoFar) });
  };
  let shownPlane: MapInput['plane'] | null = null;

  const launch = (setup: Setup, changedAt: number): void => {
    if (!scheduler) {
      pending = { setup, changedAt };
      return;
    }
    let scenario: ReturnType<typeof setupToScenario>;
    let input: MapInput;
    try {
      scenario = setupToScenario(setup);
      input = parseMapInput(scenario);
    } catch (error) {
      store
        .getState()
        .setSetupProblem(
          error instanceof ModelError
            ? `${errorLine(error)}. The map shows the last valid setup.`
            : errorLine(error),
        );
      return;
    }
    // A job whose plane is the previous one's keeps that plane object, so that what shows the
    // plane (axes, the Probe's and the Cut's fields) sees no change while a slider is dragged.
    if (shownPlane !== null && JSON.stringify(shownPlane) === JSON.stringify(input.plane)) {
      input = { ...input, plane: shownPlane };
    } else shownPlane = input.plane;
    // Only a change reaches the store (every store update runs every subscriber).
    if (store.getState().view.setupProblem !== null) store.getState().setSetupProblem(null);
    awaitingCoarse = true;
    let coarseShown = false;
    // Results arrive in bursts of many small tasks: the store (and so React and the canvas)
    // hears of them in one update per animation frame at most, and while the map refines at
    // most every REDRAW_MS, leaving the cores to the workers. Updating in an animation-frame
    // callback puts the new frame on screen in that same frame.
    let queued: MapPatch | null = null;
    let frame = 0;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const publish = () => {
      frame = 0;
      clearTimeout(timer);
      timer = undefined;
      if (queued === null) return;
      const patch = queued;
      queued = null;
      // An update of a superseded job publishes nothing.
      if (job !== scheduler?.current) return;
      // Only new grid content is a new version (what the canvas and readout redraw on).
      const version = store.getState().map.version + ('grid' in patch ? 1 : 0);
      store.getState().setMap({ ...patch, version });
    };
    const nextFrame = () => {
      if (frame === 0) frame = requestAnimationFrame(publish);
    };
    /** Queues `patch`; `soon`: at the next frame, otherwise within REDRAW_MS. */
    const bump = (patch: MapPatch, soon = false) => {
      // Patches of one job merge as the store merges them: the phase only moves forward.
      const phase =
        queued?.phase !== undefined && patch.phase !== undefined
          ? laterPhase(queued.phase, patch.phase)
          : (patch.phase ?? queued?.phase);
      queued = { ...queued, ...patch, ...(phase === undefined ? {} : { phase }) };
      if (soon) {
        clearTimeout(timer);
        timer = undefined;
        nextFrame();
      } else if (frame === 0 && timer === undefined) {
        timer = setTimeout(nextFrame, REDRAW_MS);
      }
    };
    const job = scheduler.start(
      input,
      JSON.stringify(scenario),
      {
        update: (grid, phase) => {
          // The previous map stays on screen until this job's coarse frame is complete.
          if (job !== scheduler?.current || !coarseShown) return;
          bump({ grid, phase });
        },
        coarse: (grid) => {
          if (job !== scheduler?.current) return;
          coarseShown = true;
          const ms = performance.now() - changedAt;
          afterPaint(() => {
            performance.measure(MARK_COARSE, { start: changedAt, detail: { job, mode } });
            if (performance.getEntriesByName(MARK_FIRST_COARSE).length === 0) {
              performance.mark(MARK_FIRST_COARSE, { detail: { job, mode } });
            }
          });
          bump({ grid, phase: 'refining', boundaries: [], coarseMs: ms }, true);
          awaitingCoarse = false;
          flush();
        },
        boundaries: (grid, boundaries) => {
          if (job !== scheduler?.current || !coarseShown) return;
          bump({ grid, boundaries }, true);
        },
        done: (grid, boundaries) => {
          if (job !== scheduler?.current) return;
          const ms = performance.now() - changedAt;
          afterPaint(() =>
            performance.measure(MARK_DONE, { start: changedAt, detail: { job, mode } }),
          );
          bump({ grid, boundaries, phase: 'done', doneMs: ms }, true);
          if (!workersNoticeStays && job > workersNoticeJob)
            store.getState().setMap({ workers: null });
        },
        problem: (text) => {
          if (job !== scheduler?.current) return;
          awaitingCoarse = false;
          bump({ problem: text }, true);
          flush();
        },
      },
      mode,
    );
    // A new job keeps showing the previous map (and its boundaries) until its coarse frame.
    bump({ job, phase: 'coarse', coarseMs: null, doneMs: null, problem: null }, true);
  };

  const flush = (): void => {
    if (pending && !awaitingCoarse && !stopped) {
      const next = pending;
      pending = null;
      launch(next.setup, next.changedAt);
    }
  };

  const changed = (setup: Setup): void => {
    const changedAt = performance.now();
    if (awaitingCoarse || !scheduler) pending = { setup, changedAt };
    else launch(setup, changedAt);
  };

  const unsubscribe = store.subscribe((state, previous) => {
    if (state.setup !== previous.setup && !onlyObservationsDiffer(state.setup, previous.setup)) {
      changed(state.setup);
    }
  });
  changed(store.getState().setup);

  let pool: { close(): void } | null = null;
  createMapScheduler(onPoolEvent, store.getState().setup.filling)
    .then((created) => {
      if (stopped) {
        created.pool.close();
        return;
      }
      scheduler = created.scheduler;
      pool = created.pool;
      provideSidePool(created.pool);
      flush();
    })
    .catch((error: unknown) => {
      sidePoolFailed(error);
      store.getState().setMap({ problem: `The map workers could not start: ${errorLine(error)}` });
    });

  return () => {
    stopped = true;
    unsubscribe();
    scheduler?.stop();
    pool?.close();
  };
}

/** Whether two setups differ in their observations alone (which do not change the Map). */
function onlyObservationsDiffer(a: Setup, b: Setup): boolean {
  if (a.observations === b.observations) return false;
  const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
  keys.delete('observations');
  return [...keys].every((k) => a[k as keyof Setup] === b[k as keyof Setup]);
}
