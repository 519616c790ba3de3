import type { Couplings } from './couplings';
import { choleskySolve, symmetricEigen } from './linalg';
import {
  DescentWorkspace,
  frameEnergy,
  retract,
  tangentDimension,
  tangentGradient,
  tangentModel,
} from './tangentSpace';

/**
 * Riemannian Newton descent with a Levenberg-Marquardt trust region on the Grassmannian
 * Gr(Nf, 4) (Absil, Mahony and Sepulchre, Optimization Algorithms on Matrix Manifolds, Princeton
 * University Press (2008), chapters 6 and 7), in the tangent coordinates of `tangentSpace.ts`.
 */

export interface DescentOptions {
  /** Stop when every gradient component is below this times the coupling scale. */
  gradientTolerance: number;
  readonly maxIterations: number;
  /**
   * Most polishing steps taken after the tolerance is met (each corrects every direction whose
   * gradient is above rounding noise fully; they stop once one is shorter than 1e-10).
   */
  readonly polishSteps: number;
  /**
   * Leave saddle points along negative curvature (true), or stop there and report
   * `converged: false` (false: for continuing a known branch, as map bisection does).
   */
  escapeSaddles: boolean;
  /**
   * Give up early (result `abandoned`) once the run is in its Newton phase and its quadratic
   * model, with a safety factor of two, says it cannot end below this value. Infinity never
   * abandons.
   */
  abandonAbove: number;
  /** Order parameters of the best minimum so far: a run that nears it is abandoned too. */
  abandonNear?: Float64Array | undefined;
  /**
   * Stop after an accepted Newton step shorter than this (tangent norm) from a point that
   * passed the minimum test, when the quadratic model predicted it well (see `descend`):
   * for continuing a state from a nearby point, where one step is enough.
   */
  readonly singleStep?: number;
}

export const DEFAULT_DESCENT: DescentOptions = {
  gradientTolerance: 1e-12,
  maxIterations: 200,
  polishSteps: 3,
  escapeSaddles: true,
  abandonAbove: Infinity,
};

export interface DescentResult {
  energy: number;
  /** Largest absolute gradient component at the end. */
  gradient: number;
  iterations: number;
  /** The gradient reached the tolerance and the Hessian is positive semidefinite. */
  converged: boolean;
  abandoned: boolean;
}

const MAX_STEP = 1;
/** A Newton step shorter than this (tangent norm) is taken as inside the quadratic regime. */
const SHORT_STEP = 0.05;
/**
 * A gradient below this (relative to the coupling scale) is rounding noise: the Hartree-Fock
 * matrix holds terms of the size of the scale, so its elements carry errors of a few 1e-16 of
 * it. A Newton step on such a gradient along a flat direction (a degenerate family) would only
 * move the state at random, so a descent stops there.
 */
const GRADIENT_NOISE = 1e-15;
/**
 * Smallest Levenberg-Marquardt shift of a step (relative to the coupling scale): rounding noise
 * of the gradient (about 1e-15 of the scale) then moves a state by at most about 1e-7 along a
 * flat direction, below the label tolerance; stiffer directions converge as with Newton.
 */
const MIN_SHIFT = 1e-8;
/**
 * A gradient component (along a Hessian eigenvector) below this, relative to the coupling
 * scale, is rounding noise: a polishing step leaves such directions alone.
 */
const POLISH_NOISE = 1e-14;
/**
 * The Newton step of a polishing pass into ws.step, direction by direction of the Hessian's
 * eigenvectors: each gradient component above rounding noise is corrected fully, however soft
 * its direction (a soft mode near a continuous transition, or a weak field's canting, converges
 * only slowly under the gradient tolerance alone), and components at noise level are left
 * alone, so that a flat direction (a Goldstone mode, a degenerate family) does not take a step
 * of noise / curvature.
 */
function polishStep(ws: DescentWorkspace, d: number, scale: number): number {
  const { gradient: g, step: z, eigValues: values, eigVectors: vectors, eigScratch: a } = ws;
  a.set(ws.hessian.subarray(0, d * d));
  symmetricEigen(a, d, values, vectors);
  z.fill(0, 0, d);
  for (let m = 0; m < d; m++) {
    let component = 0;
    for (let p = 0; p < d; p++) component += vectors[p * d + m]! * g[p]!;
    if (Math.abs(component) <= POLISH_NOISE * scale || !(values[m]! > 0)) continue;
    const length = -component / values[m]!;
    for (let p = 0; p < d; p++) z[p] = z[p]! + length * vectors[p * d + m]!;
  }
  let norm = 0;
  for (let p = 0; p < d; p++) norm += z[p]! * z[p]!;
  return Math.sqrt(norm);
}

/** A polishing step shorter than this (tangent norm) ends the descent: nothing is left to do. */
const POLISHED = 1e-10;

