import {
  DescentWorkspace,
  frameEnergy,
  hartreeFockOfOrder,
  multiplyFrame,
  orthonormaliseFrame,
  projectOut,
  seededRandom,
  type Couplings,
  type RandomSource,
} from '../../solver/index';

/**
 * The notebook-style baseline of the benchmark: what one would write in a few lines with a
 * general-purpose optimiser. The occupied orbitals are an unconstrained complex 4 x Nf matrix Z
 * (8 Nf real parameters), P = Z (Z^dagger Z)^-1 Z^dagger, and quasi-Newton BFGS with the
 * analytic gradient (Nocedal and Wright, Numerical Optimization, 2nd ed., Springer (2006),
 * algorithm 6.1, with a backtracking line search for the Armijo condition, section 3.1, and the
 * update skipped when the curvature condition fails) runs from several Gaussian random starts,
 * keeping the lowest energy. Defaults as a general-purpose library sets them (common practice):
 * at most 200 iterations per parameter, stop when the largest gradient component is below the
 * tolerance.
 *
 * Gradient: with S = Z^dagger Z, dE = tr(H dP) = 2 Re tr(S^-1 Z^dagger H (1 - P) dZ), H = H_HF[P]
 * the Euclidean gradient of E with respect to P (public/notes.html#gap); so dE/dRe Z = 2 Re W and
 * dE/dIm Z = 2 Im W with W = (1 - P) H Z S^-1.
 */
export interface BfgsOptions {
  readonly starts: number;
  /** Stop a start when max |dE/dx| is below this times the coupling scale. */
  readonly gradientTolerance: number;
}

export const BFGS_DEFAULTS: BfgsOptions = { starts: 8, gradientTolerance: 1e-6 };

const ARMIJO = 1e-4;

/** Scratch arrays for one thread. */
export class BfgsWorkspace {
  readonly descent = new DescentWorkspace();
  readonly frame = new Float64Array(32);
  readonly order = new Float64Array(16);
  readonly hamiltonian = new Float64Array(32);
  readonly hz = new Float64Array(32);
}

/** Energy at Z (the first 8 nf entries of `x`), and its gradient with respect to x into `gradient`. */
export function energyAndGradient(
  c: Couplings,
  x: Float64Array,
  gradient: Float64Array,
  ws: BfgsWorkspace,
): number {
  const nf = c.nf;
  const u = ws.frame;
  u.set(x.subarray(0, 8 * nf));
  orthonormaliseFrame(u, nf);
  const energy = frameEnergy(c, u, ws.descent, ws.order);
  const h = hartreeFockOfOrder(c, ws.order, ws.hamiltonian);
  // Y = H Z, then (1 - P) Y = Y - U (U^dagger Y).
  const y = multiplyFrame(h, x, nf, ws.hz);
  for (let v = 0; v < nf; v++) for (let j = 0; j < nf; j++) projectOut(u, j, y, 8 * v);
  // W = ((1 - P) H Z) S^-1: column v of W is sum_w column w of (1 - P) H Z times (S^-1)_wv.
  const s = gram(x, nf);
  const sInv = invertHermitian(s, nf);
  gradient.fill(0);
  for (let v = 0; v < nf; v++) {
    for (let w = 0; w < nf; w++) {
      const ar = sInv[2 * (nf * w + v)]!;
      const ai = sInv[2 * (nf * w + v) + 1]!;
      for (let r = 0; r < 8; r += 2) {
        const yr = y[8 * w + r]!;
        const yi = y[8 * w + r + 1]!;
        gradient[8 * v + r] = gradient[8 * v + r]! + 2 * (yr * ar - yi * ai);
        gradient[8 * v + r + 1] = gradient[8 * v + r + 1]! + 2 * (yr * ai + yi * ar);
      }
    }
  }
  return energy;
}

/** S = Z^dagger Z (nf x nf complex, row-major, interleaved). */
function gram(z: Float64Array, nf: number): Float64Array {
  const s = new Float64Array(2 * nf * nf);
  for (let a = 0; a < nf; a++) {
    for (let b = 0; b < nf; b++) {
      let re = 0;
      let im = 0;
      for (let r = 0; r < 8; r += 2) {
        re += z[8 * a + r]! * z[8 * b + r]! + z[8 * a + r + 1]! * z[8 * b + r + 1]!;
        im += z[8 * a + r]! * z[8 * b + r + 1]! - z[8 * a + r + 1]! * z[8 * b + r]!;
      }
      s[2 * (nf * a + b)] = re;
      s[2 * (nf * a + b) + 1] = im;
    }
  }
  return s;
}

