import { CHANNELS, parseModel, seededRandom, type Filling, type Model } from '../../solver/index';
import { standardPlane } from '../fixtures';

/** A model document as the CLI reads it (README, Command line). */
export type ModelDocument = Record<string, unknown>;

export interface ModelPair {
  readonly model: Model;
  /** The same model with every coupling moved by a small step (for warm starts). */
  readonly neighbour: Model;
}

/** One map pixel of the standard plane: 1/256 of its span of 4. */
export const NEIGHBOUR_STEP = 4 / 256;

/**
 * Generic models: all 15 channels, hartree and fock drawn independently from [-1, 1], zeeman from
 * [0, 0.5], valleyZeeman from [-0.3, 0.3]. Each comes with a neighbour whose couplings differ by
 * up to NEIGHBOUR_STEP (each coupling moved by the step times a number from [-1, 1]).
 */
export function genericModels(count: number, filling: Filling, seed: number): ModelPair[] {
  const random = seededRandom(seed);
  const uniform = (from: number, to: number): number => from + (to - from) * random();
  const out: ModelPair[] = [];
  for (let n = 0; n < count; n++) {
    const channels: Record<string, { hartree: number; fock: number }> = {};
    const moved: Record<string, { hartree: number; fock: number }> = {};
    for (const name of CHANNELS) {
      const hartree = uniform(-1, 1);
      const fock = uniform(-1, 1);
      channels[name] = { hartree, fock };
      moved[name] = {
        hartree: hartree + NEIGHBOUR_STEP * uniform(-1, 1),
        fock: fock + NEIGHBOUR_STEP * uniform(-1, 1),
      };
    }
    const zeeman = uniform(0, 0.5);
    const valleyZeeman = uniform(-0.3, 0.3);
    out.push({
      model: parseModel({ filling, channels, zeeman, valleyZeeman }),
      neighbour: parseModel({ filling, channels: moved, zeeman, valleyZeeman }),
    });
  }
  return out;
}

/** The anisotropic valley model of public/notes.html#energy with H = F (its worked point). */
export function standardDocument(uPerp: number, uZ: number, zeeman = 0.4): ModelDocument {
  return {
    filling: 0,
    channels: {
      x0: { hartree: uPerp, fock: uPerp },
      y0: { hartree: uPerp, fock: uPerp },
      z0: { hartree: uZ, fock: uZ },
    },
    zeeman,
    valleyZeeman: 0,
  };
}

/** (uPerp, uZ) of the standard model's worked point and of variants in each phase. */
export const STANDARD_POINTS: readonly { name: string; uPerp: number; uZ: number }[] = [
  { name: 'standard (CAF)', uPerp: -1, uZ: 2 },
  { name: 'F', uPerp: 0.5, uZ: 1 },
  { name: 'KD', uPerp: -1, uZ: 0 },
  { name: 'CDW', uPerp: 1, uZ: -2 },
  { name: 'CAF near F', uPerp: -0.15, uZ: 1 },
  { name: 'near KD/CDW', uPerp: -1, uZ: -0.98 },
];

/** Standard models at STANDARD_POINTS, each with its neighbour one map pixel away in uPerp. */
export function standardModels(): ModelPair[] {
  return STANDARD_POINTS.map(({ uPerp, uZ }) => ({
    model: parseModel(standardDocument(uPerp, uZ)),
    neighbour: parseModel(standardDocument(uPerp + NEIGHBOUR_STEP, uZ)),
  }));
}

/** The standard model on the standard (uPerp, uZ) plane at the given resolution. */
export function standardMapDocument(resolution: number): ModelDocument {
  return { ...standardDocument(-1, 2), plane: standardPlane(resolution, resolution) };
}
