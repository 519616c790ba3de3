import type { ModelSymmetry } from './symmetry';
import { orderOfProjector, projectorOf } from './state';

/**
 * Ground states are degenerate along the orbits of the model's continuous symmetries
 * (public/notes.html#state). This picks one point of each orbit so that reported projectors and
 * spinors do not depend on where a descent happened to stop. A spin rotation about the field by
 * alpha turns every pair (o_ax, o_ay) by alpha; a valley rotation about tau_z by beta turns every
 * pair (o_xb, o_yb) by beta; the block M = [[o_xx, o_xy], [o_yx, o_yy]] (rows valley x, y;
 * columns spin x, y) becomes R(beta) M R(alpha)^T.
 *
 * - A spin doublet (o_0x, o_0y), else (o_zx, o_zy), fixes alpha: it is turned onto the positive
 *   x axis. A valley doublet (o_x0, o_y0), else (o_xz, o_yz), fixes beta the same way.
 * - An angle no doublet fixes is then fixed by the block, after the other rotation: alpha by its
 *   first nonzero row, beta by its first nonzero column, onto the positive x axis.
 * - With both rotations and neither fixed by a doublet, the block alone is turned diagonal, the
 *   larger entry first and positive (its singular values, the second with the sign of det M).
 *
 * The point reached is the same from every point of the orbit.
 */

const SPIN_DOUBLETS: readonly (readonly [number, number])[] = [
  [1, 2],
  [13, 14],
];
const VALLEY_DOUBLETS: readonly (readonly [number, number])[] = [
  [4, 8],
  [7, 11],
];
/** Rows (valley x, y) and columns (spin x, y) of the block. */
const BLOCK_ROWS: readonly (readonly [number, number])[] = [
  [5, 6],
  [9, 10],
];
const BLOCK_COLUMNS: readonly (readonly [number, number])[] = [
  [5, 9],
  [6, 10],
];

const PAIR_TOLERANCE = 1e-7;

/** Angle of the first pair above the tolerance, or undefined when all vanish. */
function firstAngle(
  order: Float64Array,
  pairs: readonly (readonly [number, number])[],
): number | undefined {
  for (const [x, y] of pairs) {
    if (Math.hypot(order[x]!, order[y]!) > PAIR_TOLERANCE) return Math.atan2(order[y]!, order[x]!);
  }
  return undefined;
}

/** Scratch of `canonicaliseOrbit` (called for every Map pixel), reused between calls. */
const scratch = { projector: new Float64Array(32), order: new Float64Array(16) };

function orderOf(frame: Float64Array, nf: number): Float64Array {
  return orderOfProjector(projectorOf(frame, nf, scratch.projector), scratch.order);
}

/** Moves `frame` (in place) to the canonical point of its symmetry orbit. */
export function canonicaliseOrbit(frame: Float64Array, nf: number, symmetry: ModelSymmetry): void {
  const spin = symmetry.spinRotationAboutField;
  const valley = symmetry.valleyRotation;
  if (!spin && !valley) return;
  let order = orderOf(frame, nf);
  const spinAngle = spin ? firstAngle(order, SPIN_DOUBLETS) : undefined;
  const valleyAngle = valley ? firstAngle(order, VALLEY_DOUBLETS) : undefined;
  if (spin && valley && spinAngle === undefined && valleyAngle === undefined) {
    // The block alone: M = p R(phi1) + q R(phi2) diag(1, -1), p, q >= 0, goes to
    // R(phi1 + beta - alpha) p + R(phi2 + beta + alpha) diag(1, -1) q, diagonal for
    // alpha = (phi1 - phi2) / 2, beta = -(phi1 + phi2) / 2: diag(p + q, p - q).
    const [a, b, c, d] = [order[5]!, order[6]!, order[9]!, order[10]!];
    const phi1 = Math.hypot(a + d, c - b) > PAIR_TOLERANCE ? Math.atan2(c - b, a + d) : 0;
    const phi2 = Math.hypot(a - d, b + c) > PAIR_TOLERANCE ? Math.atan2(b + c, a - d) : 0;
    const alpha = (phi1 - phi2) / 2;
    const beta = -(phi1 + phi2) / 2;
    if (alpha !== 0 || beta !== 0) rotateFrame(frame, alpha, beta);
    return;
  }
  const alpha = spinAngle === undefined ? 0 : -spinAngle;
  const beta = valleyAngle === undefined ? 0 : -valleyAngle;
  if (alpha !== 0 || beta !== 0) rotateFrame(frame, alpha, beta);
  if (spin && spinAngle === undefined) {
    if (alpha !== 0 || beta !== 0) order = orderOf(frame, nf);
    const row = firstAngle(order, BLOCK_ROWS);
    if (row !== undefined && row !== 0) rotateFrame(frame, -row, 0);
  } else if (valley && valleyAngle === undefined) {
    if (alpha !== 0 || beta !== 0) order = orderOf(frame, nf);
    const column = firstAngle(order, BLOCK_COLUMNS);
    if (column !== undefined && column !== 0) rotateFrame(frame, 0, -column);
  }
}

/** Multiplies component r = 2 v + s of every frame vector by exp(-i (alpha s_z + beta t_z) / 2). */
function rotateFrame(frame: Float64Array, alpha: number, beta: number): void {
  for (let r = 0; r < 4; r++) {
    const sz = (r & 1) === 0 ? 1 : -1;
    const tz = r < 2 ? 1 : -1;
    const angle = -(alpha * sz + beta * tz) / 2;
    const cr = Math.cos(angle);
    const ci = Math.sin(angle);
    for (let k = 0; k < 4; k++) {
      const i = 8 * k + 2 * r;
      const xr = frame[i]!;
      const xi = frame[i + 1]!;
      frame[i] = xr * cr - xi * ci;
      frame[i + 1] = xr * ci + xi * cr;
    }
  }
}
