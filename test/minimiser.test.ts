import { describe, expect, test } from 'vitest';
import { genericModel } from './fixtures';
import {
  CHANNELS,
  DEFAULT_DESCENT,
  DescentWorkspace,
  couplingsOf,
  descend,
  frameEnergy,
  hartreeFockOfOrder,
  hermitianEigen4,
  orderOfProjector,
  parseModel,
  projectorOf,
  randomFrame,
  seededRandom,
  solve,
  solveResultToJson,
  type Couplings,
  type Model,
  type RandomSource,
} from '../solver/index';

/** Brute force: the best of `starts` Haar-random projectors, each polished by local descent. */
function bruteForce(c: Couplings, starts: number, random: RandomSource): number {
  const ws = new DescentWorkspace();
  let best = Infinity;
  for (let k = 0; k < starts; k++) {
    const frame = randomFrame(random);
    best = Math.min(best, descend(c, frame, DEFAULT_DESCENT, ws).energy);
  }
  return best;
}

/** Dense 4x4 complex G_ab = tau_a (x) sigma_b, valley first (public/notes.html#basis), built here. */
function pauliProduct(a: number, b: number): Float64Array {
  const pauli: [number, number][][][] = [
    [
      [
        [1, 0],
        [0, 0],
      ],
      [
        [0, 0],
        [1, 0],
      ],
    ],
    [
      [
        [0, 0],
        [1, 0],
      ],
      [
        [1, 0],
        [0, 0],
      ],
    ],
    [
      [
        [0, 0],
        [0, -1],
      ],
      [
        [0, 1],
        [0, 0],
      ],
    ],
    [
      [
        [1, 0],
        [0, 0],
      ],
      [
        [0, 0],
        [-1, 0],
      ],
    ],
  ];
  // pauli[letter][row][col] = [re, im]
  const out = new Float64Array(32);
  for (let v = 0; v < 2; v++)
    for (let s = 0; s < 2; s++)
      for (let w = 0; w < 2; w++)
        for (let t = 0; t < 2; t++) {
          const [ar, ai] = pauli[a]![v]![w]!;
          const [br, bi] = pauli[b]![s]![t]!;
          const idx = 2 * (4 * (2 * v + s) + (2 * w + t));
          out[idx] = ar * br - ai * bi;
          out[idx + 1] = ar * bi + ai * br;
        }
  return out;
}

function trace(m: Float64Array): number {
  return m[0]! + m[10]! + m[20]! + m[30]!;
}

/** E[P] straight from public/notes.html#energy, with dense matrices (independent of the solver). */
function denseEnergy(model: Model, p: Float64Array): number {
  const letters = '0xyz';
  let energy =
    (-model.zeeman / 2) * trace(matrixProduct(pauliProduct(0, 3), p)) -
    (model.valleyZeeman / 2) * trace(matrixProduct(pauliProduct(3, 0), p));
  for (const [name, coupling] of Object.entries(model.channels)) {
    const g = pauliProduct(letters.indexOf(name[0]!), letters.indexOf(name[1]!));
    const gp = matrixProduct(g, p);
    energy +=
      0.5 * (coupling.hartree * trace(gp) ** 2 - coupling.fock * trace(matrixProduct(gp, gp)));
  }
  return energy;
}

function matrixProduct(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(32);
  for (let r = 0; r < 4; r++) {
    for (let c = 0; c < 4; c++) {
      let re = 0;
      let im = 0;
      for (let m = 0; m < 4; m++) {
        const ar = a[2 * (4 * r + m)]!;
        const ai = a[2 * (4 * r + m) + 1]!;
        const br = b[2 * (4 * m + c)]!;
        const bi = b[2 * (4 * m + c) + 1]!;
        re += ar * br - ai * bi;
        im += ar * bi + ai * br;
      }
      out[2 * (4 * r + c)] = re;
      out[2 * (4 * r + c) + 1] = im;
    }
  }
  return out;
}

function maxAbsDifference(a: Float64Array, b: Float64Array): number {
  let worst = 0;
  for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i]! - b[i]!));
  return worst;
}

