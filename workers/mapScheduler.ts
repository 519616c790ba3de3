import {
  MapGrid,
  PIXEL_SOLVED,
  cellIsUniform,
  previewFrames,
  splitRange,
  type Boundary,
  type CellRange,
  type Crossing,
  type MapInput,
  errorLine,
} from '../solver/index';
import type { AsyncMapStages } from './mapStages';
import { CancelledError, type WorkerPool } from './workerPool';

/** Stages a job goes through, in order. */
export type JobPhase = 'coarse' | 'refining' | 'boundaries' | 'verifying' | 'done' | 'failed';

export interface MapJobEvents {
  /**
   * The grid changed (new results placed): redraw. Before `coarse` the grid is not complete
   * enough to show (and may be the one the previous job's map is not in).
   */
  update(grid: MapGrid, phase: JobPhase): void;
  /** The first full coarse frame is in the grid (every pixel shows a nearby node's label). */
  coarse(grid: MapGrid): void;
  /** The boundaries between the pixels solved so far (before the regions are checked). */
  boundaries?(grid: MapGrid, boundaries: Boundary[]): void;
  /** Every pixel solved and every boundary located. */
  done(grid: MapGrid, boundaries: Boundary[]): void;
  /** Something could not be computed; the grid keeps what was. One short sentence. */
  problem(message: string): void;
}

/** 'staged': coarse grid, adaptive cells, boundaries. 'cold': the baseline, a full search per pixel. */
export type MapMode = 'staged' | 'cold';

/** Boundary cells along a row per pixel task, region cells per task, and region pixels per task. */
const MAX_RUN = 4;
const MAX_REGION_RUN = 8;
const PIXELS_PER_TASK = 256;
/**
 * Coarse nodes per task of a first look by continuation (about 0.1 ms each), and per task of
 * full searches (a few ms each): a worker busy with a task holds up the next job's first look
 * by that long when a slider moves on.
 */
const PREVIEW_NODES_PER_TASK = 16;
const NODES_PER_TASK = 4;
/**
 * Pause after the first look before the heavier stages are queued, ms: during a slider drag the
 * next change usually arrives within one animation frame, and then starts its own first look on
 * idle workers instead of waiting behind this job's searches.
 */
export const SETTLE_MS = 24;
/** Edges per crossing task, rows per cold task. */
const EDGES_PER_TASK = 24;
const ROWS_PER_TASK = 2;

/**
 * Boundary bisection stops at this fraction of the axis span on screen: far below a pixel at any
 * resolution the app allows, and about half the work of the CLI's 1e-9 (BISECTION_TOLERANCE).
 */
export const LIVE_BISECTION_TOLERANCE = 1e-6;

/**
 * Tiles the plane over a worker pool, progressively: (1) every second coarse node, a full
 * search each, shown at once as the first coarse frame; (2) the other coarse nodes; (3) the
 * coarse cells holding a boundary (each pixel gets its own converged, certified state:
 * `solveCells`); (4) the boundaries, bisected along every pixel edge that changes label; (5) the
 * cells inside regions, every pixel solved and certified the same way, so that every pixel on
 * screen is the single-point ground state; where that finds a state the coarse nodes did not
 * see (an island, another branch), the boundaries are located again. Starting a job drops
 * everything queued for older jobs; their late results are ignored.
 */
export class MapScheduler {
  private job = 0;
  /**
   * Two grids in turn (per resolution): a new job fills the one that is not on screen, the
   * grid of the last job that reached its coarse frame, so the map on screen never empties.
   */
  private grids: MapGrid[] = [];
  private shown: MapGrid | null = null;

  constructor(
    private readonly pool: WorkerPool<AsyncMapStages>,
    /** Relative bisection tolerance of the boundaries (of the axis span). */
    private readonly bisectionTolerance = LIVE_BISECTION_TOLERANCE,
  ) {}

  /** The newest job's number. */
  get current(): number {
    return this.job;
  }

  /** Starts mapping `input` (whose scenario document is `json`); returns the job number. */
  start(input: MapInput, json: string, events: MapJobEvents, mode: MapMode = 'staged'): number {
    const job = ++this.job;
    this.pool.cancelBefore(job);
    const run =
      mode === 'cold' ? this.cold(job, input, json, events) : this.staged(job, input, json, events);
    run.catch((error: unknown) => {
      if (error instanceof CancelledError || job !== this.job) return;
      events.problem(`The map could not be finished: ${errorLine(error)}`);
    });
    return job;
  }

  /** Drops all queued work (the current job stops where it is). */
  stop(): void {
    this.job++;
    this.pool.cancelBefore(this.job);
  }

  private stale(job: number): boolean {
    return job !== this.job;
  }

  /** An emptied grid for a new job, reusing one that is not on screen when the size allows. */
  private gridFor(input: MapInput): MapGrid {
    const [nx, ny] = input.plane.resolution;
    this.grids = this.grids.filter((g) => g.nx === nx && g.ny === ny);
    const free = this.grids.find((g) => g !== this.shown);
    if (free) {
      free.reset(input);
      return free;
    }
    const grid = new MapGrid(input);
    this.grids.push(grid);
    return grid;
  }

