import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest';
import { WorkerPool, type PoolEvent, type PoolMember } from '../workers/workerPool';

/** What the fake workers compute: a square, answered at once, after a delay, or never. */
interface Api {
  square(x: number): Promise<number>;
}

/**
 * A stand-in for one worker. `silent` makes it stop answering anything (tasks and pings) without
 * an error, as a terminated or closed worker does; `busyMs` makes each task take that long on
 * the fake clock; `pings` chooses whether pings are answered at once (as the lock manager does)
 * or only between tasks.
 */
class FakeWorker implements PoolMember<Api> {
  silent = false;
  /** Every task throws (a worker the pool replaces after each failure). */
  throws = false;
  busyMs = 0;
  terminated = false;
  /** Reactions attached to `died` (through then/catch/finally or Promise.race). */
  diedReactions = 0;
  readonly died: Promise<never>;
  private busyUntil = 0;
  private dieNow: (error: Error) => void = () => undefined;

  constructor(private readonly pings: 'at once' | 'between tasks' = 'at once') {
    const died = new Promise<never>((_, reject) => (this.dieNow = reject));
    const then = died.then.bind(died);
    died.then = ((...args: Parameters<typeof then>) => {
      this.diedReactions++;
      return then(...args);
    }) as typeof died.then;
    this.died = died;
  }

  readonly api: Api = {
    square: (x) => {
      if (this.silent) return new Promise<never>(() => undefined);
      if (this.throws) return Promise.reject(new Error('bad input'));
      if (this.busyMs === 0) return Promise.resolve(x * x);
      this.busyUntil = Math.max(Date.now(), this.busyUntil) + this.busyMs;
      return new Promise((resolve) =>
        setTimeout(() => resolve(x * x), this.busyUntil - Date.now()),
      );
    },
  };

  ping(): Promise<unknown> {
    if (this.silent) return new Promise<never>(() => undefined);
    if (this.pings === 'at once' || this.busyUntil <= Date.now()) return Promise.resolve();
    return new Promise((resolve) => setTimeout(resolve, this.busyUntil - Date.now()));
  }

  die(message: string): void {
    this.dieNow(new Error(message));
  }

  terminate(): void {
    this.terminated = true;
  }
}

/** A pool of fake workers that keeps every worker it made and every event it sent. */
function fakePool(
  size: number,
  options: ConstructorParameters<typeof WorkerPool<Api>>[2] = {},
  make: () => FakeWorker = () => new FakeWorker(),
) {
  const workers: FakeWorker[] = [];
  /** When each worker was made (the fake clock, ms). */
  const createdAt: number[] = [];
  const events: PoolEvent[] = [];
  const pool = new WorkerPool<Api>(
    () => {
      createdAt.push(Date.now() - t0);
      const w = make();
      workers.push(w);
      return w;
    },
    size,
    { onEvent: (e) => events.push(e), ...options },
  );
  const t0 = Date.now();
  return { pool, workers, createdAt, events };
}

beforeEach(() => {
  vi.useFakeTimers();
});
afterEach(() => {
  vi.useRealTimers();
});

