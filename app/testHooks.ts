import { runningMapWorkers } from '../workers/mapClient';

/** What the browser tests may call on the page (`window.__fourfoldTest`). */
export interface FourfoldTestHooks {
  /** Map workers running now. */
  workerCount(): number;
  /**
   * Stops map worker `k` (oldest first) with `terminate()`, which fires no event, as a crashed
   * or closed worker would; false if there is no such worker.
   */
  killWorker(k: number): boolean;
}

declare global {
  interface Window {
    __fourfoldTest?: FourfoldTestHooks;
  }
}

/** Installs the test hooks, only when the page's address has `?test-hooks` (never otherwise). */
export function installTestHooks(): void {
  if (!new URLSearchParams(window.location.search).has('test-hooks')) return;
  window.__fourfoldTest = {
    workerCount: () => runningMapWorkers().length,
    killWorker(k) {
      const worker = runningMapWorkers()[k];
      worker?.terminate();
      return worker !== undefined;
    },
  };
}
