import { localMinima, saddlePoints, type StationaryState } from './competitors';
import { couplingsOf } from './couplings';
import { brokenSymmetries, type GaplessMode } from './goldstoneModes';
import { describeState, type SolveResult } from './groundState';
import { DEFAULT_MINIMISE, type MinimiseOptions } from './minimise';
import { searchGroundState } from './groundSearch';
import { describeDegeneracy } from './degeneracy';
import type { Model } from './model';
import { groupMagnitudes, sublatticeSpins } from './orderParameters';
import { ORDER_TOLERANCE, phaseLabel } from './phaseLabel';
import { orderOfProjector, projectorOf } from './state';
import { solveResultToJson, type SolveJson } from './solveJson';
import { MEAN_FIELD_CAUTION, SOFTWARE_VERSION } from './version';

/** One occupied spinor of the canonical gauge (spinors.ts), in polar form. */
export interface ProbeSpinor {
  /** Its Hartree-Fock level (without E_X). */
  readonly level: number;
  /** |psi_f| for the flavours K up, K down, K' up, K' down (public/notes.html#basis). */
  readonly modulus: number[];
  /** arg psi_f in radians, (-pi, pi]; 0 where the modulus is below 1e-12. */
  readonly phase: number[];
  /**
   * Spin-valley entanglement entropy in bits: -sum lambda log2 lambda over the eigenvalues of the
   * spinor's reduced valley density matrix (0 for a product of a spin and a valley state, 1 when
   * maximally entangled); Nielsen and Chuang, Quantum Computation and Quantum Information,
   * Cambridge University Press (2000), section 2.5.
   */
  readonly entropy: number;
  /** Concurrence 2 |psi_1 psi_4 - psi_2 psi_3| of the spinor (Wootters, PRL 80, 2245 (1998)). */
  readonly concurrence: number;
}

/** Charge and spin on one sublattice (K lives on A, K' on B in the n = 0 level). */
export interface SiteOrder {
  /** Electrons per flux quantum on this sublattice, (Nf +- o_z0) / 2. */
  readonly charge: number;
  /**
   * Spin vector <sigma> = (o_0b +- o_zb) / 2, b = x, y, z (z along the field), in units of hbar/2:
   * length 1 for one fully polarised electron (public/notes.html#probe).
   */
  readonly spin: number[];
  /** Angle between the spin and the field, radians (NaN for no spin). */
  readonly angleToField: number;
}

/** Valley pseudospin of the electrons with one spin projection along the field. */
export interface SpinSectorValley {
  /** Electrons with this spin per flux quantum, (Nf +- o_0z) / 2. */
  readonly weight: number;
  /** (o_a0 +- o_az) / 2 for a = x, y, z: the sector's valley pseudospin (tau_z = A minus B). */
  readonly pseudospin: number[];
}

/** Kekule bond order: complex amplitude o_x0 + i o_y0 and the three bond-class modulations. */
export interface BondOrder {
  readonly amplitude: number;
  /** arg(o_x0 + i o_y0), radians (NaN when the amplitude is below 1e-9). */
  readonly phase: number;
  /**
   * Bond-density modulation of the three bond classes of the Kekule (three-site-period) cell:
   * Re[(o_x0 + i o_y0) w^m] with w = exp(2 pi i / 3), m = 0, 1, 2, in units of the amplitude's
   * own normalisation (the hopping matrix element is not part of the model).
   */
  readonly strengths: number[];
  /** The same amplitude resolved by spin along the field: (o_x0 +- o_xz + i (o_y0 +- o_yz)) / 2. */
  readonly bySpin: {
    up: { amplitude: number; phase: number };
    down: { amplitude: number; phase: number };
  };
}

/** A gapless mode with the symmetry it belongs to, in words. */
export interface ProbeGaplessMode extends GaplessMode {
  readonly symmetry: string;
}

/** Everything the Probe shows for one ground state, as plain JSON. */
export interface ProbeReport {
  readonly format: 'fourfold-probe';
  readonly version: string;
  readonly caution: string;
  /** The solve result (energy, projector, order, phase, gap, modes, ...). */
  readonly state: SolveJson;
  readonly spinors: ProbeSpinor[];
  /** Hartree-Fock levels ascending with occupations (occupied ones include -E_X when set). */
  readonly levels: { energy: number; occupied: boolean }[];
  /** The Coulomb exchange E_X included in the levels and the gap (0 when the model sets none). */
  readonly exchange: number;
  readonly sublattices: { a: SiteOrder; b: SiteOrder };
  readonly valleyBySpin: { up: SpinSectorValley; down: SpinSectorValley };
  readonly bonds: BondOrder;
  readonly modes: {
    readonly frequencies: number[];
    readonly goldstone: number;
    /** Rotations exp(i theta G_ab) that leave the energy invariant (channel names). */
    readonly symmetries: string[];
    readonly broken: string[];
    readonly gapless: ProbeGaplessMode[];
    /** Zero-frequency pairs that no broken basis generator accounts for. */
    readonly unexplained: number;
  };
  /** Distinct local minima met in the search, lowest first, with their height above the ground state. */
  readonly competitors: Competitor[];
}

