import { complex, eigs, lusolve, matrix, type Complex } from 'mathjs';
import { describe, expect, test } from 'vitest';
import {
  hermitianEigen4,
  randomFrame,
  seededRandom,
  symmetricEigen,
  type RandomSource,
} from '../solver/index';
// choleskySolve is internal to the solver (not in solver/index.ts), so it is imported directly.
import { choleskySolve } from '../solver/linalg';

// Layouts (solver/linalg.ts header): a 4x4 complex matrix is row-major with re/im interleaved,
// entry (r, c) at [2 (4 r + c)]; a frame stores vector k contiguously, component r at [8 k + 2 r].

const MATRICES = 240;

function uniform(random: RandomSource): number {
  return 2 * random() - 1;
}

function randomHermitian4(random: RandomSource): Float64Array {
  const a = new Float64Array(32);
  for (let r = 0; r < 4; r++) {
    a[2 * (5 * r)] = uniform(random);
    for (let c = r + 1; c < 4; c++) {
      const re = uniform(random);
      const im = uniform(random);
      a[2 * (4 * r + c)] = re;
      a[2 * (4 * r + c) + 1] = im;
      a[2 * (4 * c + r)] = re;
      a[2 * (4 * c + r) + 1] = -im;
    }
  }
  return a;
}

/** U diag(values) U^dagger with U the columns of a Haar-random frame: known, possibly repeated, eigenvalues. */
function hermitianWithSpectrum(values: readonly number[], random: RandomSource): Float64Array {
  const u = randomFrame(random);
  const a = new Float64Array(32);
  for (let r = 0; r < 4; r++) {
    for (let c = 0; c < 4; c++) {
      let re = 0;
      let im = 0;
      for (let k = 0; k < 4; k++) {
        const xr = u[8 * k + 2 * r]!;
        const xi = u[8 * k + 2 * r + 1]!;
        const yr = u[8 * k + 2 * c]!;
        const yi = u[8 * k + 2 * c + 1]!;
        // values[k] * x_r * conj(x_c)
        re += values[k]! * (xr * yr + xi * yi);
        im += values[k]! * (xi * yr - xr * yi);
      }
      a[2 * (4 * r + c)] = re;
      a[2 * (4 * r + c) + 1] = im;
    }
  }
  // Exactly Hermitian, so that the input is what the test claims it is.
  for (let r = 0; r < 4; r++) {
    a[2 * (5 * r) + 1] = 0;
    for (let c = r + 1; c < 4; c++) {
      a[2 * (4 * c + r)] = a[2 * (4 * r + c)]!;
      a[2 * (4 * c + r) + 1] = -a[2 * (4 * r + c) + 1]!;
    }
  }
  return a;
}

function frobenius(a: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < a.length; i++) sum += a[i]! * a[i]!;
  return Math.sqrt(sum);
}

interface Eigen4 {
  values: Float64Array;
  vectors: Float64Array;
}

function eigen4(a: Float64Array): Eigen4 {
  const values = new Float64Array(4);
  const vectors = new Float64Array(32);
  hermitianEigen4(Float64Array.from(a), values, vectors);
  return { values, vectors };
}

/** Largest |(H v_k - lambda_k v_k)_r| over k and r. */
function hermitianResidual(a: Float64Array, { values, vectors }: Eigen4): number {
  let worst = 0;
  for (let k = 0; k < 4; k++) {
    for (let r = 0; r < 4; r++) {
      let re = -values[k]! * vectors[8 * k + 2 * r]!;
      let im = -values[k]! * vectors[8 * k + 2 * r + 1]!;
      for (let c = 0; c < 4; c++) {
        const hr = a[2 * (4 * r + c)]!;
        const hi = a[2 * (4 * r + c) + 1]!;
        const vr = vectors[8 * k + 2 * c]!;
        const vi = vectors[8 * k + 2 * c + 1]!;
        re += hr * vr - hi * vi;
        im += hr * vi + hi * vr;
      }
      worst = Math.max(worst, Math.hypot(re, im));
    }
  }
  return worst;
}

