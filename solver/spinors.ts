import { hermitianEigen4, multiplyFrame, orthonormaliseFrame } from './linalg';

/**
 * The occupied spinors of a state in a canonical gauge: eigenvectors of H_HF inside the occupied
 * subspace, ascending in level; within a degenerate cluster the basis is put in reduced row
 * echelon form and re-orthonormalised (unique for the subspace); each spinor's phase makes its
 * largest component real and positive (lowest index among near-ties).
 *
 * Returns nf vectors (8 numbers each, re/im interleaved) and their levels.
 */
export function occupiedSpinors(
  frame: Float64Array,
  nf: number,
  hamiltonian: Float64Array,
  scale: number,
): { spinors: Float64Array; levels: number[] } {
  // M_oo = U_occ^dagger H U_occ, padded to 4x4 with a large diagonal so padding sorts last.
  const m = new Float64Array(32);
  const hu = multiplyFrame(hamiltonian, frame, nf, new Float64Array(32));
  let pad = 0;
  for (let i = 0; i < 32; i++) pad = Math.max(pad, Math.abs(hamiltonian[i]!));
  pad = 10 * pad + 1;
  for (let j = 0; j < nf; j++) {
    for (let i = 0; i < nf; i++) {
      let sr = 0;
      let si = 0;
      for (let r = 0; r < 8; r += 2) {
        const ur = frame[8 * i + r]!;
        const ui = frame[8 * i + r + 1]!;
        sr += ur * hu[8 * j + r]! + ui * hu[8 * j + r + 1]!;
        si += ur * hu[8 * j + r + 1]! - ui * hu[8 * j + r]!;
      }
      m[2 * (4 * i + j)] = sr;
      m[2 * (4 * i + j) + 1] = si;
    }
  }
  for (let i = nf; i < 4; i++) m[10 * i] = pad;
  const values = new Float64Array(4);
  const vectors = new Float64Array(32);
  hermitianEigen4(m, values, vectors);
  const spinors = new Float64Array(8 * nf);
  for (let k = 0; k < nf; k++) {
    for (let r = 0; r < 4; r++) {
      let sr = 0;
      let si = 0;
      for (let j = 0; j < nf; j++) {
        const cr = vectors[8 * k + 2 * j]!;
        const ci = vectors[8 * k + 2 * j + 1]!;
        const ur = frame[8 * j + 2 * r]!;
        const ui = frame[8 * j + 2 * r + 1]!;
        sr += ur * cr - ui * ci;
        si += ur * ci + ui * cr;
      }
      spinors[8 * k + 2 * r] = sr;
      spinors[8 * k + 2 * r + 1] = si;
    }
  }
  const levels = Array.from(values.subarray(0, nf));
  let start = 0;
  while (start < nf) {
    let end = start + 1;
    while (end < nf && levels[end]! - levels[end - 1]! <= 1e-9 * scale) end++;
    if (end - start > 1) echelonCluster(spinors, start, end);
    start = end;
  }
  for (let k = 0; k < nf; k++) fixPhase(spinors, k);
  return { spinors, levels };
}

/** Reduced row echelon form of vectors start..end-1 (as rows), then Gram-Schmidt. */
function echelonCluster(v: Float64Array, start: number, end: number): void {
  let row = start;
  for (let col = 0; col < 4 && row < end; col++) {
    let pivot = -1;
    let best = 1e-6;
    for (let k = row; k < end; k++) {
      const mag = Math.hypot(v[8 * k + 2 * col]!, v[8 * k + 2 * col + 1]!);
      if (mag > best + 1e-9) {
        best = mag;
        pivot = k;
      }
    }
    if (pivot < 0) continue;
    if (pivot !== row) {
      for (let m = 0; m < 8; m++) {
        const t = v[8 * row + m]!;
        v[8 * row + m] = v[8 * pivot + m]!;
        v[8 * pivot + m] = t;
      }
    }
    // Normalise the pivot to 1, eliminate the column from the other rows of the cluster.
    const pr = v[8 * row + 2 * col]!;
    const pi = v[8 * row + 2 * col + 1]!;
    const den = pr * pr + pi * pi;
    for (let r = 0; r < 4; r++) {
      const xr = v[8 * row + 2 * r]!;
      const xi = v[8 * row + 2 * r + 1]!;
      v[8 * row + 2 * r] = (xr * pr + xi * pi) / den;
      v[8 * row + 2 * r + 1] = (xi * pr - xr * pi) / den;
    }
    for (let k = start; k < end; k++) {
      if (k === row) continue;
      const fr = v[8 * k + 2 * col]!;
      const fi = v[8 * k + 2 * col + 1]!;
      for (let r = 0; r < 4; r++) {
        const xr = v[8 * row + 2 * r]!;
        const xi = v[8 * row + 2 * r + 1]!;
        v[8 * k + 2 * r] = v[8 * k + 2 * r]! - (fr * xr - fi * xi);
        v[8 * k + 2 * r + 1] = v[8 * k + 2 * r + 1]! - (fr * xi + fi * xr);
      }
    }
    row++;
  }
  // Gram-Schmidt in order keeps the echelon shape.
  orthonormaliseFrame(v.subarray(8 * start, 8 * end), end - start);
}

function fixPhase(v: Float64Array, k: number): void {
  let best = -1;
  let mag = 0;
  for (let r = 0; r < 4; r++) {
    const m = Math.hypot(v[8 * k + 2 * r]!, v[8 * k + 2 * r + 1]!);
    if (m > mag + 1e-9) {
      mag = m;
      best = r;
    }
  }
  if (best < 0) return;
  const pr = v[8 * k + 2 * best]! / mag;
  const pi = -v[8 * k + 2 * best + 1]! / mag;
  for (let r = 0; r < 4; r++) {
    const xr = v[8 * k + 2 * r]!;
    const xi = v[8 * k + 2 * r + 1]!;
    v[8 * k + 2 * r] = xr * pr - xi * pi;
    v[8 * k + 2 * r + 1] = xr * pi + xi * pr;
  }
  v[8 * k + 2 * best + 1] = 0;
}
