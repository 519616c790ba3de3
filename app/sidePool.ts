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
const ready = new Promise<WorkerPool<AsyncMapStages>>((resolve) => (provide = resolve));

/** Hands the Map's worker pool to the side tasks (called once by the map driver). */
export function provideSidePool(pool: WorkerPool<AsyncMapStages>): void {
  provide(pool);
}

/** Runs one side task on the shared worker pool, once the pool exists. */
export async function runSideTask<T>(task: (api: AsyncMapStages) => Promise<T>): Promise<T> {
  const pool = await ready;
  return pool.run(SIDE_JOB, SIDE_PRIORITY, task);
}