/** Largest |(V^dagger V - 1)_jk|. */
function unitarityDefect(vectors: Float64Array): number {
  let worst = 0;
  for (let j = 0; j < 4; j++) {
    for (let k = 0; k < 4; k++) {
      let re = j === k ? -1 : 0;
      let im = 0;
      for (let r = 0; r < 4; r++) {
        const xr = vectors[8 * j + 2 * r]!;
        const xi = vectors[8 * j + 2 * r + 1]!;
        const yr = vectors[8 * k + 2 * r]!;
        const yi = vectors[8 * k + 2 * r + 1]!;
        re += xr * yr + xi * yi;
        im += xr * yi - xi * yr;
      }
      worst = Math.max(worst, Math.hypot(re, im));
    }
  }
  return worst;
}

function expectAscending(values: ArrayLike<number>): void {
  for (let k = 1; k < values.length; k++) expect(values[k]!).toBeGreaterThanOrEqual(values[k - 1]!);
}

/** Eigenvalues from mathjs, checked real, sorted ascending (mathjs does not sort complex input). */
function mathjsEigenvalues(rows: (number | Complex)[][], imaginaryTolerance: number): number[] {
  const { values } = eigs(matrix(rows), { eigenvectors: false });
  const list = (Array.isArray(values) ? values : values.toArray()) as (number | Complex)[];
  return list
    .map((v) => {
      if (typeof v === 'number') return v;
      expect(Math.abs(v.im)).toBeLessThan(imaginaryTolerance);
      return v.re;
    })
    .sort((x, y) => x - y);
}

function complexRows(a: Float64Array): Complex[][] {
  return [0, 1, 2, 3].map((r) =>
    [0, 1, 2, 3].map((c) => complex(a[2 * (4 * r + c)]!, a[2 * (4 * r + c) + 1]!)),
  );
}

/** Every check of this file for one Hermitian 4x4 matrix, with tolerances relative to its norm. */
function checkHermitian(
  a: Float64Array,
  expected?: readonly number[],
  relativeTolerance = 1e-13,
): Eigen4 {
  const norm = Math.max(frobenius(a), 1e-300);
  const result = eigen4(a);
  expect(hermitianResidual(a, result)).toBeLessThan(relativeTolerance * norm);
  expect(unitarityDefect(result.vectors)).toBeLessThan(1e-13);
  expectAscending(result.values);
  if (expected) {
    const sorted = [...expected].sort((x, y) => x - y);
    sorted.forEach((v, k) => expect(Math.abs(result.values[k]! - v)).toBeLessThan(1e-13 * norm));
  }
  return result;
}

