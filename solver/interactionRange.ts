/**
 * Hartree and Fock couplings of one channel from an interaction v(q) (model.md section 9):
 * with the n = 0 form factor exp(-q^2 l^2 / 4),
 *   H = v(0) / (2 pi l^2),   F = (1 / 2 pi) integral_0^inf q dq v(q) exp(-q^2 l^2 / 2).
 * Lengths in units of the magnetic length l (l = 1); `strength` is g in v(q).
 */
export type RangeProfile = 'contact' | 'gaussian' | 'screened';

/**
 * Exponential integral E1(x), x > 0: power series for x <= 1, continued fraction beyond
 * (Abramowitz and Stegun, Handbook of Mathematical Functions, 5.1.11 and 5.1.22).
 */
export function exponentialIntegralE1(x: number): number {
  if (!(x > 0)) return x === 0 ? Infinity : NaN;
  if (x <= 1) {
    const euler = 0.5772156649015329;
    let sum = 0;
    let term = 1;
    for (let k = 1; k < 60; k++) {
      term *= -x / k;
      const add = -term / k;
      sum += add;
      if (Math.abs(add) < 1e-17 * Math.abs(sum)) break;
    }
    return -euler - Math.log(x) + sum;
  }
  // Modified Lentz evaluation of the continued fraction e^-x / (x + 1/(1 + 1/(x + 2/(1 + ...)))).
  let b = x + 1;
  let c = 1 / 1e-300;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 500; i++) {
    const a = -i * i;
    b += 2;
    d = 1 / (a * d + b);
    c = b + a / c;
    const delta = c * d;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return h * Math.exp(-x);
}

/** H and F of a profile with range `a` (in units of l) and strength g. */
export function rangeCouplings(
  profile: RangeProfile,
  strength: number,
  range: number,
): { hartree: number; fock: number } {
  const hartree = strength / (2 * Math.PI);
  if (profile === 'contact' || range === 0) return { hartree, fock: hartree };
  if (profile === 'gaussian') {
    // v = g exp(-q^2 a^2 / 2): F / H = 1 / (1 + a^2).
    return { hartree, fock: hartree / (1 + range * range) };
  }
  // v = g / (1 + q^2 a^2): F = g / (2 pi) (1 / (2 a^2)) exp(x) E1(x), x = 1 / (2 a^2).
  const x = 1 / (2 * range * range);
  const scaled = x > 700 ? asymptoticExpE1(x) : Math.exp(x) * exponentialIntegralE1(x);
  return { hartree, fock: (strength / (2 * Math.PI)) * x * scaled };
}

/** e^x E1(x) for large x: 1/x (1 - 1/x + 2/x^2 - 6/x^3 + ...) (Abramowitz and Stegun 5.1.51). */
function asymptoticExpE1(x: number): number {
  let sum = 1;
  let term = 1;
  for (let k = 1; k < 12; k++) {
    term *= -k / x;
    sum += term;
  }
  return sum / x;
}