/** Steps shorter than this (tangent norm) carry the minimum test of their start point over. */
const TRUSTED_STEP = 1e-2;
/** Order parameters within this (max norm) of a known minimum, in its quadratic regime. */
const SAME_BASIN = 1e-2;

/**
 * Minimises the energy from `frame` (modified in place) to a local minimum. Saddle points are
 * left along the most negative Hessian direction, so a symmetric seed that is only a critical
 * point does not stop the descent. The energy never increases by more than rounding.
 */
export function descend(
  c: Couplings,
  frame: Float64Array,
  options: DescentOptions,
  ws: DescentWorkspace,
): DescentResult {
  const nf = c.nf;
  const d = tangentDimension(nf);
  const scale = c.scale;
  const tolerance = options.gradientTolerance * scale;
  const roundoff = 1e-11 * scale;
  const { gradient: g, hessian: k, step: z, rhs } = ws;
  let energy = frameEnergy(c, frame, ws, ws.order);
  // Never below MIN_SHIFT: along a flat direction (a Goldstone mode, a degenerate family) the
  // gradient is rounding noise, and a step of noise / curvature would move the state at random.
  const minShift = MIN_SHIFT * scale;
  let lambda = minShift;
  let escapes = 0;
  let gmax = Infinity;
  let lastRatio = 0;
  let polished = 0;
  // After a rejected step the frame is unchanged, and so are its gradient and Hessian.
  let fresh = false;
  // The last accepted step was a short one from a point whose Hessian passed the minimum test:
  // if the gradient is now below the tolerance the new point passes it too (the Hessian moved
  // by the order of the step), so the gradient alone decides.
  let trusted = false;
  let polishing = false;
  for (let iteration = 0; iteration < options.maxIterations; iteration++) {
    if (!fresh && trusted && polished >= options.polishSteps) {
      const small = tangentGradient(c, frame, ws);
      if (small <= tolerance) {
        return {
          energy,
          gradient: small,
          iterations: iteration,
          converged: true,
          abandoned: false,
        };
      }
    }
    if (!fresh) tangentModel(c, frame, ws);
    fresh = true;
    trusted = false;
    gmax = 0;
    for (let p = 0; p < d; p++) gmax = Math.max(gmax, Math.abs(g[p]!));
    if (gmax <= tolerance) {
      // A minimum has a positive semidefinite Hessian; Goldstone zeros pass the small shift.
      if (choleskySolve(k, d, 1e-11 * scale, g, z, ws.chol, 0)) {
        // Extra Newton steps cost little and clear the slow residual of soft modes near a
        // continuous transition (gradient / curvature), which would otherwise blur labels.
        if (polished >= options.polishSteps || gmax <= GRADIENT_NOISE * scale) {
          return {
            energy,
            gradient: gmax,
            iterations: iteration,
            converged: true,
            abandoned: false,
          };
        }
        polished++;
        polishing = true;
      } else {
        if (!options.escapeSaddles || escapes >= 8 || !escapeSaddle(c, frame, ws, d, energy)) {
          return {
            energy,
            gradient: gmax,
            iterations: iteration,
            converged: false,
            abandoned: false,
          };
        }
        escapes++;
        fresh = false;
        energy = frameEnergy(c, frame, ws, ws.order);
        lambda = 1e-3 * scale;
        lastRatio = 0;
        continue;
      }
    }
    for (let p = 0; p < d; p++) rhs[p] = -g[p]!;
    if (
      options.abandonAbove < Infinity &&
      choleskySolve(k, d, 1e-8 * scale, rhs, z, ws.chol, 1e-13 * scale)
    ) {
      // Newton decrement: the quadratic model's remaining decrease, 1/2 g K^-1 g (a tiny shift
      // lets Goldstone zero modes through; it only overestimates the decrease). The model is
      // trusted after a step that it predicted well, or when the Newton step is short.
      let decrement = 0;
      let stepNorm = 0;
      for (let p = 0; p < d; p++) {
        decrement -= 0.5 * g[p]! * z[p]!;
        stepNorm += z[p]! * z[p]!;
      }
      const trusted = (lastRatio > 0.5 && lastRatio < 1.5) || stepNorm < SHORT_STEP * SHORT_STEP;
      if (trusted && energy - 2 * decrement > options.abandonAbove) {
        return { energy, gradient: gmax, iterations: iteration, converged: false, abandoned: true };
      }
      // Close to the best minimum already found, with a short step left: the same basin.
      const near = options.abandonNear;
      if (near !== undefined && stepNorm < SHORT_STEP * SHORT_STEP) {
        let distance = 0;
        for (let q = 1; q < 16; q++)
          distance = Math.max(distance, Math.abs(ws.order[q]! - near[q]!));
        if (distance < SAME_BASIN) {
          return {
            energy,
            gradient: gmax,
            iterations: iteration,
            converged: false,
            abandoned: true,
          };
        }
      }
    }
    let tries = 0;
    if (polishing) {
      polishing = false;
      if (polishStep(ws, d, scale) < POLISHED) {
        return { energy, gradient: gmax, iterations: iteration, converged: true, abandoned: false };
      }
    } else {
      while (!choleskySolve(k, d, lambda, rhs, z, ws.chol, 1e-13 * scale)) {
        lambda = Math.max(4 * lambda, 1e-6 * scale);
        if (++tries > 40) break;
      }
    }
    let norm = 0;
    for (let p = 0; p < d; p++) norm += z[p]! * z[p]!;
    norm = Math.sqrt(norm);
    // The minimum test of the convergence check (Goldstone zeros pass the tiny shift), here
    // where the step is short enough for its answer to carry over to the next point.
    const passes =
      norm < TRUSTED_STEP &&
      (lambda <= 1e-11 * scale ||
        choleskySolve(k, d, 1e-11 * scale, g, ws.eigValues, ws.eigScratch, 0));
    if (norm > MAX_STEP) for (let p = 0; p < d; p++) z[p] = (z[p]! * MAX_STEP) / norm;
    let gz = 0;
    let zkz = 0;
    for (let p = 0; p < d; p++) {
      gz += g[p]! * z[p]!;
      let row = 0;
      for (let q = 0; q < d; q++) row += k[p * d + q]! * z[q]!;
      zkz += z[p]! * row;
    }
    const predicted = -(gz + 0.5 * zkz);
    retract(nf, frame, z, ws.trial, ws.scratch);
    const trialEnergy = frameEnergy(c, ws.trial, ws, ws.trialOrder);
    const decrease = energy - trialEnergy;
    const accepted =
      decrease >= 1e-4 * predicted || (predicted <= roundoff && -decrease <= roundoff);
    if (accepted) {
      frame.set(ws.trial);
      fresh = false;
      ws.order.set(ws.trialOrder);
      energy = trialEnergy;
      // Below rounding the measured decrease is noise: trust the quadratic model there.
      const ratio = predicted > roundoff ? decrease / predicted : 1;
      trusted = passes && ratio > 0.5 && ratio < 1.5;
      // One short Newton step from a state that passed the minimum test, predicted well by the
      // quadratic model, whose predicted decrease is below 1e-12 of the scale: the start was
      // already that close to the minimum in energy, and the new state is closer, so a caller
      // that continues a state from a nearby point may stop here.
      if (
        options.singleStep !== undefined &&
        passes &&
        norm < options.singleStep &&
        predicted <= 1e-12 * scale &&
        ratio > 0.5 &&
        ratio < 1.5 &&
        polished >= options.polishSteps
      ) {
        return {
          energy,
          gradient: gmax,
          iterations: iteration + 1,
          converged: true,
          abandoned: false,
        };
      }
      if (ratio > 0.75) lambda = Math.max(minShift, lambda / 4);
      else if (ratio < 0.25) lambda = Math.max(2 * lambda, 1e-4 * scale);
      lastRatio = norm <= MAX_STEP ? ratio : 0;
    } else {
      lambda = Math.max(4 * lambda, 1e-3 * scale);
      lastRatio = 0;
    }
  }
  return {
    energy,
    gradient: gmax,
    iterations: options.maxIterations,
    converged: false,
    abandoned: false,
  };
}

