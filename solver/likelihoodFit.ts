import { chiSquareRise } from './chiSquareLevels';
import { FitCancelled } from './conditionMap';
import type { ConsistencyGrid } from './consistencyGrid';
import { symmetricEigen } from './linalg';
import { hartreeRatioOf } from './fitPlane';
import { rowInLikelihood, type FitProblem, type RowPrediction } from './rowPredictions';

/**
 * Maximum likelihood over the plane's two couplings (and a freed Hartree-to-Fock ratio) with
 * Gaussian errors on the transition tilts (and gaps, when fitted): chi^2 = sum of squared
 * residuals, minimised where every phase row holds (the likelihood is zero elsewhere).
 * public/notes.html#fit describes the method and what is reported.
 */
export interface FitParameter {
  readonly label: string;
  /** The best estimate; null when the data do not constrain it (see `interval`). */
  readonly estimate: number | null;
  /** One standard deviation; null when the data do not constrain the parameter. */
  readonly sigma: number | null;
  /**
   * Where the parameter lies at 2 sigma: the profile-likelihood interval (chi^2 within 4 of its
   * minimum with every phase row holding), or, unconstrained, the range it may take.
   */
  readonly interval: readonly [number, number];
  /**
   * How sigma was found: the curvature of chi^2 (quadratic around the estimate), the profile
   * (sigma = a quarter of the 2-sigma interval, where chi^2 is not quadratic or a phase row
   * cuts it), or `region`: not constrained, only bounded.
   */
  readonly method: 'curvature' | 'profile' | 'region';
}

export interface FitResult {
  readonly parameters: FitParameter[];
  /** The point the predictions are given at: the estimate, with unconstrained parameters at a representative value. */
  readonly point: number[];
  readonly chi2: number;
  /** Rows in the likelihood minus parameters the data constrain. */
  readonly dof: number;
  /** Covariance of the constrained parameters (zero rows and columns for the others), or null. */
  readonly covariance: number[][] | null;
  /** chi^2 rise of the joint 2-sigma region of the constrained parameters (Wilks). */
  readonly deltaChi2: number;
  readonly predictions: RowPrediction[];
  /** Every phase row holds at `point`. */
  readonly feasible: boolean;
  /** Exact evaluations of all rows made by the fit. */
  readonly evaluations: number;
}

/** Evaluates every row at each parameter point (in parallel where it can). */
export type RowEvaluator = (points: number[][]) => Promise<RowPrediction[][]>;

/** Range a freed Hartree-to-Fock ratio may take. */
export const RATIO_BOUNDS: readonly [number, number] = [0, 4];

/** Relative step (of the parameter's range) of the central differences at the estimate. */
const CURVATURE_STEP = 1e-4;
/** Relative step of the forward differences during the descent. */
const DESCENT_STEP = 1e-5;
/** A parameter moving less than this (relative to its range) has converged. */
const CONVERGED = 1e-12;
/**
 * A step that lowers chi^2 by less than this (times chi^2, at least 1e-3) ends the descent: the
 * estimate is then within about 1e-4 of a standard deviation of the optimum, and exact rows are
 * met to about 1e-6 of a sigma.
 */
const CHI2_CONVERGED = 1e-9;
/** Interval ends are located to this fraction of the parameter's range. */
const END_TOLERANCE = 1e-7;

interface Evaluated {
  readonly point: number[];
  readonly predictions: RowPrediction[];
  readonly chi2: number;
  readonly phases: number;
}

/**
 * The fit, from the consistency grid (start points, the ranges of unconstrained parameters)
 * and exact evaluations of every row (`evaluate`):
 * 1. start at the grid's best pixel where the most phase rows hold (and at the best one far from
 *    it, if nearly as good);
 * 2. Levenberg-Marquardt on the residuals with forward-difference Jacobians, steps that lose a
 *    phase row refused, to convergence;
 * 3. Fisher matrix J^T J from central differences at the estimate: directions along which 2
 *    sigma spans less than the plane are constrained, the others are not; a parameter with a
 *    share of an unconstrained direction is reported without sigma;
 * 4. for each constrained parameter, chi^2 at +-2 sigma along the line where the others follow
 *    it (C e_k / C_kk): within 20 % of 4 on both sides it is quadratic (sigma from the
 *    curvature), else the interval ends are located on that line where chi^2 rises by 4 or a
 *    phase row stops holding, and sigma is a quarter of the interval (`profile`);
 * 5. an unconstrained parameter gets the range of the grid pixels where every phase row holds
 *    and chi^2 is within 4 of its minimum, each end located between pixels by bisection.
 *
 * `intervals: 'curvature'` skips steps 4 and 5 (a quick fit: sigma from the curvature alone,
 * unconstrained parameters given the plane's range).
 */