describe('hermitianEigen4 (4x4 complex Hermitian, cyclic Jacobi)', () => {
  test(`H V = V Lambda, V^dagger V = 1, ascending, on ${MATRICES} seeded random Hermitian matrices`, () => {
    const random = seededRandom(0x4e16);
    for (let m = 0; m < MATRICES; m++) checkHermitian(randomHermitian4(random));
  });

  test(`eigenvalues agree with mathjs 15.2.0 eigs on complex Hermitian input (${MATRICES} matrices)`, () => {
    // mathjs accepts the complex Hermitian matrix directly and returns real eigenvalues (up to
    // rounding in the imaginary part), so no 8x8 real embedding is needed for this comparison.
    const random = seededRandom(0x3a7b);
    for (let m = 0; m < MATRICES; m++) {
      const a = randomHermitian4(random);
      const norm = frobenius(a);
      const ours = eigen4(a).values;
      const theirs = mathjsEigenvalues(complexRows(a), 1e-10 * norm);
      theirs.forEach((v, k) => expect(Math.abs(ours[k]! - v)).toBeLessThan(1e-10 * norm));
    }
  });

  test('eigenvalues equal half of the spectrum of the 8x8 real embedding [[Re, -Im], [Im, Re]] (each doubled)', () => {
    // A second, independent route through symmetricEigen: the embedding of a Hermitian H has
    // every eigenvalue of H twice.
    const random = seededRandom(0xe8be);
    for (let m = 0; m < MATRICES; m++) {
      const a = randomHermitian4(random);
      const embedding = new Float64Array(64);
      for (let r = 0; r < 4; r++) {
        for (let c = 0; c < 4; c++) {
          const re = a[2 * (4 * r + c)]!;
          const im = a[2 * (4 * r + c) + 1]!;
          embedding[8 * r + c] = re;
          embedding[8 * r + c + 4] = -im;
          embedding[8 * (r + 4) + c] = im;
          embedding[8 * (r + 4) + c + 4] = re;
        }
      }
      const doubled = new Float64Array(8);
      symmetricEigen(embedding, 8, doubled, new Float64Array(64));
      const ours = eigen4(a).values;
      const norm = frobenius(a);
      for (let k = 0; k < 4; k++) {
        expect(Math.abs(doubled[2 * k]! - ours[k]!)).toBeLessThan(1e-12 * norm);
        expect(Math.abs(doubled[2 * k + 1]! - ours[k]!)).toBeLessThan(1e-12 * norm);
      }
    }
  });

  test('repeated eigenvalues (U diag U^dagger, Haar-random U): exact spectrum and an orthonormal eigenbasis', () => {
    const spectra = [
      [1, 1, 1, 2],
      [-1, 0.5, 0.5, 0.5],
      [0, 0, 3, 3],
      [-2, -2, 1, 4],
      [2, -1, 2, -1],
      [1e-3, 1e-3, 1e-3, 1],
      [0, 0, 0, 1e-9],
    ];
    const random = seededRandom(0xde9e);
    for (const spectrum of spectra) {
      for (let m = 0; m < 40; m++) {
        const a = hermitianWithSpectrum(spectrum, random);
        checkHermitian(a, spectrum);
        const norm = frobenius(a);
        const theirs = mathjsEigenvalues(complexRows(a), 1e-8 * norm);
        const sorted = [...spectrum].sort((x, y) => x - y);
        // mathjs's general complex path is less accurate on clusters than on simple eigenvalues.
        theirs.forEach((v, k) => expect(Math.abs(sorted[k]! - v)).toBeLessThan(1e-8 * norm));
      }
    }
  });

  test('a multiple of the identity returns its value four times and any unitary frame', () => {
    const a = new Float64Array(32);
    for (let r = 0; r < 4; r++) a[2 * (5 * r)] = 2.5;
    const result = checkHermitian(a, [2.5, 2.5, 2.5, 2.5]);
    expect(Array.from(result.values)).toEqual([2.5, 2.5, 2.5, 2.5]);
  });

  test('a diagonal matrix: its entries sorted ascending, eigenvectors the permuted basis vectors', () => {
    const diagonal = [0.7, -3, 2, -0.25];
    const a = new Float64Array(32);
    diagonal.forEach((v, r) => (a[2 * (5 * r)] = v));
    const { values, vectors } = checkHermitian(a, diagonal);
    expect(Array.from(values)).toEqual([-3, -0.25, 0.7, 2]);
    // Eigenvector k is the basis vector of the row that held values[k], up to a phase.
    [1, 3, 0, 2].forEach((row, k) => {
      expect(Math.hypot(vectors[8 * k + 2 * row]!, vectors[8 * k + 2 * row + 1]!)).toBeCloseTo(
        1,
        14,
      );
    });
  });

  test('the zero matrix gives zero eigenvalues and the identity frame', () => {
    const values = new Float64Array(4).fill(Number.NaN);
    const vectors = new Float64Array(32).fill(Number.NaN);
    hermitianEigen4(new Float64Array(32), values, vectors);
    expect(Array.from(values)).toEqual([0, 0, 0, 0]);
    expect(unitarityDefect(vectors)).toBe(0);
  });

  test('a purely imaginary off-diagonal pair (sigma_y in the K valley) has eigenvalues -1, 0, 0, 1', () => {
    const a = new Float64Array(32);
    a[2 * 1 + 1] = -1; // (0, 1) = -i
    a[2 * 4 + 1] = 1; // (1, 0) = +i
    const { values } = checkHermitian(a, [-1, 0, 0, 1]);
    expect(values[0]).toBeCloseTo(-1, 15);
    expect(values[3]).toBeCloseTo(1, 15);
  });

  test('eigenvalues scale with the matrix (s H has eigenvalues s lambda) for s from 1e-150 to 1e150', () => {
    const a = randomHermitian4(seededRandom(0x5ca1e));
    const reference = eigen4(a).values;
    for (const s of [1e-150, 1e-60, 1e-8, 1e8, 1e60, 1e150]) {
      // Near 1e-150 the squares of small rotated entries underflow, so the tolerance is 1e-12.
      const { values } = checkHermitian(
        a.map((x) => x * s),
        undefined,
        1e-12,
      );
      for (let k = 0; k < 4; k++) {
        expect(Math.abs(values[k]! / s - reference[k]!)).toBeLessThan(1e-12 * frobenius(a));
      }
    }
  });

  test('finite matrices whose squared entries under- or overflow (s = 1e-200, 1e-170, 1e160, 1e200) are still diagonalised', () => {
    // Scaling a matrix by its largest entry before forming sums of squares is common practice in
    // eigensolvers; without it the convergence test sees 0 <= 0 or Infinity <= Infinity and stops
    // before the first rotation.
    const a = randomHermitian4(seededRandom(0x5ca1e));
    const reference = eigen4(a).values;
    for (const s of [1e-200, 1e-170, 1e160, 1e200]) {
      const values = new Float64Array(4);
      hermitianEigen4(
        a.map((x) => x * s),
        values,
        new Float64Array(32),
      );
      for (let k = 0; k < 4; k++) {
        expect(Math.abs(values[k]! / s - reference[k]!)).toBeLessThan(1e-12 * frobenius(a));
      }
    }
  });
});

