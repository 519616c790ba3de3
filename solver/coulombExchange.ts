import { scaledBesselI0 } from './besselI0';

/**
 * The exchange (ladder) kernel of the SU(4)-symmetric Coulomb interaction in the n = 0 level, at
 * wavevector q (in 1/l_B), in units of e^2 / (eps l_B) (public/notes.html#dispersion):
 *
 *   X_C(q) = integral d^2p / (2 pi)^2  V(p) exp(-p^2 / 2) exp(i p x q),
 *
 * the Fourier transform of V(p) |form factor|^2 at the separation q l_B^2 of the particle and the
 * hole. In real space it is the interaction averaged over a Gaussian of width l_B about that
 * separation, X(q) = integral_0^inf r dr V(r) exp(-(q - r)^2 / 2) [e^(-qr) I_0(qr)] (derived
 * here; the bracket is the angular average). For V(p) = 2 pi / p (V(r) = 1/r) this is
 * sqrt(pi/2) e^(-q^2/4) I_0(q^2/4) (C. Kallin and B. I. Halperin, Phys. Rev. B 30, 5655
 * (1984)); X_C(0) = sqrt(pi/2) is E_X. A metal gate at distance d (in l_B) screens
 * V(p) = 2 pi (1 - exp(-2 p d)) / p, that is V(r) = 1/r - 1/sqrt(r^2 + 4 d^2) (the image
 * charge), whose second part is integrated numerically.
 */
export function coulombExchange(q: number, gateDistance?: number): number {
  const bare = Math.sqrt(Math.PI / 2) * scaledBesselI0((q * q) / 4);
  return gateDistance === undefined ? bare : bare - imageExchange(q, gateDistance);
}

/**
 * E_X - X_C(q) in units of e^2 / (eps l_B): what the Coulomb interaction adds to a
 * particle-hole excitation of wavevector q over its q = 0 value; exactly 0 at q = 0.
 */
export function coulombExchangeLoss(q: number, gateDistance?: number): number {
  if (q === 0) return 0;
  const bare = Math.sqrt(Math.PI / 2) * (1 - scaledBesselI0((q * q) / 4));
  if (gateDistance === undefined) return bare;
  return bare - (imageExchange(0, gateDistance) - imageExchange(q, gateDistance));
}

/**
 * integral_0^inf r dr exp(-(q - r)^2 / 2) e^(-qr) I_0(qr) / sqrt(r^2 + 4 d^2): the image charge's
 * part of X(q), by tanh-sinh quadrature (H. Takahasi and M. Mori, Publ. RIMS Kyoto Univ. 9, 721
 * (1974)) over r in [max(0, q - 12), q + 12], outside which the Gaussian is below 1e-31; the
 * step is halved until two levels agree to 1e-15. At q = 0 it equals
 * sqrt(pi/2) exp(2 d^2) erfc(sqrt(2) d) (derived here), and 1 / (2d) for d >> 1.
 */
export function imageExchange(q: number, gateDistance: number): number {
  const fourD2 = 4 * gateDistance * gateDistance;
  const lo = Math.max(0, q - 12);
  const hi = q + 12;
  const half = (hi - lo) / 2;
  const mid = (hi + lo) / 2;
  const f = (r: number): number => {
    const g = q - r;
    return (r * Math.exp(-(g * g) / 2) * scaledBesselI0(q * r)) / Math.sqrt(r * r + fourD2);
  };
  // r = mid + half tanh(pi/2 sinh t); the weight decays double-exponentially in |t|.
  const term = (t: number): number => {
    const u = (Math.PI / 2) * Math.sinh(t);
    const c = Math.cosh(u);
    const w = ((Math.PI / 2) * Math.cosh(t)) / (c * c);
    if (w < 1e-300) return 0;
    return f(mid + half * Math.tanh(u)) * w * half;
  };
  const limit = 3.2;
  let h = 0.5;
  let sum = 0;
  for (let t = -limit; t <= limit + 1e-12; t += h) sum += term(t);
  let integral = sum * h;
  for (let level = 0; level < 10; level++) {
    h /= 2;
    for (let t = -limit + h; t < limit; t += 2 * h) sum += term(t);
    const next = sum * h;
    const done = Math.abs(next - integral) <= 1e-15 * Math.abs(next);
    integral = next;
    if (done && level >= 2) break;
  }
  return integral;
}
