/**
 * The exponentially scaled modified Bessel function e^(-x) I_0(x), x >= 0, to full double
 * precision: the power series I_0(x) = sum_k (x/2)^(2k) / (k!)^2 (all terms positive, so no
 * cancellation) up to x = 24, and beyond it the asymptotic expansion
 * e^(-x) I_0(x) ~ (2 pi x)^(-1/2) sum_k ((2k - 1)!!)^2 / (k! (8x)^k), summed while its terms
 * fall (Abramowitz and Stegun, Handbook of Mathematical Functions, 9.6.10 and 9.7.1); at
 * x >= 24 the smallest term is far below 1e-16 of the sum.
 */
export function scaledBesselI0(x: number): number {
  if (!(x >= 0)) return Number.NaN;
  if (x <= 24) {
    const quarter = (x * x) / 4;
    let term = 1;
    let sum = 1;
    for (let k = 1; k < 200; k++) {
      term *= quarter / (k * k);
      sum += term;
      if (term < 1e-17 * sum) break;
    }
    return sum * Math.exp(-x);
  }
  let term = 1;
  let sum = 1;
  for (let k = 1; k < 60; k++) {
    const next = (term * (2 * k - 1) * (2 * k - 1)) / (k * 8 * x);
    if (next >= term) break;
    term = next;
    sum += term;
    if (term < 1e-17 * sum) break;
  }
  return sum / Math.sqrt(2 * Math.PI * x);
}
