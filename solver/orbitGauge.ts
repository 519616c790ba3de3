import type { ModelSymmetry } from './symmetry';
import { orderOfProjector, projectorOf } from './state';

/**
 * Ground states are degenerate along the orbits of the model's continuous symmetries
 * (public/notes.html#state). This picks one point of each orbit so that reported projectors and
 * spinors do not depend on where a descent happened to stop: a spin rotation about the field
 * turns the first nonzero pair (o_ax, o_ay), valley letters in the order 0, z, x, y, onto the
 * positive x axis; a valley rotation about tau_z does the same for (o_xb, o_yb), spin letters in
 * the order 0, z, x, y.
 */

const SPIN_PAIRS: readonly (readonly [number, number])[] = [
  [1, 2],
  [13, 14],
  [5, 6],
  [9, 10],
];
const VALLEY_PAIRS: readonly (readonly [number, number])[] = [
  [4, 8],
  [7, 11],
  [5, 9],
  [6, 10],
];

const PAIR_TOLERANCE = 1e-7;

function firstAngle(order: Float64Array, pairs: readonly (readonly [number, number])[]): number {
  for (const [x, y] of pairs) {
    if (Math.hypot(order[x]!, order[y]!) > PAIR_TOLERANCE) return Math.atan2(order[y]!, order[x]!);
  }
  return 0;
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

/** Scratch of `canonicaliseOrbit` (called for every Map pixel), reused between calls. */
const scratch = { projector: new Float64Array(32), order: new Float64Array(16) };

/** Moves `frame` (in place) to the canonical point of its symmetry orbit. */
export function canonicaliseOrbit(frame: Float64Array, nf: number, symmetry: ModelSymmetry): void {
  if (!symmetry.spinRotationAboutField && !symmetry.valleyRotation) return;
  const order = orderOfProjector(projectorOf(frame, nf, scratch.projector), scratch.order);
  // exp(-i alpha sigma_z / 2) turns the spin by alpha about z; undo the present angle.
  const alpha = symmetry.spinRotationAboutField ? -firstAngle(order, SPIN_PAIRS) : 0;
  const beta = symmetry.valleyRotation ? -firstAngle(order, VALLEY_PAIRS) : 0;
  if (alpha !== 0 || beta !== 0) rotateFrame(frame, alpha, beta);
}