export async function fitLikelihood(
  problem: FitProblem,
  grid: ConsistencyGrid,
  evaluate: RowEvaluator,
  cancelled: () => boolean = () => false,
  intervals: 'profile' | 'curvature' = 'profile',
): Promise<FitResult> {
  const plane = problem.plane.document.plane as {
    x: { label: string; from: number; to: number };
    y: { label: string; from: number; to: number };
  };
  const freeRatio = problem.options.freeRatio;
  const dims = freeRatio === null ? 2 : 3;
  const bounds: [number, number][] = [
    [Math.min(plane.x.from, plane.x.to), Math.max(plane.x.from, plane.x.to)],
    [Math.min(plane.y.from, plane.y.to), Math.max(plane.y.from, plane.y.to)],
    [...RATIO_BOUNDS],
  ].slice(0, dims) as [number, number][];
  const span = bounds.map(([lo, hi]) => hi - lo);
  const labels = [plane.x.label || 'x', plane.y.label || 'y', `hartreeRatio_${freeRatio ?? ''}`];
  const likelihoodRows = problem.rows.flatMap((row, k) =>
    rowInLikelihood(row, problem.options) ? [k] : [],
  );
  let phaseTarget = 0;
  for (const h of grid.phaseHeld) phaseTarget = Math.max(phaseTarget, h);

  const cache = new Map<string, Evaluated>();
  let evaluations = 0;
  const clip = (p: number[]) =>
    p.map((v, d) => Math.min(bounds[d]![1], Math.max(bounds[d]![0], v)));
  const run = async (points: number[][]): Promise<Evaluated[]> => {
    if (cancelled()) throw new FitCancelled();
    const keys = points.map((p) => p.join(','));
    const missing = [...new Set(keys)].filter((key) => !cache.has(key));
    if (missing.length > 0) {
      const fresh = await evaluate(missing.map((key) => key.split(',').map(Number)));
      evaluations += missing.length;
      missing.forEach((key, n) => {
        const predictions = fresh[n]!;
        let chi2 = 0;
        for (const k of likelihoodRows) chi2 += predictions[k]!.residual! ** 2;
        const phases = problem.rows.filter(
          (row, k) => row.kind === 'phase' && predictions[k]!.holds,
        ).length;
        cache.set(key, { point: key.split(',').map(Number), predictions, chi2, phases });
      });
    }
    if (cancelled()) throw new FitCancelled();
    return keys.map((key) => cache.get(key)!);
  };
  const better = (a: Evaluated, b: Evaluated) =>
    a.phases > b.phases || (a.phases === b.phases && a.chi2 < b.chi2);
  const residuals = (e: Evaluated) => likelihoodRows.map((k) => e.predictions[k]!.residual!);

  const { nx, x: xs, y: ys } = grid;
  const ratio0 = freeRatio === null ? [] : [hartreeRatioOf(problem.plane.document, freeRatio)];
  const pixelPoint = (p: number) => [xs[p % nx]!, ys[Math.floor(p / nx)]!, ...ratio0];
  const feasiblePixels: number[] = [];
  grid.phaseHeld.forEach((h, p) => {
    if (h >= phaseTarget) feasiblePixels.push(p);
  });

  if (likelihoodRows.length === 0) {
    // Phase rows alone: a region, no maximum.
    const centre = [0, 1].map((d) => {
      let sum = 0;
      for (const p of feasiblePixels) sum += pixelPoint(p)[d]!;
      return sum / Math.max(1, feasiblePixels.length);
    });
    let nearest = feasiblePixels[0] ?? 0;
    let distance = Infinity;
    for (const p of feasiblePixels) {
      const q = pixelPoint(p);
      const dd = ((q[0]! - centre[0]!) / span[0]!) ** 2 + ((q[1]! - centre[1]!) / span[1]!) ** 2;
      if (dd < distance) {
        distance = dd;
        nearest = p;
      }
    }
    const [at] = await run([pixelPoint(nearest)]);
    const intervals = await regionIntervals(at!, 0, [...Array(dims).keys()]);
    return {
      parameters: intervals.map((interval, d) => ({
        label: labels[d]!,
        estimate: null,
        sigma: null,
        interval,
        method: 'region',
      })),
      point: at!.point,
      chi2: 0,
      dof: 0,
      covariance: null,
      deltaChi2: 0,
      predictions: at!.predictions,
      feasible: at!.phases >= phaseTarget && phaseTarget === grid.phaseTotal,
      evaluations,
    };
  }

  // 1. Start points.
  let best = -1;
  for (const p of feasiblePixels) if (best < 0 || grid.chi2[p]! < grid.chi2[best]!) best = p;
  const starts = [best];
  let second = -1;
  for (const p of feasiblePixels) {
    const a = pixelPoint(p);
    const b = pixelPoint(best);
    const far =
      Math.abs(a[0]! - b[0]!) > 0.15 * span[0]! || Math.abs(a[1]! - b[1]!) > 0.15 * span[1]!;
    if (
      far &&
      grid.chi2[p]! < grid.chi2[best]! + 9 &&
      (second < 0 || grid.chi2[p]! < grid.chi2[second]!)
    )
      second = p;
  }
  if (second >= 0) starts.push(second);

  // 2. Levenberg-Marquardt from each start.
  /** Levenberg-Marquardt from `start`; parameters not `free` stay where they are. */
  const descend = async (start: number[], free: readonly boolean[]): Promise<Evaluated> => {
    let [current] = await run([clip(start)]);
    let lambda = 1e-3;
    const moving = free.flatMap((f, d) => (f ? [d] : []));
    let jacobian: number[][] | null = null;
    for (let iteration = 0; iteration < 60; iteration++) {
      const p = current!.point;
      const r = residuals(current!);
      if (jacobian === null) {
        const steps = p.map((v, d) => {
          const h = DESCENT_STEP * span[d]!;
          return v + h > bounds[d]![1] ? -h : h;
        });
        const shifted = await run(
          moving.map((d) => p.map((v, e) => (e === d ? v + steps[d]! : v))),
        );
        jacobian = p.map((_, d) => {
          const n = moving.indexOf(d);
          if (n < 0) return r.map(() => 0);
          return residuals(shifted[n]!).map((v, k) => (v - r[k]!) / steps[d]!);
        });
      }
      const { normal, gradient } = normalEquations(jacobian, r);
      let accepted = false;
      for (let attempt = 0; attempt < 12 && !accepted; attempt++) {
        const step = solveDamped(normal, gradient, lambda);
        const next = clip(p.map((v, d) => v - step[d]!));
        if (next.every((v, d) => Math.abs(v - p[d]!) <= CONVERGED * span[d]!)) {
          return current!;
        }
        const [trial] = await run([next]);
        if (better(trial!, current!)) {
          const samePhases = trial!.phases === current!.phases;
          const gain = current!.chi2 - trial!.chi2;
          // Broyden's rank-one update of the Jacobian along the step taken (C. G. Broyden,
          // Math. Comp. 19, 577 (1965)): no new differences while the steps keep succeeding.
          const taken = next.map((v, d) => v - p[d]!);
          const change = residuals(trial!).map((v, k) => v - r[k]!);
          const norm = taken.reduce((a, v, d) => a + (free[d] ? v * v : 0), 0);
          if (norm > 0) {
            const predicted = change.map((_, k) =>
              taken.reduce((a, v, d) => a + jacobian![d]![k]! * v, 0),
            );
            jacobian = jacobian.map((column, d) =>
              free[d]
                ? column.map((v, k) => v + ((change[k]! - predicted[k]!) * taken[d]!) / norm)
                : column,
            );
          }
          current = trial!;
          lambda = Math.max(lambda / 5, 1e-12);
          accepted = true;
          if (samePhases && gain < CHI2_CONVERGED * Math.max(current.chi2, 1e-3)) return current;
        } else if (attempt === 0 && iteration > 0) {
          // A failed step with an updated Jacobian: differences afresh before damping more.
          jacobian = null;
          break;
        } else lambda *= 8;
      }
      if (jacobian === null) continue;
      if (!accepted) return current!;
    }
    return current!;
  };
  let optimum: Evaluated | undefined;
  for (const start of starts) {
    // The second start only where it might end lower than the first one did.
    if (optimum !== undefined && grid.chi2[start]! > optimum.chi2 + 2) continue;
    const found = await descend(
      pixelPoint(start),
      bounds.map(() => true),
    );
    if (optimum === undefined || better(found, optimum)) optimum = found;
  }
  const fitted0 = optimum!.point;

  // 3. Fisher matrix from central differences.
  const h = span.map((s) => CURVATURE_STEP * s);
  const around = await run(
    fitted0.flatMap((_, d) =>
      [-1, 1].map((sign) => fitted0.map((v, e) => (e === d ? v + sign * h[d]! : v))),
    ),
  );
  const jacobian = fitted0.map((_, d) => {
    const minus = residuals(around[2 * d]!);
    const plus = residuals(around[2 * d + 1]!);
    return plus.map((v, n) => (v - minus[n]!) / (2 * h[d]!));
  });
  const fisher = normalEquations(jacobian, new Array<number>(likelihoodRows.length).fill(0)).normal;
  const scaled = new Float64Array(dims * dims);
  for (let a = 0; a < dims; a++) {
    for (let b = 0; b < dims; b++) scaled[a * dims + b] = fisher[a]![b]! * span[a]! * span[b]!;
  }
  const values = new Float64Array(dims);
  const vectors = new Float64Array(dims * dims);
  symmetricEigen(scaled, dims, values, vectors);
  // 2 sigma along an eigen-direction narrower than the plane: constrained (scaled units).
  const constrainedDirection = Array.from(values, (v) => v > 4);
  const covariance = Array.from({ length: dims }, () => new Array<number>(dims).fill(0));
  for (let i = 0; i < dims; i++) {
    if (!constrainedDirection[i]) continue;
    for (let a = 0; a < dims; a++) {
      for (let b = 0; b < dims; b++) {
        covariance[a]![b]! +=
          (vectors[a * dims + i]! * vectors[b * dims + i]! * span[a]! * span[b]!) / values[i]!;
      }
    }
  }
  const constrained = fitted0.map((_, d) => {
    let loose = 0;
    for (let i = 0; i < dims; i++)
      if (!constrainedDirection[i]) loose += vectors[d * dims + i]! ** 2;
    return loose < 1e-3 && covariance[d]![d]! > 0;
  });

  // 4. Unconstrained parameters: the range they may take; the point then moves to its middle
  // (the others re-fitted there), so that the constrained parameters' intervals are not cut
  // by a phase row that an arbitrary value of the unconstrained ones would break.
  const loose = fitted0.flatMap((_, d) => (constrained[d] ? [] : [d]));
  const regions =
    intervals === 'profile'
      ? await regionIntervals(optimum!, optimum!.chi2, loose)
      : loose.map((d) => [...bounds[d]!] as [number, number]);
  let centre = optimum!;
  if (loose.length > 0 && intervals === 'profile') {
    const middle = fitted0.map((v, d) => {
      const n = loose.indexOf(d);
      return n < 0 ? v : (regions[n]![0] + regions[n]![1]) / 2;
    });
    const moved = await descend(middle, constrained);
    if (
      moved.phases >= optimum!.phases &&
      moved.chi2 <= optimum!.chi2 + 1e-6 * Math.max(1, optimum!.chi2)
    ) {
      centre = moved;
    }
  }
  const estimate = centre;
  const p0 = estimate.point;

  // 5. Each constrained parameter: quadratic, or its profile.
  const rise = (e: Evaluated) => (e.phases < estimate.phases ? Infinity : e.chi2 - estimate.chi2);
  const parameters: FitParameter[] = [];
  for (let d = 0; d < dims; d++) {
    if (!constrained[d]) continue;
    const sigma = Math.sqrt(covariance[d]![d]!);
    const direction = covariance.map((row) => row[d]! / covariance[d]![d]!);
    const along = (t: number) => p0.map((v, e) => v + t * direction[e]!);
    const inside = (t: number) =>
      along(t).every((v, e) => v >= bounds[e]![0] && v <= bounds[e]![1]);
    const [minus, plus] =
      intervals === 'profile' ? await run([along(-2 * sigma), along(2 * sigma)].map(clip)) : [];
    const quadratic =
      intervals === 'curvature' ||
      (inside(-2 * sigma) &&
        inside(2 * sigma) &&
        [minus!, plus!].every((e) => Math.abs(rise(e) - 4) <= 0.8));
    if (quadratic) {
      parameters[d] = {
        label: labels[d]!,
        estimate: p0[d]!,
        sigma,
        interval: [p0[d]! - 2 * sigma, p0[d]! + 2 * sigma],
        method: 'curvature',
      };
      continue;
    }
    const ends = await Promise.all(
      [-1, 1].map((sign) =>
        intervalEnd(
          (t) => along(sign * t),
          2 * sigma,
          (t) => inside(sign * t),
          span[d]!,
        ),
      ),
    );
    const lo = p0[d]! - ends[0]!.t;
    const hi = p0[d]! + ends[1]!.t;
    const open = ends.some((e) => e.open);
    parameters[d] = {
      label: labels[d]!,
      estimate: open ? null : p0[d]!,
      sigma: open ? null : (hi - lo) / 4,
      interval: [lo, hi],
      method: open ? 'region' : 'profile',
    };
  }
  loose.forEach((d, n) => {
    parameters[d] = {
      label: labels[d]!,
      estimate: null,
      sigma: null,
      interval: regions[n]!,
      method: 'region',
    };
  });
  const fitted = parameters.filter((p) => p.sigma !== null).length;
  return {
    parameters,
    point: p0,
    chi2: estimate.chi2,
    dof: Math.max(0, likelihoodRows.length - fitted),
    covariance: constrained.some(Boolean) ? covariance : null,
    deltaChi2: chiSquareRise(constrained.filter(Boolean).length),
    predictions: estimate.predictions,
    feasible: estimate.phases >= phaseTarget && phaseTarget === grid.phaseTotal,
    evaluations,
  };

  /**
   * Bisection between `inside` (where `test` holds) and `outside` (where it does not) to
   * END_TOLERANCE of `width`.
   */
  async function bisect(
    inside: number,
    outside: number,
    width: number,
    test: (t: number) => Promise<boolean>,
  ): Promise<number> {
    while (Math.abs(outside - inside) > END_TOLERANCE * width) {
      const m = (inside + outside) / 2;
      if (await test(m)) inside = m;
      else outside = m;
    }
    return (inside + outside) / 2;
  }

  /**
   * Where chi^2 first rises by 4 above the estimate, or a phase row stops holding, along
   * `line(t)` (t >= 0, in units of the parameter): doubling from `first`, then bisection. Open
   * when the plane's edge comes first.
   */
  async function intervalEnd(
    line: (t: number) => number[],
    first: number,
    within: (t: number) => boolean,
    width: number,
  ): Promise<{ t: number; open: boolean }> {
    let lo = 0;
    let hi = first;
    for (;;) {
      if (!within(hi)) {
        // The last t inside the plane along the line.
        let a = lo;
        let b = hi;
        for (let k = 0; k < 60; k++) {
          const m = (a + b) / 2;
          if (within(m)) a = m;
          else b = m;
        }
        const [edge] = await run([clip(line(a))]);
        if (rise(edge!) <= 4) return { t: a, open: true };
        hi = a;
        break;
      }
      const [e] = await run([line(hi)]);
      if (rise(e!) > 4) break;
      lo = hi;
      hi *= 2;
    }
    const t = await bisect(lo, hi, width, async (m) => rise((await run([clip(line(m))]))[0]!) <= 4);
    return { t, open: false };
  }

  /**
   * The range of each listed parameter over the grid pixels where the most phase rows hold and
   * chi^2 lies within 4 of `chiMin`, each end located between its pixel and the next one out
   * by bisection on exact evaluations (a freed ratio: along its own axis from the estimate).
   */
  async function regionIntervals(
    at: Evaluated,
    chiMin: number,
    which: number[],
  ): Promise<[number, number][]> {
    const allowed = (e: Evaluated) => e.phases >= at.phases && e.chi2 - chiMin <= 4;
    let gridMin = Infinity;
    for (const p of feasiblePixels) gridMin = Math.min(gridMin, grid.chi2[p]!);
    const floor = Math.min(chiMin, gridMin);
    const inRegion = feasiblePixels.filter((p) => grid.chi2[p]! - floor <= 4);
    return Promise.all(
      which.map(async (d): Promise<[number, number]> => {
        if (d === 2) {
          const ends = await Promise.all(
            [0, 1].map(async (side) => {
              const edge = bounds[2]![side]!;
              const point = (v: number) => [...at.point.slice(0, 2), v];
              const [far] = await run([point(edge)]);
              if (allowed(far!)) return edge;
              return bisect(at.point[2]!, edge, span[2]!, async (m) =>
                allowed((await run([point(m)]))[0]!),
              );
            }),
          );
          return [ends[0]!, ends[1]!];
        }
        const coordinate = (p: number) => pixelPoint(p)[d]!;
        const pitch = Math.abs(d === 0 ? xs[1]! - xs[0]! : ys[1]! - ys[0]!);
        /** Between an allowed point and the next pixel out along d: bisection. */
        const refine = async (inner: number[], outward: -1 | 1): Promise<number> => {
          const step = pitch * outward;
          const edge = bounds[d]![outward < 0 ? 0 : 1]!;
          if ((inner[d]! + step - edge) * outward >= 0) {
            const [last] = await run([inner.map((v, e) => (e === d ? edge : v))]);
            if (allowed(last!)) return edge;
          }
          const reach = Math.min(pitch, Math.abs(edge - inner[d]!));
          const t = await bisect(0, reach, span[d]!, async (m) =>
            allowed((await run([inner.map((v, i) => (i === d ? v + m * outward : v))]))[0]!),
          );
          return inner[d]! + t * outward;
        };
        /** From the estimate along d in doubling steps while allowed, then by bisection. */
        const walk = async (outward: -1 | 1): Promise<number> => {
          const edge = bounds[d]![outward < 0 ? 0 : 1]!;
          const reach = Math.abs(edge - at.point[d]!);
          const point = (t: number) => at.point.map((v, e) => (e === d ? v + t * outward : v));
          let inside = 0;
          let outside = Math.min(pitch, reach);
          for (;;) {
            const [e] = await run([point(outside)]);
            if (!allowed(e!)) break;
            inside = outside;
            if (outside >= reach) return edge;
            outside = Math.min(2 * outside, reach);
          }
          const t = await bisect(inside, outside, span[d]!, async (m) =>
            allowed((await run([point(m)]))[0]!),
          );
          return at.point[d]! + t * outward;
        };
        const ends = await Promise.all([walk(-1), walk(1)]);
        if (inRegion.length === 0) return [ends[0]!, ends[1]!];
        let lowPixel = inRegion[0]!;
        let highPixel = inRegion[0]!;
        for (const p of inRegion) {
          if (coordinate(p) < coordinate(lowPixel)) lowPixel = p;
          if (coordinate(p) > coordinate(highPixel)) highPixel = p;
        }
        const [lo, hi] = await Promise.all([
          refine(pixelPoint(lowPixel), -1),
          refine(pixelPoint(highPixel), 1),
        ]);
        return [Math.min(lo, ends[0]!), Math.max(hi, ends[1]!)];
      }),
    );
  }
}