describe('WorkerPool liveness (workers/workerPool.ts)', () => {
  test('a worker that stops answering is lost within the liveness window, replaced, and its task retried', async () => {
    const { pool, workers, events } = fakePool(1, { pingMs: 500, livenessMs: 2000 });
    expect(await pool.run(1, 0, (api) => api.square(3))).toBe(9);
    workers[0]!.silent = true;
    let result: number | undefined;
    void pool.run(1, 0, (api) => api.square(4)).then((value) => (result = value));
    // Silent but still inside the window: kept.
    await vi.advanceTimersByTimeAsync(2000);
    expect(workers).toHaveLength(1);
    expect(result).toBeUndefined();
    // Pinged after 500 ms of silence, unanswered for 2 s more, noticed at the next check.
    await vi.advanceTimersByTimeAsync(1000);
    expect(workers).toHaveLength(2);
    expect(workers[0]!.terminated).toBe(true);
    expect(pool.replaced).toBe(1);
    expect(result).toBe(16);
    expect(events).toEqual([{ kind: 'replaced', reason: 'the worker gave no answer for 2 s' }]);
    pool.close();
  });

  test('a worker busy on one long task is kept while it answers pings', async () => {
    const { pool, workers, events } = fakePool(1, { pingMs: 500, livenessMs: 2000 });
    await pool.run(1, 0, (api) => api.square(1));
    workers[0]!.busyMs = 10_000;
    const long = pool.run(1, 0, (api) => api.square(5));
    await vi.advanceTimersByTimeAsync(10_000);
    expect(await long).toBe(25);
    expect(workers).toHaveLength(1);
    expect(events).toEqual([]);
    pool.close();
  });

  test('a worker that answers pings only between tasks is kept while its queue is shorter than the window', async () => {
    const { pool, workers, events } = fakePool(
      1,
      { pingMs: 500, livenessMs: 2000, depth: 3 },
      () => new FakeWorker('between tasks'),
    );
    await pool.run(1, 0, (api) => api.square(1));
    // Three tasks of 600 ms in the worker at once: a ping waits up to 1.8 s for its answer.
    workers[0]!.busyMs = 600;
    const results = Promise.all(
      [2, 3, 4, 5, 6, 7].map((x) => pool.run(1, 0, (api) => api.square(x))),
    );
    await vi.advanceTimersByTimeAsync(6 * 600);
    expect(await results).toEqual([4, 9, 16, 25, 36, 49]);
    expect(workers).toHaveLength(1);
    expect(events).toEqual([]);
    pool.close();
  });

  test('a worker that dies with an error is replaced at once; its in-flight tasks run on the new one', async () => {
    const { pool, workers, events } = fakePool(1, { depth: 3 });
    await pool.run(1, 0, (api) => api.square(1));
    workers[0]!.busyMs = 1000;
    const results = Promise.all([2, 3, 4].map((x) => pool.run(1, 0, (api) => api.square(x))));
    await vi.advanceTimersByTimeAsync(100);
    workers[0]!.die('out of memory');
    await vi.advanceTimersByTimeAsync(0);
    expect(workers).toHaveLength(2);
    expect(events).toEqual([{ kind: 'replaced', reason: 'out of memory' }]);
    expect(await results).toEqual([4, 9, 16]);
    pool.close();
  });

  test('a worker that hangs past the task timeout is replaced even if it answers pings', async () => {
    const { pool, workers } = fakePool(1, { timeoutMs: 30_000 });
    await pool.run(1, 0, (api) => api.square(1));
    workers[0]!.busyMs = 60_000;
    const result = pool.run(1, 0, (api) => api.square(6));
    await vi.advanceTimersByTimeAsync(30_000);
    expect(workers).toHaveLength(1);
    await vi.advanceTimersByTimeAsync(500);
    expect(workers).toHaveLength(2);
    expect(await result).toBe(36);
    pool.close();
  });

  test('replacements at one place back off: at once, then 250, 500, 1000 ms, up to the limit', async () => {
    let failing = true;
    const { pool, workers, createdAt, events } = fakePool(
      1,
      { backoffMs: 250, maxBackoffMs: 1000 },
      () => Object.assign(new FakeWorker(), { throws: failing }),
    );
    const results = Array.from({ length: 12 }, (_, k) =>
      pool.run(1, 0, (api) => api.square(k)).catch(() => 'failed'),
    );
    await vi.advanceTimersByTimeAsync(3000);
    expect(createdAt).toEqual([0, 0, 250, 750, 1750, 2750]);
    expect(events).toHaveLength(6);
    expect(events[0]).toEqual({ kind: 'replaced', reason: 'bad input' });
    // The next worker works: the tasks charged twice failed, the rest are done.
    failing = false;
    await vi.advanceTimersByTimeAsync(1000);
    expect(createdAt.at(-1)).toBe(3750);
    expect(await Promise.all(results)).toEqual([
      ...['failed', 'failed', 'failed'],
      ...[3, 4, 5, 6, 7, 8, 9, 10, 11].map((k) => k * k),
    ]);
    // A task that succeeded ended the run of strikes: the next loss is replaced at once.
    workers.at(-1)!.throws = true;
    expect(await pool.run(2, 0, (api) => api.square(2))).toBe(4);
    // Made at once: the clock still stands at 4000 ms.
    expect(createdAt.slice(6)).toEqual([3750, 4000]);
    pool.close();
  });
});

