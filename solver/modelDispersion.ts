import { solve } from './groundState';
import { ModelError, type Model } from './model';
import { modeDispersion, type ModeDispersion } from './modeDispersion';

/** Largest wavevector, 1/l_B: far past where every branch has reached its particle-hole limit. */
export const MAX_WAVEVECTOR = 1000;
/** Most wavevectors in one dispersion. */
export const MAX_WAVEVECTOR_COUNT = 10000;
/** The default grid, 0 to 6 / l_B in 61 steps (README, Command line). */
export const DEFAULT_WAVEVECTORS = { from: 0, to: 6, count: 61 } as const;

/**
 * `count` evenly spaced wavevectors from `from` to `to` (1/l_B), both included. Throws a
 * ModelError naming the problem unless 0 <= from < to <= MAX_WAVEVECTOR and count is an
 * integer from 2 to MAX_WAVEVECTOR_COUNT.
 */
export function wavevectorGrid(from: number, to: number, count: number): number[] {
  if (!Number.isFinite(from) || !Number.isFinite(to) || from < 0 || to <= from) {
    throw new ModelError(`q: expected 0 <= FROM < TO, got ${from} to ${to}`);
  }
  if (to > MAX_WAVEVECTOR) {
    throw new ModelError(`q: at most ${MAX_WAVEVECTOR} / l_B, got ${to}`);
  }
  if (!Number.isInteger(count) || count < 2 || count > MAX_WAVEVECTOR_COUNT) {
    throw new ModelError(`q: expected 2 to ${MAX_WAVEVECTOR_COUNT} points, got ${count}`);
  }
  return Array.from({ length: count }, (_, k) =>
    k === count - 1 ? to : from + ((to - from) * k) / (count - 1),
  );
}

/** A model's ground state and its modes along q. */
export interface ModelDispersion {
  readonly dispersion: ModeDispersion;
  readonly phase: string;
  /** The q = 0 modes of `solve` (what the Probe lists). */
  readonly uniformModes: number[];
}

/**
 * Solves `model` (the global search of `solve`) and computes its modes at the wavevectors `q`
 * (1/l_B) with the Coulomb scale `coulomb` (default: the model's own) and an optional gate at
 * `gateDistance` l_B. Throws a ModelError when there is no Coulomb scale.
 */
export function modelDispersion(
  model: Model,
  q: readonly number[],
  options: { coulomb?: number; gateDistance?: number } = {},
): ModelDispersion {
  const coulomb = options.coulomb ?? model.coulomb;
  if (coulomb === undefined) {
    throw new ModelError(
      "coulomb: missing; the modes at finite wavevector need the Coulomb scale e^2/(eps l_B) in the model's unit",
    );
  }
  if (options.gateDistance !== undefined && !(options.gateDistance > 0)) {
    throw new ModelError(
      `gate: expected a distance > 0 in units of l_B, got ${options.gateDistance}`,
    );
  }
  const r = solve(model);
  const dispersion = modeDispersion(r.couplings, r.frame, {
    coulomb,
    q,
    ...(options.gateDistance !== undefined ? { gateDistance: options.gateDistance } : {}),
  });
  return { dispersion, phase: r.phase, uniformModes: r.modes.frequencies };
}
