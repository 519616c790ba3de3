import { describe, expect, test } from 'vitest';
import {
  BISECTION_TOLERANCE,
  computePhaseMap,
  parseMapInput,
  PIXEL_SOLVED,
  type Boundary,
  type CoarseNodes,
  type MapGrid,
} from '../solver/index';
import { mapStagesApi, type AsyncMapStages } from '../workers/mapStages';
import { MapScheduler, type MapJobEvents } from '../workers/mapScheduler';
import { WorkerPool, type PoolMember } from '../workers/workerPool';
import { INTERFACES_EXAMPLE, standardPlane } from './fixtures';

/** The stages run in this thread, behind the same asynchronous interface as a worker. */
function inThread(fault?: (name: string, args: unknown[]) => void): PoolMember<AsyncMapStages> {
  let deathRejects: (reason: Error) => void = () => undefined;
  const died = new Promise<never>((_, reject) => (deathRejects = reject));
  const api = Object.fromEntries(
    Object.entries(mapStagesApi).map(([name, fn]) => [
      name,
      async (...args: unknown[]) => {
        await new Promise((r) => setTimeout(r, 0));
        fault?.(name, args);
        return (fn as (...a: unknown[]) => unknown)(...args);
      },
    ]),
  ) as unknown as AsyncMapStages;
  return { api, died, terminate: () => deathRejects(new Error('terminated')) };
}

interface Outcome {
  grid: MapGrid;
  boundaries: Boundary[];
  problems: string[];
  coarseSeen: boolean;
}

function run(scheduler: MapScheduler, json: string): { job: number; outcome: Promise<Outcome> } {
  const problems: string[] = [];
  let coarseSeen = false;
  let job = 0;
  const outcome = new Promise<Outcome>((resolve) => {
    const events: MapJobEvents = {
      update: () => undefined,
      coarse: () => (coarseSeen = true),
      done: (grid, boundaries) => resolve({ grid, boundaries, problems, coarseSeen }),
      problem: (text) => problems.push(text),
    };
    job = scheduler.start(parseMapInput(JSON.parse(json)), json, events);
  });
  return { job, outcome };
}

/** Same polylines (pairs, order, point count), points within 1e-8 of the axis span of 4. */
function expectSameBoundaries(actual: readonly Boundary[], expected: readonly Boundary[]): void {
  expect(actual.map((b) => [b.between, b.order, b.points.length])).toEqual(
    expected.map((b) => [b.between, b.order, b.points.length]),
  );
  actual.forEach((b, k) =>
    b.points.forEach(([x, y], n) => {
      expect(Math.abs(x - expected[k]!.points[n]![0])).toBeLessThan(1e-8);
      expect(Math.abs(y - expected[k]!.points[n]![1])).toBeLessThan(1e-8);
    }),
  );
}

const SCENARIO = JSON.stringify({ ...INTERFACES_EXAMPLE, plane: standardPlane(48, 40) });

