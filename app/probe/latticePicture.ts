import type { ProbeReport } from '../../solver/index';

/** A lattice site of the patch, in units of the carbon-carbon distance. */
export interface LatticeSite {
  readonly x: number;
  readonly y: number;
  readonly sublattice: 'A' | 'B';
  /** Electrons per flux quantum on this sublattice (0..Nf). */
  readonly charge: number;
  /** Spin vector <sigma> (units of hbar/2); z along the field, drawn out of the page. */
  readonly spin: readonly number[];
}

/** A nearest-neighbour bond and its modulation. */
export interface LatticeBond {
  readonly x1: number;
  readonly y1: number;
  readonly x2: number;
  readonly y2: number;
  /** Bond class 0, 1, 2 of the Kekule (three-site-period) pattern. */
  readonly bondClass: number;
  /** Charge bond-density modulation of its class, Re[(o_x0 + i o_y0) w^m]. */
  readonly modulation: number;
  /** The same per spin along the field (up, down); they add up to `modulation`. */
  readonly bySpin: readonly [number, number];
  /**
   * Spin-density modulation of the bond across the field (in-plane spin bond order, SBxy): the
   * x and y components Re[(o_xb + i o_yb) w^m], b = x, y, in units of hbar/2.
   */
  readonly spinAcross: readonly [number, number];
}

export interface LatticePicture {
  readonly sites: LatticeSite[];
  readonly bonds: LatticeBond[];
  /** Corners of one enlarged (Kekule) unit cell, for an outline. */
  readonly cell: [number, number][];
  /** Half-width and half-height of the patch window. */
  readonly halfWidth: number;
  readonly halfHeight: number;
  readonly nf: number;
  /** Largest |modulation| over the three classes and both spins (0 without bond order). */
  readonly maxModulation: number;
  /** Largest length of a bond's in-plane spin modulation (0 without in-plane spin bond order). */
  readonly maxSpinAcross: number;
}

// Honeycomb with carbon-carbon distance 1: A sites at n1 a1 + n2 a2, B sites at A + delta_0;
// the A site at R bonds to the B sites at R + delta_j (common practice, e.g. Castro Neto et al.,
// Rev. Mod. Phys. 81, 109 (2009), section II.A, rotated).
const SQRT3 = Math.sqrt(3);
const A1: [number, number] = [SQRT3, 0];
const A2: [number, number] = [SQRT3 / 2, 1.5];
const DELTA: [number, number][] = [
  [0, 1],
  [SQRT3 / 2, -0.5],
  [-SQRT3 / 2, -0.5],
];

/**
 * Bond class of the bond from the A site (n1, n2) along delta_j: (j + n1 - n2) mod 3. The phase
 * exp(i (K - K') . r) of the intervalley coherence takes three values on the lattice, so the
 * bonds fall into three classes, and every site has one bond of each (the Kekule pattern; Hou,
 * Chamon and Mudry, PRL 98, 186809 (2007), from memory). Which class carries phase 0 is a
 * convention chosen here.
 */
export function bondClass(n1: number, n2: number, j: number): number {
  return (((j + n1 - n2) % 3) + 3) % 3;
}

function classModulation(amplitude: number, phase: number, m: number): number {
  return Number.isNaN(phase) || amplitude === 0
    ? 0
    : amplitude * Math.cos(phase + (2 * Math.PI * m) / 3);
}

/**
 * A patch of honeycomb lattice drawn from a Probe's numbers: the charge and spin of each
 * sublattice on its sites, and the Kekule modulation on the bonds (of the charge, of each spin
 * along the field, and of the spin across it). Nothing is chosen by phase
 * label: a state with no bond order has equal bonds, one with no CDW equal sites.
 */
