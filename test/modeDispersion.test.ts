import cephes from 'cephes';
import * as mathjs from 'mathjs';
import { beforeAll, describe, expect, test } from 'vitest';
import {
  CHANNELS,
  FIT_WAVEVECTOR,
  ModelError,
  WavevectorHessian,
  channelChange,
  channelReading,
  collectiveModes,
  couplingsOf,
  coulombExchange,
  eigenvaluesOfReal,
  imageExchange,
  modeDispersion,
  parseModel,
  rangeCouplings,
  scaledBesselI0,
  seededRandom,
  solve,
  symmetricEigen,
  type Model,
  type RandomSource,
} from '../solver/index';
import { genericModel } from './fixtures';

const SQRT_HALF_PI = Math.sqrt(Math.PI / 2);
const Q_DEFAULT = Array.from({ length: 61 }, (_, n) => n / 10);

function dispersionOf(model: Model, q: readonly number[] = Q_DEFAULT, gateDistance?: number) {
  const r = solve(model);
  const coulomb = model.coulomb ?? 0;
  return {
    result: r,
    dispersion: modeDispersion(r.couplings, r.frame, { coulomb, q, gateDistance }),
  };
}

/** The smallest eigenvalue of K(q) at the state of `r`. */
function lowestCurvature(r: ReturnType<typeof solve>, coulomb: number, q: number): number {
  const hessian = new WavevectorHessian(r.couplings, r.frame, coulomb);
  const d = hessian.dimension;
  const values = new Float64Array(d);
  symmetricEigen(hessian.at(q), d, values, new Float64Array(d * d));
  return values[0]!;
}

describe('the scaled Bessel function e^-x I_0(x)', () => {
  // Independent of the series: (1/pi) int_0^pi exp(x (cos t - 1)) dt (Abramowitz and Stegun
  // 9.6.19), by the trapezoid rule, which converges geometrically for a periodic integrand.
  function byIntegral(x: number): number {
    const n = 4000;
    let sum = 0;
    for (let k = 0; k <= n; k++) {
      const w = k === 0 || k === n ? 0.5 : 1;
      sum += w * Math.exp(x * (Math.cos((Math.PI * k) / n) - 1));
    }
    return sum / n;
  }

  test.each([0, 1e-3, 0.25, 1, 2.5, 9, 23.9, 24.1, 60, 400])(
    'x = %s agrees with its integral representation to 1e-14',
    (x) => {
      expect(Math.abs(scaledBesselI0(x) - byIntegral(x))).toBeLessThan(1e-14);
    },
  );

  test('agrees with i0e of the Cephes library (npm cephes, a WebAssembly build of Cephes) to 4e-15 from x = 0 to 2e5', async () => {
    // Cephes i0e: Chebyshev expansions on [0, 8] and [8, inf) (S. L. Moshier, Methods and
    // Programs for Mathematical Functions (1989)), accurate to a few 1e-16 relative (from memory).
    await cephes.compiled;
    let worst = 0;
    for (let k = 0; k <= 4000; k++) {
      const x = k <= 2000 ? k * 0.01 : 20 * 1.0046 ** (k - 2000);
      worst = Math.max(worst, Math.abs(scaledBesselI0(x) / cephes.i0e(x) - 1));
    }
    // Measured: 1.8e-15 (near x = 22.7, where the series is summed furthest).
    expect(worst).toBeLessThan(4e-15);
    expect(cephes.i0e(0)).toBe(1);
  });
});

