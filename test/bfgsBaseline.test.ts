import { describe, expect, test } from 'vitest';
import { couplingsOf, minimiseEnergy, parseModel, seededRandom } from '../solver/index';
import { BfgsWorkspace, bfgsSolve, energyAndGradient } from './bench/bfgs';
import { genericModels, standardDocument } from './bench/models';

// The benchmark's notebook-style baseline (test/bench/bfgs.ts) must be a correct method: its
// analytic gradient is the derivative of its energy, and it finds the ground state.

describe('notebook-style BFGS baseline', () => {
  test.each([-1, 0, 1] as const)('the gradient matches central differences (nu = %i)', (nu) => {
    const c = couplingsOf(genericModels(1, nu, 11)[0]!.model);
    const random = seededRandom(3);
    const x = Float64Array.from({ length: 8 * c.nf }, () => random() - 0.5);
    const ws = new BfgsWorkspace();
    const gradient = new Float64Array(x.length);
    energyAndGradient(c, x, gradient, ws);
    const scratch = new Float64Array(x.length);
    const h = 1e-6;
    for (let i = 0; i < x.length; i++) {
      const plus = Float64Array.from(x);
      const minus = Float64Array.from(x);
      plus[i] = plus[i]! + h;
      minus[i] = minus[i]! - h;
      const numeric =
        (energyAndGradient(c, plus, scratch, ws) - energyAndGradient(c, minus, scratch, ws)) /
        (2 * h);
      expect(Math.abs(gradient[i]! - numeric)).toBeLessThan(1e-6 * c.scale);
    }
  });

  test('eight starts find the ground state of the standard model and of generic ones', () => {
    const ws = new BfgsWorkspace();
    const cases = [
      couplingsOf(parseModel(standardDocument(-1, 2))),
      couplingsOf(parseModel(standardDocument(0.5, 1))),
      ...genericModels(4, 0, 7).map(({ model }) => couplingsOf(model)),
    ];
    cases.forEach((c, n) => {
      const excess = (bfgsSolve(c, n, ws) - minimiseEnergy(c).energy) / c.scale;
      expect(Math.abs(excess)).toBeLessThan(1e-9);
    });
  });
});