/** A family of local minima with one label and one energy. */
export interface Competitor {
  readonly phase: string;
  readonly energy: number;
  /** Energy above the ground state (0 for the ground state's own family). */
  readonly above: number;
  /** Unstable directions (Morse index): 0 for a local minimum, more for a saddle point. */
  readonly unstable: number;
  /** Orientation where the label does not give it ("charge on B", "spin against the field"). */
  readonly note: string;
  /**
   * Distinct minima of this label and energy that the search met: more than one means a
   * degenerate family (a continuous set of states of equal energy, such as all spin directions
   * of a ferromagnet where no term fixes one).
   */
  readonly count: number;
}

/** Competitors listed at most. */
export const MAX_COMPETITORS = 10;

/**
 * Which way a state points where its label alone does not say: the sublattice that holds the
 * charge imbalance, and whether the spin moment is along or against the field (e.g. a CDW on
 * the other sublattice, or a ferromagnet reversed, competing with the ground state).
 */
function orientationNote(order: Float64Array, tol: number): string {
  const notes: string[] = [];
  if (Math.abs(order[12]!) > tol) notes.push(order[12]! > 0 ? 'charge on A' : 'charge on B');
  if (Math.abs(order[3]!) > tol) {
    notes.push(order[3]! > 0 ? 'spin along the field' : 'spin against the field');
  }
  return notes.join(', ');
}

/**
 * What tells two states apart up to the rotations about the field and about tau_z: the group
 * magnitudes and the components along both axes (o_0z, o_z0, o_zz).
 */
function invariantsOf(order: Float64Array): number[] {
  return [...groupMagnitudes(order), order[3]!, order[12]!, order[15]!];
}

/**
 * The ground state's family first, then the other local minima and the saddle points of the
 * symmetric state families by energy, merged by label, orientation, energy and stability.
 */
function mergeCompetitors(r: SolveResult, others: readonly StationaryState[]): Competitor[] {
  const c = r.couplings;
  const tol = 1e-9 * c.scale;
  // Many descents land on the same state (or on the ground state): count each state once.
  const seen = [{ energy: r.energy, invariants: invariantsOf(r.order) }];
  const isNew = (m: { energy: number; invariants: number[] }): boolean => {
    const known = seen.some(
      (o) =>
        Math.abs(o.energy - m.energy) <= tol &&
        o.invariants.every((x, q) => Math.abs(x - m.invariants[q]!) <= 1e-6),
    );
    if (!known) seen.push(m);
    return !known;
  };
  const labelled = others
    .map((s) => {
      const order = orderOfProjector(
        projectorOf(s.frame, c.nf, new Float64Array(32)),
        new Float64Array(16),
      );
      return {
        phase: phaseLabel(order, c),
        note: orientationNote(order, ORDER_TOLERANCE),
        energy: s.energy,
        unstable: s.unstable,
        invariants: invariantsOf(order),
      };
    })
    .sort((a, b) => a.energy - b.energy)
    .filter(isNew);
  const out: { phase: string; note: string; energy: number; count: number; unstable: number }[] = [
    {
      phase: r.phase,
      note: orientationNote(r.order, ORDER_TOLERANCE),
      energy: r.energy,
      count: 1,
      unstable: 0,
    },
  ];
  for (const m of labelled) {
    const same = out.find(
      (o) =>
        o.phase === m.phase &&
        o.note === m.note &&
        o.unstable === m.unstable &&
        Math.abs(o.energy - m.energy) <= tol,
    );
    if (same) same.count++;
    else
      out.push({ phase: m.phase, note: m.note, energy: m.energy, unstable: m.unstable, count: 1 });
  }
  return out
    .slice(0, MAX_COMPETITORS)
    .map((o) => ({ ...o, above: Math.max(0, o.energy - r.energy) }));
}

const SYMMETRY_NAMES: Record<string, string> = {
  '0z': 'spin rotation about the field, U(1)',
  '0x': 'spin rotation about an in-plane axis (x)',
  '0y': 'spin rotation about an in-plane axis (y)',
  z0: 'valley rotation about tau_z, U(1)',
  x0: 'valley rotation about tau_x',
  y0: 'valley rotation about tau_y',
};

function symmetryName(generators: readonly string[]): string {
  const names = generators.map(
    (g) => SYMMETRY_NAMES[g] ?? `rotation generated by tau_${g[0]} sigma_${g[1]}`,
  );
  return names.join(' + ');
}