describe('spin waves of the SU(4) Coulomb ferromagnet (Kallin and Halperin, PRB 30, 5655 (1984); Bychkov, Iordanskii and Eliashberg, JETP Lett. 33, 143 (1981))', () => {
  // The closed form with I_0 from the Cephes library, not from the solver's besselI0.ts.
  beforeAll(async () => {
    await cephes.compiled;
  });
  const kallinHalperin = (zeeman: number, coulomb: number, q: number) =>
    zeeman + SQRT_HALF_PI * coulomb * (1 - cephes.i0e((q * q) / 4));

  test.each([
    [0.3, 1],
    [0.05, 2.5],
    [1.2, 0.4],
  ])(
    'nu = 0, E_Z = %s, e^2/(eps l_B) = %s: every branch is E_Z + E_X - X_C(q) to 1e-9',
    (ez, c) => {
      const { result, dispersion } = dispersionOf(
        parseModel({ filling: 0, channels: {}, zeeman: ez, coulomb: c }),
      );
      expect(result.phase).toBe('F');
      expect(dispersion.branches).toHaveLength(4);
      const scale = Math.max(ez, c);
      for (const branch of dispersion.branches) {
        branch.forEach((w, n) => {
          expect(Math.abs(w - kallinHalperin(ez, c, Q_DEFAULT[n]!))).toBeLessThan(1e-9 * scale);
        });
      }
      // Small q: 1 - e^-x I_0(x) = x - 3x^2/4 + ..., x = q^2/4, so rho = sqrt(pi/2) C / 4.
      for (const rho of dispersion.stiffness) {
        expect(Math.abs(rho! - (SQRT_HALF_PI * c) / 4)).toBeLessThan(1e-8 * c);
      }
      expect(dispersion.velocities).toEqual([null, null, null, null]);
      expect(dispersion.stable).toBe(true);
    },
  );

  test('nu = -1 (one filled flavour): two spin flips follow Kallin and Halperin, the valley flip starts at 0 (derived)', () => {
    const ez = 0.4;
    const c = 1.5;
    const { dispersion } = dispersionOf(
      parseModel({ filling: -1, channels: {}, zeeman: ez, coulomb: c }),
    );
    expect(dispersion.goldstone).toEqual([true, false, false]);
    Q_DEFAULT.forEach((q, n) => {
      expect(dispersion.branches[0]![n]).toBeCloseTo(kallinHalperin(0, c, q), 12);
      expect(dispersion.branches[1]![n]).toBeCloseTo(kallinHalperin(ez, c, q), 12);
      expect(dispersion.branches[2]![n]).toBeCloseTo(kallinHalperin(ez, c, q), 12);
    });
    // A valley ferromagnet with no anisotropy: a quadratic Goldstone branch, the same rho.
    expect(dispersion.velocities[0]).toBeNull();
    expect(dispersion.stiffness[0]).toBeCloseTo((SQRT_HALF_PI * c) / 4, 8);
  });

  test('E_Z = 0: the Goldstone branch is quadratic, omega = E_X - X_C(q), rho = sqrt(pi/2) C / 4', () => {
    const c = 2;
    const { dispersion } = dispersionOf(parseModel({ filling: 0, channels: {}, coulomb: c }));
    expect(dispersion.goldstone.every((g) => g)).toBe(true);
    for (const k of [0, 1, 2, 3]) {
      expect(dispersion.velocities[k]).toBeNull();
      expect(dispersion.stiffness[k]).toBeCloseTo((SQRT_HALF_PI * c) / 4, 8);
    }
  });
});

/** The standard contact model of public/notes.html#closed-forms, with a Coulomb scale. */
function standard(uPerp: number, uZ: number, zeeman: number, extra: object = {}): Model {
  return parseModel({
    filling: 0,
    channels: { x0: uPerp, y0: uPerp, z0: uZ },
    zeeman,
    coulomb: 3,
    ...extra,
  });
}

const REFERENCE_STATES: [string, Model][] = [
  ['F', standard(0.5, 1, 0.3)],
  ['CAF', standard(-1, 2, 0.4)],
  ['KD', standard(-1.5, -0.5, 0.1)],
  ['CDW', standard(1, -1.5, 0.1, { valleyZeeman: 0.2 })],
  ['AF', standard(0.2, 1.5, 0, { channels: { x0: 0.2, y0: 0.2, z0: 1.5, zz: -0.6 } })],
  [
    'nu = -1',
    parseModel({ filling: -1, channels: { x0: -0.6, z0: 0.4, zz: 0.3 }, zeeman: 0.2, coulomb: 2 }),
  ],
  [
    'nu = +1',
    parseModel({
      filling: 1,
      channels: { x0: { hartree: 0.5, fock: -0.4 }, z0: -0.3 },
      zeeman: 0.3,
      valleyZeeman: 0.1,
      coulomb: 2,
    }),
  ],
];

