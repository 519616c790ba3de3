import { CHANNELS } from './channels';
import type { Couplings } from './couplings';
import { isSymmetry, orbitTangent } from './goldstoneModes';
import { ORDER_GROUPS, type OrderGroupKey } from './orderParameters';

/** The order-parameter group of each channel index 1..15. */
const GROUP_OF = new Map<number, OrderGroupKey>(
  ORDER_GROUPS.flatMap((g) => g.channels.map((ch) => [CHANNELS.indexOf(ch) + 1, g.key] as const)),
);

/** Generators in the order ties are settled: spin about the field, valley about tau_z, the rest. */
const PREFERENCE: readonly number[] = [3, 12, 1, 2, 4, 5, 6, 7, 8, 9, 10, 11, 13, 14, 15];

/**
 * Which rotation a collective mode performs (public/notes.html#dispersion). Every tangent
 * direction of the state is a combination of the orbit tangents of the 15 rotations
 * exp(i theta G_ab) (goldstoneModes.ts); a mode performs the rotation whose tangent lies most
 * nearly in the plane of its motion. Several can lie in it (on a canted antiferromagnet the spin
 * rotation about the field and a Neel rotation move the state alike); then a symmetry of the
 * model goes first, and among equals the spin rotation about the field, the valley rotation
 * about tau_z, then channel order. The mode is reported by the order-parameter group of that
 * generator (orderParameters.ts: 0z spin about the field, 0x and 0y spin about an in-plane
 * axis, ...), whose colour the charts use.
 */
export class ModeRotation {
  private readonly tangents: { generator: number; unit: Float64Array; rank: number }[] = [];

  constructor(c: Couplings, frame: Float64Array) {
    PREFERENCE.forEach((g, order) => {
      const t = orbitTangent(frame, c.nf, g);
      const norm = Math.sqrt(dot(t, t));
      if (norm <= 1e-8) return;
      const rank = order + (isSymmetry(c, g) ? 0 : PREFERENCE.length);
      this.tangents.push({ generator: g, unit: t.map((x) => x / norm), rank });
    });
  }

  /**
   * The group of the mode moving in the plane spanned by the two vectors of `plane` (d numbers
   * each), or null when the plane is degenerate.
   */
  groupOf(plane: Float64Array): OrderGroupKey | null {
    const d = plane.length / 2;
    const spanned: Float64Array[] = [];
    for (const half of [plane.subarray(0, d), plane.subarray(d)]) {
      const v = Float64Array.from(half);
      if (orthonormalInto(spanned, v)) spanned.push(v);
    }
    if (spanned.length === 0) return null;
    let best: { generator: number; share: number; rank: number } | null = null;
    for (const { generator, unit, rank } of this.tangents) {
      let share = 0;
      for (const x of spanned) share += dot(unit, x) ** 2;
      if (share < 1e-6) continue;
      const clearlyMore = best === null || share > best.share + 1e-3;
      const asMuch = best !== null && Math.abs(share - best.share) <= 1e-3;
      if (clearlyMore || (asMuch && rank < best!.rank)) best = { generator, share, rank };
    }
    return best === null ? null : (GROUP_OF.get(best.generator) ?? null);
  }
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let k = 0; k < a.length; k++) s += a[k]! * b[k]!;
  return s;
}

/**
 * Makes `v` orthonormal to `basis` in place (Gram-Schmidt, twice for accuracy); false when
 * nothing of it is left (norm below 1e-8 of what it was, or below 1e-12).
 */
function orthonormalInto(basis: readonly Float64Array[], v: Float64Array): boolean {
  const before = Math.sqrt(dot(v, v));
  if (before === 0) return false;
  for (let pass = 0; pass < 2; pass++) {
    for (const b of basis) {
      const p = dot(v, b);
      for (let k = 0; k < v.length; k++) v[k] = v[k]! - p * b[k]!;
    }
  }
  const after = Math.sqrt(dot(v, v));
  if (after <= 1e-8 * before || after <= 1e-12) return false;
  for (let k = 0; k < v.length; k++) v[k] = v[k]! / after;
  return true;
}
