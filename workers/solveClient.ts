import { releaseProxy, wrap } from 'comlink';
import type { SolveJson } from './solvePoint';
import type { SolveWorkerApi } from './solveWorker';

export type { SolveJson } from './solvePoint';

/** Solves single points off the main thread. */
export interface SolveClient {
  /** Resolves with the solved point; rejects with the solver's one-line Error on bad input. */
  solvePoint(modelJson: unknown): Promise<SolveJson>;
  /** Stops the worker; later calls reject. */
  dispose(): void;
}

/**
 * Starts a module worker running the solver. Where workers are unavailable, solves on the
 * calling thread instead (the solver is then loaded on first use).
 */
export function createSolveClient(): SolveClient {
  if (typeof Worker === 'undefined') return createMainThreadClient();

  const worker = new Worker(new URL('./solveWorker.ts', import.meta.url), { type: 'module' });
  const remote = wrap<SolveWorkerApi>(worker);
  // A worker that fails to load would otherwise leave every call pending forever.
  const workerFailed = new Promise<never>((_, reject) => {
    worker.addEventListener(
      'error',
      (event) => reject(new Error(`The solver worker failed to start: ${event.message}`)),
      { once: true },
    );
  });
  workerFailed.catch(() => undefined);

  return {
    solvePoint: (modelJson) => Promise.race([remote.solvePoint(modelJson), workerFailed]),
    dispose() {
      remote[releaseProxy]();
      worker.terminate();
    },
  };
}

function createMainThreadClient(): SolveClient {
  let disposed = false;
  return {
    async solvePoint(modelJson) {
      if (disposed) throw new Error('The solve client has been disposed.');
      const { solvePoint } = await import('./solvePoint');
      return solvePoint(modelJson);
    },
    dispose() {
      disposed = true;
    },
  };
}
