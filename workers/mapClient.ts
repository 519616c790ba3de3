import { releaseProxy, wrap } from 'comlink';
import { MapScheduler } from './mapScheduler';
import type { AsyncMapStages, MapStagesApi } from './mapStages';
import { WorkerPool, type PoolMember } from './workerPool';

/** One browser module worker running the Map stages. */
function browserMember(): PoolMember<AsyncMapStages> {
  const worker = new Worker(new URL('./mapWorker.ts', import.meta.url), { type: 'module' });
  const remote = wrap<MapStagesApi>(worker);
  const died = new Promise<never>((_, reject) => {
    worker.addEventListener('error', (event) =>
      reject(new Error(`a map worker stopped: ${event.message || 'it failed to load'}`)),
    );
  });
  return {
    api: remote as unknown as AsyncMapStages,
    died,
    terminate() {
      remote[releaseProxy]();
      worker.terminate();
    },
  };
}

/** The stages on the calling thread, for browsers without module workers. */
async function mainThreadMember(): Promise<PoolMember<AsyncMapStages>> {
  const { mapStagesApi } = await import('./mapStages');
  const api = Object.fromEntries(
    Object.entries(mapStagesApi).map(([name, fn]) => [
      name,
      // Yield to the page between tasks so it stays responsive.
      (...args: unknown[]) =>
        new Promise((resolve) =>
          setTimeout(() => resolve((fn as (...a: unknown[]) => unknown)(...args)), 0),
        ),
    ]),
  ) as unknown as AsyncMapStages;
  return { api, died: new Promise<never>(() => undefined), terminate: () => undefined };
}

/** Workers: one per core (at least one), or the page itself where workers are missing. */
export async function createMapScheduler(): Promise<{
  scheduler: MapScheduler;
  pool: WorkerPool<AsyncMapStages>;
}> {
  const size = Math.max(1, navigator.hardwareConcurrency || 1);
  let pool: WorkerPool<AsyncMapStages>;
  if (typeof Worker === 'undefined') {
    const member = await mainThreadMember();
    pool = new WorkerPool(() => member, 1);
  } else {
    pool = new WorkerPool(browserMember, size);
  }
  await pool.each((api) => api.warmUp());
  return { scheduler: new MapScheduler(pool), pool };
}