  private async staged(job: number, input: MapInput, json: string, events: MapJobEvents) {
    // The map on screen, when it has the same grid and filling, gives every coarse node a warm
    // start: the first look can then use a lighter search, verified right after.
    const previous = this.shown;
    const grid = this.gridFor(input);
    const warmSource =
      previous &&
      previous !== grid &&
      previous.nx === grid.nx &&
      previous.ny === grid.ny &&
      previous.coarseComplete &&
      previous.input.model.filling === input.model.filling
        ? previous.nodeFrames
        : null;
    const width = grid.cols.length;
    const height = grid.rows.length;
    const stride = grid.cols.length > 1 ? grid.cols[1]! - grid.cols[0]! : 1;
    // The first look takes every second node; with no map to continue from (the page just
    // opened, or a new grid) every fourth, since those are full searches on workers that are
    // still warming up.
    const spacing = warmSource === null ? 4 : 2;
    const even = (k: number, n: number) => k % spacing === 0 || k === n - 1;
    const first: number[] = [];
    const second: number[] = [];
    for (let b = 0; b < height; b++) {
      for (let a = 0; a < width; a++)
        (even(a, width) && even(b, height) ? first : second).push(b * width + a);
    }
    const framesOf = (source: Float64Array | null, ids: Int32Array) => {
      if (!source) return undefined;
      const out = new Float64Array(32 * ids.length);
      ids.forEach((node, n) => out.set(source.subarray(32 * node, 32 * node + 32), 32 * n));
      return out;
    };
    const solveNodes = async (
      nodes: number[],
      priority: number,
      radius: number,
      quick: boolean,
      warm: (ids: Int32Array) => Float64Array | undefined,
      preview?: (ids: Int32Array) => Float64Array,
    ) => {
      const perTask = preview === undefined ? NODES_PER_TASK : PREVIEW_NODES_PER_TASK;
      await Promise.all(
        splitRange(nodes.length, Math.ceil(nodes.length / perTask)).map(async ([start, count]) => {
          const ids = Int32Array.from(nodes.slice(start, start + count));
          const frames = warm(ids);
          const around = preview?.(ids);
          const block = await this.pool.run(job, priority, (api) =>
            api.coarse(json, ids, quick, frames, around),
          );
          if (this.stale(job)) return;
          grid.placeCoarse(block, radius);
          events.update(grid, 'coarse');
        }),
      );
    };
    // After a small change (a slider step), the first look continues every node's previous
    // state and its neighbours' (a search only where that fails its check); the full search
    // of every node follows.
    const quick = warmSource !== null;
    await solveNodes(
      first,
      0,
      (stride * spacing) / 2,
      quick,
      (ids) => framesOf(warmSource, ids),
      warmSource === null ? undefined : (ids) => previewFrames(grid, warmSource, ids),
    );
    if (this.stale(job)) return;
    this.shown = grid;
    events.coarse(grid);
    if (this.stale(job)) return;
    await new Promise((resolve) => setTimeout(resolve, SETTLE_MS));
    if (this.stale(job)) return;
    // The other nodes, and (after a quick first look) the first ones again with the full search.
    const radius = Math.max(1, Math.ceil(stride / 2));
    const levelA = grid.nodeFrames.slice();
    await Promise.all([
      solveNodes(second, 1, radius, false, (ids) => framesOf(warmSource, ids)),
      quick ? solveNodes(first, 1, radius, false, (ids) => framesOf(levelA, ids)) : undefined,
    ]);
    if (this.stale(job)) return;

    // Only cells whose corners disagree hold a boundary and are solved pixel by pixel now;
    // inside regions every pixel already shows its cell's label, and its own state is solved
    // when asked for (hover, export). Runs of up to MAX_RUN boundary cells along a row make one
    // task each.
    const coarse = grid.coarseNodes();
    const runs: { -readonly [K in keyof CellRange]: number }[] = [];
    for (let b = 0; b < height - 1; b++) {
      for (let a = 0; a < width - 1; a++) {
        if (cellIsUniform(coarse, a, b)) continue;
        const last = runs[runs.length - 1];
        if (last && last.b0 === b && last.a1 === a && a - last.a0 < MAX_RUN) last.a1 = a + 1;
        else runs.push({ a0: a, b0: b, a1: a + 1, b1: b + 1 });
      }
    }
    const failures: string[] = [];
    const attempt = async (work: () => Promise<void>) => {
      try {
        await work();
      } catch (error) {
        if (error instanceof CancelledError) throw error;
        failures.push(errorLine(error));
      }
    };

    // Every other pixel, cell by cell (`verifying`): queued now, behind every task of the
    // boundary (priority 5), so that no worker waits while the last boundary cells, their end
    // pixels and the crossings run on the other. Shown as they come.
    const regionRuns: { -readonly [K in keyof CellRange]: number }[] = [];
    for (let b = 0; b < height - 1; b++) {
      for (let a = 0; a < width - 1; a++) {
        if (!cellIsUniform(coarse, a, b)) continue;
        const last = regionRuns[regionRuns.length - 1];
        if (last && last.b0 === b && last.a1 === a && a - last.a0 < MAX_REGION_RUN) last.a1 = a + 1;
        else regionRuns.push({ a0: a, b0: b, a1: a + 1, b1: b + 1 });
      }
    }
    /** Solves the cells of run t on the pool and places them: whether a label changed. */
    const solveRun = async (t: CellRange, priority: number): Promise<boolean | undefined> => {
      const window = grid.coarseWindow(t);
      const block = await this.pool.run(job, priority, (api) =>
        api.cells(json, window, { a0: 0, b0: 0, a1: t.a1 - t.a0, b1: t.b1 - t.b0 }),
      );
      return this.stale(job) ? undefined : grid.placePixels(block);
    };
    let phase: 'refining' | 'verifying' = 'refining';
    let changed = false;
    const regionWork = Promise.all(
      regionRuns.map((t) =>
        attempt(async () => {
          const moved = await solveRun(t, 5);
          if (moved === undefined) return;
          if (moved) changed = true;
          events.update(grid, phase);
        }),
      ),
    );
    // Awaited below; a superseded job may return before that.
    regionWork.catch(() => undefined);

    await Promise.all(
      runs.map((t) =>
        attempt(async () => {
          if ((await solveRun(t, 2)) !== undefined) events.update(grid, 'refining');
        }),
      ),
    );
    if (this.stale(job)) return;

    // A boundary edge may end on a region pixel next to a boundary cell: solve those ends.
    const ends = new Set<number>();
    for (const edge of grid.boundaryEdges()) {
      const p = edge >> 1;
      const q = (edge & 1) === 1 ? p + grid.nx : p + 1;
      if (grid.status[p] !== PIXEL_SOLVED) ends.add(p);
      if (grid.status[q] !== PIXEL_SOLVED) ends.add(q);
    }
    const endPixels = Int32Array.from([...ends].sort((x, y) => x - y));
    await Promise.all(
      splitRange(endPixels.length, Math.ceil(endPixels.length / PIXELS_PER_TASK)).map(
        ([start, count]) =>
          attempt(async () => {
            const ids = endPixels.slice(start, start + count);
            const block = await this.pool.run(job, 3, (api) => api.pixels(json, coarse, ids));
            if (!this.stale(job)) grid.placePixelList(ids, block);
          }),
      ),
    );
    if (this.stale(job)) return;

    // Boundaries along edges whose two ends are both solved and differ.
    const locate = async (): Promise<Crossing[]> => {
      const edges = grid.boundaryEdges().filter((edge) => {
        const p = edge >> 1;
        const q = (edge & 1) === 1 ? p + grid.nx : p + 1;
        return grid.status[p] === PIXEL_SOLVED && grid.status[q] === PIXEL_SOLVED;
      });
      const found: Crossing[] = [];
      await Promise.all(
        splitRange(edges.length, Math.ceil(edges.length / EDGES_PER_TASK)).map(
          async ([start, count]) => {
            const ids = edges.slice(start, start + count);
            const { endFrames, endLabels } = grid.edgeEnds(ids);
            try {
              const located = await this.pool.run(job, 4, (api) =>
                api.crossings(json, ids, endFrames, endLabels, this.bisectionTolerance),
              );
              if (!this.stale(job)) found.push(...located);
            } catch (error) {
              if (error instanceof CancelledError) throw error;
              failures.push(errorLine(error));
            }
          },
        ),
      );
      // Crossings in edge order, so the polylines do not depend on which task finished first.
      return found.sort((a, b) => a.edge - b.edge);
    };
    events.update(grid, 'boundaries');
    // Region cells placed from here on may change a label that the crossings below miss.
    changed = false;
    let crossings = await locate();
    if (this.stale(job)) return;
    events.boundaries?.(grid, grid.phaseMap(crossings).boundaries);

    // The boundaries above are shown while the region cells finish.
    phase = 'verifying';
    events.update(grid, 'verifying');
    await regionWork;
    if (this.stale(job)) return;
    if (changed) crossings = await locate();
    if (failures.length > 0) {
      events.problem(
        `${failures.length} part${failures.length > 1 ? 's' : ''} of the map could not be computed (${failures[0]}); they show the coarse preview.`,
      );
    }
    events.done(grid, grid.phaseMap(crossings).boundaries);
  }

  private async cold(job: number, input: MapInput, json: string, events: MapJobEvents) {
    const grid = this.gridFor(input);
    await Promise.all(
      splitRange(grid.ny, Math.ceil(grid.ny / ROWS_PER_TASK)).map(async ([j0, rows]) => {
        const block = await this.pool.run(job, 0, (api) => api.coldRows(json, j0, rows));
        if (this.stale(job)) return;
        grid.placePixels(block);
        events.update(grid, 'refining');
      }),
    );
    if (this.stale(job)) return;
    this.shown = grid;
    events.coarse(grid);
    events.done(grid, []);
  }
}
