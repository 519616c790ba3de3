/**
 * Eigenvalues of a small real n x n matrix (row-major), which may be complex: Householder
 * reduction to upper Hessenberg form, then the QR algorithm in complex arithmetic with Wilkinson
 * shifts, each step made of Givens rotations, deflating where a subdiagonal entry falls to
 * rounding (Golub and Van Loan, Matrix Computations, 4th ed., sections 7.4 and 7.5). Used where
 * no symmetric form exists: the linearised dynamics about a state that is not a minimum.
 * Returns the real and imaginary parts, in the order they deflate.
 */
export function eigenvaluesOfReal(a: ArrayLike<number>, n: number): { re: number[]; im: number[] } {
  const hr = Float64Array.from({ length: n * n }, (_, k) => a[k]!);
  const hi = new Float64Array(n * n);
  toHessenberg(hr, n);
  const re: number[] = [];
  const im: number[] = [];
  let norm = 0;
  for (let k = 0; k < n * n; k++) norm = Math.max(norm, Math.abs(hr[k]!));
  const eps = 2.220446049250313e-16;
  let last = n - 1;
  let iterations = 0;
  while (last >= 0) {
    // The lowest l whose subdiagonal entry is negligible, scanning up from the bottom.
    let l = last;
    while (l > 0) {
      const sub = Math.hypot(hr[l * n + l - 1]!, hi[l * n + l - 1]!);
      let diag =
        Math.hypot(hr[(l - 1) * n + l - 1]!, hi[(l - 1) * n + l - 1]!) +
        Math.hypot(hr[l * n + l]!, hi[l * n + l]!);
      if (diag === 0) diag = norm;
      if (sub <= eps * diag) {
        hr[l * n + l - 1] = 0;
        hi[l * n + l - 1] = 0;
        break;
      }
      l--;
    }
    if (l === last) {
      re.push(hr[last * n + last]!);
      im.push(hi[last * n + last]!);
      last--;
      iterations = 0;
      continue;
    }
    if (++iterations > 60 * n) throw new Error('eigenvalues: the QR iteration did not converge');
    const [mr, mi] = wilkinsonShift(hr, hi, n, last, iterations);
    qrStep(hr, hi, n, l, last, mr, mi);
  }
  return { re, im };
}

/** In place: H = Q^T A Q upper Hessenberg by Householder reflections (real arithmetic). */
function toHessenberg(a: Float64Array, n: number): void {
  const v = new Float64Array(n);
  for (let k = 0; k < n - 2; k++) {
    let norm = 0;
    for (let i = k + 1; i < n; i++) norm += a[i * n + k]! * a[i * n + k]!;
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const x0 = a[(k + 1) * n + k]!;
    const alpha = x0 >= 0 ? -norm : norm;
    v.fill(0);
    for (let i = k + 1; i < n; i++) v[i] = a[i * n + k]!;
    v[k + 1] = x0 - alpha;
    let vv = 0;
    for (let i = k + 1; i < n; i++) vv += v[i]! * v[i]!;
    if (vv === 0) continue;
    // A <- (I - 2 v v^T / v^T v) A (I - 2 v v^T / v^T v)
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let i = k + 1; i < n; i++) s += v[i]! * a[i * n + j]!;
      s = (2 * s) / vv;
      for (let i = k + 1; i < n; i++) a[i * n + j] = a[i * n + j]! - s * v[i]!;
    }
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = k + 1; j < n; j++) s += a[i * n + j]! * v[j]!;
      s = (2 * s) / vv;
      for (let j = k + 1; j < n; j++) a[i * n + j] = a[i * n + j]! - s * v[j]!;
    }
  }
}

/**
 * The eigenvalue of the trailing 2 x 2 block nearer its last diagonal entry; at the 10th and
 * 20th iteration without deflation, an exceptional shift breaks a possible cycle.
 */