describe('q = 0 is the uniform modes; q -> infinity is the particle-hole continuum (derived in public/notes.html#dispersion)', () => {
  test.each(REFERENCE_STATES)('%s: q = 0 equals collectiveModes bit for bit', (_, model) => {
    const { result, dispersion } = dispersionOf(model);
    const direct = collectiveModes(result.couplings, result.frame);
    expect(dispersion.gaps).toEqual(direct.frequencies);
    expect(dispersion.branches.map((b) => b[0])).toEqual(direct.frequencies);
    expect(dispersion.goldstone.filter((g) => g)).toHaveLength(direct.goldstone);
    expect(dispersion.stable).toBe(true);
  });

  test('the reference states carry their labels', () => {
    const labels = REFERENCE_STATES.slice(0, 5).map(([, m]) => solve(m).phase);
    expect(labels).toEqual(['F', 'CAF', 'KD', 'CDW', 'AF']);
  });

  test.each(REFERENCE_STATES)(
    '%s: at large q each branch is eps_a - eps_i + E_X less the Coulomb binding C X_C(q)',
    (_, model) => {
      const q = [1e3, 1e4];
      const { result, dispersion } = dispersionOf(model, q);
      const c = model.coulomb!;
      expect(dispersion.exchange).toBeCloseTo(SQRT_HALF_PI * c, 14);
      // Particle-hole energies with E_X: the quasiparticle gap is the lowest of them.
      const levels = solve({ ...model, exchange: dispersion.exchange });
      expect(dispersion.particleHole[0]).toBeCloseTo(levels.gap, 10);
      expect(result.gap + dispersion.exchange).toBeCloseTo(dispersion.particleHole[0]!, 10);
      q.forEach((qq, n) => {
        // X_C(q) ~ 1/q (Abramowitz and Stegun 9.7.1); the anisotropic kernels are gone.
        expect(Math.abs(coulombExchange(qq) * qq - 1)).toBeLessThan(1 / (qq * qq));
        dispersion.branches.forEach((branch, b) => {
          const limit = dispersion.particleHole[b]! - c * coulombExchange(qq);
          expect(Math.abs(branch[n]! - limit)).toBeLessThan(1e-10 * c);
        });
      });
    },
  );
});

