/** One worker as the pool sees it: its API, a way to stop it, and signs of its death. */
export interface PoolMember<Api> {
  readonly api: Api;
  /** Rejects when the worker dies (an uncaught error or a failed load); never resolves. */
  readonly died: Promise<never>;
  /**
   * The liveness check: resolves while the worker lives, rejects once it is known to be gone.
   * A busy worker may answer late (between two tasks), so the pool allows `livenessMs`.
   * Without it a worker that dies without an error is noticed only by the task timeout.
   */
  ping?(): Promise<unknown>;
  terminate(): void;
}

/** What the pool tells its owner about its workers (for one line under the Map). */
export type PoolEvent =
  /** A worker that had been working died, fell silent, hung or threw; a new one took its place. */
  | { readonly kind: 'replaced'; readonly reason: string }
  /** No worker could be started; the tasks run on the fallback member from now on. */
  | { readonly kind: 'fallback'; readonly reason: string }
  /** No worker could be started and there is no fallback: every task fails with `reason`. */
  | { readonly kind: 'unavailable'; readonly reason: string };

/** A queued task was dropped because a newer job replaced its job. */
export class CancelledError extends Error {
  constructor() {
    super('cancelled by a newer job');
    this.name = 'CancelledError';
  }
}

interface Task<Api> {
  readonly job: number;
  readonly priority: number;
  readonly order: number;
  readonly run: (api: Api) => Promise<unknown>;
  readonly resolve: (value: unknown) => void;
  readonly reject: (reason: unknown) => void;
  /** Tries this task may take; failures charged to it so far. */
  readonly attempts: number;
  failures: number;
  /** Bound to the worker it was sent to (a warm-up): never moved to another. */
  readonly pinned: boolean;
}

/** A task sent to a worker and not yet answered. */
interface InFlight<Api> {
  readonly task: Task<Api>;
  readonly startedAt: number;
}

/** One place in the pool: its current worker (if any) and that worker's record. */
interface Slot<Api> {
  member: PoolMember<Api> | null;
  inFlight: Set<InFlight<Api>>;
  /** The member has answered a ping or a task (it started). */
  started: boolean;
  /** When the member last answered anything (or was created). */
  lastAnswer: number;
  /** When the unanswered ping was sent, or null. */
  pingSentAt: number | null;
  /** Workers lost here since a task last succeeded (sets the backoff). */
  strikes: number;
  /** Workers lost here in a row before they started. */
  failedStarts: number;
  /** No new worker before this time (backoff); a timer wakes the pool then. */
  notBefore: number;
  wake: ReturnType<typeof setTimeout> | undefined;
  /** Given up: its workers never start. */
  retired: boolean;
}

export interface PoolOptions<Api = unknown> {
  /** Tries per task before its failure is reported (a failed try replaces the worker). */
  readonly attempts?: number;
  /** A task running longer than this (ms) counts as a hung worker: the last resort. */
  readonly timeoutMs?: number;
  /**
   * Tasks sent to one worker at a time: more than one keeps the next task waiting inside the
   * worker, so it never idles through a round trip to a busy page; stale work after a cancel
   * stays small because tasks are.
   */
  readonly depth?: number;
  /** A worker with tasks that has not answered for this long (ms) is pinged. */
  readonly pingMs?: number;
  /** A ping unanswered for this long (ms) means the worker is gone. */
  readonly livenessMs?: number;
  /** The same for a new worker's first answer (it loads and warms up first). */
  readonly startMs?: number;
  /** Backoff before the second replacement in a row at one place (ms); it doubles, up to `maxBackoffMs`. */
  readonly backoffMs?: number;
  readonly maxBackoffMs?: number;
  /** Workers in a row that die before they start, after which a place gives up. */
  readonly maxStarts?: number;
  /** Where tasks run when no worker can be started at all (the page itself). */
  readonly fallback?: () => PoolMember<Api>;
  /** Hears of replaced workers and of the fallback, once each. */
  readonly onEvent?: (event: PoolEvent) => void;
}

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/**
 * A fixed-size pool of workers with a priority queue of tasks tagged by job. Starting a newer job
 * drops the queued tasks of older ones at once (a running task finishes; its caller ignores a
 * stale result).
 *
 * A worker is lost when its task throws, it dies (`died`), its liveness check fails or goes
 * unanswered for `livenessMs`, or a task runs past `timeoutMs`. Its tasks go back to the queue
 * (the one it was running is charged a try; a task out of tries is rejected) and a new worker
 * takes its place: at once the first time, then after a backoff that doubles up to
 * `maxBackoffMs`. A place whose workers die `maxStarts` times in a row before they start gives
 * up; when every place has, the tasks run on `fallback` (or fail). One timer checks liveness and
 * timeouts while tasks are in flight; nothing is attached per task beyond its own promise.
 */
