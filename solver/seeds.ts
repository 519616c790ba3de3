import { COMMUTATION_SIGN, MATRIX_COUNT, denseMatrix, productIndex } from './channels';
import { hermitianEigen4, multiplyFrame, orthonormaliseFrame } from './linalg';
import { retract } from './tangentSpace';
import { gaussian, seededRandom, type RandomSource } from './random';
import { orderOfProjector, projectorOf } from './state';

/**
 * Starting states for the global search. Every seed is model independent, so its order
 * parameters are computed once and a model only needs a dot product to rank it.
 *
 * - Stabiliser states: joint eigenstates of a maximal set of three commuting G's, filled with any
 *   Nf of the four joint eigenvectors. They contain the F, CDW, KD and AF states of
 *   public/notes.html#closed-forms and their rotations into the other channels.
 * - Canted states: the CAF family at several canting angles and valley spinors tilted between
 *   the poles (KD towards CDW), the continuous families of the closed forms.
 * - Random states: Haar-random frames from a fixed seed.
 */
export interface Seed {
  /** Frame to descend from (structured seeds nudged off their symmetric point). */
  readonly frame: Float64Array;
  /**
   * Order parameters of the frame, used to rank seeds. (Ranking the nudged frames rather than
   * the exact symmetric states missed fewer global minima in a 6000-model stress test.)
   */
  readonly order: Float64Array;
  /** The un-nudged frame of a structured seed (its exact symmetric state). */
  readonly exact?: Float64Array;
  /**
   * Order parameters of the exact state (of the frame itself for random seeds). Ranking by these
   * lets a weak field choose among states that the couplings leave degenerate: the nudge alone
   * moves a seed's energy by about 4e-4 of the coupling scale.
   */
  readonly exactOrder: Float64Array;
  readonly kind: 'stabiliser' | 'rotated' | 'canted' | 'random';
}

const RANDOM_SEEDS = 64;
const LIBRARY_SEED = 0x5eed4;
const NUDGE = 0.02;

/** A Haar-random unitary frame (QR of a complex Gaussian matrix). */
export function randomFrame(random: RandomSource): Float64Array {
  const frame = new Float64Array(32);
  for (let i = 0; i < 32; i++) frame[i] = gaussian(random);
  orthonormaliseFrame(frame, 4);
  return frame;
}

function seedOf(frame: Float64Array, nf: number, kind: Seed['kind']): Seed {
  const p = projectorOf(frame, nf, new Float64Array(32));
  const order = orderOfProjector(p, new Float64Array(MATRIX_COUNT));
  return { frame, order, exactOrder: order, kind };
}

function combinations(n: number, k: number): number[][] {
  if (k === 0) return [[]];
  const out: number[][] = [];
  for (let first = 0; first <= n - k; first++) {
    for (const rest of combinations(n - first - 1, k - 1)) {
      out.push([first, ...rest.map((r) => r + first + 1)]);
    }
  }
  return out;
}

function stabiliserSeeds(nf: number): Seed[] {
  const sets = new Set<string>();
  const seeds: Seed[] = [];
  for (let g1 = 1; g1 < MATRIX_COUNT; g1++) {
    for (let g2 = g1 + 1; g2 < MATRIX_COUNT; g2++) {
      if (COMMUTATION_SIGN[16 * g1 + g2] !== 1) continue;
      const g3 = productIndex(g1, g2);
      const key = [g1, g2, g3].sort((a, b) => a - b).join(',');
      if (sets.has(key)) continue;
      sets.add(key);
      const a = denseMatrix(g1);
      const b = denseMatrix(g2);
      for (let i = 0; i < 32; i++) a[i] = a[i]! + 2 * b[i]!;
      const values = new Float64Array(4);
      const basis = new Float64Array(32);
      hermitianEigen4(a, values, basis);
      for (const chosen of combinations(4, nf)) {
        const frame = new Float64Array(32);
        const order = [...chosen, ...[0, 1, 2, 3].filter((v) => !chosen.includes(v))];
        order.forEach((v, slot) => frame.set(basis.subarray(8 * v, 8 * v + 8), 8 * slot));
        seeds.push(seedOf(frame, nf, 'stabiliser'));
      }
    }
  }
  return seeds;
}

/**
 * Stabiliser states turned by exp(-i (theta / 2) G_k) for every matrix G_k and theta = +-pi/4:
 * canted states halfway between a stabiliser state and its image under a quarter turn, such
 * as a ferromagnet tilted 45 degrees off the field towards an in-plane moment or towards spin
 * bond order. Strong fields favour such canted states.
 */
function rotatedSeeds(stabiliser: readonly Seed[], nf: number): Seed[] {
  const out: Seed[] = [];
  const cos = Math.cos(Math.PI / 8);
  for (const seed of stabiliser) {
    for (let k = 1; k < MATRIX_COUNT; k++) {
      const gu = multiplyFrame(denseMatrix(k), seed.frame, 4, new Float64Array(32));
      for (const sign of [1, -1]) {
        // u' = cos u - i sin G u
        const sin = sign * Math.sin(Math.PI / 8);
        const frame = new Float64Array(32);
        for (let q = 0; q < 32; q += 2) {
          frame[q] = cos * seed.frame[q]! + sin * gu[q + 1]!;
          frame[q + 1] = cos * seed.frame[q + 1]! - sin * gu[q]!;
        }
        out.push(seedOf(frame, nf, 'rotated'));
      }
    }
  }
  return out;
}