describe('Goldstone and Larmor theorems', () => {
  test.each(REFERENCE_STATES)('%s: every Goldstone branch starts at 0 and rises', (_, model) => {
    const { dispersion } = dispersionOf(model);
    dispersion.goldstone.forEach((g, b) => {
      if (!g) return;
      expect(dispersion.branches[b]![0]).toBeLessThan(1e-6);
      expect(dispersion.branches[b]![1]).toBeGreaterThan(dispersion.branches[b]![0]!);
      // Linear or quadratic, never both, never neither.
      expect((dispersion.velocities[b] === null) !== (dispersion.stiffness[b] === null)).toBe(true);
    });
  });

  test('CAF: the Goldstone branch rotates the spin about the field and is linear, omega ~ v q', () => {
    const { dispersion } = dispersionOf(standard(-1, 2, 0.4));
    expect(dispersion.goldstone).toEqual([true, false, false, false]);
    expect(dispersion.rotates[0]![0]).toBe('spinAlongField');
    const v = dispersion.velocities[0]!;
    expect(v).toBeGreaterThan(0);
    // The fit's limit agrees with the slope at small q, computed on its own.
    const h = 1e-4;
    const d2 = dispersionOf(standard(-1, 2, 0.4), [h]).dispersion;
    expect(Math.abs(d2.branches[0]![0]! / h - v)).toBeLessThan(1e-6 * v);
  });

  test('Larmor: with only the spin-invariant channels x0, y0, z0, the spin flips of F start at E_Z', () => {
    const ez = 0.35;
    const { dispersion } = dispersionOf(standard(0.5, 1, ez));
    // The flip of the total spin (both valleys in phase) is protected; the others are not.
    const flips = dispersion.gaps.flatMap((w, b) => (Math.abs(w - ez) < 1e-12 ? [b] : []));
    expect(flips.length).toBeGreaterThanOrEqual(1);
    expect(flips.map((b) => dispersion.rotates[b]![1])).toContain('spinInPlane');
    // With the Coulomb exchange the spin wave rises from there.
    for (const b of flips) expect(dispersion.stiffness[b]).toBeGreaterThan(0);
  });

  test('Larmor on the CAF (x0, y0, z0 only, E_Z = 0.4): the in-plane spin precesses at E_Z exactly; the rotation about the field, which the field leaves a symmetry, is the Goldstone branch (Larmor theorem, common practice)', () => {
    const ez = 0.4;
    const { dispersion } = dispersionOf(standard(-1, 2, ez));
    expect(dispersion.gaps[0]).toBeLessThan(1e-9);
    expect(dispersion.rotates[0]![1]).toBe('spinAlongField');
    const larmor = dispersion.gaps.findIndex((w) => Math.abs(w - ez) < 1e-12);
    expect(larmor).toBe(1);
    expect(dispersion.rotates[larmor]![1]).toBe('spinInPlane');
    expect(dispersion.branches[larmor]![1]).toBeGreaterThan(ez);
  });

  test('the fit wavevector is small enough that the q^4 term is below 1e-9 of the stiffness', () => {
    expect(FIT_WAVEVECTOR ** 2).toBeLessThan(1e-5);
  });
});

describe('channels at finite q (public/notes.html#dispersion)', () => {
  test('a contact channel (H = F): D(q) = H e^-q^2/2 and X(q) = F e^-q^2/2', () => {
    for (const q of [0.3, 1, 2.5]) {
      const { direct, exchange } = channelChange(0.7, 0.7, q);
      expect(direct + 0.7).toBeCloseTo(0.7 * Math.exp((-q * q) / 2), 14);
      expect(exchange + 0.7).toBeCloseTo(0.7 * Math.exp((-q * q) / 2), 14);
    }
  });

  test('the Gaussian reading has the range of public/notes.html#interaction-range and its own D(q), X(q)', () => {
    const a = 1.7;
    const { hartree, fock } = rangeCouplings('gaussian', 2 * Math.PI, a);
    const reading = channelReading(hartree, fock);
    expect(reading.kind).toBe('gaussian');
    expect(reading.kind === 'gaussian' && reading.rangeSquared).toBeCloseTo(a * a, 12);
    // X(q) by quadrature of the real-space form X = int r dr V(r) e^-(q-r)^2/2 e^-qr I_0(qr),
    // V(r) = exp(-r^2 / 2a^2) / a^2 for v(p) = 2 pi exp(-p^2 a^2 / 2); D = v(q) e^-q^2/2 / 2 pi.
    for (const q of [0.5, 1.5, 3]) {
      const { direct, exchange } = channelChange(hartree, fock, q);
      expect(direct + hartree).toBeCloseTo(Math.exp((-q * q * (a * a + 1)) / 2), 12);
      const n = 20000;
      const top = q + 14;
      // Simpson's rule (the integrand vanishes at r = 0 and beyond q + 14).
      let integral = 0;
      for (let k = 1; k < n; k++) {
        const r = (top * k) / n;
        const weight = k % 2 === 1 ? 4 : 2;
        integral +=
          weight *
          r *
          (Math.exp((-r * r) / (2 * a * a)) / (a * a)) *
          Math.exp(-((q - r) ** 2) / 2) *
          scaledBesselI0(q * r);
      }
      integral *= top / n / 3;
      expect(exchange + fock).toBeCloseTo(integral, 9);
    }
  });

  test.each([
    [0.4, 0.9, 'F/H > 1'],
    [0.5, -0.3, 'opposite signs'],
    [0, 0.6, 'no direct part'],
    [0.8, 0, 'no exchange part'],
  ])(
    'H = %s, F = %s (%s): contact plus a Gaussian of range l_B, exact at q = 0, gone at large q',
    (h, f) => {
      const reading = channelReading(h, f);
      expect(reading.kind).toBe('contactPlusGaussian');
      if (reading.kind !== 'contactPlusGaussian') return;
      expect(reading.contact + reading.gaussian).toBeCloseTo(h, 15);
      expect(reading.contact + reading.gaussian / 2).toBeCloseTo(f, 15);
      expect(channelChange(h, f, 0)).toEqual({ direct: 0, exchange: 0 });
      const far = channelChange(h, f, 40);
      expect(far.direct).toBeCloseTo(-h, 15);
      expect(far.exchange).toBeCloseTo(-f, 15);
    },
  );

  test('the two readings meet at F = H (continuity)', () => {
    const below = channelChange(1, 1 - 1e-9, 1.2);
    const above = channelChange(1, 1 + 1e-9, 1.2);
    expect(Math.abs(below.direct - above.direct)).toBeLessThan(1e-8);
    expect(Math.abs(below.exchange - above.exchange)).toBeLessThan(1e-8);
  });
});