describe('energy functional', () => {
  test('diagonal form in the order parameters equals the matrix form of public/notes.html#energy', () => {
    const random = seededRandom(11);
    const ws = new DescentWorkspace();
    for (let n = 0; n < 60; n++) {
      const model = genericModel(random, ([-1, 0, 1] as const)[n % 3]);
      const c = couplingsOf(model);
      const frame = randomFrame(random);
      const p = projectorOf(frame, c.nf, new Float64Array(32));
      expect(frameEnergy(c, frame, ws, new Float64Array(16))).toBeCloseTo(
        denseEnergy(model, p),
        12,
      );
    }
  });

  test('a descent never raises the energy (beyond rounding)', () => {
    const random = seededRandom(12);
    const ws = new DescentWorkspace();
    for (let n = 0; n < 40; n++) {
      const c = couplingsOf(genericModel(random, ([-1, 0, 1] as const)[n % 3]));
      const frame = randomFrame(random);
      const before = frameEnergy(c, frame, ws, new Float64Array(16));
      let previous = before;
      for (let step = 0; step < 6; step++) {
        const r = descend(c, frame, { ...DEFAULT_DESCENT, maxIterations: 1 }, ws);
        expect(r.energy).toBeLessThanOrEqual(previous + 1e-11 * c.scale);
        previous = r.energy;
      }
    }
  });
});

describe('global minimiser', () => {
  test('on 600 seeded generic models (all channels, nu = -1, 0, +1, H != F) it is never above the best of 64 random projectors polished by local descent', () => {
    const random = seededRandom(2026);
    let worst = -Infinity;
    for (let n = 0; n < 600; n++) {
      const model = genericModel(random, ([-1, 0, 1] as const)[n % 3]);
      const c = couplingsOf(model);
      const ours = solve(model).energy;
      const reference = bruteForce(c, 64, seededRandom(90000 + n));
      worst = Math.max(worst, (ours - reference) / c.scale);
    }
    expect(worst).toBeLessThanOrEqual(1e-10);
  });

  test('with strong fields (E_Z up to 3, |Delta_V| up to 1) on 300 generic models at nu = 0 it is never above the best of 64 polished random projectors', () => {
    // Strong one-body terms favour canted states that no symmetric seed sits near: with four
    // ranked seeds instead of six, this family showed misses of up to 7 percent of the scale.
    const random = seededRandom(777);
    let worst = -Infinity;
    for (let n = 0; n < 300; n++) {
      const model = genericModel(random, 0, 3, 1);
      const c = couplingsOf(model);
      const reference = bruteForce(c, 64, seededRandom(70000 + n));
      worst = Math.max(worst, (solve(model).energy - reference) / c.scale);
    }
    expect(worst).toBeLessThanOrEqual(1e-10);
  });

  test('returned states are projectors of rank Nf, self-consistent, and pass the swap test of a global minimum', () => {
    const random = seededRandom(7);
    let aufbauChecked = 0;
    for (let n = 0; n < 150; n++) {
      const model = genericModel(random, ([-1, 0, 1] as const)[n % 3]);
      const r = solve(model);
      const c = r.couplings;
      const p = r.projector;
      expect(maxAbsDifference(matrixProduct(p, p), p)).toBeLessThan(1e-12); // P^2 = P
      expect(p[0]! + p[10]! + p[20]! + p[30]!).toBeCloseTo(c.nf, 12); // tr P = Nf
      expect(r.commutator).toBeLessThan(1e-9 * c.scale); // [H_HF, P] = 0
      // Moving one electron from occupied level i to empty level a changes the energy by
      // eps_a - eps_i + 1/2 sum_k kappa_k (tr G_k (|a><a| - |i><i|))^2 (derived from the energy,
      // public/notes.html#energy): at a global minimum that is never negative. When every
      // kappa_k <= 0 this forces the Aufbau principle; with Hartree-dominated channels Aufbau may
      // fail and the gap is < 0.
      const h = hartreeFockOfOrder(c, r.order, new Float64Array(32));
      const values = new Float64Array(4);
      const vectors = new Float64Array(32);
      hermitianEigen4(Float64Array.from(h), values, vectors);
      const weights = [0, 1, 2, 3].map((k) => {
        const one = new Float64Array(32);
        one.set(vectors.subarray(8 * k, 8 * k + 8), 0);
        const pk = projectorOf(one, 1, new Float64Array(32));
        let w = 0;
        for (let i = 0; i < 32; i += 2) w += pk[i]! * p[i]! + pk[i + 1]! * p[i + 1]!;
        return { k, w, order: orderOfProjector(pk, new Float64Array(16)) };
      });
      const occupied = weights.filter((x) => x.w > 0.5);
      const empty = weights.filter((x) => x.w <= 0.5);
      expect(occupied.length).toBe(c.nf);
      for (const i of occupied) {
        for (const a of empty) {
          let interaction = 0;
          for (let k = 1; k < 16; k++)
            interaction += 0.5 * c.kappa[k]! * (a.order[k]! - i.order[k]!) ** 2;
          expect(values[a.k]! - values[i.k]! + interaction).toBeGreaterThanOrEqual(-1e-9 * c.scale);
        }
      }
      if (c.kappa.every((k) => k <= 0)) {
        aufbauChecked++;
        expect(r.aufbau).toBe(true);
        expect(r.gap).toBeGreaterThanOrEqual(-1e-9 * c.scale);
      }
    }
    // Exchange-dominated models where Aufbau is a theorem, checked above.
    const exchangeDominated = seededRandom(8);
    for (let n = 0; n < 60; n++) {
      const channels: Record<string, { hartree: number; fock: number }> = {};
      // F = f in all 15 channels gives sum_cd F_cd s(cd, ab) = -f (7 commuting, 8 anticommuting
      // partners), so kappa_ab = H_ab + f/4: any H_ab <= -f/4 makes every kappa <= 0.
      const f = exchangeDominated();
      for (const ch of CHANNELS) channels[ch] = { hartree: -f / 4 - exchangeDominated(), fock: f };
      const model = parseModel({
        filling: ([-1, 0, 1] as const)[n % 3],
        channels,
        zeeman: exchangeDominated(),
        valleyZeeman: exchangeDominated() - 0.5,
      });
      const c = couplingsOf(model);
      if (!c.kappa.every((k) => k <= 0)) continue;
      aufbauChecked++;
      expect(solve(model).aufbau).toBe(true);
    }
    expect(aufbauChecked).toBeGreaterThan(20);
  });

  test('order parameters are gauge invariant: a unitary rotation among occupied spinors leaves them unchanged', () => {
    const random = seededRandom(5);
    for (let n = 0; n < 30; n++) {
      const r = solve(genericModel(random, ([-1, 0, 1] as const)[n % 3]));
      const nf = r.couplings.nf;
      const rotation = randomFrame(random); // use its first nf x nf block, re-orthonormalised
      const mixed = new Float64Array(32);
      for (let k = 0; k < nf; k++) {
        for (let j = 0; j < nf; j++) {
          const cr = rotation[8 * k + 2 * j]!;
          const ci = rotation[8 * k + 2 * j + 1]!;
          for (let m = 0; m < 4; m++) {
            const ur = r.frame[8 * j + 2 * m]!;
            const ui = r.frame[8 * j + 2 * m + 1]!;
            mixed[8 * k + 2 * m] = mixed[8 * k + 2 * m]! + cr * ur - ci * ui;
            mixed[8 * k + 2 * m + 1] = mixed[8 * k + 2 * m + 1]! + cr * ui + ci * ur;
          }
        }
      }
      // Re-orthonormalising keeps the span: the projector, hence every o_ab, must not move.
      const q = projectorOf(orthonormalised(mixed, nf), nf, new Float64Array(32));
      const order = orderOfProjector(q, new Float64Array(16));
      expect(maxAbsDifference(order, r.order)).toBeLessThan(1e-12);
      // The canonical spinors span the same space.
      const fromSpinors = projectorOf(padded(r.spinors), nf, new Float64Array(32));
      expect(maxAbsDifference(fromSpinors, r.projector)).toBeLessThan(1e-12);
    }
  });

  test('deterministic: the same model gives the same result, bit for bit', () => {
    const random = seededRandom(99);
    for (let n = 0; n < 10; n++) {
      const model = genericModel(random, ([-1, 0, 1] as const)[n % 3]);
      expect(JSON.stringify(solveResultToJson(solve(model)))).toBe(
        JSON.stringify(solveResultToJson(solve(model))),
      );
    }
  });
});

