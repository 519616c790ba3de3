/**
 * Small dense linear algebra for the 4-flavour problem.
 *
 * Layouts:
 * - a 4x4 complex matrix is a Float64Array(32), row-major, re/im interleaved: entry (r, c) at
 *   [2 (4 r + c)] and [2 (4 r + c) + 1];
 * - a set of four column vectors (a unitary frame) is a Float64Array(32) with vector k stored
 *   contiguously: component r at [8 k + 2 r] and [8 k + 2 r + 1];
 * - a real n x n matrix is a Float64Array(n * n), row-major.
 */

const JACOBI_MAX_SWEEPS = 30;

/**
 * Eigen-decomposition of a 4x4 Hermitian matrix by cyclic complex Jacobi rotations
 * (Golub and Van Loan, Matrix Computations, 4th ed., section 8.5, extended to Hermitian matrices
 * by a diagonal phase). `a` is overwritten. Eigenvalues ascending into `values`, eigenvectors as a
 * frame into `vectors` (vector k belongs to values[k]).
 */
export function hermitianEigen4(
  a: Float64Array,
  values: Float64Array,
  vectors: Float64Array,
): void {
  vectors.fill(0);
  for (let k = 0; k < 4; k++) vectors[8 * k + 2 * k] = 1;
  // Work on a / max|a_ij| so that squares neither overflow nor underflow (common practice).
  let largest = 0;
  for (let i = 0; i < 32; i++) largest = Math.max(largest, Math.abs(a[i]!));
  if (largest === 0 || !Number.isFinite(largest)) {
    for (let k = 0; k < 4; k++) values[k] = a[2 * (5 * k)]!;
    sortFrameByValues(values, vectors, 4);
    return;
  }
  for (let i = 0; i < 32; i++) a[i] = a[i]! / largest;
  let total = 0;
  for (let i = 0; i < 32; i++) total += a[i]! * a[i]!;
  const threshold = total * 1e-30;
  for (let sweep = 0; sweep < JACOBI_MAX_SWEEPS; sweep++) {
    let off = 0;
    for (let p = 0; p < 3; p++) {
      for (let q = p + 1; q < 4; q++) {
        const i = 2 * (4 * p + q);
        off += a[i]! * a[i]! + a[i + 1]! * a[i + 1]!;
      }
    }
    if (off <= threshold) break;
    for (let p = 0; p < 3; p++) {
      for (let q = p + 1; q < 4; q++) {
        const ipq = 2 * (4 * p + q);
        const xr = a[ipq]!;
        const xi = a[ipq + 1]!;
        const r = Math.hypot(xr, xi);
        if (r * r <= threshold * 1e-6) continue;
        // Phase e^{-i phi} of a_pq; rotation angle from the real symmetric 2x2 problem.
        const er = xr / r;
        const ei = -xi / r;
        const app = a[2 * (5 * p)]!;
        const aqq = a[2 * (5 * q)]!;
        const tau = (aqq - app) / (2 * r);
        const t = (tau >= 0 ? 1 : -1) / (Math.abs(tau) + Math.sqrt(1 + tau * tau));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = t * c;
        // Columns: new_p = c col_p - s e col_q ; new_q = s col_p + c e col_q  (e = e^{-i phi}).
        for (let row = 0; row < 4; row++) {
          const ip = 2 * (4 * row + p);
          const iq = 2 * (4 * row + q);
          const pr = a[ip]!;
          const pi = a[ip + 1]!;
          const qr = er * a[iq]! - ei * a[iq + 1]!;
          const qi = er * a[iq + 1]! + ei * a[iq]!;
          a[ip] = c * pr - s * qr;
          a[ip + 1] = c * pi - s * qi;
          a[iq] = s * pr + c * qr;
          a[iq + 1] = s * pi + c * qi;
        }
        // Rows: the conjugate transform, new_p = c row_p - s conj(e) row_q, new_q = s row_p + c conj(e) row_q.
        for (let col = 0; col < 4; col++) {
          const ip = 2 * (4 * p + col);
          const iq = 2 * (4 * q + col);
          const pr = a[ip]!;
          const pi = a[ip + 1]!;
          const qr = er * a[iq]! + ei * a[iq + 1]!;
          const qi = er * a[iq + 1]! - ei * a[iq]!;
          a[ip] = c * pr - s * qr;
          a[ip + 1] = c * pi - s * qi;
          a[iq] = s * pr + c * qr;
          a[iq + 1] = s * pi + c * qi;
        }
        a[ipq] = 0;
        a[ipq + 1] = 0;
        a[2 * (4 * q + p)] = 0;
        a[2 * (4 * q + p) + 1] = 0;
        a[2 * (5 * p) + 1] = 0;
        a[2 * (5 * q) + 1] = 0;
        for (let row = 0; row < 4; row++) {
          const ip = 8 * p + 2 * row;
          const iq = 8 * q + 2 * row;
          const pr = vectors[ip]!;
          const pi = vectors[ip + 1]!;
          const qr = er * vectors[iq]! - ei * vectors[iq + 1]!;
          const qi = er * vectors[iq + 1]! + ei * vectors[iq]!;
          vectors[ip] = c * pr - s * qr;
          vectors[ip + 1] = c * pi - s * qi;
          vectors[iq] = s * pr + c * qr;
          vectors[iq + 1] = s * pi + c * qi;
        }
      }
    }
  }
  for (let k = 0; k < 4; k++) values[k] = a[2 * (5 * k)]! * largest;
  sortFrameByValues(values, vectors, 4);
}

