import type { ConditionMap } from './conditionMap';
import { FitCancelled } from './conditionMap';
import { consistencyGrid, type ConsistencyGrid } from './consistencyGrid';
import {
  conditionDocument,
  conditionKey,
  fieldConditionOf,
  sweepConditionOf,
  type FieldCondition,
  type FitPlane,
  type TiltSweepCondition,
} from './fitPlane';
import { fitLikelihood, type FitResult } from './likelihoodFit';
import { axisValue } from './plane';
import { rowInGrid, type FitProblem, type RowPrediction } from './rowPredictions';
import { computeSweepField, type SweepField, type SweepFieldOptions } from './sweepField';
import type { TiltSweep } from './tiltSweep';

/** Where the pieces of a fit run: the CLI's threads, the app's worker pool, or here. */
export interface FitRunners {
  /** The Map of one field condition, every pixel solved (`computeConditionMap`). */
  conditionMap(document: string): Promise<ConditionMap>;
  /** Tilt sweeps (`tiltSweep`) at the (x, y) pairs of `points` in the per-tesla document. */
  sweeps(
    document: string,
    gFactor: number,
    startDeg: number,
    points: Float64Array,
  ): Promise<TiltSweep[]>;
  /** Every row at each parameter point (`predictRows`). */
  rows(problem: FitProblem, points: number[][]): Promise<RowPrediction[][]>;
}

export interface FitProgress {
  readonly stage: 'maps' | 'sweeps' | 'fit';
  /** Maps finished (stage `maps`), sweeps made (stage `sweeps`) or exact evaluations (`fit`). */
  readonly done: number;
}

export interface FitOutcome {
  readonly grid: ConsistencyGrid;
  readonly fit: FitResult;
  /** Maps computed and tilt sweeps made for the grid. */
  readonly maps: number;
  readonly sweeps: number;
  /** Some sweep field stopped refining at its budget. */
  readonly truncated: boolean;
  /** Wall time of the grid (maps and sweeps) and of the fit, ms. */
  readonly milliseconds: { readonly grid: number; readonly fit: number };
}

/**
 * A whole fit (public/notes.html#observations): the Map of every distinct field condition of the
 * phase rows (and gap rows, when fitted) and the sweep field of every distinct tilt-sweep
 * condition of the transition rows, all at once; the consistency grid from them; then the
 * likelihood fit with exact evaluations at the points it needs.
 */
export async function runFit(
  problem: FitProblem,
  runners: FitRunners,
  fieldOptions: SweepFieldOptions,
  onProgress: (progress: FitProgress) => void = () => undefined,
  cancelled: () => boolean = () => false,
  clock: () => number = () => Date.now(),
): Promise<FitOutcome> {
  const started = clock();
  const plane = problem.plane as FitPlane;
  const planeAxes = plane.document.plane as FitPlane['input']['plane'];
  const [nx, ny] = planeAxes.resolution;
  const x = Float64Array.from({ length: nx }, (_, i) => axisValue(planeAxes.x, nx, i));
  const y = Float64Array.from({ length: ny }, (_, j) => axisValue(planeAxes.y, ny, j));

  const fieldConditions = new Map<string, FieldCondition>();
  const sweepConditions = new Map<string, { condition: TiltSweepCondition; rows: number[] }>();
  problem.rows.forEach((row, k) => {
    if (row.kind === 'transition_tilt') {
      const condition = sweepConditionOf(plane, row);
      const key = conditionKey(condition);
      const entry = sweepConditions.get(key) ?? { condition, rows: [] };
      entry.rows.push(k);
      sweepConditions.set(key, entry);
    } else if (rowInGrid(row, problem.options)) {
      const condition = fieldConditionOf(plane, row);
      fieldConditions.set(conditionKey(condition), condition);
    }
  });

  let mapsDone = 0;
  let sweepsDone = 0;
  const maps = new Map<string, ConditionMap>();
  const fields = new Map<string, { rows: number[]; field: SweepField }>();
  await Promise.all([
    ...[...fieldConditions].map(async ([key, condition]) => {
      const map = await runners.conditionMap(JSON.stringify(conditionDocument(plane, condition)));
      maps.set(key, map);
      onProgress({ stage: 'maps', done: ++mapsDone });
    }),
    ...[...sweepConditions].map(async ([key, { condition, rows }]) => {
      const document = JSON.stringify(conditionDocument(plane, condition));
      const field = await computeSweepField(
        rows.map((k) => problem.rows[k]!),
        x,
        y,
        async (points) => {
          const out = await runners.sweeps(document, plane.gFactor, condition.startDeg, points);
          sweepsDone += out.length;
          onProgress({ stage: 'sweeps', done: sweepsDone });
          return out;
        },
        fieldOptions,
        cancelled,
      );
      fields.set(key, { rows, field });
    }),
  ]);
  if (cancelled()) throw new FitCancelled();
  const grid = consistencyGrid(problem, x, y, maps, fields);
  const gridDone = clock();
  let evaluations = 0;
  const fit = await fitLikelihood(
    problem,
    grid,
    async (points) => {
      const out = await runners.rows(problem, points);
      evaluations += points.length;
      onProgress({ stage: 'fit', done: evaluations });
      return out;
    },
    cancelled,
  );
  return {
    grid,
    fit,
    maps: maps.size,
    sweeps: [...fields.values()].reduce((s, f) => s + f.field.sweeps, 0),
    truncated: [...fields.values()].some((f) => f.field.truncated),
    milliseconds: { grid: gridDone - started, fit: clock() - gridDone },
  };
}