describe('browser Map scheduler (workers/mapScheduler.ts) over a worker pool', () => {
  test('adaptive tiling gives the one-shot map: labels, boundaries, and every pixel solved', async () => {
    const reference = await computePhaseMap(parseMapInput(JSON.parse(SCENARIO)));
    const pool = new WorkerPool(() => inThread(), 2);
    const { outcome } = run(new MapScheduler(pool, BISECTION_TOLERANCE), SCENARIO);
    const result = await outcome;
    const { grid } = result;
    expect(result.coarseSeen).toBe(true);
    expect(result.problems).toEqual([]);
    expect(grid.labels).toEqual(reference.labels);
    expect(new Set(grid.labels)).toEqual(new Set(['F', 'CAF', 'KD', 'CDW']));
    // Every pixel is solved and certified, cells holding a boundary first.
    const solved = grid.status.filter((s) => s === PIXEL_SOLVED).length;
    expect(solved).toBe(grid.nx * grid.ny);
    // Boundaries: same polylines, points within the bisection tolerance (their edge ends may
    // differ in the last bits).
    expectSameBoundaries(result.boundaries, reference.boundaries);
    // Every pixel's state equals the one-shot state.
    for (let p = 0; p < grid.nx * grid.ny; p++) {
      expect(grid.labels[p]).toBe(reference.labels[p]);
      expect(Math.abs(grid.energy[p]! - reference.energy[p]!)).toBeLessThan(1e-12);
    }
    pool.close();
  });

  test('a newer job drops the older one: no event of the old job arrives after the new start', async () => {
    const pool = new WorkerPool(() => inThread(), 2);
    const scheduler = new MapScheduler(pool, BISECTION_TOLERANCE);
    const lateEvents: string[] = [];
    let firstStarted = true;
    const old = scheduler.start(parseMapInput(JSON.parse(SCENARIO)), SCENARIO, {
      update: () => (firstStarted ? undefined : lateEvents.push('update')),
      coarse: () => lateEvents.push('coarse'),
      done: () => lateEvents.push('done'),
      problem: (t) => lateEvents.push(t),
    });
    firstStarted = false;
    const other = JSON.stringify({
      ...INTERFACES_EXAMPLE,
      zeeman: 0.8,
      plane: standardPlane(24, 24),
    });
    const { job, outcome } = run(scheduler, other);
    expect(job).toBe(old + 1);
    const result = await outcome;
    expect(result.grid.nx).toBe(24);
    // The old job's events are suppressed by the scheduler (stale) or its queue was dropped.
    expect(lateEvents).toEqual([]);
    pool.close();
  });

  test('two grids in turn: a new job never fills the grid whose map is on screen', async () => {
    const pool = new WorkerPool(() => inThread(), 2);
    const scheduler = new MapScheduler(pool, BISECTION_TOLERANCE);
    const small = JSON.stringify({ ...INTERFACES_EXAMPLE, plane: standardPlane(24, 24) });
    const first = (await run(scheduler, small).outcome).grid;
    const second = (await run(scheduler, small).outcome).grid;
    const third = (await run(scheduler, small).outcome).grid;
    expect(second).not.toBe(first);
    // The first grid is off screen again once the second has shown its coarse frame: reused.
    expect(third).toBe(first);
    expect(third.labels).toEqual(second.labels);
    // Another resolution gets its own grid.
    const other = JSON.stringify({ ...INTERFACES_EXAMPLE, plane: standardPlane(20, 24) });
    expect((await run(scheduler, other).outcome).grid.nx).toBe(20);
    pool.close();
  });

  test('after a small change the quick first look, once verified, gives the map a fresh job gives', async () => {
    const pool = new WorkerPool(() => inThread(), 2);
    const withHistory = new MapScheduler(pool, BISECTION_TOLERANCE);
    const fresh = new MapScheduler(pool, BISECTION_TOLERANCE);
    // The y range is shifted so that no pixel centre lies on uZ = uPerp, where KD and CDW are
    // exactly degenerate (either is then right, and history may pick the other).
    const at = (zeeman: number) =>
      JSON.stringify({
        ...INTERFACES_EXAMPLE,
        zeeman,
        plane: standardPlane(40, 40, [-2, 2], [-1.97, 2.03]),
      });
    await run(withHistory, at(0.4)).outcome;
    const changed = await run(withHistory, at(0.9)).outcome;
    const reference = await run(fresh, at(0.9)).outcome;
    expect(changed.grid.labels).toEqual(reference.grid.labels);
    expectSameBoundaries(changed.boundaries, reference.boundaries);
    pool.close();
  });

  test('a worker that throws once is replaced and its tile redone: the map is unchanged', async () => {
    const reference = await computePhaseMap(parseMapInput(JSON.parse(SCENARIO)));
    let faults = 0;
    const pool = new WorkerPool(
      () =>
        inThread((name) => {
          if (name === 'cells' && faults < 2) {
            faults++;
            throw new Error('simulated worker failure');
          }
        }),
      2,
    );
    const { outcome } = run(new MapScheduler(pool, BISECTION_TOLERANCE), SCENARIO);
    const result = await outcome;
    expect(faults).toBe(2);
    expect(pool.replaced).toBe(2);
    expect(result.problems).toEqual([]);
    expect(result.grid.labels).toEqual(reference.labels);
    expect(result.boundaries.length).toBe(reference.boundaries.length);
    pool.close();
  });

  test('a tile that keeps failing is reported in one sentence; the rest of the map is finished', async () => {
    let calls = 0;
    let doomed = '';
    const pool = new WorkerPool(
      () =>
        inThread((name, args) => {
          // The first boundary-cell task fails on every attempt.
          if (name !== 'cells') return;
          const coarse = args[1] as CoarseNodes;
          const key = `${coarse.cols[0]},${coarse.rows[0]}`;
          if (doomed === '') doomed = key;
          if (key === doomed) {
            calls++;
            throw new Error('simulated crash');
          }
        }),
      2,
      { attempts: 2 },
    );
    const { outcome } = run(new MapScheduler(pool, BISECTION_TOLERANCE), SCENARIO);
    const result = await outcome;
    expect(calls).toBe(2);
    expect(result.problems).toHaveLength(1);
    expect(result.problems[0]).toMatch(
      /^1 part of the map could not be computed \(simulated crash\)/,
    );
    // The failed cells keep their coarse preview; the map still shows every region.
    expect(result.grid.labels.every((label) => label !== '')).toBe(true);
    expect(result.boundaries.length).toBeGreaterThan(0);
    pool.close();
  });

  test('a worker that hangs is timed out, replaced, and the task retried', async () => {
    // A member whose first call never settles.
    let first = true;
    const hangingPool = new WorkerPool(
      () => {
        const m = inThread();
        if (!first) return m;
        first = false;
        const api = { ...m.api, coarse: () => new Promise<never>(() => undefined) };
        return { ...m, api } as PoolMember<AsyncMapStages>;
      },
      1,
      { timeoutMs: 3000 },
    );
    const { outcome } = run(new MapScheduler(hangingPool), SCENARIO);
    const result = await outcome;
    expect(hangingPool.replaced).toBe(1);
    expect(result.problems).toEqual([]);
    expect(result.grid.labels.every((label) => label !== '')).toBe(true);
    hangingPool.close();
  });
});
