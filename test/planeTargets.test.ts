import { describe, expect, test } from 'vitest';
import {
  CHANNELS,
  PlaneCouplings,
  couplingsOf,
  modelAtPoint,
  modelToJson,
  parseMapInput,
  parseModel,
  planeTargets,
  seededRandom,
  type RandomSource,
} from '../solver/index';
import { errorOf } from './fixtures';
import { FOCK_ONLY_SCENARIO } from './scenarios';

function withPlane(channels: Record<string, unknown>, x: Record<string, number>) {
  return {
    filling: 0,
    channels,
    zeeman: 0.2,
    plane: {
      x: { from: -1, to: 1, targets: x },
      y: { from: 0, to: 1, targets: { zeeman: 1 } },
      resolution: [8, 8],
    },
  };
}

describe('an axis that sets one part of a channel', () => {
  test('a channel listed in channels keeps its other part (Fock-only and Hartree-only targets)', () => {
    const input = parseMapInput(FOCK_ONLY_SCENARIO);
    const model = modelAtPoint(input, 0.7, -1.2);
    expect(model.channels.x0).toEqual({ hartree: -0.8, fock: 0.7 });
    expect(model.channels.y0).toEqual({ hartree: -0.8, fock: 0.7 });
    // z0 is listed with fock alone: its Hartree part is 1.5 (missing hartree = fock) and stays.
    expect(model.channels.z0).toEqual({ hartree: 1.5, fock: -1.2 });
    expect(planeTargets(input)).toEqual({
      x: { 'x0.fock': 1, 'y0.fock': 1 },
      y: { 'z0.fock': 1 },
    });

    const hartreeOnly = parseMapInput(
      withPlane({ xz: { hartree: 0.3, fock: -0.4 } }, { 'xz.hartree': 2 }),
    );
    expect(modelAtPoint(hartreeOnly, 0.25, 0.5).channels.xz).toEqual({ hartree: 0.5, fock: -0.4 });
  });

  test('a channel absent from channels has its Hartree part follow the axis (missing hartree = fock)', () => {
    const input = parseMapInput(withPlane({ x0: -1 }, { 'zz.fock': 0.5 }));
    expect(planeTargets(input).x).toEqual({ 'zz.fock': 0.5, 'zz.hartree': 0.5 });
    expect(modelAtPoint(input, 0.8, 0.3).channels.zz).toEqual({ hartree: 0.4, fock: 0.4 });
    expect(modelAtPoint(input, 0.8, 0.3).zeeman).toBe(0.3);
    // Listed as zero, the channel keeps its Hartree part at zero instead.
    const listed = parseMapInput(withPlane({ x0: -1, zz: 0 }, { 'zz.fock': 0.5 }));
    expect(modelAtPoint(listed, 0.8, 0.3).channels.zz).toEqual({ hartree: 0, fock: 0.4 });
    // A Hartree target on the other axis is the axes' own: nothing follows.
    const both = parseMapInput({
      ...withPlane({}, { 'zz.fock': 1 }),
      plane: {
        x: { from: -1, to: 1, targets: { 'zz.fock': 1 } },
        y: { from: 0, to: 1, targets: { 'zz.hartree': 3 } },
      },
    });
    expect(modelAtPoint(both, 0.5, 0.25).channels.zz).toEqual({ hartree: 0.75, fock: 0.5 });
  });

  test('a Hartree target on a channel with no Fock part anywhere is refused, naming the target', () => {
    const message = errorOf(() => parseMapInput(withPlane({ x0: -1 }, { 'zz.hartree': 1 })));
    expect(message).not.toContain('\n');
    expect(message).toMatch(/^plane\.x\.targets\.zz\.hartree: /);
    expect(message).toContain('zz.fock');
  });

  test('two axes that name the same target add their contributions', () => {
    const input = parseMapInput({
      ...withPlane({ xy: { hartree: 0.1, fock: 0.2 } }, {}),
      plane: {
        x: { from: -1, to: 1, targets: { 'xy.fock': 1, valleyZeeman: 2 } },
        y: { from: 0, to: 1, targets: { 'xy.fock': -0.5, valleyZeeman: 1 } },
      },
    });
    const model = modelAtPoint(input, 0.5, 0.25);
    expect(model.channels.xy).toEqual({ hartree: 0.1, fock: 0.5 - 0.125 });
    expect(model.valleyZeeman).toBe(1.25);
  });
});

function randomTargets(random: RandomSource): Record<string, number> {
  const out: Record<string, number> = {};
  const count = 1 + Math.floor(random() * 4);
  for (let k = 0; k < count; k++) {
    const r = random();
    const name =
      r < 0.1
        ? 'zeeman'
        : r < 0.2
          ? 'valleyZeeman'
          : `${CHANNELS[Math.floor(random() * CHANNELS.length)]!}.${random() < 0.75 ? 'fock' : 'hartree'}`;
    out[name] = 2 * random() - 1;
  }
  return out;
}

describe('a plane point is the model of modelAtPoint', () => {
  test('PlaneCouplings at a point equal the couplings of parseModel(modelAtPoint) (300 random planes)', () => {
    const random = seededRandom(20240612);
    let checked = 0;
    for (let trial = 0; trial < 300; trial++) {
      const channels: Record<string, unknown> = {};
      for (const ch of CHANNELS) {
        const r = random();
        if (r < 0.4) continue;
        channels[ch] =
          r < 0.6
            ? { fock: 2 * random() - 1 }
            : { hartree: 2 * random() - 1, fock: 2 * random() - 1 };
      }
      const json = {
        filling: [-1, 0, 1][Math.floor(random() * 3)],
        channels,
        zeeman: random(),
        valleyZeeman: random() - 0.5,
        oneBody: random() < 0.3 ? { '0z': random() - 0.5, xx: random() - 0.5 } : {},
        plane: {
          x: { from: -2, to: 2, targets: randomTargets(random) },
          y: { from: -1, to: 3, targets: randomTargets(random) },
          resolution: [4, 4],
        },
      };
      let input;
      try {
        input = parseMapInput(json);
      } catch (error) {
        // Only the Hartree-alone rule refuses these planes.
        expect((error as Error).message).toMatch(/Hartree part alone/);
        continue;
      }
      const plane = new PlaneCouplings(input);
      for (const [x, y] of [
        [random() * 4 - 2, random() * 4 - 1],
        [0.3, -0.7],
      ] as const) {
        const direct = couplingsOf(parseModel(modelToJson(modelAtPoint(input, x, y))));
        const at = plane.at(x, y);
        const tolerance = 1e-12 * direct.scale;
        for (let k = 0; k < 16; k++) {
          expect(Math.abs(at.hartree[k]! - direct.hartree[k]!)).toBeLessThan(tolerance);
          expect(Math.abs(at.fock[k]! - direct.fock[k]!)).toBeLessThan(tolerance);
          expect(Math.abs(at.eta[k]! - direct.eta[k]!)).toBeLessThan(tolerance);
          expect(Math.abs(at.kappa[k]! - direct.kappa[k]!)).toBeLessThan(4 * tolerance);
        }
        expect(Math.abs(at.c0 - direct.c0)).toBeLessThan(16 * tolerance);
        expect(Math.abs(at.identityShift - direct.identityShift)).toBeLessThan(16 * tolerance);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(400);
  });
});
