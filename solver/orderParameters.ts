import { channelIndex, type Channel } from './channels';

/**
 * Order-parameter groups of public/notes.html#order-parameters: components that transform together
 * under spin rotation about the field (U(1)_s) and valley rotation about tau_z (U(1)_v).
 */
export interface OrderGroup {
  readonly key: OrderGroupKey;
  readonly title: string;
  readonly channels: readonly Channel[];
  /** Short symbol used in composed phase labels. */
  readonly token: string;
}

export type OrderGroupKey =
  | 'spinAlongField'
  | 'spinInPlane'
  | 'neelAlongField'
  | 'neelInPlane'
  | 'cdw'
  | 'bondOrder'
  | 'spinBondAlongField'
  | 'spinBondInPlane';

/** The groups in the fixed order used for labels and readouts. */
export const ORDER_GROUPS: readonly OrderGroup[] = [
  { key: 'spinAlongField', title: 'spin along field', channels: ['0z'], token: 'F' },
  { key: 'spinInPlane', title: 'spin in plane', channels: ['0x', '0y'], token: 'Fxy' },
  { key: 'neelAlongField', title: 'Neel along field', channels: ['zz'], token: 'AF' },
  { key: 'neelInPlane', title: 'Neel in plane', channels: ['zx', 'zy'], token: 'CAF' },
  { key: 'cdw', title: 'CDW (sublattice imbalance)', channels: ['z0'], token: 'CDW' },
  { key: 'bondOrder', title: 'bond order (Kekule)', channels: ['x0', 'y0'], token: 'KD' },
  {
    key: 'spinBondAlongField',
    title: 'spin bond order along field',
    channels: ['xz', 'yz'],
    token: 'SB',
  },
  {
    key: 'spinBondInPlane',
    title: 'spin bond order in plane',
    channels: ['xx', 'xy', 'yx', 'yy'],
    token: 'SBxy',
  },
];

const GROUP_INDICES = ORDER_GROUPS.map((g) => g.channels.map(channelIndex));

/** Euclidean magnitude of each group, in ORDER_GROUPS order, from o (indexed by channel). */
export function groupMagnitudes(order: ArrayLike<number>): Float64Array {
  const out = new Float64Array(ORDER_GROUPS.length);
  GROUP_INDICES.forEach((indices, g) => {
    let sum = 0;
    for (const k of indices) sum += order[k]! * order[k]!;
    out[g] = Math.sqrt(sum);
  });
  return out;
}

/**
 * Spin vectors <sigma> on sublattice A (valley K) and B (valley K'): (o_0b +- o_zb) / 2,
 * b = x, y, z, in units of hbar/2 (public/notes.html#probe).
 */
export function sublatticeSpins(order: ArrayLike<number>): { a: number[]; b: number[] } {
  const a: number[] = [];
  const b: number[] = [];
  for (let s = 1; s < 4; s++) {
    a.push((order[s]! + order[12 + s]!) / 2);
    b.push((order[s]! - order[12 + s]!) / 2);
  }
  return { a, b };
}

/**
 * Angles where they mean something: the canting angle of the spin on sublattice A from the field
 * axis (radians; the CAF of public/notes.html#closed-forms has cos(theta) = E_Z / (4 |uPerp_F|)),
 * and the phase of the Kekule amplitude o_x0 + i o_y0 (radians). NaN when the magnitude is below
 * `tol`.
 */
export function orderAngles(
  order: ArrayLike<number>,
  tol = 1e-9,
): { canting: number; bondPhase: number } {
  const { a } = sublatticeSpins(order);
  const inPlane = Math.hypot(a[0]!, a[1]!);
  const length = Math.hypot(inPlane, a[2]!);
  const canting = length > tol ? Math.atan2(inPlane, a[2]!) : NaN;
  const bond = Math.hypot(order[4]!, order[8]!);
  const bondPhase = bond > tol ? Math.atan2(order[8]!, order[4]!) : NaN;
  return { canting, bondPhase };
}

/**
 * Number of order-parameter groups above `tol`: a measure of how mixed a state is, used to
 * prefer the simplest state among exactly degenerate ones.
 */
export function presentGroupCount(order: ArrayLike<number>, tol: number): number {
  let count = 0;
  for (const indices of GROUP_INDICES) {
    let sum = 0;
    for (const k of indices) sum += order[k]! * order[k]!;
    if (sum > tol * tol) count++;
  }
  return count;
}