function wilkinsonShift(
  hr: Float64Array,
  hi: Float64Array,
  n: number,
  m: number,
  iterations: number,
): [number, number] {
  const ar = hr[(m - 1) * n + m - 1]!;
  const ai = hi[(m - 1) * n + m - 1]!;
  const br = hr[(m - 1) * n + m]!;
  const bi = hi[(m - 1) * n + m]!;
  const cr = hr[m * n + m - 1]!;
  const ci = hi[m * n + m - 1]!;
  const dr = hr[m * n + m]!;
  const di = hi[m * n + m]!;
  if (iterations % 10 === 0) {
    return [dr + 0.75 * Math.hypot(cr, ci), di];
  }
  // mu = d + e -+ sqrt(e^2 + b c), e = (a - d) / 2, the root nearer d.
  const er = (ar - dr) / 2;
  const ei = (ai - di) / 2;
  const zr = er * er - ei * ei + (br * cr - bi * ci);
  const zi = 2 * er * ei + (br * ci + bi * cr);
  let [sr, si] = complexSqrt(zr, zi);
  // Choose the sign that makes e + s large, so that mu = d - b c / (e + s) is the nearer root.
  if (er * sr + ei * si < 0) {
    sr = -sr;
    si = -si;
  }
  const tr = er + sr;
  const ti = ei + si;
  const t2 = tr * tr + ti * ti;
  if (t2 === 0) return [dr, di];
  const bcr = br * cr - bi * ci;
  const bci = br * ci + bi * cr;
  // b c / t
  const qr = (bcr * tr + bci * ti) / t2;
  const qi = (bci * tr - bcr * ti) / t2;
  return [dr - qr, di - qi];
}

function complexSqrt(re: number, im: number): [number, number] {
  const r = Math.hypot(re, im);
  if (r === 0) return [0, 0];
  const sr = Math.sqrt((r + Math.abs(re)) / 2);
  if (re >= 0) return [sr, im / (2 * sr)];
  return [Math.abs(im) / (2 * sr), im >= 0 ? sr : -sr];
}

/**
 * One shifted QR step on rows and columns l..m of the Hessenberg matrix: H - mu = Q R by Givens
 * rotations G_k = [[c, s], [-conj(s), c]] (c real), then H <- R Q + mu.
 */
function qrStep(
  hr: Float64Array,
  hi: Float64Array,
  n: number,
  l: number,
  m: number,
  mr: number,
  mi: number,
): void {
  for (let k = l; k <= m; k++) {
    hr[k * n + k] = hr[k * n + k]! - mr;
    hi[k * n + k] = hi[k * n + k]! - mi;
  }
  const cs = new Float64Array(m - l);
  const snr = new Float64Array(m - l);
  const sni = new Float64Array(m - l);
  for (let k = l; k < m; k++) {
    const xr = hr[k * n + k]!;
    const xi = hi[k * n + k]!;
    const yr = hr[(k + 1) * n + k]!;
    const yi = hi[(k + 1) * n + k]!;
    const ax = Math.hypot(xr, xi);
    const norm = Math.hypot(ax, Math.hypot(yr, yi));
    let c: number;
    let sr: number;
    let si: number;
    if (norm === 0) {
      c = 1;
      sr = 0;
      si = 0;
    } else if (ax === 0) {
      c = 0;
      sr = 1;
      si = 0;
    } else {
      c = ax / norm;
      // s = (x / |x|) conj(y) / norm
      const ur = xr / ax;
      const ui = xi / ax;
      sr = (ur * yr + ui * yi) / norm;
      si = (ui * yr - ur * yi) / norm;
    }
    cs[k - l] = c;
    snr[k - l] = sr;
    sni[k - l] = si;
    for (let j = k; j <= m; j++) {
      const pr = hr[k * n + j]!;
      const pi = hi[k * n + j]!;
      const qr = hr[(k + 1) * n + j]!;
      const qi = hi[(k + 1) * n + j]!;
      // row k <- c p + s q ; row k+1 <- -conj(s) p + c q
      hr[k * n + j] = c * pr + (sr * qr - si * qi);
      hi[k * n + j] = c * pi + (sr * qi + si * qr);
      hr[(k + 1) * n + j] = -(sr * pr + si * pi) + c * qr;
      hi[(k + 1) * n + j] = -(sr * pi - si * pr) + c * qi;
    }
  }
  for (let k = l; k < m; k++) {
    const c = cs[k - l]!;
    const sr = snr[k - l]!;
    const si = sni[k - l]!;
    const top = Math.min(k + 2, m);
    for (let i = l; i <= top; i++) {
      const pr = hr[i * n + k]!;
      const pi = hi[i * n + k]!;
      const qr = hr[i * n + k + 1]!;
      const qi = hi[i * n + k + 1]!;
      // column k <- c p + conj(s) q ; column k+1 <- -s p + c q
      hr[i * n + k] = c * pr + (sr * qr + si * qi);
      hi[i * n + k] = c * pi + (sr * qi - si * qr);
      hr[i * n + k + 1] = -(sr * pr - si * pi) + c * qr;
      hi[i * n + k + 1] = -(sr * pi + si * pr) + c * qi;
    }
  }
  for (let k = l; k <= m; k++) {
    hr[k * n + k] = hr[k * n + k]! + mr;
    hi[k * n + k] = hi[k * n + k]! + mi;
  }
}
