import { describe, expect, test } from 'vitest';
import {
  DEFAULT_DESCENT,
  DescentWorkspace,
  couplingsOf,
  descend,
  frameEnergy,
  randomFrame,
  retract,
  seededRandom,
  tangentDimension,
  tangentModel,
} from '../solver/index';
import { genericModel } from './fixtures';

/**
 * The analytic gradient and Hessian of solver/tangentSpace.ts against finite differences of the
 * energy along the retraction (central differences; common practice). The Hessian of E composed
 * with a first-order retraction equals the Riemannian one at a critical point, so it is checked
 * at converged minima.
 */
describe('tangent model', () => {
  const energyAlong = (
    c: ReturnType<typeof couplingsOf>,
    frame: Float64Array,
    step: Float64Array,
    ws: DescentWorkspace,
  ): number => {
    const out = new Float64Array(32);
    retract(c.nf, frame, step, out, new Float64Array(8));
    return frameEnergy(c, out, ws, new Float64Array(16));
  };

  test('the gradient equals central differences of the energy at random frames (all fillings)', () => {
    const random = seededRandom(11);
    const ws = new DescentWorkspace();
    for (let n = 0; n < 60; n++) {
      const c = couplingsOf(genericModel(random, ([-1, 0, 1] as const)[n % 3]));
      const frame = randomFrame(random);
      const d = tangentDimension(c.nf);
      frameEnergy(c, frame, ws, ws.order);
      tangentModel(c, frame, ws);
      const g = Float64Array.from(ws.gradient.subarray(0, d));
      const h = 1e-6;
      for (let p = 0; p < d; p++) {
        const step = new Float64Array(8);
        step[p] = h;
        const plus = energyAlong(c, frame, step, ws);
        step[p] = -h;
        const minus = energyAlong(c, frame, step, ws);
        expect(Math.abs((plus - minus) / (2 * h) - g[p]!)).toBeLessThan(1e-7 * c.scale);
      }
    }
  });

  test('the Hessian equals second differences of the energy at converged minima', () => {
    const random = seededRandom(12);
    const ws = new DescentWorkspace();
    for (let n = 0; n < 30; n++) {
      const c = couplingsOf(genericModel(random, ([-1, 0, 1] as const)[n % 3]));
      const frame = randomFrame(random);
      descend(c, frame, DEFAULT_DESCENT, ws);
      const d = tangentDimension(c.nf);
      frameEnergy(c, frame, ws, ws.order);
      tangentModel(c, frame, ws);
      const k = Float64Array.from(ws.hessian.subarray(0, d * d));
      const h = 1e-4;
      const e0 = frameEnergy(c, frame, ws, new Float64Array(16));
      for (let p = 0; p < d; p++) {
        for (let q = p; q < d; q++) {
          const step = new Float64Array(8);
          const at = (sp: number, sq: number): number => {
            step.fill(0);
            step[p] = step[p]! + sp * h;
            step[q] = step[q]! + sq * h;
            return energyAlong(c, frame, step, ws);
          };
          const fd =
            p === q
              ? (at(1, 0) - 2 * e0 + at(-1, 0)) / (h * h)
              : (at(1, 1) - at(1, -1) - at(-1, 1) + at(-1, -1)) / (4 * h * h);
          expect(Math.abs(fd - k[p * d + q]!)).toBeLessThan(2e-5 * c.scale);
          expect(k[q * d + p]).toBe(k[p * d + q]);
        }
      }
    }
  });
});
