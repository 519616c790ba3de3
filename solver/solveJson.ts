import { CHANNELS } from './channels';
import type { Degeneracy } from './degeneracy';
import type { SolveResult } from './groundState';
import { modelToJson } from './model';
import { ORDER_GROUPS, orderAngles, sublatticeSpins } from './orderParameters';
import { MEAN_FIELD_CAUTION, SOFTWARE_VERSION } from './version';

/** Plain JSON form of a solve result (the `solve` output of the README, with extra fields). */
export interface SolveJson {
  energy: number;
  projector: { re: number[][]; im: number[][] };
  order: Record<string, number>;
  phase: string;
  gap: number;
  modes: number[];
  goldstone: number;
  groups: Record<string, number>;
  angles: { canting: number | null; bondPhase: number | null };
  spins: { a: number[]; b: number[] };
  levels: number[];
  aufbau: boolean;
  spinors: { re: number[]; im: number[] }[];
  minima: { energy: number; phase: string }[];
  /** The degenerate family of the ground state, or null (see `SolveResult.degenerate`). */
  degenerate: Degeneracy | null;
  residual: { gradient: number; commutator: number };
  model: Record<string, unknown>;
  version: string;
  caution: string;
}

/** Rounds away float noise: values within 1e-12 of zero become 0 (and -0 becomes 0). */
export function clean(x: number, zero = 1e-12): number {
  return Math.abs(x) < zero ? 0 : x;
}

export function solveResultToJson(r: SolveResult): SolveJson {
  const zero = 1e-12 * r.couplings.scale;
  const re: number[][] = [];
  const im: number[][] = [];
  for (let i = 0; i < 4; i++) {
    re.push([0, 1, 2, 3].map((j) => clean(r.projector[2 * (4 * i + j)]!)));
    im.push([0, 1, 2, 3].map((j) => clean(r.projector[2 * (4 * i + j) + 1]!)));
  }
  const order: Record<string, number> = {};
  CHANNELS.forEach((name, k) => (order[name] = clean(r.order[k + 1]!)));
  const groups: Record<string, number> = {};
  ORDER_GROUPS.forEach((g, i) => (groups[g.key] = clean(r.groups[i]!)));
  const angles = orderAngles(r.order);
  const spins = sublatticeSpins(r.order);
  const spinors: { re: number[]; im: number[] }[] = [];
  for (let k = 0; k < r.spinors.length / 8; k++) {
    spinors.push({
      re: [0, 1, 2, 3].map((c) => clean(r.spinors[8 * k + 2 * c]!)),
      im: [0, 1, 2, 3].map((c) => clean(r.spinors[8 * k + 2 * c + 1]!)),
    });
  }
  return {
    energy: r.energy,
    projector: { re, im },
    order,
    phase: r.phase,
    gap: clean(r.gap, zero),
    modes: r.modes.frequencies.map((w) => clean(w, zero)),
    goldstone: r.modes.goldstone,
    groups,
    angles: {
      canting: Number.isNaN(angles.canting) ? null : angles.canting,
      bondPhase: Number.isNaN(angles.bondPhase) ? null : angles.bondPhase,
    },
    spins: { a: spins.a.map((x) => clean(x)), b: spins.b.map((x) => clean(x)) },
    levels: r.levels.map((x) => clean(x, zero)),
    aufbau: r.aufbau,
    spinors,
    minima: r.minima,
    degenerate: r.degenerate ?? null,
    residual: { gradient: r.gradient, commutator: r.commutator },
    model: modelToJson(r.model),
    version: SOFTWARE_VERSION,
    caution: MEAN_FIELD_CAUTION,
  };
}
