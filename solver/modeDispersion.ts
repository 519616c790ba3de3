import { GOLDSTONE_TOLERANCE, HESSIAN_ZERO } from './collectiveModes';
import { coulombExchange } from './coulombExchange';
import type { Couplings } from './couplings';
import { hermitianEigen4 } from './linalg';
import { ModeRotation } from './modeRotation';
import type { OrderGroupKey } from './orderParameters';
import { hartreeFockOfOrder, orderOfProjector, projectorOf } from './state';
import { symplecticModes, type SymplecticModes } from './symplecticModes';
import { WavevectorHessian } from './wavevectorHessian';

/** What the finite-wavevector modes need beyond the state (public/notes.html#dispersion). */
export interface DispersionOptions {
  /** Coulomb scale e^2 / (eps l_B) in the model's energy unit, >= 0. */
  readonly coulomb: number;
  /** Distance of a metal gate, in units of l_B (> 0); undefined: no gate. */
  readonly gateDistance?: number;
  /** Wavevectors q, in 1/l_B (>= 0). */
  readonly q: readonly number[];
}

/**
 * The collective modes of a uniform state along q (time-dependent Hartree-Fock; public/notes.html#dispersion).
 * Branches are the modes sorted ascending at each q (so a crossing swaps their identities);
 * `branches[b][n]` is branch b at q[n].
 */
export interface ModeDispersion {
  readonly q: number[];
  /** Re omega, one array per branch, ascending at each q (energy unit of the model). */
  readonly branches: number[][];
  /** |Im omega| of the same points: 0 for a stable oscillation, else a growth rate. */
  readonly growth: number[][];
  /** The group of rotations exp(i theta G_ab) each point's mode performs (modeRotation.ts). */
  readonly rotates: (OrderGroupKey | null)[][];
  /** omega_b(q = 0), the gap of each branch (the q = 0 modes of collectiveModes.ts). */
  readonly gaps: number[];
  /** Branches that start at zero (omega_b(0) below 1e-6 of the coupling scale). */
  readonly goldstone: boolean[];
  /** Goldstone branches that rise linearly: v = lim omega / q (energy x l_B); else null. */
  readonly velocities: (number | null)[];
  /** Quadratic branches: rho = lim (omega - gap) / q^2 (energy x l_B^2); else null. */
  readonly stiffness: (number | null)[];
  /** The q -> infinity limits: every particle-hole energy eps_a - eps_i + E_X, ascending. */
  readonly particleHole: number[];
  /** E_X = C X_C(0), the Coulomb exchange of the filled level (with the gate, if any). */
  readonly exchange: number;
  readonly coulomb: number;
  readonly gateDistance: number | null;
  /** No modulation at any q computed lowers the energy (K(q) positive semidefinite). */
  readonly stable: boolean;
  /** The wavevectors (of `q`) where some modulation lowers the energy. */
  readonly unstableAt: number[];
}

/** Wavevector of the fits for velocities and stiffness (and twice it), 1/l_B. */
export const FIT_WAVEVECTOR = 1e-3;

/**
 * A Goldstone branch is linear when its extrapolated v^2 exceeds this times the squared energy
 * scale (the rounding of omega^2 / q^2 at the fit points is about 1e-13 of it).
 */
const LINEAR_THRESHOLD = 1e-10;

/**
 * The modes of the stationary state `frame` (occupied vectors first, as solve returns it) at
 * every wavevector of `options.q`, with each branch's gap, Goldstone velocity or stiffness, and
 * the large-q limits. The gap, velocity and stiffness come from the branch near q = 0: with
 * h = FIT_WAVEVECTOR, f(q) = omega^2 / q^2 for a branch that starts at zero (v^2 = lim f) or
 * (omega - gap) / q^2 otherwise (rho = lim f), extrapolated from h and 2h as (4 f(h) - f(2h)) / 3
 * (Richardson; the error is of order h^4 since every kernel is a function of q^2). A Goldstone
 * branch whose v^2 vanishes is quadratic, with rho = lim omega / q^2 taken the same way.
 */