describe('WorkerPool start failures (workers/workerPool.ts)', () => {
  /** A worker whose script cannot load: it dies before answering anything. */
  const unloadable = () => {
    const w = new FakeWorker();
    w.silent = true;
    queueMicrotask(() => w.die('the worker failed to load'));
    return w;
  };

  test('a worker that cannot start is retried with growing delays, then reported once; tasks fail', async () => {
    const { pool, workers, createdAt, events } = fakePool(
      1,
      { backoffMs: 250, maxStarts: 5 },
      unloadable,
    );
    let failure: unknown;
    const result = pool.run(1, 0, (api) => api.square(2)).catch((error) => (failure = error));
    await vi.advanceTimersByTimeAsync(60_000);
    await result;
    expect(createdAt).toEqual([0, 0, 250, 750, 1750]);
    expect(events).toEqual([{ kind: 'unavailable', reason: 'the worker failed to load' }]);
    expect((failure as Error).message).toBe(
      'no worker could be started (the worker failed to load)',
    );
    // From now on tasks fail at once, and no worker is started again.
    await expect(pool.run(2, 0, (api) => api.square(3))).rejects.toThrow(
      'no worker could be started',
    );
    await vi.advanceTimersByTimeAsync(60_000);
    expect(workers).toHaveLength(5);
    pool.close();
  });

  test('when no worker can start the tasks move to the fallback, reported once', async () => {
    const fallback = new FakeWorker();
    const fallbacks: FakeWorker[] = [];
    const { pool, workers, events } = fakePool(
      2,
      {
        maxStarts: 3,
        fallback: () => {
          fallbacks.push(fallback);
          return fallback;
        },
      },
      () => {
        // A creation that throws counts as a start that failed, as a death before answering does.
        if (workers.length % 2 === 0) throw new Error('workers are not allowed here');
        return unloadable();
      },
    );
    const results = Promise.all([1, 2, 3].map((x) => pool.run(1, 0, (api) => api.square(x))));
    await vi.advanceTimersByTimeAsync(10_000);
    expect(await results).toEqual([1, 4, 9]);
    expect(events).toHaveLength(1);
    expect(events[0]!.kind).toBe('fallback');
    expect(fallbacks).toHaveLength(1);
    pool.close();
  });

  test('a start that fails once and then succeeds is not reported', async () => {
    let n = 0;
    const { pool, events } = fakePool(1, {}, () => (n++ === 0 ? unloadable() : new FakeWorker()));
    const result = pool.run(1, 0, (api) => api.square(7));
    await vi.advanceTimersByTimeAsync(0);
    expect(await result).toBe(49);
    expect(events).toEqual([]);
    pool.close();
  });
});

describe('WorkerPool holds nothing per task (workers/workerPool.ts)', () => {
  test('over 10,000 tasks: one reaction on each worker`s death, one timer, nothing in flight after', async () => {
    const { pool, workers } = fakePool(2, { pingMs: 500 });
    const snapshot = () => ({
      workers: workers.length,
      diedReactions: workers.map((w) => w.diedReactions),
      timers: vi.getTimerCount(),
      inFlight: pool.inFlight,
    });
    const batch = (job: number) =>
      Promise.all(Array.from({ length: 100 }, (_, k) => pool.run(job, 0, (api) => api.square(k))));
    await batch(0);
    const first = snapshot();
    expect(first).toEqual({ workers: 2, diedReactions: [1, 1], timers: 1, inFlight: 0 });
    for (let job = 1; job < 100; job++) {
      await batch(job);
      // Pings and timeouts are checked while tasks run (the clock moves between batches).
      await vi.advanceTimersByTimeAsync(100);
    }
    expect(snapshot()).toEqual({ ...first, timers: vi.getTimerCount() });
    expect(vi.getTimerCount()).toBeLessThanOrEqual(1);
    pool.close();
    expect(vi.getTimerCount()).toBe(0);
  });
});