/** Inverse of a small complex matrix by Gauss-Jordan elimination with partial pivoting. */
function invertHermitian(m: Float64Array, n: number): Float64Array {
  const a = Float64Array.from(m);
  const inv = new Float64Array(2 * n * n);
  for (let i = 0; i < n; i++) inv[2 * (n * i + i)] = 1;
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) {
      if (
        Math.hypot(a[2 * (n * r + col)]!, a[2 * (n * r + col) + 1]!) >
        Math.hypot(a[2 * (n * pivot + col)]!, a[2 * (n * pivot + col) + 1]!)
      )
        pivot = r;
    }
    for (const mat of [a, inv]) {
      for (let k = 0; k < 2 * n; k++) {
        const t = mat[2 * n * col + k]!;
        mat[2 * n * col + k] = mat[2 * n * pivot + k]!;
        mat[2 * n * pivot + k] = t;
      }
    }
    const pr = a[2 * (n * col + col)]!;
    const pi = a[2 * (n * col + col) + 1]!;
    const d = pr * pr + pi * pi;
    const [ir, ii] = [pr / d, -pi / d];
    for (const mat of [a, inv]) {
      for (let k = 0; k < n; k++) {
        const re = mat[2 * (n * col + k)]!;
        const im = mat[2 * (n * col + k) + 1]!;
        mat[2 * (n * col + k)] = re * ir - im * ii;
        mat[2 * (n * col + k) + 1] = re * ii + im * ir;
      }
    }
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const fr = a[2 * (n * r + col)]!;
      const fi = a[2 * (n * r + col) + 1]!;
      for (const mat of [a, inv]) {
        for (let k = 0; k < n; k++) {
          const re = mat[2 * (n * col + k)]!;
          const im = mat[2 * (n * col + k) + 1]!;
          mat[2 * (n * r + k)] = mat[2 * (n * r + k)]! - (fr * re - fi * im);
          mat[2 * (n * r + k) + 1] = mat[2 * (n * r + k) + 1]! - (fr * im + fi * re);
        }
      }
    }
  }
  return inv;
}

function maxAbs(v: Float64Array): number {
  let m = 0;
  for (const x of v) m = Math.max(m, Math.abs(x));
  return m;
}

/** One BFGS run from `x` (modified in place); returns the energy reached. */
export function bfgsDescent(c: Couplings, x: Float64Array, ws: BfgsWorkspace): number {
  const n = 8 * c.nf;
  const tolerance = BFGS_DEFAULTS.gradientTolerance * c.scale;
  const maxIterations = 200 * n;
  const g = new Float64Array(n);
  const gNew = new Float64Array(n);
  const p = new Float64Array(n);
  const s = new Float64Array(n);
  const yk = new Float64Array(n);
  const trial = new Float64Array(n);
  const hy = new Float64Array(n);
  // Inverse Hessian approximation, identity over the scale at the start.
  const hInv = new Float64Array(n * n);
  for (let i = 0; i < n; i++) hInv[i * n + i] = 1 / c.scale;
  let f = energyAndGradient(c, x, g, ws);
  for (let iteration = 0; iteration < maxIterations; iteration++) {
    if (maxAbs(g) < tolerance) break;
    let slope = 0;
    for (let i = 0; i < n; i++) {
      let sum = 0;
      for (let j = 0; j < n; j++) sum -= hInv[i * n + j]! * g[j]!;
      p[i] = sum;
      slope += sum * g[i]!;
    }
    if (slope >= 0) {
      // Not a descent direction (rounding): restart from steepest descent.
      hInv.fill(0);
      for (let i = 0; i < n; i++) hInv[i * n + i] = 1 / c.scale;
      continue;
    }
    let t = 1;
    let fNew = Infinity;
    for (let tries = 0; tries < 60; tries++) {
      for (let i = 0; i < n; i++) trial[i] = x[i]! + t * p[i]!;
      fNew = energyAndGradient(c, trial, gNew, ws);
      if (fNew <= f + ARMIJO * t * slope) break;
      t /= 2;
    }
    if (!(fNew <= f + ARMIJO * t * slope)) break;
    let sy = 0;
    for (let i = 0; i < n; i++) {
      s[i] = trial[i]! - x[i]!;
      yk[i] = gNew[i]! - g[i]!;
      sy += s[i]! * yk[i]!;
    }
    x.set(trial);
    g.set(gNew);
    f = fNew;
    if (sy <= 1e-300) continue;
    // H <- (1 - rho s y^T) H (1 - rho y s^T) + rho s s^T
    const rho = 1 / sy;
    let yhy = 0;
    for (let i = 0; i < n; i++) {
      let sum = 0;
      for (let j = 0; j < n; j++) sum += hInv[i * n + j]! * yk[j]!;
      hy[i] = sum;
      yhy += yk[i]! * sum;
    }
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        hInv[i * n + j] =
          hInv[i * n + j]! -
          rho * (hy[i]! * s[j]! + s[i]! * hy[j]!) +
          (rho * rho * yhy + rho) * s[i]! * s[j]!;
      }
    }
  }
  return f;
}

function gaussian(random: RandomSource): number {
  const u = Math.max(random(), 1e-300);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

/** The lowest energy over `starts` BFGS runs from Gaussian random Z of the stream `seed`. */
export function bfgsSolve(
  c: Couplings,
  seed: number,
  ws: BfgsWorkspace,
  starts = BFGS_DEFAULTS.starts,
): number {
  const random = seededRandom(seed);
  let best = Infinity;
  for (let k = 0; k < starts; k++) {
    const x = new Float64Array(8 * c.nf);
    for (let i = 0; i < x.length; i++) x[i] = gaussian(random);
    best = Math.min(best, bfgsDescent(c, x, ws));
  }
  return best;
}
