import {
  conditionDocument,
  conditionKey,
  fieldConditionOf,
  sweepConditionOf,
  withHartreeRatio,
  type FitPlane,
  type FreeRatio,
} from './fitPlane';
import { searchGroundState } from './groundSearch';
import { ModelError } from './model';
import type { Observation } from './observations';
import { groupMagnitudes } from './orderParameters';
import { PlaneCouplings, parseMapInput } from './plane';
import { conditionHolds, parseStateCondition, type StateCondition } from './stateCondition';
import { PixelScratch, summarise } from './stateSummary';
import { predictedTilt, tiltResidual, tiltSweep } from './tiltSweep';
import { exchangeEnergyMeV } from './units';

/** How a fit treats its rows. */
export interface FitOptions {
  /** Gap rows enter the likelihood (off by default: the Hartree-Fock gap is an upper estimate). */
  readonly fitGaps: boolean;
  /** A common coupling whose Hartree-to-Fock ratio is a third fit parameter, or null. */
  readonly freeRatio: FreeRatio | null;
}

export const DEFAULT_FIT_OPTIONS: FitOptions = { fitGaps: false, freeRatio: null };

/** Everything a fit needs, as plain data (it crosses to workers). */
export interface FitProblem {
  readonly plane: Omit<FitPlane, 'input'>;
  readonly rows: readonly Observation[];
  readonly options: FitOptions;
}

/** What the model says about one row at one point of the plane. */
export interface RowPrediction {
  /** The label there (phase), the transition tilt in degrees or the gap in meV; null: none. */
  readonly predicted: string | number | null;
  /** (predicted - observed) / sigma for a transition or gap; null for a phase. */
  readonly residual: number | null;
  /** A phase matches, a transition or gap lies within 2 sigma. */
  readonly holds: boolean;
}

/** Whether a row enters the likelihood (chi^2) under these options. */
export function rowInLikelihood(row: Observation, options: FitOptions): boolean {
  return row.kind === 'transition_tilt' || (row.kind === 'gap' && options.fitGaps);
}

/** Whether a row counts towards the consistency grid (gaps only when they are fitted). */
export function rowInGrid(row: Observation, options: FitOptions): boolean {
  return row.kind !== 'gap' || options.fitGaps;
}

const conditionCache = new Map<string, StateCondition>();

/** The parsed condition of a phase row's value (cached: rows are evaluated many times). */
export function rowCondition(row: Observation): StateCondition {
  const text = String(row.value);
  let condition = conditionCache.get(text);
  if (condition === undefined) {
    condition = parseStateCondition(text);
    conditionCache.set(text, condition);
  }
  return condition;
}

/** The per-tesla document at a parameter point's Hartree ratio (when the fit frees one). */
export function documentAt(problem: FitProblem, point: readonly number[]): Record<string, unknown> {
  const which = problem.options.freeRatio;
  if (which === null) return { ...problem.plane.document };
  const ratio = point[2];
  if (ratio === undefined || !Number.isFinite(ratio)) {
    throw new ModelError('fit: a freed Hartree ratio needs a third parameter');
  }
  return withHartreeRatio(problem.plane.document, which, ratio);
}

/** The gap a row predicts, meV: the per-tesla Hartree-Fock gap times B_perp, plus E_X if set. */
export function gapAtField(problem: FitProblem, row: Observation, gapPerTesla: number): number {
  const exchange =
    problem.plane.exchangePermittivity === null
      ? 0
      : exchangeEnergyMeV(row.bPerpTesla, problem.plane.exchangePermittivity);
  return gapPerTesla * row.bPerpTesla + exchange;
}

/** A row's residual and whether it holds, from what the model predicts for it. */
export function judgeRow(
  row: Observation,
  predicted: string | number | null,
  groups?: ArrayLike<number>,
): RowPrediction {
  if (row.kind === 'phase') {
    const label = predicted as string;
    return {
      predicted: label,
      residual: null,
      holds: conditionHolds(rowCondition(row), label, groups ?? []),
    };
  }
  const sigma = row.sigma!;
  const residual =
    row.kind === 'transition_tilt'
      ? tiltResidual(predicted as number | null, row.value as number, sigma, row.tiltDeg ?? 0)
      : ((predicted as number) - (row.value as number)) / sigma;
  return { predicted, residual, holds: predicted !== null && Math.abs(residual) <= 2 };
}

/**
 * Every row at the parameter point (x, y[, ratio]): each distinct field condition is solved
 * once (a full global search, as a Map's coarse node), each distinct tilt sweep run once
 * (`tiltSweep`), so rows that share a condition share the work.
 */
export function predictRows(problem: FitProblem, point: readonly number[]): RowPrediction[] {
  const [x, y] = point as [number, number];
  const document = documentAt(problem, point);
  const plane = problem.plane as FitPlane;
  const states = new Map<string, { label: string; groups: Float64Array; gap: number }>();
  const sweeps = new Map<string, ReturnType<typeof tiltSweep>>();
  const scratch = new PixelScratch();
  return problem.rows.map((row) => {
    if (row.kind === 'transition_tilt') {
      const condition = sweepConditionOf(plane, row);
      const key = conditionKey(condition);
      let sweep = sweeps.get(key);
      if (sweep === undefined) {
        const input = parseMapInput(conditionDocument({ document }, condition));
        sweep = tiltSweep(input, x, y, plane.gFactor, condition.startDeg);
        sweeps.set(key, sweep);
      }
      return judgeRow(row, predictedTilt(sweep, condition.startDeg, row.pair));
    }
    const condition = fieldConditionOf(plane, row);
    const key = conditionKey(condition);
    let state = states.get(key);
    if (state === undefined) {
      const input = parseMapInput(conditionDocument({ document }, condition));
      const c = new PlaneCouplings(input).at(x, y);
      const frame = searchGroundState(c).frame;
      const summary = summarise(c, frame, c.nf, scratch);
      state = { label: summary.label, groups: groupMagnitudes(scratch.order), gap: summary.gap };
      states.set(key, state);
    }
    if (row.kind === 'phase') return judgeRow(row, state.label, state.groups);
    return judgeRow(row, gapAtField(problem, row, state.gap));
  });
}

/** chi^2 of a point's predictions: the squared residuals of the rows in the likelihood. */
export function chiSquare(problem: FitProblem, predictions: readonly RowPrediction[]): number {
  let sum = 0;
  problem.rows.forEach((row, k) => {
    if (rowInLikelihood(row, problem.options)) sum += predictions[k]!.residual! ** 2;
  });
  return sum;
}

/** Whether every phase row holds at a point (the likelihood is zero elsewhere). */
export function phasesHold(problem: FitProblem, predictions: readonly RowPrediction[]): boolean {
  return problem.rows.every((row, k) => row.kind !== 'phase' || predictions[k]!.holds);
}
