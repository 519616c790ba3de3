/** One worker as the pool sees it: its API, a way to stop it, and a promise that rejects if it dies. */
export interface PoolMember<Api> {
  readonly api: Api;
  /** Rejects when the worker dies (an uncaught error or a failed load); never resolves. */
  readonly died: Promise<never>;
  terminate(): void;
}

/** A queued task was dropped because a newer job replaced its job. */
export class CancelledError extends Error {
  constructor() {
    super('cancelled by a newer job');
    this.name = 'CancelledError';
  }
}

interface QueuedTask<Api> {
  readonly job: number;
  readonly priority: number;
  readonly order: number;
  readonly run: (api: Api) => Promise<unknown>;
  readonly resolve: (value: unknown) => void;
  readonly reject: (reason: unknown) => void;
  attempts: number;
}

export interface PoolOptions {
  /** Tries per task before its failure is reported (a failed try replaces the worker). */
  readonly attempts?: number;
  /** A task running longer than this (ms) counts as a hung worker. */
  readonly timeoutMs?: number;
  /**
   * Tasks sent to one worker at a time: more than one keeps the next task waiting inside the
   * worker, so it never idles through a round trip to a busy page; stale work after a cancel
   * stays small because tasks are.
   */
  readonly depth?: number;
}

/**
 * A fixed-size pool of workers with a priority queue of tasks tagged by job. Starting a newer job
 * drops the queued tasks of older ones at once (a running task finishes; its caller ignores a
 * stale result). A worker whose task throws, that dies, or that hangs is terminated and replaced,
 * and the task is tried again on a fresh worker before its failure is reported.
 */
export class WorkerPool<Api> {
  private readonly members: (PoolMember<Api> | null)[];
  private readonly busy: number[];
  private queue: QueuedTask<Api>[] = [];
  private counter = 0;
  private closed = false;
  readonly attempts: number;
  readonly timeoutMs: number;
  readonly depth: number;
  /** Workers replaced so far (a health figure for the UI and tests). */
  replaced = 0;

  constructor(
    private readonly create: () => PoolMember<Api>,
    readonly size: number,
    options: PoolOptions = {},
  ) {
    this.attempts = options.attempts ?? 2;
    this.timeoutMs = options.timeoutMs ?? 30000;
    this.depth = options.depth ?? 3;
    this.members = Array.from({ length: Math.max(1, size) }, () => null);
    this.busy = this.members.map(() => 0);
  }

  private member(slot: number): PoolMember<Api> {
    let m = this.members[slot];
    if (!m) {
      m = this.create();
      m.died.catch(() => undefined);
      this.members[slot] = m;
    }
    return m;
  }

  /** Runs `run` on every worker once (warm-up), outside the queue. */
  async each(run: (api: Api) => Promise<unknown>): Promise<void> {
    await Promise.all(
      this.members.map((_, slot) => {
        const m = this.member(slot);
        return Promise.race([run(m.api), m.died]).catch(() => undefined);
      }),
    );
  }

  /** Queues a task of job `job`; lower `priority` runs first, then first come first served. */
  run<T>(job: number, priority: number, run: (api: Api) => Promise<T>): Promise<T> {
    if (this.closed) return Promise.reject(new Error('the worker pool is closed'));
    return new Promise<T>((resolve, reject) => {
      this.queue.push({
        job,
        priority,
        order: this.counter++,
        run,
        resolve: resolve as (value: unknown) => void,
        reject,
        attempts: 0,
      });
      this.queue.sort((a, b) => a.priority - b.priority || a.order - b.order);
      this.pump();
    });
  }

  /** Drops every queued task of a job older than `job`. */
  cancelBefore(job: number): void {
    const kept: QueuedTask<Api>[] = [];
    for (const task of this.queue) {
      if (task.job < job) task.reject(new CancelledError());
      else kept.push(task);
    }
    this.queue = kept;
  }

  private pump(): void {
    // Fill every worker to one task first, then to `depth`.
    for (let level = 1; level <= this.depth; level++) {
      for (let slot = 0; slot < this.members.length && this.queue.length > 0; slot++) {
        if (this.busy[slot]! >= level) continue;
        const task = this.queue.shift()!;
        this.busy[slot]!++;
        void this.execute(slot, task);
      }
    }
  }

  private async execute(slot: number, task: QueuedTask<Api>): Promise<void> {
    const m = this.member(slot);
    let timer: ReturnType<typeof setTimeout> | undefined;
    const hung = new Promise<never>((_, reject) => {
      timer = setTimeout(
        () => reject(new Error(`a worker took over ${this.timeoutMs / 1000} s on one task`)),
        this.timeoutMs,
      );
    });
    try {
      task.attempts++;
      const value = await Promise.race([task.run(m.api), m.died, hung]);
      task.resolve(value);
    } catch (error) {
      // Whatever went wrong, this worker is suspect: replace it (once, if several of its tasks
      // fail together), then retry or report.
      if (this.members[slot] !== m) {
        // Its worker was already replaced because of another task: not this task's fault.
        task.attempts--;
      } else {
        m.terminate();
        this.members[slot] = null;
        this.replaced++;
      }
      if (task.attempts < this.attempts && !this.closed) {
        this.queue.unshift(task);
      } else {
        task.reject(error);
      }
    } finally {
      clearTimeout(timer);
      this.busy[slot]!--;
      if (!this.closed) this.pump();
    }
  }

  close(): void {
    this.closed = true;
    for (const task of this.queue) task.reject(new CancelledError());
    this.queue = [];
    this.members.forEach((m) => m?.terminate());
  }
}
