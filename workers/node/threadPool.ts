import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { wrap, type Remote } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import {
  computeConditionMap,
  parseMapInput,
  type FitRunners,
  type MapStages,
} from '../../solver/index';
import type { MapThreadApi } from './mapThread';

/**
 * A pool of worker threads running the Map stages and the pieces of a fit for the CLI. Calls queue for the next free
 * thread; results do not depend on which thread ran them. `close()` ends the threads.
 */
export class ThreadPool {
  readonly size: number;
  private readonly workers: Worker[] = [];
  private readonly remotes: Remote<MapThreadApi>[] = [];
  private readonly idle: number[] = [];
  private readonly waiting: ((slot: number) => void)[] = [];

  constructor(workerUrl: URL, size = availableParallelism()) {
    this.size = Math.max(1, size);
    for (let k = 0; k < this.size; k++) {
      const worker = new Worker(workerUrl);
      worker.unref();
      this.workers.push(worker);
      this.remotes.push(wrap<MapThreadApi>(nodeEndpoint(worker)));
      this.idle.push(k);
    }
  }

  private async acquire(): Promise<number> {
    const slot = this.idle.pop();
    if (slot !== undefined) return slot;
    return new Promise((resolve) => this.waiting.push(resolve));
  }

  private release(slot: number): void {
    const next = this.waiting.shift();
    if (next) next(slot);
    else this.idle.push(slot);
  }

  private async run<T>(task: (remote: Remote<MapThreadApi>) => Promise<T>): Promise<T> {
    const slot = await this.acquire();
    try {
      return await task(this.remotes[slot]!);
    } finally {
      this.release(slot);
    }
  }

  readonly stages: MapStages = {
    coarse: (input, nodes) => this.run((r) => r.coarse(input, nodes)),
    cells: (input, coarse, cells) => this.run((r) => r.cells(input, coarse, cells)),
    crossings: (input, edges, frames, labels) =>
      this.run((r) => r.crossings(input, edges, frames, labels)),
  };

  /** The pieces of a fit (`runFit`): each condition's Map on the Map stages, sweeps and rows. */
  readonly fitRunners: FitRunners = {
    conditionMap: (document) =>
      computeConditionMap(parseMapInput(JSON.parse(document)), this.stages, this.size),
    sweeps: (document, gFactor, startDeg, points) =>
      this.run((r) => r.sweeps(document, gFactor, startDeg, points)),
    // One point per call, so that the points of one step spread over the threads.
    rows: (problem, points) =>
      Promise.all(points.map((p) => this.run((r) => r.rows(problem, [p])).then((out) => out[0]!))),
  };

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
