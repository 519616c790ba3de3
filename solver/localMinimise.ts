import { G_COL, G_IM, G_RE, MATRIX_COUNT } from './channels';
import { energyOfOrder, type Couplings } from './couplings';
import { choleskySolve, completeFrame, orthonormaliseFrame, symmetricEigen } from './linalg';
import { hartreeFockOfOrder, orderOfProjector, projectorOf } from './state';

/**
 * Riemannian Newton descent with a Levenberg-Marquardt trust region on the Grassmannian
 * Gr(Nf, 4) (Absil, Mahony and Sepulchre, Optimization Algorithms on Matrix Manifolds, Princeton
 * University Press (2008), chapters 6 and 7).
 *
 * Tangent coordinates at a frame U: a complex (4 - Nf) x Nf block Z moves occupied vector i to
 * u_i + sum_a Z_ai u_(Nf+a), then the frame is re-orthonormalised (a second-order retraction is
 * not needed for Newton's quadratic convergence). Real coordinates are ordered
 * (Re Z_ai, Im Z_ai) with index 2 (a Nf + i).
 *
 * With M = U^dagger H_HF U and gamma^k_ai = u_a^dagger G_k u_i (derived here from section 4):
 *   gradient  g = (2 Re M_ai, 2 Im M_ai),
 *   Hessian   K_kl = 2 Re[conj(alpha) beta (delta_ij M_ab - delta_ab M_ji)] + sum_k kappa_k w^k_k w^k_l,
 *   with w^k = (2 Re gamma^k_ai, 2 Im gamma^k_ai) and alpha, beta = 1 or i for the real or
 *   imaginary part of each coordinate.
 */

export interface DescentOptions {
  /** Stop when every gradient component is below this times the coupling scale. */
  gradientTolerance: number;
  readonly maxIterations: number;
  /** Newton steps taken after the tolerance is met (each squares the residual). */
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
}