function orthonormalised(frame: Float64Array, count: number): Float64Array {
  const out = Float64Array.from(frame);
  for (let k = 0; k < count; k++) {
    for (let j = 0; j < k; j++) {
      let dr = 0;
      let di = 0;
      for (let r = 0; r < 8; r += 2) {
        dr += out[8 * j + r]! * out[8 * k + r]! + out[8 * j + r + 1]! * out[8 * k + r + 1]!;
        di += out[8 * j + r]! * out[8 * k + r + 1]! - out[8 * j + r + 1]! * out[8 * k + r]!;
      }
      for (let r = 0; r < 8; r += 2) {
        const vr = out[8 * j + r]!;
        const vi = out[8 * j + r + 1]!;
        out[8 * k + r] = out[8 * k + r]! - (dr * vr - di * vi);
        out[8 * k + r + 1] = out[8 * k + r + 1]! - (dr * vi + di * vr);
      }
    }
    let norm = 0;
    for (let r = 0; r < 8; r++) norm += out[8 * k + r]! ** 2;
    for (let r = 0; r < 8; r++) out[8 * k + r] = out[8 * k + r]! / Math.sqrt(norm);
  }
  return out;
}

function padded(spinors: Float64Array): Float64Array {
  const out = new Float64Array(32);
  out.set(spinors);
  return out;
}
