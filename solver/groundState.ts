import { couplingsOf, energyOfOrder, type Couplings } from './couplings';
import { collectiveModes, type CollectiveModes } from './collectiveModes';
import { hermitianEigen4 } from './linalg';
import { DEFAULT_DESCENT, descend } from './localMinimise';
import { DescentWorkspace } from './tangentSpace';
import { DEFAULT_MINIMISE, type MinimiseOptions } from './minimise';
import { searchGroundState } from './groundSearch';
import { describeDegeneracy, type Degeneracy } from './degeneracy';
import type { Model } from './model';
import { canonicaliseOrbit } from './orbitGauge';
import { groupMagnitudes } from './orderParameters';
import { phaseLabel } from './phaseLabel';
import { occupiedSpinors } from './spinors';
import { hartreeFockOfOrder, orderOfProjector, projectorOf } from './state';
import { modelSymmetry } from './symmetry';

/** Everything Fourfold reports about the ground state of one model. */
export interface SolveResult {
  readonly model: Model;
  readonly couplings: Couplings;
  /** Energy per flux quantum, public/notes.html#energy (no Coulomb constant). */
  readonly energy: number;
  /** Occupied frame (vectors 0..Nf-1) at the canonical orbit point. */
  readonly frame: Float64Array;
  /** P, 4x4 complex, row-major, re/im interleaved. */
  readonly projector: Float64Array;
  /** o_k = tr(G_k P), k = 0..15 (o_0 = Nf). */
  readonly order: Float64Array;
  /** Magnitudes of the order-parameter groups (ORDER_GROUPS order). */
  readonly groups: Float64Array;
  readonly phase: string;
  /** Hartree-Fock levels ascending, including -E_X on occupied levels when E_X is set. */
  readonly levels: number[];
  /** Whether each of `levels` is occupied (same order). */
  readonly occupied: boolean[];
  /**
   * Quasiparticle gap (public/notes.html#gap): lowest empty minus highest occupied HF level, plus
   * E_X when set; eps_(Nf+1) - eps_(Nf) under the Aufbau principle.
   */
  readonly gap: number;
  /**
   * Occupied levels are the lowest Nf eigenvalues of H_HF. Not guaranteed for every coupling
   * set: with Hartree-dominated channels a global minimum can violate it (then gap < 0).
   */
  readonly aufbau: boolean;
  readonly modes: CollectiveModes;
  /** Occupied spinors in the canonical gauge (8 numbers each). */
  readonly spinors: Float64Array;
  /** Largest tangent-gradient component, absolute. */
  readonly gradient: number;
  /** Largest entry of [H_HF, P]. */
  readonly commutator: number;
  /** Distinct local minima met in the search, lowest first (the ground state is the first). */
  readonly minima: { energy: number; phase: string }[];
  /**
   * The family of states the model leaves degenerate with this one (to 1e-9 of the scale), and
   * how this member was chosen; undefined when there is none beyond rotations about the field
   * and about tau_z.
   */
  readonly degenerate: Degeneracy | undefined;
}

/** Solves one model: global minimum, then every derived quantity. */
export function solve(model: Model, options: MinimiseOptions = DEFAULT_MINIMISE): SolveResult {
  const c = couplingsOf(model);
  const search = searchGroundState(c, options);
  const result = describeState(model, c, search.frame, search.minima);
  return { ...result, degenerate: describeDegeneracy(c, result.frame, search.selection) };
}

/**
 * Polishes a frame that is already (close to) the ground state and derives the reported
 * quantities. `minima` are other local minima to list as competitors.
 */
