import type { Couplings } from './couplings';
import { ORDER_GROUPS, groupMagnitudes, type OrderGroupKey } from './orderParameters';

/**
 * Order parameters below this magnitude count as zero when naming a phase (o_ab = tr(G_ab P)
 * ranges over [-Nf, Nf]).
 */
export const ORDER_TOLERANCE = 1e-6;

/** What each label token stands for, for legends and the README. */
export const TOKEN_MEANINGS: Readonly<Record<string, string>> = {
  F: 'ferromagnet: spin moment (along the field when there is one)',
  Fxy: 'spin moment in the plane perpendicular to the field',
  AF: 'antiferromagnet: Neel order along the field',
  CAF: 'canted antiferromagnet: Neel order perpendicular to the field',
  CDW: 'charge density wave: sublattice (valley) imbalance',
  KD: 'Kekule distortion: bond order, intervalley coherence',
  SB: 'spin bond order along the field (valley-coherent, spin-dependent)',
  SBxy: 'spin bond order perpendicular to the field',
};

/**
 * Groups that the model's one-body terms induce without any symmetry breaking: a Zeeman field
 * allows the moment along it, a sublattice splitting allows the CDW, and both together allow the
 * Neel component along the field (their product).
 */
export function inducedGroups(c: Couplings): Set<OrderGroupKey> {
  const out = new Set<OrderGroupKey>();
  const field = c.eta[3] !== 0;
  const sublattice = c.eta[12] !== 0;
  if (field) out.add('spinAlongField');
  if (sublattice) out.add('cdw');
  if (c.eta[15] !== 0 || (field && sublattice)) out.add('neelAlongField');
  ORDER_GROUPS.forEach((g) => {
    if (g.channels.some((ch) => c.eta[channelSlot(ch)] !== 0)) {
      out.add(g.key);
    }
  });
  return out;
}

function channelSlot(name: string): number {
  const letters = '0xyz';
  return 4 * letters.indexOf(name[0]!) + letters.indexOf(name[1]!);
}

/**
 * Phase label from the computed state only (public/notes.html#labels): the nonzero
 * order-parameter groups, in the fixed order of ORDER_GROUPS, joined by '+' (at odd filling, a
 * product spinor is named by its valley and spin factors instead). Groups that the one-body terms
 * induce are left out only when something else is broken. Where the model leaves a family of
 * states degenerate (a spin-isotropic model without a field, say), the solver reports the member
 * that vanishing fields select (degeneracy.ts), and the label names that member: a Neel state
 * without a field is named as in an infinitesimal field along the field axis (CAF), not by a
 * merged name, so the label does not change at E_Z = 0.
 */
export function phaseLabel(order: ArrayLike<number>, c: Couplings): string {
  if (c.nf % 2 === 1) return composeLabel(order, c);
  // At even filling the label depends only on which groups are present and which are induced:
  // memoise on those bits (the Map calls this once per pixel).
  let key = 0;
  for (let g = 0; g < GROUP_INDICES.length; g++) {
    let sum = 0;
    let field = false;
    for (const k of GROUP_INDICES[g]!) {
      sum += order[k]! * order[k]!;
      if (c.eta[k] !== 0) field = true;
    }
    if (sum > ORDER_TOLERANCE * ORDER_TOLERANCE) key |= 1 << g;
    if (field) key |= 1 << (8 + g);
  }
  if (c.eta[3] !== 0 && c.eta[12] !== 0) key |= 1 << (8 + NEEL_ALONG_FIELD);
  let label = labelMemo.get(key);
  if (label === undefined) {
    label = composeLabel(order, c);
    labelMemo.set(key, label);
  }
  return label;
}

const GROUP_INDICES = ORDER_GROUPS.map((g) => g.channels.map(channelSlot));
const NEEL_ALONG_FIELD = ORDER_GROUPS.findIndex((g) => g.key === 'neelAlongField');
const labelMemo = new Map<number, string>();

function composeLabel(order: ArrayLike<number>, c: Couplings): string {
  const induced = inducedGroups(c);
  if (c.nf % 2 === 1) {
    const product = productStateLabel(order, c.nf, induced);
    if (product !== undefined) return product;
  }
  const magnitudes = groupMagnitudes(order);
  const present: { key: OrderGroupKey; token: string }[] = [];
  ORDER_GROUPS.forEach((g, i) => {
    if (magnitudes[i]! > ORDER_TOLERANCE) present.push({ key: g.key, token: g.token });
  });
  // Induced groups name a state only when nothing else is broken.
  const broken = present.filter((p) => !induced.has(p.key));
  const tokens = broken.length > 0 ? broken : present;
  return tokens.length === 0 ? 'sym' : tokens.map((t) => t.token).join('+');
}

/**
 * At nu = -1 (one particle) and nu = +1 (one hole) a state is one spinor phi. When phi is a
 * product of a valley and a spin state, o_ab = v_a s_b for the particle (or the hole, o -> -o),
 * and the natural name is that of its two factors: the valley part is CDW (along tau_z) and/or
 * KD (in the plane), the spin part F (along the field) and/or Fxy. Otherwise undefined.
 */
function productStateLabel(
  order: ArrayLike<number>,
  nf: number,
  induced: Set<OrderGroupKey>,
): string | undefined {
  const sign = nf === 1 ? 1 : -1;
  const o = (k: number): number => sign * order[k]!;
  for (let a = 1; a < 4; a++) {
    for (let b = 1; b < 4; b++) {
      if (Math.abs(o(4 * a + b) - o(4 * a) * o(b)) > ORDER_TOLERANCE) return undefined;
    }
  }
  const parts: { key: OrderGroupKey; token: string }[] = [];
  const spinInPlane = Math.hypot(o(1), o(2)) > ORDER_TOLERANCE;
  const spinAlong = Math.abs(o(3)) > ORDER_TOLERANCE;
  if (spinAlong) parts.push({ key: 'spinAlongField', token: 'F' });
  if (spinInPlane) parts.push({ key: 'spinInPlane', token: 'Fxy' });
  if (Math.abs(o(12)) > ORDER_TOLERANCE) parts.push({ key: 'cdw', token: 'CDW' });
  if (Math.hypot(o(4), o(8)) > ORDER_TOLERANCE) parts.push({ key: 'bondOrder', token: 'KD' });
  const broken = parts.filter((p) => !induced.has(p.key));
  const tokens = broken.length > 0 ? broken : parts;
  return tokens.length === 0 ? 'sym' : tokens.map((t) => t.token).join('+');
}