export function latticePicture(
  report: ProbeReport,
  halfWidth = 4.6,
  halfHeight = 3.4,
): LatticePicture {
  const nf = report.spinors.length;
  const { a, b } = report.sublattices;
  const bonds = report.bonds;
  const up = report.bonds.bySpin.up;
  const down = report.bonds.bySpin.down;
  const order = report.state.order;
  const across = (spin: 'x' | 'y') => {
    const re = order[`x${spin}`] ?? 0;
    const im = order[`y${spin}`] ?? 0;
    return { amplitude: Math.hypot(re, im), phase: Math.atan2(im, re) };
  };
  const acrossX = across('x');
  const acrossY = across('y');
  const sites: LatticeSite[] = [];
  const bondList: LatticeBond[] = [];
  const inside = (x: number, y: number) =>
    Math.abs(x) <= halfWidth + 1e-9 && Math.abs(y) <= halfHeight + 1e-9;
  const range = Math.ceil(Math.max(halfWidth, halfHeight)) + 3;
  for (let n1 = -2 * range; n1 <= 2 * range; n1++) {
    for (let n2 = -range; n2 <= range; n2++) {
      const x = n1 * A1[0] + n2 * A2[0];
      const y = n1 * A1[1] + n2 * A2[1];
      const bx = x + DELTA[0]![0];
      const by = y + DELTA[0]![1];
      if (inside(x, y)) sites.push({ x, y, sublattice: 'A', charge: a.charge, spin: a.spin });
      if (inside(bx, by))
        sites.push({ x: bx, y: by, sublattice: 'B', charge: b.charge, spin: b.spin });
      if (!inside(x, y)) continue;
      DELTA.forEach(([dx, dy], j) => {
        const x2 = x + dx;
        const y2 = y + dy;
        if (!inside(x2, y2)) return;
        const m = bondClass(n1, n2, j);
        bondList.push({
          x1: x,
          y1: y,
          x2,
          y2,
          bondClass: m,
          modulation: classModulation(bonds.amplitude, bonds.phase, m),
          bySpin: [
            classModulation(up.amplitude, up.phase, m),
            classModulation(down.amplitude, down.phase, m),
          ],
          spinAcross: [
            classModulation(acrossX.amplitude, acrossX.phase, m),
            classModulation(acrossY.amplitude, acrossY.phase, m),
          ],
        });
      });
    }
  }
  let maxModulation = 0;
  let maxSpinAcross = 0;
  for (const bond of bondList) {
    maxSpinAcross = Math.max(maxSpinAcross, Math.hypot(...bond.spinAcross));
    maxModulation = Math.max(
      maxModulation,
      Math.abs(bond.modulation),
      Math.abs(bond.bySpin[0]),
      Math.abs(bond.bySpin[1]),
    );
  }
  // One enlarged cell: spanned by a1 + a2 and 2 a1 - a2 (three graphene cells, six sites), with
  // a corner at the A site nearest the centre.
  const c1: [number, number] = [A1[0] + A2[0], A1[1] + A2[1]];
  const c2: [number, number] = [2 * A1[0] - A2[0], 2 * A1[1] - A2[1]];
  const o: [number, number] = [-(c1[0] + c2[0]) / 2, -(c1[1] + c2[1]) / 2];
  const snap = nearestA(o);
  const cell: [number, number][] = [
    snap,
    [snap[0] + c2[0], snap[1] + c2[1]],
    [snap[0] + c1[0] + c2[0], snap[1] + c1[1] + c2[1]],
    [snap[0] + c1[0], snap[1] + c1[1]],
  ];
  return {
    sites,
    bonds: bondList,
    cell,
    halfWidth,
    halfHeight,
    nf,
    maxModulation,
    maxSpinAcross,
  };
}

function nearestA(p: [number, number]): [number, number] {
  // Solve p = n1 a1 + n2 a2 and round.
  const n2 = Math.round(p[1] / A2[1]);
  const n1 = Math.round((p[0] - n2 * A2[0]) / A1[0]);
  return [n1 * A1[0] + n2 * A2[0], n1 * A1[1] + n2 * A2[1]];
}
