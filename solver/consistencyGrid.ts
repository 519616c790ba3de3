import type { ConditionMap } from './conditionMap';
import { conditionKey, fieldConditionOf, sweepConditionOf, type FitPlane } from './fitPlane';
import { conditionHolds } from './stateCondition';
import {
  gapAtField,
  rowCondition,
  rowInGrid,
  rowInLikelihood,
  type FitProblem,
} from './rowPredictions';
import type { SweepField } from './sweepField';

/**
 * Which observations hold at each pixel of the plane (public/notes.html#observations): a phase
 * row where its condition's Map shows the state, a transition row where the predicted tilt lies
 * within 2 sigma, a gap row (only when gaps are fitted) where the gap does. Grids are row-major,
 * `values[j nx + i]` at (x[i], y[j]), per tesla of B_perp.
 */
export interface ConsistencyGrid {
  readonly nx: number;
  readonly ny: number;
  readonly x: Float64Array;
  readonly y: Float64Array;
  /** Per row of the problem (null for a row not in the grid): 1 where it holds. */
  readonly rowHolds: (Uint8Array | null)[];
  /** Rows that hold, per pixel, of `total`. */
  readonly held: Uint16Array;
  readonly total: number;
  /** Phase rows that hold, per pixel, of `phaseTotal`. */
  readonly phaseHeld: Uint16Array;
  readonly phaseTotal: number;
  /** chi^2 of the rows in the likelihood per pixel (from the interpolated sweep fields). */
  readonly chi2: Float64Array;
}

/** The grid from the Maps of the field conditions and the sweep fields, both keyed by condition. */
export function consistencyGrid(
  problem: FitProblem,
  x: Float64Array,
  y: Float64Array,
  maps: ReadonlyMap<string, ConditionMap>,
  fields: ReadonlyMap<string, { readonly rows: readonly number[]; readonly field: SweepField }>,
): ConsistencyGrid {
  const nx = x.length;
  const ny = y.length;
  const total = nx * ny;
  const plane = problem.plane as FitPlane;
  const held = new Uint16Array(total);
  const phaseHeld = new Uint16Array(total);
  const chi2 = new Float64Array(total);
  let rowsInGrid = 0;
  let phaseTotal = 0;
  const rowHolds = problem.rows.map((row, k) => {
    const inGrid = rowInGrid(row, problem.options);
    const inLikelihood = rowInLikelihood(row, problem.options);
    if (!inGrid && !inLikelihood) return null;
    const holds = new Uint8Array(total);
    if (row.kind === 'transition_tilt') {
      const entry = fields.get(conditionKey(sweepConditionOf(plane, row)))!;
      const residual = entry.field.residual[entry.rows.indexOf(k)]!;
      const predicted = entry.field.predicted[entry.rows.indexOf(k)]!;
      for (let p = 0; p < total; p++) {
        const r = residual[p]!;
        holds[p] = !Number.isNaN(predicted[p]!) && Math.abs(r) <= 2 ? 1 : 0;
        chi2[p] += r * r;
      }
    } else {
      const map = maps.get(conditionKey(fieldConditionOf(plane, row)))!;
      if (row.kind === 'phase') {
        const condition = rowCondition(row);
        phaseTotal++;
        for (let p = 0; p < total; p++) {
          const h = conditionHolds(
            condition,
            map.labels[p]!,
            map.groups.subarray(8 * p, 8 * p + 8),
          );
          holds[p] = h ? 1 : 0;
          if (h) phaseHeld[p]++;
        }
      } else {
        const observed = row.value as number;
        for (let p = 0; p < total; p++) {
          const r = (gapAtField(problem, row, map.gap[p]!) - observed) / row.sigma!;
          holds[p] = Math.abs(r) <= 2 ? 1 : 0;
          if (inLikelihood) chi2[p] += r * r;
        }
      }
    }
    if (!inGrid) return null;
    rowsInGrid++;
    for (let p = 0; p < total; p++) held[p] += holds[p]!;
    return holds;
  });
  return { nx, ny, x, y, rowHolds, held, total: rowsInGrid, phaseHeld, phaseTotal, chi2 };
}
