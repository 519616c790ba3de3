import type { AsyncMapStages } from '../workers/mapStages';
import type { WorkerPool } from '../workers/workerPool';

/**
 * Job number of interactive side tasks (a Probe's point solve, a Cut): above every Map job, so a
 * new Map job never cancels them.
 */
export const SIDE_JOB = Number.MAX_SAFE_INTEGER;
/**
 * Quiet time after a burst of setup changes (typing, a slider drag) before side tasks follow it,
 * ms: they queue ahead of the Map's stages, so they must not be sent for every step of a drag.
 */
export const SIDE_TASK_QUIET_MS = 120;

/** Queue priority of side tasks: ahead of every Map stage, since the user is waiting on them. */
export const SIDE_PRIORITY = -1;

let provide: (pool: WorkerPool<AsyncMapStages>) => void = () => undefined;
let fail: (error: unknown) => void = () => undefined;
const ready = new Promise<WorkerPool<AsyncMapStages>>((resolve, reject) => {
  provide = resolve;
  fail = reject;
});
// Reported by the map driver; a side task that asks later gets the same error.
ready.catch(() => undefined);

/** Hands the Map's worker pool to the side tasks (called once by the map driver). */
export function provideSidePool(pool: WorkerPool<AsyncMapStages>): void {
  provide(pool);
}

/** The Map's worker pool could not be made: side tasks fail with `error` instead of waiting. */
export function sidePoolFailed(error: unknown): void {
  fail(error);
}

/**
 * Runs one side task on the shared worker pool, once the pool exists. The pool retries it on a
 * new worker if its worker dies, and runs it on the page if no worker can start.
 */
export async function runSideTask<T>(task: (api: AsyncMapStages) => Promise<T>): Promise<T> {
  const pool = await ready;
  return pool.run(SIDE_JOB, SIDE_PRIORITY, task);
}

/** Queue priority of a series of Maps: behind every stage of the Map on screen, which stays live. */
export const SERIES_PRIORITY = 6;

/** Runs one task of a series of Maps on the shared worker pool, behind the Map's own stages. */
export async function runSeriesTask<T>(task: (api: AsyncMapStages) => Promise<T>): Promise<T> {
  const pool = await ready;
  return pool.run(SIDE_JOB, SERIES_PRIORITY, task);
}
