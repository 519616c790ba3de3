import { describe, expect, test } from 'vitest';
import {
  exchangeIntegral,
  exponentialIntegralE1,
  interactionOf,
  magneticLength,
  rangeCouplings,
  rangeCouplingsMeV,
  scaledExponentialIntegral,
} from '../solver/index';

describe('exponential integral E1 (Abramowitz and Stegun, Handbook of Mathematical Functions, ch. 5)', () => {
  // Table 5.1 values, from memory; they agree to 10 digits with an independent
  // arbitrary-precision evaluation (mpmath e1).
  test('E1(x) for x <= 2 and E1(x) + ln x near 0 (Table 5.1, from memory)', () => {
    const e1: [number, number][] = [
      [0.1, 1.8229239584],
      [0.5, 0.5597735948],
      [1, 0.2193839344],
      [2, 0.0489005107],
    ];
    for (const [x, value] of e1) expect(exponentialIntegralE1(x) / value).toBeCloseTo(1, 9);
    const plusLog: [number, number][] = [
      [0.01, -0.5672406094],
      [0.1, -0.4796611346],
      [0.5, -0.1333735858],
    ];
    for (const [x, value] of plusLog) {
      expect(exponentialIntegralE1(x) + Math.log(x)).toBeCloseTo(value, 9);
    }
  });

  test('x e^x E1(x) for x >= 1, the form the table uses at large x (Table 5.1, from memory)', () => {
    const table: [number, number][] = [
      [1, 0.5963473623],
      [2, 0.7226572338],
      [5, 0.8521108814],
      [10, 0.9156333394],
      [20, 0.9543709099],
    ];
    for (const [x, value] of table) {
      expect(x * scaledExponentialIntegral(x)).toBeCloseTo(value, 9);
      expect(x * Math.exp(x) * exponentialIntegralE1(x)).toBeCloseTo(value, 9);
    }
  });

  test('series and continued fraction meet at x = 1, and the asymptotic series 5.1.51 holds at large x', () => {
    const below = exponentialIntegralE1(1 - 1e-12);
    const above = exponentialIntegralE1(1 + 1e-12);
    expect(Math.abs(below - above)).toBeLessThan(1e-12);
    // e^x E1(x) ~ (1/x)(1 - 1/x + 2/x^2 - 6/x^3 + 24/x^4), error below the next term 120/x^6.
    const x = 400;
    const series = (1 - 1 / x + 2 / x ** 2 - 6 / x ** 3 + 24 / x ** 4) / x;
    expect(Math.abs(scaledExponentialIntegral(x) - series)).toBeLessThan(120 / x ** 6);
  });
});

describe('range-derived couplings: quadrature against the closed forms of public/notes.html#interaction-range (derived there)', () => {
  const ranges = [0.01, 0.2, 0.7, 1, 1.5, 4, 30, 1000];

  test('Gaussian: H = g / 2 pi and F / H = 1 / (1 + a^2 / l^2)', () => {
    for (const g of [1.7, -0.4]) {
      for (const a of ranges) {
        const c = rangeCouplings('gaussian', g, a);
        expect(c.hartree).toBeCloseTo(g / (2 * Math.PI), 14);
        expect(c.fock / c.hartree / (1 / (1 + a * a))).toBeCloseTo(1, 13);
      }
    }
  });

  test('screened 1/(1 + q^2 a^2): F = g/(2 pi) (1/(2 a^2)) exp(x) E1(x), x = l^2 / (2 a^2)', () => {
    const g = 2.3;
    for (const a of ranges) {
      const x = 1 / (2 * a * a);
      const closed = (g / (2 * Math.PI)) * x * scaledExponentialIntegral(x);
      expect(rangeCouplings('screened', g, a).fock / closed).toBeCloseTo(1, 13);
      expect(rangeCouplings('screened', g, a).hartree).toBeCloseTo(g / (2 * Math.PI), 14);
    }
  });

  test('contact: H = F, and every profile tends to contact as a -> 0', () => {
    for (const a of ranges) {
      const c = rangeCouplings('contact', 1.3, a);
      expect(c.fock / c.hartree).toBeCloseTo(1, 14);
    }
    for (const profile of ['gaussian', 'screened'] as const) {
      const c = rangeCouplings(profile, 1, 1e-4);
      expect(c.fock / c.hartree).toBeCloseTo(1, 6);
    }
  });

  test('the quadrature is the integral itself: a profile with no closed form here against a fine midpoint sum', () => {
    // v(q) = exp(-q a) (invented for this test): (1/2 pi) int q e^{-q a} e^{-q^2/2} dq.
    const a = 0.8;
    const v = (q: number) => Math.exp(-q * a);
    const midpoint = (n: number) => {
      let sum = 0;
      const qMax = 20;
      for (let k = 0; k < n; k++) {
        const q = ((k + 0.5) * qMax) / n;
        sum += q * v(q) * Math.exp((-q * q) / 2) * (qMax / n);
      }
      return sum;
    };
    // Richardson: the midpoint rule's h^2 error term cancels.
    const reference = (4 * midpoint(200000) - midpoint(100000)) / 3;
    expect(exchangeIntegral(v) / (reference / (2 * Math.PI))).toBeCloseTo(1, 11);
    expect(interactionOf('screened', 2, 0.5)(2)).toBeCloseTo(1, 14);
  });

  test('in meV: H = g / (2 pi l_B^2) grows as B_perp; F / H falls with B_perp for a fixed range in nm', () => {
    const g = 400; // meV nm^2, invented
    const a = 10; // nm
    const lNm = (b: number) => magneticLength(b) * 1e9;
    let last = Infinity;
    for (const b of [1, 4, 9, 16, 30]) {
      const c = rangeCouplingsMeV('gaussian', g, a, b);
      expect(c.hartree / (g / (2 * Math.PI * lNm(b) ** 2))).toBeCloseTo(1, 13);
      const ratio = c.fock / c.hartree;
      expect(ratio / (1 / (1 + (a / lNm(b)) ** 2))).toBeCloseTo(1, 13);
      expect(ratio).toBeLessThan(last);
      last = ratio;
    }
  });
});
