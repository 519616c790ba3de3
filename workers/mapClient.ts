import { releaseProxy, wrap } from 'comlink';
import { MapScheduler } from './mapScheduler';
import type { AsyncMapStages, MapStagesApi } from './mapStages';
import { WorkerPool, type PoolEvent, type PoolMember } from './workerPool';

/**
 * What `workers/mapWorker.ts` exposes: the stages, a ping answered between tasks, and whether it
 * holds its life lock (answered once it does).
 */
type MapWorkerApi = MapStagesApi & { ping(): boolean; lifeLock(): Promise<boolean> };

/** The page's map workers still running (in order of creation). */
const running = new Set<Worker>();
let created = 0;

let firstAnswered: () => void = () => undefined;
/**
 * Settles when a map worker first answers (its script loaded and ran): the page may wait for it
 * before its first render, since a worker's script loads only while the page's thread is free.
 */
export const firstWorkerAnswer = new Promise<void>((resolve) => (firstAnswered = resolve));

/** The map workers running now, oldest first (for the page's test hooks). */
export function runningMapWorkers(): readonly Worker[] {
  return [...running];
}

/**
 * One browser module worker running the Map stages. It holds a Web Lock named after it while it
 * lives; once it says so, its ping asks the browser's lock manager, which answers at once even
 * while the worker is busy, and a lock gone means the worker stopped (a `terminate()` or
 * `close()` fires no event). Where Web Locks are missing (a page not served over HTTPS or from
 * localhost), and until the worker holds its lock, the ping is a call the worker answers
 * between tasks.
 */
function browserMember(): PoolMember<AsyncMapStages> {
  const locks = navigator.locks as LockManager | undefined;
  const name = `fourfold-map-worker-${++created}-${Date.now()}-${Math.random().toString(36).slice(2)}`;
  const worker = new Worker(new URL('./mapWorker.ts', import.meta.url), { type: 'module', name });
  running.add(worker);
  const remote = wrap<MapWorkerApi>(worker);
  const died = new Promise<never>((_, reject) => {
    worker.addEventListener('error', (event) =>
      reject(
        new Error(
          event.message ? `the worker stopped: ${event.message}` : 'the worker failed to load',
        ),
      ),
    );
  });
  let holdsLock = false;
  if (locks) void remote.lifeLock().then((holds) => (holdsLock = holds));
  remote.ping().then(firstAnswered, () => undefined);
  return {
    api: remote as unknown as AsyncMapStages,
    died,
    async ping() {
      if (!holdsLock) return remote.ping();
      const { held = [] } = await locks!.query();
      if (!held.some((lock) => lock.name === name))
        throw new Error('the worker stopped without an error');
    },
    terminate() {
      running.delete(worker);
      remote[releaseProxy]();
      worker.terminate();
    },
  };
}

/** The stages on the calling thread: for browsers without module workers, or when none starts. */
function mainThreadMember(): PoolMember<AsyncMapStages> {
  const stages = import('./mapStages');
  stages.catch(() => undefined); // reported by the task that needs it
  const call =
    (name: keyof MapStagesApi) =>
    async (...args: unknown[]): Promise<unknown> => {
      const { mapStagesApi } = await stages;
      // Yield to the page between tasks so it stays responsive.
      await new Promise((next) => setTimeout(next, 0));
      return (mapStagesApi[name] as (...a: unknown[]) => unknown)(...args);
    };
  const api = new Proxy({} as AsyncMapStages, {
    // Not a thenable: only the stage names are functions.
    get: (_, name) => (name === 'then' ? undefined : call(name as keyof MapStagesApi)),
  });
  return { api, died: new Promise<never>(() => undefined), terminate: () => undefined };
}

/**
 * Workers: one per core (at least one), or the page itself where workers are missing or none
 * can be started. `onEvent` hears of replaced workers and of the move to the page.
 */
export async function createMapScheduler(
  onEvent?: (event: PoolEvent) => void,
  /** The first map's filling: the workers warm up for it alone. */
  filling?: -1 | 0 | 1,
): Promise<{
  scheduler: MapScheduler;
  pool: WorkerPool<AsyncMapStages>;
}> {
  const size = Math.max(1, navigator.hardwareConcurrency || 1);
  const pool =
    typeof Worker === 'undefined'
      ? new WorkerPool(mainThreadMember, 1, { onEvent })
      : new WorkerPool(browserMember, size, {
          fallback: mainThreadMember,
          onEvent,
          // A worker holding its lock is known dead at once. A worker's own answer to a ping waits
          // for the tasks ahead of it (up to three; a Probe takes a second or two on a busy
          // machine), so that answer gets 8 s.
          livenessMs: 8000,
        });
  await pool.each((api) => api.warmUp(filling));
  return { scheduler: new MapScheduler(pool), pool };
}