function randomSymmetric(n: number, random: RandomSource): Float64Array {
  const a = new Float64Array(n * n);
  for (let r = 0; r < n; r++) {
    for (let c = r; c < n; c++) {
      const v = uniform(random);
      a[r * n + c] = v;
      a[c * n + r] = v;
    }
  }
  return a;
}

/** Q diag(values) Q^T with Q orthogonal (Gram-Schmidt of a random matrix). */
function symmetricWithSpectrum(values: readonly number[], random: RandomSource): Float64Array {
  const n = values.length;
  const q: number[][] = [];
  while (q.length < n) {
    const v = Array.from({ length: n }, () => uniform(random));
    for (const u of q) {
      const dot = u.reduce((s, x, i) => s + x * v[i]!, 0);
      u.forEach((x, i) => (v[i] = v[i]! - dot * x));
    }
    const norm = Math.hypot(...v);
    if (norm < 0.1) continue;
    q.push(v.map((x) => x / norm));
  }
  const a = new Float64Array(n * n);
  for (let r = 0; r < n; r++) {
    for (let c = r; c < n; c++) {
      let sum = 0;
      for (let k = 0; k < n; k++) sum += values[k]! * q[k]![r]! * q[k]![c]!;
      a[r * n + c] = sum;
      a[c * n + r] = sum;
    }
  }
  return a;
}

interface EigenN {
  values: Float64Array;
  vectors: Float64Array;
}

function eigenN(a: Float64Array, n: number): EigenN {
  const values = new Float64Array(n);
  const vectors = new Float64Array(n * n);
  symmetricEigen(Float64Array.from(a), n, values, vectors);
  return { values, vectors };
}

function checkSymmetric(a: Float64Array, n: number, expected?: readonly number[]): EigenN {
  const norm = Math.max(frobenius(a), 1e-300);
  const result = eigenN(a, n);
  const { values, vectors } = result;
  let residual = 0;
  let defect = 0;
  for (let k = 0; k < n; k++) {
    for (let r = 0; r < n; r++) {
      let sum = -values[k]! * vectors[r * n + k]!;
      for (let c = 0; c < n; c++) sum += a[r * n + c]! * vectors[c * n + k]!;
      residual = Math.max(residual, Math.abs(sum));
    }
    for (let j = 0; j < n; j++) {
      let dot = j === k ? -1 : 0;
      for (let r = 0; r < n; r++) dot += vectors[r * n + j]! * vectors[r * n + k]!;
      defect = Math.max(defect, Math.abs(dot));
    }
  }
  expect(residual).toBeLessThan(1e-13 * norm);
  expect(defect).toBeLessThan(1e-13);
  expectAscending(values);
  if (expected) {
    const sorted = [...expected].sort((x, y) => x - y);
    sorted.forEach((v, k) => expect(Math.abs(values[k]! - v)).toBeLessThan(1e-13 * norm));
  }
  return result;
}

function rowsOf(a: Float64Array, n: number): number[][] {
  return Array.from({ length: n }, (_, r) => Array.from(a.subarray(r * n, r * n + n)));
}