export class WorkerPool<Api> {
  private slots: Slot<Api>[];
  private create: () => PoolMember<Api>;
  private queue: Task<Api>[] = [];
  private counter = 0;
  private closed = false;
  /** Set when no worker can start and there is no fallback. */
  private broken: Error | null = null;
  private ticker: ReturnType<typeof setTimeout> | undefined;
  readonly attempts: number;
  readonly timeoutMs: number;
  readonly depth: number;
  readonly pingMs: number;
  readonly livenessMs: number;
  readonly startMs: number;
  readonly backoffMs: number;
  readonly maxBackoffMs: number;
  readonly maxStarts: number;
  /** Workers replaced so far (a health figure for the UI and tests). */
  replaced = 0;

  constructor(
    create: () => PoolMember<Api>,
    readonly size: number,
    private readonly options: PoolOptions<Api> = {},
  ) {
    this.create = create;
    this.attempts = options.attempts ?? 2;
    this.timeoutMs = options.timeoutMs ?? 30000;
    this.depth = options.depth ?? 3;
    this.pingMs = options.pingMs ?? 500;
    this.livenessMs = options.livenessMs ?? 2000;
    this.startMs = options.startMs ?? 10000;
    this.backoffMs = options.backoffMs ?? 250;
    this.maxBackoffMs = options.maxBackoffMs ?? 4000;
    this.maxStarts = options.maxStarts ?? 5;
    this.slots = Array.from({ length: Math.max(1, size) }, () => this.emptySlot());
  }

  private emptySlot(): Slot<Api> {
    return {
      member: null,
      inFlight: new Set(),
      started: false,
      lastAnswer: 0,
      pingSentAt: null,
      strikes: 0,
      failedStarts: 0,
      notBefore: 0,
      wake: undefined,
      retired: false,
    };
  }

  /** Tasks sent to workers and not yet answered (for tests: nothing else is held per task). */
  get inFlight(): number {
    return this.slots.reduce((n, slot) => n + slot.inFlight.size, 0);
  }

  /** The slot's worker, started if there is none and the backoff allows; null if not now. */
  private memberOf(slot: Slot<Api>): PoolMember<Api> | null {
    if (slot.member) return slot.member;
    if (slot.retired || this.closed || performance.now() < slot.notBefore) return null;
    let member: PoolMember<Api>;
    try {
      member = this.create();
    } catch (error) {
      this.afterLoss(slot, false, error);
      return null;
    }
    slot.member = member;
    slot.started = false;
    slot.lastAnswer = performance.now();
    slot.pingSentAt = null;
    // The one reaction the pool attaches to a worker's death.
    member.died.catch((error: unknown) => this.lose(slot, member, error));
    return member;
  }

  /** Runs `run` on every worker once (warm-up), outside the queue; never rejects. */
  async each(run: (api: Api) => Promise<unknown>): Promise<void> {
    await Promise.all(
      this.slots.map(
        (slot) =>
          new Promise<void>((done) => {
            const member = this.memberOf(slot);
            if (!member) return done();
            this.send(
              slot,
              member,
              this.task(
                0,
                0,
                run,
                () => done(),
                () => done(),
                1,
                true,
              ),
            );
          }),
      ),
    );
  }

