import {
  DescentWorkspace,
  frameEnergy,
  hartreeFockOfOrder,
  multiplyFrame,
  orthonormaliseFrame,
  projectOut,
  randomFrame,
  seededRandom,
  type Couplings,
} from '../../solver/index';

/**
 * The naive baseline the benchmark compares against: plain multi-start steepest descent on the
 * Grassmannian Gr(Nf, 4) from Haar-random frames, with an Armijo backtracking line search
 * (Nocedal and Wright, Numerical Optimization, 2nd ed., Springer (2006), section 3.1; on
 * manifolds: Absil, Mahony and Sepulchre, Optimization Algorithms on Matrix Manifolds,
 * Princeton University Press (2008), section 4.2). No seed library, no Newton step, no warm
 * start: each point is solved from scratch.
 *
 * The Euclidean gradient of E with respect to P is H_HF[P] (public/notes.html#gap), so moving
 * occupied vector u_i by delta_i changes E by 2 Re sum_i u_i^dagger H_HF delta_i. The steepest
 * direction is delta_i = -(1 - P) H_HF u_i; with d_i = (1 - P) H_HF u_i the slope along it is
 * -2 sum_i |d_i|^2. A step moves u_i to u_i - t d_i and re-orthonormalises the occupied vectors
 * (Gram-Schmidt), which only changes the energy at second order in t.
 */
export interface NaiveOptions {
  /** Haar-random starts per point. */
  readonly starts: number;
  /** Stop a start when the tangent gradient norm 2 |d| is below this times the coupling scale. */
  readonly gradientTolerance: number;
  readonly maxIterations: number;
}

export const NAIVE_DEFAULTS: Omit<NaiveOptions, 'starts'> = {
  gradientTolerance: 1e-8,
  maxIterations: 2000,
};

/** Armijo sufficient-decrease constant. */
const ARMIJO = 1e-4;
/** Smallest energy decrease (relative to the scale) a line search trusts. */
const ROUNDOFF = 1e-15;
/** Gradient (relative to the scale) below which a rounding-limited stop counts as converged. */
const ROUNDING_GRADIENT = 1e-6;

/** Scratch arrays for the naive descent (one per thread). */
export class NaiveWorkspace {
  readonly descent = new DescentWorkspace();
  readonly order = new Float64Array(16);
  readonly trialOrder = new Float64Array(16);
  readonly hamiltonian = new Float64Array(32);
  readonly direction = new Float64Array(32);
  readonly trial = new Float64Array(32);
}

export interface NaiveDescent {
  readonly energy: number;
  readonly iterations: number;
  /** The gradient tolerance was met (otherwise the iteration cap or the line search stopped it). */
  readonly converged: boolean;
}

/**
 * d_i = (1 - P) H u_i for the occupied vectors into ws.direction; returns sum_i |d_i|^2.
 * H is ws.hamiltonian (4x4 complex, row-major, interleaved).
 */
function steepestDirection(nf: number, frame: Float64Array, ws: NaiveWorkspace): number {
  const d = multiplyFrame(ws.hamiltonian, frame, nf, ws.direction);
  let norm2 = 0;
  for (let i = 0; i < nf; i++) {
    // Project out every occupied vector: (1 - P) H u_i.
    for (let j = 0; j < nf; j++) projectOut(frame, j, d, 8 * i);
    for (let r = 0; r < 8; r++) norm2 += d[8 * i + r]! * d[8 * i + r]!;
  }
  return norm2;
}

/**
 * Steepest descent with Armijo backtracking from `frame` (modified in place). Besides the
 * gradient tolerance and the iteration cap, a start stops when no step length gives a decrease
 * that double precision can resolve: the predicted decrease t 2 |d|^2 has fallen below
 * ROUNDOFF times the scale. That is the end of what an energy-based line search can do; the
 * start then counts as converged when its gradient is below ROUNDING_GRADIENT times the scale
 * (its energy is then within about |gradient|^2 / curvature of the minimum).
 */
export function naiveDescent(
  c: Couplings,
  frame: Float64Array,
  ws: NaiveWorkspace,
  options: Omit<NaiveOptions, 'starts'> = NAIVE_DEFAULTS,
): NaiveDescent {
  const nf = c.nf;
  const tolerance = options.gradientTolerance * c.scale;
  const roundoff = ROUNDOFF * c.scale;
  let energy = frameEnergy(c, frame, ws.descent, ws.order);
  // Trial step length: twice the last accepted one (a common line-search initialisation).
  let step = 1 / c.scale;
  for (let iteration = 0; iteration < options.maxIterations; iteration++) {
    hartreeFockOfOrder(c, ws.order, ws.hamiltonian);
    const norm2 = steepestDirection(nf, frame, ws);
    const gradient = 2 * Math.sqrt(norm2);
    if (gradient < tolerance) return { energy, iterations: iteration, converged: true };
    let t = 2 * step;
    let accepted = false;
    while (t * 2 * norm2 >= roundoff) {
      const trial = ws.trial;
      for (let k = 0; k < 8 * nf; k++) trial[k] = frame[k]! - t * ws.direction[k]!;
      orthonormaliseFrame(trial, nf);
      const e = frameEnergy(c, trial, ws.descent, ws.trialOrder);
      if (e < energy && e <= energy - ARMIJO * t * 2 * norm2) {
        frame.set(trial.subarray(0, 8 * nf));
        ws.order.set(ws.trialOrder);
        energy = e;
        step = t;
        accepted = true;
        break;
      }
      t /= 2;
    }
    if (!accepted) {
      return {
        energy,
        iterations: iteration,
        converged: gradient < ROUNDING_GRADIENT * c.scale,
      };
    }
  }
  return { energy, iterations: options.maxIterations, converged: false };
}

export interface NaiveSolve {
  /** Lowest energy over all starts. */
  readonly energy: number;
  /** Energy reached from each start, in start order. */
  readonly startEnergies: Float64Array;
  readonly iterations: number;
  /** Starts that stopped before meeting the gradient tolerance. */
  readonly unconverged: number;
}

/**
 * Solves one point from `options.starts` Haar-random frames of the stream `seed`. The first k
 * starts of a solve are the same for every `starts >= k`, so a long run also gives the result of
 * every shorter one.
 */
export function naiveSolve(
  c: Couplings,
  options: NaiveOptions,
  seed: number,
  ws: NaiveWorkspace,
): NaiveSolve {
  const random = seededRandom(seed);
  const startEnergies = new Float64Array(options.starts);
  let best = Infinity;
  let iterations = 0;
  let unconverged = 0;
  for (let s = 0; s < options.starts; s++) {
    const frame = randomFrame(random);
    const result = naiveDescent(c, frame, ws, options);
    startEnergies[s] = result.energy;
    best = Math.min(best, result.energy);
    iterations += result.iterations;
    if (!result.converged) unconverged++;
  }
  return { energy: best, startEnergies, iterations, unconverged };
}