/** Insertion sort of n values ascending, carrying frame vectors (8 numbers each) along. */
function sortFrameByValues(values: Float64Array, vectors: Float64Array, n: number): void {
  for (let i = 1; i < n; i++) {
    for (let j = i; j > 0 && values[j - 1]! > values[j]!; j--) {
      const t = values[j]!;
      values[j] = values[j - 1]!;
      values[j - 1] = t;
      for (let m = 0; m < 8; m++) {
        const u = vectors[8 * j + m]!;
        vectors[8 * j + m] = vectors[8 * (j - 1) + m]!;
        vectors[8 * (j - 1) + m] = u;
      }
    }
  }
}

/**
 * Eigen-decomposition of a real symmetric n x n matrix by cyclic Jacobi rotations
 * (Golub and Van Loan, section 8.5). `a` is overwritten. Eigenvalues ascending into `values`;
 * eigenvector k is column k of `vectors` (row-major n x n).
 */
export function symmetricEigen(
  a: Float64Array,
  n: number,
  values: Float64Array,
  vectors: Float64Array,
): void {
  vectors.fill(0, 0, n * n);
  for (let k = 0; k < n; k++) vectors[k * n + k] = 1;
  let largest = 0;
  for (let i = 0; i < n * n; i++) largest = Math.max(largest, Math.abs(a[i]!));
  if (largest === 0 || !Number.isFinite(largest)) largest = 1;
  for (let i = 0; i < n * n; i++) a[i] = a[i]! / largest;
  let total = 0;
  for (let i = 0; i < n * n; i++) total += a[i]! * a[i]!;
  const threshold = total * 1e-30;
  for (let sweep = 0; sweep < JACOBI_MAX_SWEEPS; sweep++) {
    let off = 0;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) off += a[p * n + q]! * a[p * n + q]!;
    }
    if (off <= threshold) break;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = a[p * n + q]!;
        if (apq * apq <= threshold * 1e-6) continue;
        const tau = (a[q * n + q]! - a[p * n + p]!) / (2 * apq);
        const t = (tau >= 0 ? 1 : -1) / (Math.abs(tau) + Math.sqrt(1 + tau * tau));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k * n + p]!;
          const akq = a[k * n + q]!;
          a[k * n + p] = c * akp - s * akq;
          a[k * n + q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p * n + k]!;
          const aqk = a[q * n + k]!;
          a[p * n + k] = c * apk - s * aqk;
          a[q * n + k] = s * apk + c * aqk;
        }
        a[p * n + q] = 0;
        a[q * n + p] = 0;
        for (let k = 0; k < n; k++) {
          const vkp = vectors[k * n + p]!;
          const vkq = vectors[k * n + q]!;
          vectors[k * n + p] = c * vkp - s * vkq;
          vectors[k * n + q] = s * vkp + c * vkq;
        }
      }
    }
  }
  for (let k = 0; k < n; k++) values[k] = a[k * n + k]! * largest;
  // Selection sort of columns (n <= 8 here).
  for (let i = 0; i < n - 1; i++) {
    let m = i;
    for (let j = i + 1; j < n; j++) if (values[j]! < values[m]!) m = j;
    if (m !== i) {
      const t = values[i]!;
      values[i] = values[m]!;
      values[m] = t;
      for (let k = 0; k < n; k++) {
        const u = vectors[k * n + i]!;
        vectors[k * n + i] = vectors[k * n + m]!;
        vectors[k * n + m] = u;
      }
    }
  }
}

/**
 * Solves (A + shift I) x = b for symmetric A (n x n, row-major) by Cholesky factorisation into
 * `work` (n * n). Returns false, leaving x undefined, when a pivot falls at or below `minPivot`
 * (the shifted matrix is not safely positive definite).
 */