  private task(
    job: number,
    priority: number,
    run: (api: Api) => Promise<unknown>,
    resolve: (value: unknown) => void,
    reject: (reason: unknown) => void,
    attempts = this.attempts,
    pinned = false,
  ): Task<Api> {
    return {
      job,
      priority,
      order: this.counter++,
      run,
      resolve,
      reject,
      attempts,
      failures: 0,
      pinned,
    };
  }

  /** Queues a task of job `job`; lower `priority` runs first, then first come first served. */
  run<T>(job: number, priority: number, run: (api: Api) => Promise<T>): Promise<T> {
    if (this.closed) return Promise.reject(new Error('the worker pool is closed'));
    if (this.broken) return Promise.reject(this.broken);
    return new Promise<T>((resolve, reject) => {
      this.enqueue(this.task(job, priority, run, resolve as (value: unknown) => void, reject));
      this.pump();
    });
  }

  /** Inserts a task in queue order (priority, then age). */
  private enqueue(task: Task<Api>): void {
    let lo = 0;
    let hi = this.queue.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      const q = this.queue[mid]!;
      if (q.priority < task.priority || (q.priority === task.priority && q.order < task.order))
        lo = mid + 1;
      else hi = mid;
    }
    this.queue.splice(lo, 0, task);
  }

  /** Drops every queued task of a job older than `job`. */
  cancelBefore(job: number): void {
    const kept: Task<Api>[] = [];
    for (const task of this.queue) {
      if (task.job < job) task.reject(new CancelledError());
      else kept.push(task);
    }
    this.queue = kept;
  }

  private pump(): void {
    if (this.closed) return;
    // Fill every worker to one task first, then to `depth`.
    for (let level = 1; level <= this.depth; level++) {
      for (const slot of this.slots) {
        if (this.queue.length === 0) return;
        if (slot.inFlight.size >= level) continue;
        const member = this.memberOf(slot);
        if (member) this.send(slot, member, this.queue.shift()!);
      }
    }
  }

  private send(slot: Slot<Api>, member: PoolMember<Api>, task: Task<Api>): void {
    const flight: InFlight<Api> = { task, startedAt: performance.now() };
    slot.inFlight.add(flight);
    let answer: Promise<unknown>;
    try {
      answer = task.run(member.api);
    } catch (error) {
      answer = Promise.reject(error);
    }
    answer.then(
      (value) => {
        // Already given up (its worker was lost meanwhile): the task went elsewhere.
        if (!slot.inFlight.delete(flight)) return;
        this.answered(slot);
        slot.strikes = 0;
        task.resolve(value);
        this.pump();
      },
      (error: unknown) => {
        if (!slot.inFlight.delete(flight)) return;
        this.answered(slot);
        // Whatever went wrong, this worker is suspect: replace it, then retry or report.
        this.lose(slot, member, error, flight);
      },
    );
    this.tickSoon();
  }

  /** The slot's worker answered (a task or a ping): it has started and is alive. */
  private answered(slot: Slot<Api>): void {
    slot.started = true;
    slot.failedStarts = 0;
    slot.lastAnswer = performance.now();
  }

  /**
   * The slot's worker `member` is lost (if it is still the slot's worker): it is stopped, its
   * tasks go back to the queue or are rejected, and a replacement is due after the backoff.
   * `culprit` is the task that threw or hung; a worker that died or fell silent is charged to
   * the oldest task it held, and one that never started to none.
   */
  private lose(
    slot: Slot<Api>,
    member: PoolMember<Api>,
    error: unknown,
    culprit?: InFlight<Api>,
  ): void {
    if (slot.member !== member || this.closed) return;
    slot.member = null;
    slot.pingSentAt = null;
    member.terminate();
    this.replaced++;
    const held = [...slot.inFlight];
    slot.inFlight.clear();
    if (culprit && !held.includes(culprit)) held.unshift(culprit);
    const charged = culprit ?? (slot.started ? held[0] : undefined);
    for (const flight of held) {
      const { task } = flight;
      if (flight === charged) task.failures++;
      if (task.pinned || task.failures >= task.attempts) task.reject(error);
      else this.enqueue(task);
    }
    if (slot.started) this.options.onEvent?.({ kind: 'replaced', reason: messageOf(error) });
    this.afterLoss(slot, slot.started, error);
    this.pump();
  }

  /**
   * A worker of this slot was lost (`started`: after it had answered) or could not be created:
   * the slot backs off, or gives up after `maxStarts` workers in a row that never started.
   */
  private afterLoss(slot: Slot<Api>, started: boolean, error: unknown): void {
    slot.strikes++;
    if (!started) slot.failedStarts++;
    if (slot.failedStarts < this.maxStarts) return this.backOff(slot);
    slot.retired = true;
    if (this.slots.every((s) => s.retired)) this.giveUp(error);
  }

  /** No new worker at this slot before the backoff of its strikes has passed. */
  private backOff(slot: Slot<Api>): void {
    const delay =
      slot.strikes <= 1 ? 0 : Math.min(this.maxBackoffMs, this.backoffMs * 2 ** (slot.strikes - 2));
    slot.notBefore = performance.now() + delay;
    clearTimeout(slot.wake);
    slot.wake =
      delay > 0
        ? setTimeout(() => {
            slot.wake = undefined;
            this.pump();
          }, delay)
        : undefined;
  }

  /** Every slot gave up: move to the fallback, or fail every task from now on. */
  private giveUp(error: unknown): void {
    const fallback = this.options.fallback;
    const reason = messageOf(error);
    if (fallback) {
      this.create = fallback;
      this.slots = [this.emptySlot()];
      this.options.onEvent?.({ kind: 'fallback', reason });
      this.pump();
      return;
    }
    this.broken = new Error(`no worker could be started (${reason})`);
    for (const task of this.queue) task.reject(this.broken);
    this.queue = [];
    this.options.onEvent?.({ kind: 'unavailable', reason });
  }

  /** Keeps the liveness timer running while tasks are in flight. */
  private tickSoon(): void {
    if (this.ticker === undefined && !this.closed)
      this.ticker = setTimeout(() => this.tick(), this.pingMs);
  }

  /** Pings silent workers, and loses those that hung on a task or left a ping unanswered. */
  private tick(): void {
    this.ticker = undefined;
    const now = performance.now();
    for (const slot of this.slots) {
      const member = slot.member;
      if (!member || slot.inFlight.size === 0) continue;
      const [oldest] = slot.inFlight;
      if (now - oldest!.startedAt > this.timeoutMs) {
        this.lose(
          slot,
          member,
          new Error(`the worker took over ${this.timeoutMs / 1000} s on one task`),
          oldest,
        );
      } else if (slot.pingSentAt !== null) {
        // Silent since the ping (or since its last answer, if a task came back meanwhile).
        const limit = slot.started ? this.livenessMs : this.startMs;
        if (now - Math.max(slot.pingSentAt, slot.lastAnswer) > limit)
          this.lose(
            slot,
            member,
            new Error(
              slot.started
                ? `the worker gave no answer for ${limit / 1000} s`
                : `the worker did not start within ${limit / 1000} s`,
            ),
          );
      } else if (member.ping && now - slot.lastAnswer >= this.pingMs) {
        this.ping(slot, member, now);
      }
    }
    if (this.slots.some((slot) => slot.inFlight.size > 0)) this.tickSoon();
  }

  private ping(slot: Slot<Api>, member: PoolMember<Api>, now: number): void {
    slot.pingSentAt = now;
    let answer: Promise<unknown>;
    try {
      answer = member.ping!();
    } catch (error) {
      answer = Promise.reject(error);
    }
    answer.then(
      () => {
        if (slot.member !== member) return;
        slot.pingSentAt = null;
        this.answered(slot);
      },
      (error: unknown) => this.lose(slot, member, error),
    );
  }

  close(): void {
    this.closed = true;
    clearTimeout(this.ticker);
    this.ticker = undefined;
    for (const task of this.queue) task.reject(new CancelledError());
    this.queue = [];
    for (const slot of this.slots) {
      clearTimeout(slot.wake);
      for (const { task } of slot.inFlight) task.reject(new CancelledError());
      slot.inFlight.clear();
      slot.member?.terminate();
      slot.member = null;
    }
  }
}