function spinorOf(v: Float64Array, k: number, level: number): ProbeSpinor {
  const re = [0, 1, 2, 3].map((r) => v[8 * k + 2 * r]!);
  const im = [0, 1, 2, 3].map((r) => v[8 * k + 2 * r + 1]!);
  const modulus = re.map((x, r) => Math.hypot(x, im[r]!));
  const phase = re.map((x, r) => (modulus[r]! > 1e-12 ? Math.atan2(im[r]!, x) : 0));
  // psi as a 2 x 2 matrix M[valley][spin]: the reduced valley density matrix M M^dagger has
  // determinant |det M|^2, so its eigenvalues are (1 +- sqrt(1 - 4 |det M|^2)) / 2.
  const detRe = re[0]! * re[3]! - im[0]! * im[3]! - (re[1]! * re[2]! - im[1]! * im[2]!);
  const detIm = re[0]! * im[3]! + im[0]! * re[3]! - (re[1]! * im[2]! + im[1]! * re[2]!);
  const concurrence = Math.min(1, 2 * Math.hypot(detRe, detIm));
  const root = Math.sqrt(Math.max(0, 1 - concurrence * concurrence));
  const entropy = [(1 + root) / 2, (1 - root) / 2].reduce(
    (s, lambda) => (lambda > 1e-15 ? s - lambda * Math.log2(lambda) : s),
    0,
  );
  return { level, modulus, phase, entropy, concurrence };
}

function site(order: Float64Array, nf: number, sign: 1 | -1, spin: number[]): SiteOrder {
  const length = Math.hypot(spin[0]!, spin[1]!, spin[2]!);
  return {
    charge: (nf + sign * order[12]!) / 2,
    spin,
    angleToField: length > 1e-9 ? Math.atan2(Math.hypot(spin[0]!, spin[1]!), spin[2]!) : NaN,
  };
}

function sector(order: Float64Array, nf: number, sign: 1 | -1): SpinSectorValley {
  return {
    weight: (nf + sign * order[3]!) / 2,
    pseudospin: [4, 8, 12].map((a) => (order[a]! + sign * order[a + 3]!) / 2),
  };
}

function polar(re: number, im: number): { amplitude: number; phase: number } {
  const amplitude = Math.hypot(re, im);
  return { amplitude, phase: amplitude > 1e-9 ? Math.atan2(im, re) : NaN };
}

/** The Probe's numbers for a solved state (the ground state of `solve`, or any polished minimum). */
export function probeOfResult(
  r: SolveResult,
  others: readonly StationaryState[] = [],
): ProbeReport {
  const c = r.couplings;
  const nf = c.nf;
  const o = r.order;
  const spins = sublatticeSpins(o);
  const occupiedLevels = r.levels.filter((_, k) => r.occupied[k]).map((e) => e + c.exchange);
  const spinors = Array.from({ length: nf }, (_, k) =>
    spinorOf(r.spinors, k, occupiedLevels[k] ?? NaN),
  );
  const bond = polar(o[4]!, o[8]!);
  const strengths = [0, 1, 2].map((m) =>
    Number.isNaN(bond.phase) ? 0 : bond.amplitude * Math.cos(bond.phase + (2 * Math.PI * m) / 3),
  );
  const symmetry = brokenSymmetries(c, r.frame);
  const gapless = symmetry.modes.map((m) => ({ ...m, symmetry: symmetryName(m.generators) }));
  return {
    format: 'fourfold-probe',
    version: SOFTWARE_VERSION,
    caution: MEAN_FIELD_CAUTION,
    state: solveResultToJson(r),
    spinors,
    levels: r.levels.map((energy, k) => ({ energy, occupied: r.occupied[k]! })),
    exchange: c.exchange,
    sublattices: { a: site(o, nf, 1, spins.a), b: site(o, nf, -1, spins.b) },
    valleyBySpin: { up: sector(o, nf, 1), down: sector(o, nf, -1) },
    bonds: {
      ...bond,
      strengths,
      bySpin: {
        up: polar((o[4]! + o[7]!) / 2, (o[8]! + o[11]!) / 2),
        down: polar((o[4]! - o[7]!) / 2, (o[8]! - o[11]!) / 2),
      },
    },
    modes: {
      frequencies: r.modes.frequencies,
      goldstone: r.modes.goldstone,
      symmetries: [...symmetry.symmetries],
      broken: [...symmetry.broken],
      gapless,
      unexplained: Math.max(0, r.modes.goldstone - gapless.length),
    },
    competitors: mergeCompetitors(r, others),
  };
}

/**
 * Solves one model and reports everything the Probe shows. The ground state is the one `solve`
 * finds (the same search as the CLI); the competitors come from descents from the whole seed
 * library as well.
 */
export function probeModel(model: Model, options: MinimiseOptions = DEFAULT_MINIMISE): ProbeReport {
  const c = couplingsOf(model);
  const search = searchGroundState(c, options);
  const minima = [
    ...search.minima.filter((m) => m.converged),
    ...localMinima(c).filter((m) => m.energy >= search.energy - 1e-9 * c.scale),
  ];
  const described = describeState(model, c, search.frame, search.minima);
  const result = {
    ...described,
    degenerate: describeDegeneracy(c, described.frame, search.selection),
  };
  return probeOfResult(result, [
    ...minima.map((m) => ({ frame: m.frame, energy: m.energy, unstable: 0 })),
    ...saddlePoints(c),
  ]);
}