/** Steps from a saddle along the most negative curvature direction; true when energy fell. */
function escapeSaddle(
  c: Couplings,
  frame: Float64Array,
  ws: DescentWorkspace,
  d: number,
  energy: number,
): boolean {
  ws.eigScratch.set(ws.hessian.subarray(0, d * d));
  symmetricEigen(ws.eigScratch, d, ws.eigValues, ws.eigVectors);
  if (!(ws.eigValues[0]! < 0)) return false;
  // Deterministic sign: largest component positive.
  let big = 0;
  for (let p = 0; p < d; p++) {
    if (Math.abs(ws.eigVectors[p * d]!) > Math.abs(big)) big = ws.eigVectors[p * d]!;
  }
  const sign = big < 0 ? -1 : 1;
  // Near a continuous transition the negative curvature is tiny and the new minimum close:
  // shrink the step towards the quartic estimate sqrt(|lambda| / scale).
  const smallest = 0.3 * Math.sqrt(-ws.eigValues[0]! / c.scale);
  for (let length = 0.5; length >= smallest; length *= 0.3) {
    for (let p = 0; p < d; p++) ws.step[p] = sign * length * ws.eigVectors[p * d]!;
    retract(c.nf, frame, ws.step, ws.trial, ws.scratch);
    const e = frameEnergy(c, ws.trial, ws, ws.trialOrder);
    if (e < energy) {
      frame.set(ws.trial);
      return true;
    }
  }
  return false;
}