export function choleskySolve(
  a: Float64Array,
  n: number,
  shift: number,
  b: Float64Array,
  x: Float64Array,
  work: Float64Array,
  minPivot: number,
): boolean {
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = a[i * n + j]! + (i === j ? shift : 0);
      for (let k = 0; k < j; k++) sum -= work[i * n + k]! * work[j * n + k]!;
      if (i === j) {
        if (!(sum > minPivot)) return false;
        work[i * n + i] = Math.sqrt(sum);
      } else {
        work[i * n + j] = sum / work[j * n + j]!;
      }
    }
  }
  for (let i = 0; i < n; i++) {
    let sum = b[i]!;
    for (let k = 0; k < i; k++) sum -= work[i * n + k]! * x[k]!;
    x[i] = sum / work[i * n + i]!;
  }
  for (let i = n - 1; i >= 0; i--) {
    let sum = x[i]!;
    for (let k = i + 1; k < n; k++) sum -= work[k * n + i]! * x[k]!;
    x[i] = sum / work[i * n + i]!;
  }
  return true;
}

/** out vector k = M u_k for the first `count` vectors of a frame (M 4x4 complex, row-major). */
export function multiplyFrame(
  m: Float64Array,
  frame: Float64Array,
  count: number,
  out: Float64Array,
): Float64Array {
  for (let v = 0; v < count; v++) {
    for (let r = 0; r < 4; r++) {
      let sr = 0;
      let si = 0;
      for (let col = 0; col < 4; col++) {
        const mr = m[2 * (4 * r + col)]!;
        const mi = m[2 * (4 * r + col) + 1]!;
        const ur = frame[8 * v + 2 * col]!;
        const ui = frame[8 * v + 2 * col + 1]!;
        sr += mr * ur - mi * ui;
        si += mr * ui + mi * ur;
      }
      out[8 * v + 2 * r] = sr;
      out[8 * v + 2 * r + 1] = si;
    }
  }
  return out;
}

/**
 * Removes from the 4-vector at target[offset..offset + 8) its component along frame vector j
 * (assumed normalised): t <- t - <u_j, t> u_j.
 */
export function projectOut(
  frame: Float64Array,
  j: number,
  target: Float64Array,
  offset: number,
): void {
  const oj = 8 * j;
  let dr = 0;
  let di = 0;
  for (let r = 0; r < 8; r += 2) {
    // <u_j, t> = sum conj(u_j) t
    dr += frame[oj + r]! * target[offset + r]! + frame[oj + r + 1]! * target[offset + r + 1]!;
    di += frame[oj + r]! * target[offset + r + 1]! - frame[oj + r + 1]! * target[offset + r]!;
  }
  for (let r = 0; r < 8; r += 2) {
    const vr = frame[oj + r]!;
    const vi = frame[oj + r + 1]!;
    target[offset + r] = target[offset + r]! - (dr * vr - di * vi);
    target[offset + r + 1] = target[offset + r + 1]! - (dr * vi + di * vr);
  }
}

/**
 * Orthonormalises vectors 0..count-1 of a frame in place by modified Gram-Schmidt.
 * Returns the smallest norm met before normalisation (a measure of how independent they were).
 */
export function orthonormaliseFrame(frame: Float64Array, count: number): number {
  let smallest = Infinity;
  for (let k = 0; k < count; k++) {
    const ok = 8 * k;
    for (let j = 0; j < k; j++) projectOut(frame, j, frame, ok);
    let norm = 0;
    for (let r = 0; r < 8; r++) norm += frame[ok + r]! * frame[ok + r]!;
    norm = Math.sqrt(norm);
    if (norm < smallest) smallest = norm;
    const inv = norm > 0 ? 1 / norm : 0;
    for (let r = 0; r < 8; r++) frame[ok + r] = frame[ok + r]! * inv;
  }
  return smallest;
}

/**
 * Completes the first `count` orthonormal vectors of a frame to a unitary frame. The remaining
 * slots hold hints (for example the previous empty vectors); each is projected out of the span
 * so far and kept when it stays well independent, else a standard basis vector is used.
 */
export function completeFrame(frame: Float64Array, count: number, scratch: Float64Array): void {
  let filled = count;
  const candidates = 4 - count + 4;
  for (let c = 0; c < candidates && filled < 4; c++) {
    if (c < 4 - count) {
      for (let m = 0; m < 8; m++) scratch[m] = frame[8 * (count + c) + m]!;
    } else {
      scratch.fill(0, 0, 8);
      scratch[2 * (c - (4 - count))] = 1;
    }
    for (let j = 0; j < filled; j++) projectOut(frame, j, scratch, 0);
    let norm = 0;
    for (let r = 0; r < 8; r++) norm += scratch[r]! * scratch[r]!;
    norm = Math.sqrt(norm);
    if (norm < 0.3) continue;
    for (let r = 0; r < 8; r++) frame[8 * filled + r] = scratch[r]! / norm;
    filled++;
  }
  // One re-orthogonalisation pass keeps the frame unitary to rounding.
  orthonormaliseFrame(frame, 4);
}
