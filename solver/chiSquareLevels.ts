/**
 * Probability that a normal variable lies within 2 standard deviations, erf(sqrt(2)) (a
 * standard value; Abramowitz and Stegun, Handbook of Mathematical Functions, table 26.1).
 */
export const TWO_SIGMA_LEVEL = 0.9544997361036416;

/**
 * The rise of chi^2 above its minimum that bounds a likelihood region of probability `level`
 * for `m` fitted parameters (Wilks: Delta chi^2 follows the chi^2 distribution with m degrees
 * of freedom; W. H. Press et al., Numerical Recipes, 3rd ed., section 15.6.5): 4 for one
 * parameter at 2 sigma, 6.18 for two, 8.02 for three. Solved here from the distribution's
 * closed forms for m = 1, 2, 3 (Abramowitz and Stegun 26.4.4, 26.4.5).
 */
export function chiSquareRise(m: number, level = TWO_SIGMA_LEVEL): number {
  if (m <= 0) return 0;
  if (m === 2) return -2 * Math.log(1 - level);
  const cdf = (x: number): number => {
    const s = Math.sqrt(x / 2);
    return m === 1 ? erf(s) : erf(s) - Math.sqrt((2 * x) / Math.PI) * Math.exp(-x / 2);
  };
  if (m > 3) throw new Error(`chiSquareRise: ${m} parameters (at most 3)`);
  let lo = 0;
  let hi = 50;
  for (let k = 0; k < 200; k++) {
    const mid = (lo + hi) / 2;
    if (cdf(mid) < level) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * The error function to about 1e-15 relative (series below 3, continued fraction above;
 * Abramowitz and Stegun 7.1.5 and 7.1.14).
 */
export function erf(x: number): number {
  const a = Math.abs(x);
  let value: number;
  if (a < 3) {
    // erf x = 2/sqrt(pi) sum (-1)^n x^(2n+1) / (n! (2n+1))
    let term = a;
    let sum = a;
    for (let n = 1; n < 200; n++) {
      term *= (-a * a) / n;
      const next = term / (2 * n + 1);
      sum += next;
      if (Math.abs(next) < 1e-17 * Math.abs(sum)) break;
    }
    value = (2 / Math.sqrt(Math.PI)) * sum;
  } else {
    // erfc x = exp(-x^2)/sqrt(pi) * 1/(x + 1/2/(x + 1/(x + 3/2/(x + ...))))
    let f = a;
    for (let n = 60; n >= 1; n--) f = a + n / 2 / f;
    value = 1 - Math.exp(-a * a) / Math.sqrt(Math.PI) / f;
  }
  return x < 0 ? -value : value;
}