/** Spinor chi (x) xi with valley Bloch angles (beta, phiV) and spin angles (theta, phiS). */
function productSpinor(beta: number, phiV: number, theta: number, phiS: number): number[] {
  const v = [
    Math.cos(beta / 2),
    0,
    Math.sin(beta / 2) * Math.cos(phiV),
    Math.sin(beta / 2) * Math.sin(phiV),
  ];
  const s = [
    Math.cos(theta / 2),
    0,
    Math.sin(theta / 2) * Math.cos(phiS),
    Math.sin(theta / 2) * Math.sin(phiS),
  ];
  const out: number[] = [];
  for (let iv = 0; iv < 2; iv++) {
    for (let is = 0; is < 2; is++) {
      const ar = v[2 * iv]!;
      const ai = v[2 * iv + 1]!;
      const br = s[2 * is]!;
      const bi = s[2 * is + 1]!;
      out.push(ar * br - ai * bi, ar * bi + ai * br);
    }
  }
  return out;
}

function frameFromSpinors(spinors: number[][], random: RandomSource): Float64Array {
  const frame = randomFrame(random);
  spinors.forEach((s, k) => frame.set(s, 8 * k));
  orthonormaliseFrame(frame, 4);
  return frame;
}

function cantedSeeds(nf: number, random: RandomSource): Seed[] {
  const seeds: Seed[] = [];
  const angles = [0.35, 0.8, 1.2];
  for (const theta of angles) {
    if (nf === 2) {
      // CAF: spin on A (valley K) and on B (valley K') at +-theta from the field.
      seeds.push(
        seedOf(
          frameFromSpinors(
            [productSpinor(0, 0, theta, 0), productSpinor(Math.PI, 0, theta, Math.PI)],
            random,
          ),
          nf,
          'canted',
        ),
      );
      // Valley spinor tilted from the pole towards the bond-ordered equator, both spins filled.
      seeds.push(
        seedOf(
          frameFromSpinors(
            [productSpinor(theta, 0, 0, 0), productSpinor(theta, 0, Math.PI, 0)],
            random,
          ),
          nf,
          'canted',
        ),
      );
    } else {
      const spinors = [
        productSpinor(theta, 0, theta, 0),
        productSpinor(theta, 0, Math.PI - theta, Math.PI),
      ];
      const frame = frameFromSpinors(spinors.slice(0, 1), random);
      seeds.push(seedOf(nf === 1 ? frame : complementFrame(frame), nf, 'canted'));
      const frame2 = frameFromSpinors(
        [productSpinor(Math.PI - theta, 0, theta, Math.PI / 2)],
        random,
      );
      seeds.push(seedOf(nf === 1 ? frame2 : complementFrame(frame2), nf, 'canted'));
    }
  }
  return seeds;
}

/** The frame with vector 0 moved last: the hole of a one-particle state (Nf = 3). */
function complementFrame(frame: Float64Array): Float64Array {
  const out = new Float64Array(32);
  out.set(frame.subarray(8, 32), 0);
  out.set(frame.subarray(0, 8), 24);
  return out;
}

const libraries = new Map<number, readonly Seed[]>();

/** The seed library for Nf occupied flavours (built once, deterministic). */
export function seedLibrary(nf: number): readonly Seed[] {
  let library = libraries.get(nf);
  if (library === undefined) {
    const random = seededRandom(LIBRARY_SEED + nf);
    const stabiliser = dedupe(stabiliserSeeds(nf));
    const seeds = [...stabiliser, ...cantedSeeds(nf, random), ...rotatedSeeds(stabiliser, nf)];
    for (let i = 0; i < RANDOM_SEEDS; i++) seeds.push(seedOf(randomFrame(random), nf, 'random'));
    // Nudge every structured seed off its symmetric point: exact critical points would need a
    // saddle escape (an eigen-decomposition); a small fixed rotation lets Newton's shifted
    // steps leave a saddle directly.
    const step = new Float64Array(8);
    const scratch = new Float64Array(8);
    const nudged = dedupe(seeds).map((seed) => {
      if (seed.kind === 'random') return seed;
      for (let p = 0; p < 8; p++) step[p] = NUDGE * gaussian(random);
      const frame = new Float64Array(32);
      retract(nf, seed.frame, step, frame, scratch);
      return { ...seedOf(frame, nf, seed.kind), exact: seed.frame, exactOrder: seed.order };
    });
    library = nudged;
    libraries.set(nf, library);
  }
  return library;
}

function dedupe(seeds: Seed[]): Seed[] {
  const seen = new Set<string>();
  return seeds.filter((s) => {
    const key = Array.from(s.order, (x) => Math.round(x * 1e6) + 0).join(',');
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}
