import type { FitResult } from './likelihoodFit';
import type { Observation } from './observations';
import type { FitProblem, RowPrediction } from './rowPredictions';

/** What the fit predicts for a transition at another field (public/notes.html#fit). */
export interface TiltPrediction {
  /** The field (T) and the pair of labels (null: the first transition) it is for. */
  readonly bPerpTesla: number;
  readonly pair: readonly [string, string] | null;
  /** Predicted transition tilt at the estimate (degrees), or null: no such transition. */
  readonly tiltDeg: number | null;
  /**
   * One standard deviation of the prediction from the covariance of the constrained
   * parameters (linear propagation, central differences); null where a parameter the
   * prediction depends on is not constrained, or there is no transition.
   */
  readonly sigmaDeg: number | null;
}

/** Relative step (of the parameter's range) of the central differences. */
const STEP = 1e-4;

/**
 * The transition tilt the fitted model predicts at field `bPerpTesla` for each transition row's
 * pair (one prediction per distinct pair and Delta_V), with its band: sigma^2 = g^T C g with g
 * the tilt's gradient in the parameters and C the fit's covariance. `evaluate` is the fit's row
 * evaluator (the CLI's threads, the page's workers, or here).
 */
export async function predictTilts(
  problem: FitProblem,
  fit: FitResult,
  bPerpTesla: number,
  evaluate: (problem: FitProblem, points: number[][]) => Promise<RowPrediction[][]>,
): Promise<TiltPrediction[]> {
  const seen = new Set<string>();
  const rows: Observation[] = [];
  for (const row of problem.rows) {
    if (row.kind !== 'transition_tilt') continue;
    const key = `${row.pair?.join('/') ?? ''}|${row.valleyZeemanMeV}|${row.tiltDeg}`;
    if (seen.has(key)) continue;
    seen.add(key);
    // The observed value does not enter the prediction; the row only names what to predict.
    rows.push({ ...row, bPerpTesla, value: 45, sigma: 1 });
  }
  if (rows.length === 0) return [];
  const asked: FitProblem = { ...problem, rows };
  const plane = problem.plane.document.plane as {
    x: { from: number; to: number };
    y: { from: number; to: number };
  };
  const spans = [
    Math.abs(plane.x.to - plane.x.from),
    Math.abs(plane.y.to - plane.y.from),
    ...fit.point.slice(2).map(() => 1),
  ];
  const p0 = fit.point;
  const points = [p0];
  p0.forEach((_, d) => {
    for (const sign of [-1, 1]) {
      points.push(p0.map((v, e) => (e === d ? v + sign * STEP * spans[d]! : v)));
    }
  });
  const out = await evaluate(asked, points);
  const constrained = fit.parameters.map((p) => p.sigma !== null);
  return rows.map((row, r) => {
    const tilt = out[0]![r]!.predicted as number | null;
    let sigma: number | null = null;
    if (tilt !== null && fit.covariance !== null) {
      const gradient = p0.map((_, d) => {
        const minus = out[1 + 2 * d]![r]!.predicted as number | null;
        const plus = out[2 + 2 * d]![r]!.predicted as number | null;
        if (minus === null || plus === null) return NaN;
        return (plus - minus) / (2 * STEP * spans[d]!);
      });
      const depends = gradient.some((g, d) => !constrained[d] && Math.abs(g) * spans[d]! > 1e-6);
      if (!depends && gradient.every(Number.isFinite)) {
        let variance = 0;
        gradient.forEach((ga, a) =>
          gradient.forEach((gb, b) => (variance += ga * fit.covariance![a]![b]! * gb)),
        );
        sigma = Math.sqrt(Math.max(0, variance));
      }
    }
    return { bPerpTesla, pair: row.pair, tiltDeg: tilt, sigmaDeg: sigma };
  });
}