export const DEFAULT_DESCENT: DescentOptions = {
  gradientTolerance: 1e-12,
  maxIterations: 200,
  polishSteps: 1,
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

/** Scratch arrays for one descent; reuse one per thread to avoid allocation in hot loops. */
export class DescentWorkspace {
  readonly projector = new Float64Array(32);
  readonly order = new Float64Array(MATRIX_COUNT);
  readonly hamiltonian = new Float64Array(32);
  readonly hu = new Float64Array(32);
  readonly m = new Float64Array(32);
  readonly outer = new Float64Array(128);
  readonly w = new Float64Array(8);
  readonly gradient = new Float64Array(8);
  readonly hessian = new Float64Array(64);
  readonly step = new Float64Array(8);
  readonly rhs = new Float64Array(8);
  readonly chol = new Float64Array(64);
  readonly eigValues = new Float64Array(8);
  readonly eigVectors = new Float64Array(64);
  readonly eigScratch = new Float64Array(64);
  readonly trial = new Float64Array(32);
  readonly trialOrder = new Float64Array(MATRIX_COUNT);
  readonly scratch = new Float64Array(8);
}

/** Real dimension of Gr(nf, 4). */
export function tangentDimension(nf: number): number {
  return 2 * nf * (4 - nf);
}

/** Energy of a frame; fills ws.projector and the given order array. */
export function frameEnergy(
  c: Couplings,
  frame: Float64Array,
  ws: DescentWorkspace,
  order: Float64Array,
): number {
  projectorOf(frame, c.nf, ws.projector);
  orderOfProjector(ws.projector, order);
  return energyOfOrder(c, order);
}

/**
 * Gradient and Hessian in tangent coordinates at `frame` (ws.gradient, ws.hessian), given its
 * order parameters in ws.order. Also leaves M = U^dagger H_HF U in ws.m.
 */
export function tangentModel(c: Couplings, frame: Float64Array, ws: DescentWorkspace): void {
  const nf = c.nf;
  const ne = 4 - nf;
  const d = 2 * nf * ne;
  const { hamiltonian: h, hu, m, w, gradient: g, hessian: k } = ws;
  hartreeFockOfOrder(c, ws.order, h);
  for (let v = 0; v < 4; v++) {
    for (let r = 0; r < 4; r++) {
      let sr = 0;
      let si = 0;
      for (let col = 0; col < 4; col++) {
        const hr = h[2 * (4 * r + col)]!;
        const hi = h[2 * (4 * r + col) + 1]!;
        const ur = frame[8 * v + 2 * col]!;
        const ui = frame[8 * v + 2 * col + 1]!;
        sr += hr * ur - hi * ui;
        si += hr * ui + hi * ur;
      }
      hu[8 * v + 2 * r] = sr;
      hu[8 * v + 2 * r + 1] = si;
    }
  }
  // m[2 (4 a + b)] = u_a^dagger H u_b
  for (let a = 0; a < 4; a++) {
    for (let b = 0; b < 4; b++) {
      let sr = 0;
      let si = 0;
      for (let r = 0; r < 8; r += 2) {
        const ur = frame[8 * a + r]!;
        const ui = frame[8 * a + r + 1]!;
        const vr = hu[8 * b + r]!;
        const vi = hu[8 * b + r + 1]!;
        sr += ur * vr + ui * vi;
        si += ur * vi - ui * vr;
      }
      m[2 * (4 * a + b)] = sr;
      m[2 * (4 * a + b) + 1] = si;
    }
  }
  for (let a = 0; a < ne; a++) {
    for (let i = 0; i < nf; i++) {
      const idx = 2 * (a * nf + i);
      const mi = 2 * (4 * (nf + a) + i);
      g[idx] = 2 * m[mi]!;
      g[idx + 1] = 2 * m[mi + 1]!;
    }
  }
  k.fill(0, 0, d * d);
  // Outer products conj(u_a[r]) u_i[c] for every (empty a, occupied i) pair: then
  // gamma^k_ai = sum_r g^k_r conj(u_a[r]) u_i[col^k_r] costs four products per channel.
  const outer = ws.outer;
  for (let a = 0; a < ne; a++) {
    const oa = 8 * (nf + a);
    for (let i = 0; i < nf; i++) {
      const base = 32 * (a * nf + i);
      for (let r = 0; r < 4; r++) {
        const ar = frame[oa + 2 * r]!;
        const ai = frame[oa + 2 * r + 1]!;
        for (let col = 0; col < 4; col++) {
          const br = frame[8 * i + 2 * col]!;
          const bi = frame[8 * i + 2 * col + 1]!;
          outer[base + 8 * r + 2 * col] = ar * br + ai * bi;
          outer[base + 8 * r + 2 * col + 1] = ar * bi - ai * br;
        }
      }
    }
  }
  const pairs = nf * ne;
  for (let ch = 1; ch < MATRIX_COUNT; ch++) {
    const kappa = c.kappa[ch]!;
    if (kappa === 0) continue;
    for (let pair = 0; pair < pairs; pair++) {
      const base = 32 * pair;
      let sr = 0;
      let si = 0;
      for (let r = 0; r < 4; r++) {
        const gr = G_RE[4 * ch + r]!;
        const gi = G_IM[4 * ch + r]!;
        const idx = base + 8 * r + 2 * G_COL[4 * ch + r]!;
        const orr = outer[idx]!;
        const oi = outer[idx + 1]!;
        sr += gr * orr - gi * oi;
        si += gr * oi + gi * orr;
      }
      w[2 * pair] = 2 * sr;
      w[2 * pair + 1] = 2 * si;
    }
    for (let p = 0; p < d; p++) {
      const wp = kappa * w[p]!;
      for (let q = p; q < d; q++) k[p * d + q] = k[p * d + q]! + wp * w[q]!;
    }
  }
  for (let a = 0; a < ne; a++) {
    for (let i = 0; i < nf; i++) {
      for (let b = 0; b < ne; b++) {
        for (let j = 0; j < nf; j++) {
          let xr = 0;
          let xi = 0;
          if (i === j) {
            xr += m[2 * (4 * (nf + a) + nf + b)]!;
            xi += m[2 * (4 * (nf + a) + nf + b) + 1]!;
          }
          if (a === b) {
            xr -= m[2 * (4 * j + i)]!;
            xi -= m[2 * (4 * j + i) + 1]!;
          }
          const p = 2 * (a * nf + i);
          const q = 2 * (b * nf + j);
          if (q >= p) {
            k[p * d + q] = k[p * d + q]! + 2 * xr;
            k[(p + 1) * d + q + 1] = k[(p + 1) * d + q + 1]! + 2 * xr;
            k[p * d + q + 1] = k[p * d + q + 1]! - 2 * xi;
            if (q > p) k[(p + 1) * d + q] = k[(p + 1) * d + q]! + 2 * xi;
          }
        }
      }
    }
  }
  for (let p = 0; p < d; p++) for (let q = 0; q < p; q++) k[p * d + q] = k[q * d + p]!;
}

/** Moves `frame` along tangent coordinates `z` into `out` (orthonormalised, completed). */
export function retract(
  nf: number,
  frame: Float64Array,
  z: Float64Array,
  out: Float64Array,
  scratch: Float64Array,
): void {
  out.set(frame);
  const ne = 4 - nf;
  for (let i = 0; i < nf; i++) {
    for (let a = 0; a < ne; a++) {
      const zr = z[2 * (a * nf + i)]!;
      const zi = z[2 * (a * nf + i) + 1]!;
      const oa = 8 * (nf + a);
      for (let r = 0; r < 8; r += 2) {
        const ur = frame[oa + r]!;
        const ui = frame[oa + r + 1]!;
        out[8 * i + r] = out[8 * i + r]! + zr * ur - zi * ui;
        out[8 * i + r + 1] = out[8 * i + r + 1]! + zr * ui + zi * ur;
      }
    }
  }
  orthonormaliseFrame(out, nf);
  completeFrame(out, nf, scratch);
}

const MAX_STEP = 1;
/** A Newton step shorter than this (tangent norm) is taken as inside the quadratic regime. */
const SHORT_STEP = 0.05;
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
  let lambda = 0;
  let escapes = 0;
  let gmax = Infinity;
  let lastRatio = 0;
  let polished = 0;
  // After a rejected step the frame is unchanged, and so are its gradient and Hessian.
  let fresh = false;
  for (let iteration = 0; iteration < options.maxIterations; iteration++) {
    if (!fresh) tangentModel(c, frame, ws);
    fresh = true;
    gmax = 0;
    for (let p = 0; p < d; p++) gmax = Math.max(gmax, Math.abs(g[p]!));
    if (gmax <= tolerance) {
      // A minimum has a positive semidefinite Hessian; Goldstone zeros pass the small shift.
      if (choleskySolve(k, d, 1e-11 * scale, g, z, ws.chol, 0)) {
        // Extra Newton steps cost little and clear the slow residual of soft modes near a
        // continuous transition (gradient / curvature), which would otherwise blur labels.
        if (polished >= options.polishSteps || gmax <= 1e-15 * scale) {
          return {
            energy,
            gradient: gmax,
            iterations: iteration,
            converged: true,
            abandoned: false,
          };
        }
        polished++;
        // The same tiny shift that passed the test above: Goldstone zero modes stay harmless,
        // soft modes far above it are corrected fully.
        lambda = 1e-11 * scale;
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
    while (!choleskySolve(k, d, lambda, rhs, z, ws.chol, 1e-13 * scale)) {
      lambda = Math.max(4 * lambda, 1e-6 * scale);
      if (++tries > 40) break;
    }
    let norm = 0;
    for (let p = 0; p < d; p++) norm += z[p]! * z[p]!;
    norm = Math.sqrt(norm);
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
      if (ratio > 0.75) lambda = lambda < 1e-10 * scale ? 0 : lambda / 4;
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