describe('symmetricEigen (real symmetric n x n, cyclic Jacobi)', () => {
  test(`H V = V Lambda, V^T V = 1, ascending, and mathjs 15.2.0 eigs agree: ${MATRICES} seeded matrices for each n = 2..8`, () => {
    const random = seededRandom(0x5e1f);
    for (let n = 2; n <= 8; n++) {
      for (let m = 0; m < MATRICES; m++) {
        const a = randomSymmetric(n, random);
        const { values } = checkSymmetric(a, n);
        const theirs = mathjsEigenvalues(rowsOf(a, n), 1e-12);
        const norm = frobenius(a);
        theirs.forEach((v, k) => expect(Math.abs(values[k]! - v)).toBeLessThan(1e-12 * norm));
      }
    }
  });

  test('repeated eigenvalues (Q diag Q^T): exact spectrum and an orthonormal eigenbasis, n = 2..8', () => {
    const random = seededRandom(0xd0b1e);
    for (let n = 2; n <= 8; n++) {
      const spectra = [
        Array.from({ length: n }, () => 1.5),
        Array.from({ length: n }, (_, k) => (k < n / 2 ? -1 : 2)),
        Array.from({ length: n }, (_, k) => (k === 0 ? 3 : 0)),
        Array.from({ length: n }, (_, k) => Math.floor(k / 2) - 1),
      ];
      for (const spectrum of spectra) {
        for (let m = 0; m < 10; m++) {
          const a = symmetricWithSpectrum(spectrum, random);
          checkSymmetric(a, n, spectrum);
          const norm = frobenius(a);
          const theirs = mathjsEigenvalues(rowsOf(a, n), 1e-12);
          const sorted = [...spectrum].sort((x, y) => x - y);
          theirs.forEach((v, k) => expect(Math.abs(sorted[k]! - v)).toBeLessThan(1e-12 * norm));
        }
      }
    }
  });

  test('a diagonal matrix: entries sorted ascending, eigenvectors the permuted basis vectors', () => {
    const diagonal = [4, -1, 0, 2.5, -7, 1];
    const n = diagonal.length;
    const a = new Float64Array(n * n);
    diagonal.forEach((v, r) => (a[r * n + r] = v));
    const { values, vectors } = checkSymmetric(a, n, diagonal);
    expect(Array.from(values)).toEqual([-7, -1, 0, 1, 2.5, 4]);
    [4, 1, 2, 5, 3, 0].forEach((row, k) => expect(Math.abs(vectors[row * n + k]!)).toBe(1));
  });

  test('eigenvalues scale with the matrix for s from 1e-150 to 1e150, n = 6', () => {
    const a = randomSymmetric(6, seededRandom(0x5ca1f));
    const reference = eigenN(a, 6).values;
    for (const s of [1e-150, 1e-60, 1e60, 1e150]) {
      const { values } = eigenN(
        a.map((x) => x * s),
        6,
      );
      for (let k = 0; k < 6; k++) {
        expect(Math.abs(values[k]! / s - reference[k]!)).toBeLessThan(1e-12 * frobenius(a));
      }
    }
  });

  test('finite matrices whose squared entries under- or overflow (s = 1e-200, 1e-170, 1e160, 1e200) are still diagonalised, n = 6', () => {
    // Same cause as for hermitianEigen4. The collective modes square the Hessian (A^T A), so
    // there the overflow starts at couplings near 1e77.
    const a = randomSymmetric(6, seededRandom(0x5ca1f));
    const reference = eigenN(a, 6).values;
    for (const s of [1e-200, 1e-170, 1e160, 1e200]) {
      const { values } = eigenN(
        a.map((x) => x * s),
        6,
      );
      for (let k = 0; k < 6; k++) {
        expect(Math.abs(values[k]! / s - reference[k]!)).toBeLessThan(1e-12 * frobenius(a));
      }
    }
  });

  test('the 2x2 matrix [[2, 1], [1, 2]] has eigenvalues 1 and 3 with vectors (1, -+1)/sqrt 2', () => {
    const { values, vectors } = checkSymmetric(Float64Array.from([2, 1, 1, 2]), 2, [1, 3]);
    expect(values[0]).toBeCloseTo(1, 15);
    expect(values[1]).toBeCloseTo(3, 15);
    expect(Math.abs(vectors[0]! + vectors[2]!)).toBeLessThan(1e-15);
    expect(Math.abs(vectors[1]! - vectors[3]!)).toBeLessThan(1e-15);
  });
});

function randomSpd(n: number, random: RandomSource): Float64Array {
  const b = Array.from({ length: n * n }, () => uniform(random));
  const a = new Float64Array(n * n);
  for (let r = 0; r < n; r++) {
    for (let c = 0; c < n; c++) {
      let sum = r === c ? 0.1 : 0;
      for (let k = 0; k < n; k++) sum += b[r * n + k]! * b[c * n + k]!;
      a[r * n + c] = sum;
    }
  }
  return a;
}