describe('gate screening', () => {
  test.each([0.3, 1, 1.5])(
    'd = %s l_B: the image part at q = 0 is sqrt(pi/2) e^(2d^2) erfc(sqrt2 d) (derived; erf from mathjs)',
    (d) => {
      const closed = SQRT_HALF_PI * Math.exp(2 * d * d) * (1 - mathjs.erf(Math.SQRT2 * d));
      expect(imageExchange(0, d)).toBeCloseTo(closed, 12);
    },
  );

  test('a far gate subtracts 1/(2d); a near one screens almost everything', () => {
    expect(imageExchange(0.7, 200) * 400).toBeCloseTo(1, 4);
    expect(coulombExchange(0, 1e-3)).toBeLessThan(3e-3);
    expect(coulombExchange(1, 1)).toBeLessThan(coulombExchange(1));
  });

  test('with a gate, q = 0 is unchanged and the branches follow E_Z + E_X(d) - X_C(q; d)', () => {
    const ez = 0.2;
    const d = 1.5;
    const { dispersion, result } = dispersionOf(
      parseModel({ filling: 0, channels: {}, zeeman: ez, coulomb: 1 }),
      Q_DEFAULT,
      d,
    );
    expect(dispersion.gaps).toEqual(collectiveModes(result.couplings, result.frame).frequencies);
    Q_DEFAULT.forEach((q, n) => {
      const expected = ez + coulombExchange(0, d) - coulombExchange(q, d);
      for (const branch of dispersion.branches) expect(branch[n]).toBeCloseTo(expected, 12);
    });
  });
});

