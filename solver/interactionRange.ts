import { magneticLength } from './units';

/**
 * Hartree and Fock couplings of one channel from an interaction v(q)
 * (public/notes.html#interaction-range): with the n = 0 form factor exp(-q^2 l^2 / 4),
 *   H = v(0) / (2 pi l^2),   F = (1 / 2 pi) integral_0^inf q dq v(q) exp(-q^2 l^2 / 2).
 * F is computed by numerical quadrature for every profile; the closed forms of the notes are
 * the tests' reference, not the code path.
 */
export type RangeProfile = 'contact' | 'gaussian' | 'screened';

export const RANGE_PROFILES: readonly RangeProfile[] = ['gaussian', 'screened', 'contact'];

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
  return Math.exp(-x) * continuedFraction(x);
}

/** e^x E1(x), x > 0, without overflow for large x (the continued fraction of A&S 5.1.22). */
export function scaledExponentialIntegral(x: number): number {
  if (!(x > 0)) return x === 0 ? Infinity : NaN;
  return x <= 1 ? Math.exp(x) * exponentialIntegralE1(x) : continuedFraction(x);
}

/** Modified Lentz evaluation of 1 / (x + 1 / (1 + 1 / (x + 2 / (1 + ...)))), x > 1. */
function continuedFraction(x: number): number {
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
  return h;
}

/**
 * The interaction v(q) of a profile, lengths in units of l (q in 1/l, range a in l):
 * contact g; Gaussian g exp(-q^2 a^2 / 2); screened g / (1 + q^2 a^2).
 */
export function interactionOf(
  profile: RangeProfile,
  strength: number,
  range: number,
): (q: number) => number {
  if (profile === 'contact') return () => strength;
  const a2 = range * range;
  if (profile === 'gaussian') return (q) => strength * Math.exp((-q * q * a2) / 2);
  return (q) => strength / (1 + q * q * a2);
}

/**
 * (1 / 2 pi) integral_0^inf q dq v(q) exp(-q^2 / 2) (l = 1) by exp-sinh quadrature in
 * s = q^2 / 2, where the integral reads (1 / 2 pi) integral_0^inf v(sqrt(2 s)) e^-s ds
 * (H. Takahasi and M. Mori, Publ. RIMS Kyoto Univ. 9, 721 (1974): s = exp(pi/2 sinh t), a
 * trapezoid rule in t, step halved until two levels agree to 1e-15). The substitution spreads
 * every scale of s over t evenly, so a range far longer or shorter than l costs nothing extra.
 */
export function exchangeIntegral(v: (q: number) => number): number {
  const term = (t: number): number => {
    const s = Math.exp((Math.PI / 2) * Math.sinh(t));
    if (s === 0 || s > 800) return 0;
    return v(Math.sqrt(2 * s)) * Math.exp(-s) * s * (Math.PI / 2) * Math.cosh(t);
  };
  // exp(pi/2 sinh t) is below 1e-300 for t < -6.2 and e^-s vanishes for t > 3.3.
  const low = -6.5;
  const high = 3.5;
  let h = 0.5;
  let sum = 0;
  for (let t = low; t <= high + 1e-12; t += h) sum += term(t);
  let integral = sum * h;
  for (let level = 0; level < 12; level++) {
    h /= 2;
    for (let t = low + h; t < high; t += 2 * h) sum += term(t);
    const next = sum * h;
    const done = Math.abs(next - integral) <= 1e-15 * Math.abs(next);
    integral = next;
    if (done && level >= 2) break;
  }
  return integral / (2 * Math.PI);
}

/**
 * H and F of a profile with range `a` (in units of l) and strength g (dimensionless units:
 * H = g / 2 pi). F by quadrature (exchangeIntegral).
 */
export function rangeCouplings(
  profile: RangeProfile,
  strength: number,
  range: number,
): { hartree: number; fock: number } {
  const v = interactionOf(profile, strength, range);
  return { hartree: v(0) / (2 * Math.PI), fock: exchangeIntegral(v) };
}

/**
 * H and F in meV at perpendicular field `bPerpTesla`, for an interaction of strength g in
 * meV nm^2 (v(0) = g) and range a in nm: H = g / (2 pi l_B^2), F from the same quadrature with
 * a / l_B. Both grow with B_perp; F / H depends on B_perp through a / l_B.
 */
export function rangeCouplingsMeV(
  profile: RangeProfile,
  strengthMeVnm2: number,
  rangeNm: number,
  bPerpTesla: number,
): { hartree: number; fock: number } {
  const lNm = magneticLength(bPerpTesla) * 1e9;
  return rangeCouplings(profile, strengthMeVnm2 / (lNm * lNm), rangeNm / lNm);
}