function cholesky(
  a: Float64Array,
  n: number,
  b: Float64Array,
  shift = 0,
  minPivot = 0,
): Float64Array | false {
  const x = new Float64Array(n);
  const ok = choleskySolve(a, n, shift, b, x, new Float64Array(n * n), minPivot);
  return ok ? x : false;
}

describe('choleskySolve ((A + shift I) x = b for symmetric positive definite A)', () => {
  test('agrees with mathjs 15.2.0 lusolve on 240 seeded SPD systems, n = 1..8', () => {
    const random = seededRandom(0xc401);
    for (let m = 0; m < MATRICES; m++) {
      const n = 1 + (m % 8);
      const a = randomSpd(n, random);
      const b = Float64Array.from({ length: n }, () => uniform(random));
      const x = cholesky(a, n, b);
      expect(x).not.toBe(false);
      const reference = (lusolve(rowsOf(a, n), Array.from(b)) as number[][]).map((row) => row[0]!);
      const size = Math.max(1, ...reference.map(Math.abs));
      reference.forEach((v, i) =>
        expect(Math.abs((x as Float64Array)[i]! - v)).toBeLessThan(1e-9 * size),
      );
      // And the residual A x - b itself.
      for (let r = 0; r < n; r++) {
        let sum = -b[r]!;
        for (let c = 0; c < n; c++) sum += a[r * n + c]! * (x as Float64Array)[c]!;
        expect(Math.abs(sum)).toBeLessThan(1e-12 * frobenius(a) * size);
      }
    }
  });

  test('the shift is added to the diagonal: (A + s I) x = b agrees with mathjs lusolve', () => {
    const random = seededRandom(0x5f17);
    const n = 5;
    const a = randomSpd(n, random);
    const b = Float64Array.from({ length: n }, () => uniform(random));
    const shifted = rowsOf(a, n).map((row, r) => row.map((v, c) => v + (r === c ? 0.75 : 0)));
    const x = cholesky(a, n, b, 0.75);
    expect(x).not.toBe(false);
    const reference = (lusolve(shifted, Array.from(b)) as number[][]).map((row) => row[0]!);
    reference.forEach((v, i) => expect((x as Float64Array)[i]).toBeCloseTo(v, 12));
  });

  test('returns false for indefinite matrices', () => {
    // [[1, 2], [2, 1]] has eigenvalues -1 and 3.
    expect(cholesky(Float64Array.from([1, 2, 2, 1]), 2, Float64Array.from([1, 1]))).toBe(false);
    // diag(2, -1, 3): the second pivot is negative.
    const d = new Float64Array(9);
    [2, -1, 3].forEach((v, r) => (d[4 * r] = v));
    expect(cholesky(d, 3, Float64Array.from([1, 1, 1]))).toBe(false);
    // Q diag(-0.5, 1, 2, 3) Q^T: indefinite although every diagonal entry may be positive.
    const random = seededRandom(0x1de7);
    for (let m = 0; m < 20; m++) {
      const a = symmetricWithSpectrum([-0.5, 1, 2, 3], random);
      expect(cholesky(a, 4, Float64Array.from([1, 0, 0, 0]))).toBe(false);
      // A shift of 1 makes it positive definite again.
      expect(cholesky(a, 4, Float64Array.from([1, 0, 0, 0]), 1)).not.toBe(false);
    }
  });

  test('returns false for a singular matrix and when a pivot falls at or below minPivot', () => {
    expect(cholesky(Float64Array.from([1, 1, 1, 1]), 2, Float64Array.from([1, 0]))).toBe(false);
    const a = Float64Array.from([1, 0, 0, 1e-3]);
    const b = Float64Array.from([1, 1]);
    expect(cholesky(a, 2, b, 0, 1e-2)).toBe(false);
    expect(cholesky(a, 2, b, 0, 1e-3)).toBe(false);
    const x = cholesky(a, 2, b, 0, 1e-4);
    expect(x).not.toBe(false);
    expect((x as Float64Array)[0]).toBeCloseTo(1, 15);
    expect((x as Float64Array)[1]).toBeCloseTo(1000, 10);
  });
});