export function modeDispersion(
  c: Couplings,
  frame: Float64Array,
  options: DispersionOptions,
): ModeDispersion {
  const hessian = new WavevectorHessian(c, frame, options.coulomb, options.gateDistance);
  const d = hessian.dimension;
  const rotation = new ModeRotation(c, frame);
  const energyScale = Math.max(c.scale, options.coulomb);
  const modesAt = (q: number): SymplecticModes =>
    // At q = 0 exactly the threshold of collectiveModes.ts, so that the two agree to the bit.
    symplecticModes(hessian.at(q), d, HESSIAN_ZERO * (q === 0 ? c.scale : energyScale));
  const zero = modesAt(0);
  const h = FIT_WAVEVECTOR;
  const near = modesAt(h);
  const twice = modesAt(2 * h);
  const count = d / 2;
  const gaps = zero.frequencies;
  const goldstone = gaps.map((w) => w < GOLDSTONE_TOLERANCE * c.scale);
  const velocities: (number | null)[] = [];
  const stiffness: (number | null)[] = [];
  const fitted = near.stable && twice.stable;
  for (let b = 0; b < count; b++) {
    const w1 = near.frequencies[b]!;
    const w2 = twice.frequencies[b]!;
    const extrapolate = (f1: number, f2: number) => (4 * f1 - f2) / 3;
    if (!fitted) {
      velocities.push(null);
      stiffness.push(null);
    } else if (goldstone[b]) {
      const v2 = extrapolate((w1 * w1) / (h * h), (w2 * w2) / (4 * h * h));
      const linear = v2 > LINEAR_THRESHOLD * energyScale * energyScale;
      velocities.push(linear ? Math.sqrt(v2) : null);
      stiffness.push(linear ? null : extrapolate(w1 / (h * h), w2 / (4 * h * h)));
    } else {
      velocities.push(null);
      stiffness.push(extrapolate((w1 - gaps[b]!) / (h * h), (w2 - gaps[b]!) / (4 * h * h)));
    }
  }
  const branches: number[][] = Array.from({ length: count }, () => []);
  const growth: number[][] = Array.from({ length: count }, () => []);
  const rotates: (OrderGroupKey | null)[][] = Array.from({ length: count }, () => []);
  const nearGroups = near.planes.map((p) => (p === null ? null : rotation.groupOf(p)));
  const unstableAt: number[] = [];
  const zeroFrequency = HESSIAN_ZERO * energyScale;
  for (const q of options.q) {
    const modes = q === 0 ? zero : modesAt(q);
    if (!modes.stable) unstableAt.push(q);
    for (let b = 0; b < count; b++) {
      branches[b]!.push(modes.frequencies[b]!);
      growth[b]!.push(modes.growth[b]!);
      const plane = modes.planes[b] ?? null;
      // A mode at zero frequency (a Goldstone branch at q = 0) has no motion of its own to
      // classify: it is the same branch as just above q = 0.
      rotates[b]!.push(
        plane === null
          ? null
          : modes.frequencies[b]! <= zeroFrequency
            ? (nearGroups[b] ?? null)
            : rotation.groupOf(plane),
      );
    }
  }
  const exchange = options.coulomb * coulombExchange(0, options.gateDistance);
  return {
    q: [...options.q],
    branches,
    growth,
    rotates,
    gaps,
    goldstone,
    velocities,
    stiffness,
    particleHole: particleHoleEnergies(c, frame, exchange),
    exchange,
    coulomb: options.coulomb,
    gateDistance: options.gateDistance ?? null,
    stable: zero.stable && unstableAt.length === 0,
    unstableAt,
  };
}

/**
 * eps_a - eps_i + E_X for every empty level a and occupied level i of H_HF (the Hartree-Fock
 * levels of public/notes.html#gap without -E_X P), ascending: where the branches end at large q.
 */
function particleHoleEnergies(c: Couplings, frame: Float64Array, exchange: number): number[] {
  const projector = projectorOf(frame, c.nf, new Float64Array(32));
  const order = orderOfProjector(projector, new Float64Array(16));
  const values = new Float64Array(4);
  const vectors = new Float64Array(32);
  hermitianEigen4(hartreeFockOfOrder(c, order, new Float64Array(32)), values, vectors);
  // A level is occupied when its eigenvector lies in the occupied span: sum_i |<u_i|v>|^2 ~ 1.
  const weight = [0, 1, 2, 3].map((k) => {
    let w = 0;
    for (let i = 0; i < c.nf; i++) {
      let re = 0;
      let im = 0;
      for (let r = 0; r < 8; r += 2) {
        const ur = frame[8 * i + r]!;
        const ui = frame[8 * i + r + 1]!;
        const vr = vectors[8 * k + r]!;
        const vi = vectors[8 * k + r + 1]!;
        re += ur * vr + ui * vi;
        im += ur * vi - ui * vr;
      }
      w += re * re + im * im;
    }
    return w;
  });
  const ranked = [0, 1, 2, 3].sort((x, y) => weight[y]! - weight[x]!);
  const occupied = ranked.slice(0, c.nf).map((k) => values[k]!);
  const empty = ranked.slice(c.nf).map((k) => values[k]!);
  const out: number[] = [];
  for (const a of empty) for (const i of occupied) out.push(a - i + exchange);
  return out.sort((x, y) => x - y);
}
