import { expect } from 'vitest';
import { CHANNELS, ModelError, parseModel, type Model, type RandomSource } from '../solver/index';

/** Shared test inputs (not a test file itself: vitest runs `*.test.ts` only). */

/** A model file: the worked point of public/notes.html#closed-forms (H = F). */
export const INTERFACES_EXAMPLE = {
  filling: 0,
  channels: {
    x0: { hartree: -1.0, fock: -1.0 },
    y0: { hartree: -1.0, fock: -1.0 },
    z0: { hartree: 2.0, fock: 2.0 },
  },
  zeeman: 0.4,
  valleyZeeman: 0.0,
};

/**
 * The (uPerp, uZ) plane (a model file's `plane`) for the standard model (H = F), with its ranges
 * and resolution free.
 */
export function standardPlane(
  nx: number,
  ny: number,
  xRange: readonly [number, number] = [-2, 2],
  yRange: readonly [number, number] = [-2, 2],
) {
  return {
    x: {
      label: 'u_perp',
      from: xRange[0],
      to: xRange[1],
      targets: { 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': 1, 'y0.hartree': 1 },
    },
    y: {
      label: 'u_z',
      from: yRange[0],
      to: yRange[1],
      targets: { 'z0.fock': 1, 'z0.hartree': 1 },
    },
    resolution: [nx, ny] as [number, number],
  };
}

/** The invented sample of public/examples/sample-map.json on a plane of the given size. */
export function sampleMapDocument(nx: number, ny: number, zeeman = 0.5) {
  return {
    filling: 0,
    channels: {
      x0: { hartree: -0.8, fock: -1.0 },
      y0: { hartree: -0.8, fock: -1.0 },
      z0: { fock: 1.5 },
    },
    zeeman,
    valleyZeeman: 0.1,
    plane: {
      x: {
        label: 'u_perp',
        from: -2,
        to: 2,
        targets: { 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': 0.8, 'y0.hartree': 0.8 },
      },
      y: { label: 'u_z', from: -2, to: 2, targets: { 'z0.fock': 1, 'z0.hartree': 1 } },
      resolution: [nx, ny] as [number, number],
    },
  };
}

/** A generic model: all 15 channels, Hartree and Fock drawn independently in [-1, 1]. */
export function genericModel(
  random: RandomSource,
  filling: -1 | 0 | 1,
  zeemanMax = 0.6,
  valleyZeemanMax = 0.3,
): Model {
  const channels: Record<string, { hartree: number; fock: number }> = {};
  for (const ch of CHANNELS) channels[ch] = { hartree: 2 * random() - 1, fock: 2 * random() - 1 };
  return parseModel({
    filling,
    channels,
    zeeman: zeemanMax * random(),
    valleyZeeman: valleyZeemanMax * (2 * random() - 1),
  });
}

/** A random small Map: any filling, 2 to 15 channels, H != F, fields on the axes, 2 to 9 per side. */
export function randomMapDocument(random: RandomSource): Record<string, unknown> {
  const filling = [-1, 0, 1][Math.floor(3 * random())]!;
  const names = [...CHANNELS]
    .map((name) => ({ name, key: random() }))
    .sort((a, b) => a.key - b.key)
    .slice(0, 2 + Math.floor(14 * random()))
    .map((c) => c.name);
  const channels: Record<string, unknown> = {};
  for (const name of names) {
    const fock = 2 * random() - 1;
    channels[name] = random() < 0.3 ? { fock } : { hartree: 2 * random() - 1, fock };
  }
  const pool = [...names.flatMap((n) => [`${n}.fock`, `${n}.hartree`]), 'zeeman', 'valleyZeeman'];
  const axis = (): Record<string, unknown> => {
    const targets: Record<string, number> = {};
    for (let q = 1 + Math.floor(3 * random()); q > 0; q--) {
      targets[pool[Math.floor(random() * pool.length)]!] =
        Math.round((4 * random() - 2) * 10) / 10 || 1;
    }
    const from = Math.round((4 * random() - 2) * 4) / 4;
    const to = Math.round((4 * random() - 2) * 4) / 4;
    return { from, to: to === from ? from + 1 : to, targets };
  };
  // A Hartree target of a channel the model does not list needs a Fock part (the file rule).
  const document = {
    filling,
    channels,
    zeeman: random() < 0.5 ? 0 : Math.round(random() * 10) / 10,
    valleyZeeman: random() < 0.5 ? 0 : Math.round((random() - 0.5) * 10) / 10,
    plane: {
      x: axis(),
      y: axis(),
      resolution: [2 + Math.floor(8 * random()), 2 + Math.floor(8 * random())],
    },
  };
  return document;
}

/** The ModelError message thrown by `run`; fails the test when nothing or something else is thrown. */
export function errorOf(run: () => unknown): string {
  try {
    run();
  } catch (error) {
    expect(error).toBeInstanceOf(ModelError);
    return (error as ModelError).message;
  }
  throw new Error('expected a ModelError, but nothing was thrown');
}
