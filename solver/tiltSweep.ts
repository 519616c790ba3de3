import { computeCut } from './cut';
import { MAX_SWEEP_TILT } from './fitPlane';
import type { MapInput } from './plane';
import { zeemanEnergyMeV } from './units';

/** The transitions met when the field is tilted at one point of a fit's plane. */
export interface TiltSweep {
  /** Label at the starting tilt and at MAX_SWEEP_TILT. */
  readonly start: string;
  readonly end: string;
  /** Located transitions, in order of tilt (degrees), each between two labels. */
  readonly transitions: readonly {
    readonly tiltDeg: number;
    readonly between: readonly [string, string];
    readonly order: 'first' | 'continuous';
  }[];
}

/** Samples of a sweep: each gets a global search, and the Cut continues its neighbours too. */
export const SWEEP_SAMPLES = 6;

/**
 * Tilts the field from `startDeg` to MAX_SWEEP_TILT at the plane point (x, y) of a per-tesla
 * input (its `valleyZeeman` the row's Delta_V per tesla): E_Z = g mu_B / cos(tilt) per tesla, the
 * couplings stay (public/notes.html#observations). A tilt Cut (`computeCut`) of SWEEP_SAMPLES
 * samples: every sample gets a global search, each is also reached from its neighbours both
 * ways, and each transition is bisected to 1e-9 of the sweep.
 */
export function tiltSweep(
  input: MapInput,
  x: number,
  y: number,
  gFactor: number,
  startDeg: number,
): TiltSweep {
  const cut = computeCut(
    input,
    {
      kind: 'tilt',
      at: [x, y],
      from: startDeg,
      to: MAX_SWEEP_TILT,
      zeemanPerp: zeemanEnergyMeV(1, 0, gFactor),
    },
    SWEEP_SAMPLES,
  );
  return {
    start: cut.labels[0]!,
    end: cut.labels[cut.labels.length - 1]!,
    transitions: cut.transitions.map((t) => ({
      tiltDeg: t.s,
      between: t.between,
      order: t.order,
    })),
  };
}

/**
 * The transition tilt a sweep predicts for a row: the first transition between the row's pair
 * (lower tilt first; the reverse order is accepted when that order is absent), or the first
 * transition of all when the row names none. Without one, a sweep that already starts in the
 * state the transition leads to (the pair's second label; for no pair: no change at all up to
 * MAX_SWEEP_TILT, so the start already is the large-tilt state) predicts the start: the
 * transition lies at or below it. Otherwise null: the model has no such transition.
 */
export function predictedTilt(
  sweep: TiltSweep,
  startDeg: number,
  pair: readonly [string, string] | null,
): number | null {
  if (pair === null) {
    return sweep.transitions.length > 0 ? sweep.transitions[0]!.tiltDeg : startDeg;
  }
  const forward = sweep.transitions.find(
    (t) => t.between[0] === pair[0] && t.between[1] === pair[1],
  );
  const either =
    forward ?? sweep.transitions.find((t) => t.between[0] === pair[1] && t.between[1] === pair[0]);
  if (either !== undefined) return either.tiltDeg;
  return sweep.start === pair[1] ? startDeg : null;
}

/**
 * The residual of a transition row in units of its sigma; a row whose transition the model lacks
 * (null prediction) counts as lying at the farther end of the sweep's range from the observed
 * tilt, so that the likelihood stays finite and pushes away from there.
 */
export function tiltResidual(
  predicted: number | null,
  observed: number,
  sigma: number,
  startDeg: number,
): number {
  if (predicted !== null) return (predicted - observed) / sigma;
  const far = observed - startDeg > MAX_SWEEP_TILT - observed ? startDeg : MAX_SWEEP_TILT;
  return (far - observed) / sigma;
}