export function describeState(
  model: Model,
  c: Couplings,
  start: Float64Array,
  minima: readonly { frame: Float64Array; energy: number }[] = [],
): SolveResult {
  const nf = c.nf;
  const symmetry = modelSymmetry(c);
  const frame = Float64Array.from(start);
  const ws = new DescentWorkspace();
  descend(c, frame, DEFAULT_DESCENT, ws);
  canonicaliseOrbit(frame, nf, symmetry);
  // One more Newton pass after the rotation (the rotation is exact, so this only tidies rounding).
  const polish = descend(c, frame, DEFAULT_DESCENT, ws);
  const projector = projectorOf(frame, nf, new Float64Array(32));
  const order = orderOfProjector(projector, new Float64Array(16));
  const energy = energyOfOrder(c, order);
  const hamiltonian = hartreeFockOfOrder(c, order, new Float64Array(32));
  const commutator = commutatorNorm(hamiltonian, projector);
  const values = new Float64Array(4);
  const vectors = new Float64Array(32);
  hermitianEigen4(Float64Array.from(hamiltonian), values, vectors);
  const { spinors, levels: occupiedLevels } = occupiedSpinors(frame, nf, hamiltonian, c.scale);
  const aufbau = occupiedLevels.every((e, i) => Math.abs(e - values[i]!) <= 1e-9 * c.scale);
  // Occupied levels are those of the occupied spinors (not necessarily the lowest: see aufbau).
  const occupiedSet = [...occupiedLevels];
  const emptyLevels = Array.from(values).filter((e) => {
    const k = occupiedSet.findIndex((o) => Math.abs(o - e) <= 1e-9 * c.scale);
    if (k < 0) return true;
    occupiedSet.splice(k, 1);
    return false;
  });
  const spectrum = [
    ...occupiedLevels.map((e) => ({ energy: e - c.exchange, occupied: true })),
    ...emptyLevels.map((e) => ({ energy: e, occupied: false })),
  ].sort((a, b) => a.energy - b.energy);
  const levels = spectrum.map((l) => l.energy);
  const occupied = spectrum.map((l) => l.occupied);
  // Particle and hole far apart: cheapest empty level minus the highest occupied one. Equal to
  // eps_(Nf+1) - eps_(Nf) when the Aufbau principle holds; negative when it does not.
  const gap = Math.min(...emptyLevels) - Math.max(...occupiedLevels) + c.exchange;
  const modes = collectiveModes(c, frame);
  const phase = phaseLabel(order, c);
  const competitors = distinctMinima(c, symmetry, [{ frame, energy }, ...minima]);
  return {
    model,
    couplings: c,
    energy,
    frame,
    projector,
    order,
    groups: groupMagnitudes(order),
    phase,
    levels,
    occupied,
    gap,
    aufbau,
    modes,
    spinors,
    gradient: polish.gradient,
    commutator,
    minima: competitors,
    degenerate: undefined,
  };
}

function commutatorNorm(h: Float64Array, p: Float64Array): number {
  let worst = 0;
  for (let r = 0; r < 4; r++) {
    for (let col = 0; col < 4; col++) {
      let re = 0;
      let im = 0;
      for (let m = 0; m < 4; m++) {
        const ar = h[2 * (4 * r + m)]!;
        const ai = h[2 * (4 * r + m) + 1]!;
        const br = p[2 * (4 * m + col)]!;
        const bi = p[2 * (4 * m + col) + 1]!;
        const cr = p[2 * (4 * r + m)]!;
        const ci = p[2 * (4 * r + m) + 1]!;
        const dr = h[2 * (4 * m + col)]!;
        const di = h[2 * (4 * m + col) + 1]!;
        re += ar * br - ai * bi - (cr * dr - ci * di);
        im += ar * bi + ai * br - (cr * di + ci * dr);
      }
      worst = Math.max(worst, Math.hypot(re, im));
    }
  }
  return worst;
}

function distinctMinima(
  c: Couplings,
  symmetry: ReturnType<typeof modelSymmetry>,
  minima: readonly { frame: Float64Array; energy: number }[],
): { energy: number; phase: string }[] {
  const out: { energy: number; phase: string; groups: Float64Array }[] = [];
  const sorted = [...minima].sort((a, b) => a.energy - b.energy);
  for (const m of sorted) {
    const order = orderOfProjector(
      projectorOf(m.frame, c.nf, new Float64Array(32)),
      new Float64Array(16),
    );
    const groups = groupMagnitudes(order);
    const same = out.some(
      (o) =>
        Math.abs(o.energy - m.energy) <= 1e-9 * c.scale &&
        o.groups.every((g, i) => Math.abs(g - groups[i]!) <= 1e-6),
    );
    if (!same) out.push({ energy: m.energy, phase: phaseLabel(order, c), groups });
  }
  return out.map(({ energy, phase }) => ({ energy, phase }));
}
