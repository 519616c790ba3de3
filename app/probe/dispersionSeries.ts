import { ORDER_GROUPS, type ModeDispersion, type OrderGroupKey } from '../../solver/index';
import { TOKEN_COLOURS, UNKNOWN_TOKEN_COLOUR } from '../figure/palette';

/**
 * What the Probe's dispersion chart and its SVG figure draw, from a `ModeDispersion` (pure, shared
 * by the app and the CLI): the rotation each colour stands for, the branches cut into runs of
 * one colour, and the axis units.
 */

/**
 * The rotation a mode performs, by the group of its generator G_ab (solver/modeRotation.ts),
 * written for `typesetLabel` (sigma_z is the spin about the field, tau_z the valley about the
 * sublattice axis).
 */
export const ROTATION_NAMES: Readonly<Record<OrderGroupKey, string>> = {
  spinAlongField: 'sigma_z: spin about the field',
  spinInPlane: 'sigma_{x,y}: spin about an in-plane axis',
  neelAlongField: 'tau_z sigma_z: A and B spins about the field, opposite',
  neelInPlane: 'tau_z sigma_{x,y}: A and B spins about an in-plane axis, opposite',
  cdw: 'tau_z: valley about tau_z',
  bondOrder: 'tau_{x,y}: valley about an in-plane axis',
  spinBondAlongField: 'tau_{x,y} sigma_z',
  spinBondInPlane: 'tau_{x,y} sigma_{x,y}',
};

/** The colour of a rotation group: the region colour of its order-parameter token. */
export function rotationColour(group: OrderGroupKey | null): string {
  if (group === null) return UNKNOWN_TOKEN_COLOUR;
  const token = ORDER_GROUPS.find((g) => g.key === group)?.token;
  return (token && TOKEN_COLOURS[token]) ?? UNKNOWN_TOKEN_COLOUR;
}

/** A stretch of one branch in one colour: point indices from `from` to `to` (inclusive). */
export interface BranchRun {
  readonly branch: number;
  readonly from: number;
  readonly to: number;
  readonly group: OrderGroupKey | null;
}

/**
 * Each branch cut where the rotation of its mode changes; a segment between two points takes
 * the rotation of its upper end (at q = 0 a Goldstone mode's own is that just above).
 */
export function branchRuns(d: ModeDispersion): BranchRun[] {
  const runs: BranchRun[] = [];
  d.branches.forEach((values, b) => {
    if (values.length < 2) return;
    let start = 0;
    let group = d.rotates[b]![1] ?? d.rotates[b]![0] ?? null;
    for (let k = 1; k < values.length; k++) {
      const g = d.rotates[b]![k] ?? group;
      if (g !== group) {
        runs.push({ branch: b, from: start, to: k - 1, group });
        start = k - 1;
        group = g;
      }
    }
    runs.push({ branch: b, from: start, to: values.length - 1, group });
  });
  return runs;
}

/** The rotation groups present, in ORDER_GROUPS order (for a legend). */
export function groupsPresent(d: ModeDispersion): OrderGroupKey[] {
  const seen = new Set(d.rotates.flat());
  return ORDER_GROUPS.map((g) => g.key).filter((k) => seen.has(k));
}

/** Units of the axes: q in 1/l_B, or 1/nm given l_B in nm; energy in the model's unit or meV. */
export interface DispersionUnits {
  /** l_B in nm (physical units), or undefined (q in 1/l_B). */
  readonly magneticLengthNm?: number;
  /** 'meV', or undefined for the model's own unit. */
  readonly energyUnit?: string;
}

/** q on the chart's axis: 1/l_B, or 1/nm. */
export function wavevectorScale(units: DispersionUnits): number {
  return units.magneticLengthNm === undefined ? 1 : 1 / units.magneticLengthNm;
}

export function wavevectorTitle(units: DispersionUnits): string {
  return units.magneticLengthNm === undefined ? 'q l_B' : 'q (1/nm)';
}

/** The energy axis: omega with its unit (a bare omega turned on its side reads as a 3). */
export function energyTitle(units: DispersionUnits): string {
  return `omega (${units.energyUnit ?? 'model unit'})`;
}

/** The energy range to show: from the deepest growth rate (drawn as -Im omega) or 0 to the top. */
export function energyExtent(d: ModeDispersion): [number, number] {
  let hi = 0;
  let lo = 0;
  for (const b of d.branches) for (const w of b) hi = Math.max(hi, w);
  for (const w of d.particleHole) hi = Math.max(hi, w);
  for (const g of d.growth) for (const w of g) lo = Math.min(lo, -w);
  if (hi === lo) hi = lo + 1;
  const pad = 0.04 * (hi - lo);
  return [lo === 0 ? 0 : lo - pad, hi + pad];
}