describe('symplectic structure and stability', () => {
  test('frequencies come in +- pairs: (1/2) J K(q) has eigenvalues -+i omega of the stable form', () => {
    const model = standard(-1, 2, 0.4);
    const r = solve(model);
    const hessian = new WavevectorHessian(r.couplings, r.frame, 3);
    const { dispersion } = dispersionOf(model, [0.7, 2]);
    [0.7, 2].forEach((q, n) => {
      const k = hessian.at(q);
      const d = hessian.dimension;
      const jk = new Float64Array(d * d);
      for (let p = 0; p < d; p += 2) {
        for (let s = 0; s < d; s++) {
          jk[p * d + s] = 0.5 * k[(p + 1) * d + s]!;
          jk[(p + 1) * d + s] = -0.5 * k[p * d + s]!;
        }
      }
      const { re, im } = eigenvaluesOfReal(jk, d);
      for (const x of re) expect(Math.abs(x)).toBeLessThan(1e-9);
      const positive = im.filter((y) => y > 0).sort((a, b) => a - b);
      const negative = im
        .filter((y) => y < 0)
        .map((y) => -y)
        .sort((a, b) => a - b);
      const branches = dispersion.branches.map((b) => b[n]!);
      positive.forEach((y, j) => expect(y).toBeCloseTo(branches[j]!, 9));
      negative.forEach((y, j) => expect(y).toBeCloseTo(branches[j]!, 9));
    });
  });

  test('general eigenvalues: a matrix of known complex spectrum', () => {
    // Block diag([[1, -2], [2, 1]], [[3]], [[0, 1], [-4, 0]]) turned by a fixed orthogonal
    // similarity: eigenvalues 1 +- 2i, 3, +-2i.
    const n = 5;
    const block = new Float64Array(n * n);
    block.set([1, -2, 0, 0, 0, 2, 1, 0, 0, 0, 0, 0, 3, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0, -4, 0]);
    const random = seededRandom(3);
    // Q from Gram-Schmidt of a random matrix.
    const q: number[][] = [];
    for (let i = 0; i < n; i++) {
      const v = Array.from({ length: n }, () => random() - 0.5);
      for (const u of q) {
        const p = v.reduce((s, x, k) => s + x * u[k]!, 0);
        for (let k = 0; k < n; k++) v[k] = v[k]! - p * u[k]!;
      }
      const norm = Math.hypot(...v);
      q.push(v.map((x) => x / norm));
    }
    const a = new Float64Array(n * n);
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let k = 0; k < n; k++)
          for (let l = 0; l < n; l++) s += q[k]![i]! * block[k * n + l]! * q[l]![j]!;
        a[i * n + j] = s;
      }
    const { re, im } = eigenvaluesOfReal(a, n);
    const found = re.map((x, k) => [x, im[k]!] as const).sort((u, v) => u[0] - v[0] || u[1] - v[1]);
    const expected = [
      [0, -2],
      [0, 2],
      [1, -2],
      [1, 2],
      [3, 0],
    ];
    found.forEach(([x, y], k) => {
      expect(x).toBeCloseTo(expected[k]![0]!, 12);
      expect(y).toBeCloseTo(expected[k]![1]!, 12);
    });
  });

  function contactModel(random: RandomSource, filling: -1 | 0 | 1): Model {
    const channels: Record<string, number> = {};
    for (const ch of CHANNELS) channels[ch] = 2 * random() - 1;
    return parseModel({
      filling,
      channels,
      zeeman: 0.6 * random(),
      valleyZeeman: 0.3 * (2 * random() - 1),
      coulomb: 10 * random(),
    });
  }

  test('150 seeded contact models (H = F) with a Coulomb scale: wherever the global minimum obeys Aufbau, no imaginary frequency and no unstable modulation at any q (derived: K(q) = e^-q^2/2 K(0) + (1 - e^-q^2/2) K_ph + 2C [X_C(0) - X_C(q)])', () => {
    const random = seededRandom(150);
    let aufbau = 0;
    for (let k = 0; k < 150; k++) {
      const model = contactModel(random, ([-1, 0, 1] as const)[k % 3]!);
      const { result, dispersion } = dispersionOf(model);
      if (!result.aufbau) continue;
      aufbau++;
      expect(dispersion.stable).toBe(true);
      for (const g of dispersion.growth) expect(Math.max(...g)).toBe(0);
    }
    // The set is not empty of what it tests: most models here obey Aufbau.
    expect(aufbau).toBeGreaterThan(60);
  });

  test.each([3, 10])(
    'the 150-model property set of test/minimiser.test.ts (genericModel, seed 7) with e^2/(eps l_B) = %s: no imaginary frequency and no unstable modulation at the global minimum, q from 0 to 6 / l_B (derived: K(q) positive semidefinite)',
    (coulomb) => {
      const random = seededRandom(7);
      let count = 0;
      for (let n = 0; n < 150; n++) {
        const base = genericModel(random, ([-1, 0, 1] as const)[n % 3]!);
        const { dispersion } = dispersionOf({ ...base, coulomb });
        expect(dispersion.unstableAt).toEqual([]);
        expect(dispersion.stable).toBe(true);
        for (const g of dispersion.growth) expect(Math.max(...g)).toBe(0);
        count++;
      }
      expect(count).toBe(150);
      // Measured on this set: with e^2/(eps l_B) = 1, as large as the couplings, 3 of the 150
      // minima (none obeying Aufbau) are unstable to a modulation and 2 of them show a growth
      // rate; with 0, 7 and 6. They are reported (next test), not hidden.
    },
  );

  test('150 seeded generic models (genericModel, H and F independent) with a Coulomb scale: q = 0 is always stable, and an imaginary frequency appears only where a modulation lowers the energy', () => {
    const random = seededRandom(1984);
    let unstable = 0;
    for (let k = 0; k < 150; k++) {
      const base = genericModel(random, ([-1, 0, 1] as const)[k % 3]!);
      const model: Model = { ...base, coulomb: 10 };
      const { result, dispersion } = dispersionOf(
        model,
        Q_DEFAULT.filter((_, n) => n % 3 === 0),
      );
      expect(dispersion.growth.every((g) => g[0] === 0)).toBe(true);
      dispersion.q.forEach((q, n) => {
        const grows = dispersion.growth.some((g) => g[n]! > 0);
        if (grows) expect(lowestCurvature(result, 10, q)).toBeLessThan(0);
        expect(dispersion.unstableAt.includes(q)).toBe(lowestCurvature(result, 10, q) < -1e-9);
      });
      if (!dispersion.stable) unstable++;
    }
    // Measured: one of these minima (a state that does not obey Aufbau) is unstable to
    // modulations at q of 0.2 to 0.4 / l_B, through a channel whose direct part is far
    // longer-ranged than its exchange part (F/H << 1).
    expect(unstable).toBe(1);
  });

  test('a saddle point reports its instability as a growth rate, not a frequency', () => {
    // Kekule order along x0 where y0 binds more strongly: rotating towards y0 lowers the
    // energy, the conjugate rotation towards z0 (CDW) raises it, so omega^2 < 0.
    const model = parseModel({ filling: 0, channels: { x0: -1, y0: -1.5, z0: 2 }, coulomb: 5 });
    const s = Math.SQRT1_2;
    const frame = new Float64Array(32);
    frame.set([s, 0, 0, 0, s, 0, 0, 0], 0);
    frame.set([0, 0, s, 0, 0, 0, s, 0], 8);
    frame.set([s, 0, 0, 0, -s, 0, 0, 0], 16);
    frame.set([0, 0, s, 0, 0, 0, -s, 0], 24);
    const c = couplingsOf(model);
    const d = modeDispersion(c, frame, { coulomb: 5, q: [0, 0.5] });
    expect(d.stable).toBe(false);
    expect(d.unstableAt).toContain(0);
    expect(Math.max(...d.growth.map((g) => g[0]!))).toBeGreaterThan(1);
    expect(d.velocities.every((v) => v === null)).toBe(true);
  });
});

describe('the model field coulomb', () => {
  test('accepted when finite and >= 0, kept by parseModel', () => {
    expect(parseModel({ filling: 0, coulomb: 2.5 }).coulomb).toBe(2.5);
    expect(parseModel({ filling: 0, coulomb: 0 }).coulomb).toBe(0);
    expect(parseModel({ filling: 0 }).coulomb).toBeUndefined();
  });

  test.each([
    [-1, 'coulomb'],
    ['2', 'coulomb'],
    [null, 'coulomb'],
  ])('%s is refused in one line naming the field', (value, field) => {
    try {
      parseModel({ filling: 0, coulomb: value });
      throw new Error('accepted');
    } catch (error) {
      expect(error).toBeInstanceOf(ModelError);
      expect((error as Error).message).toContain(field);
      expect((error as Error).message).not.toContain('\n');
    }
  });
});