/** J^T J and J^T r from a Jacobian stored by parameter (jacobian[d][n] = d r_n / d p_d). */
function normalEquations(
  jacobian: number[][],
  r: number[],
): { normal: number[][]; gradient: number[] } {
  const dims = jacobian.length;
  const normal = Array.from({ length: dims }, (_, a) =>
    Array.from({ length: dims }, (_, b) =>
      jacobian[a]!.reduce((s, v, n) => s + v * jacobian[b]![n]!, 0),
    ),
  );
  const gradient = jacobian.map((column) => column.reduce((s, v, n) => s + v * r[n]!, 0));
  return { normal, gradient };
}

/**
 * Solves (N + lambda diag N) step = g (Levenberg-Marquardt, Marquardt's scaling), with a tiny
 * ridge so that a parameter no residual depends on stays where it is.
 */
function solveDamped(normal: number[][], gradient: number[], lambda: number): number[] {
  const dims = normal.length;
  let trace = 0;
  for (let a = 0; a < dims; a++) trace += normal[a]![a]!;
  const ridge = 1e-14 * Math.max(trace, 1e-300);
  const m = normal.map((row, a) => row.map((v, b) => (a === b ? v * (1 + lambda) + ridge : v)));
  const g = [...gradient];
  // Gaussian elimination with partial pivoting (dims <= 3).
  for (let c = 0; c < dims; c++) {
    let pivot = c;
    for (let r = c + 1; r < dims; r++) if (Math.abs(m[r]![c]!) > Math.abs(m[pivot]![c]!)) pivot = r;
    [m[c], m[pivot]] = [m[pivot]!, m[c]!];
    [g[c], g[pivot]] = [g[pivot]!, g[c]!];
    const diag = m[c]![c]!;
    if (diag === 0) continue;
    for (let r = c + 1; r < dims; r++) {
      const f = m[r]![c]! / diag;
      for (let k = c; k < dims; k++) m[r]![k]! -= f * m[c]![k]!;
      g[r]! -= f * g[c]!;
    }
  }
  const x = new Array<number>(dims).fill(0);
  for (let c = dims - 1; c >= 0; c--) {
    let s = g[c]!;
    for (let k = c + 1; k < dims; k++) s -= m[c]![k]! * x[k]!;
    x[c] = m[c]![c]! === 0 ? 0 : s / m[c]![c]!;
  }
  return x;
}
