import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { wrap, type Remote } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import {
  computeConditionMap,
  parseMapInput,
  type ConditionStages,
  type FitRunners,
} from '../../solver/index';
import type { FitThreadApi } from './fitThread';

/**
 * Worker threads running the pieces of a fit for the CLI (`fit`): a call waits for the next
 * free thread; results do not depend on which thread ran them. `close()` ends the threads.
 */
export class FitThreads {
  readonly size: number;
  private readonly workers: Worker[] = [];
  private readonly remotes: Remote<FitThreadApi>[] = [];
  private readonly idle: number[] = [];
  private readonly waiting: ((slot: number) => void)[] = [];

  constructor(workerUrl: URL, size = availableParallelism()) {
    this.size = Math.max(1, size);
    for (let k = 0; k < this.size; k++) {
      const worker = new Worker(workerUrl);
      worker.unref();
      this.workers.push(worker);
      this.remotes.push(wrap<FitThreadApi>(nodeEndpoint(worker)));
      this.idle.push(k);
    }
  }

  private async call<T>(task: (remote: Remote<FitThreadApi>) => Promise<T>): Promise<T> {
    const slot = this.idle.pop() ?? (await new Promise<number>((r) => this.waiting.push(r)));
    try {
      return await task(this.remotes[slot]!);
    } finally {
      const next = this.waiting.shift();
      if (next) next(slot);
      else this.idle.push(slot);
    }
  }

  private readonly stages: ConditionStages = {
    coarse: (input, nodes) => this.call((r) => r.coarse(input, nodes)),
    cells: (input, coarse, cells) => this.call((r) => r.cells(input, coarse, cells)),
  };

  readonly runners: FitRunners = {
    conditionMap: (document) =>
      computeConditionMap(parseMapInput(JSON.parse(document)), this.stages, this.size),
    sweeps: (document, gFactor, startDeg, points) =>
      this.call((r) => r.sweeps(document, gFactor, startDeg, points)),
    // One point per call, so that the points of one step spread over the threads.
    rows: async (problem, points) =>
      Promise.all(points.map((p) => this.call((r) => r.rows(problem, [p])).then((out) => out[0]!))),
  };

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
