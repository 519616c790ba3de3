import { PlaneCouplings, type CutPath, type MapInput } from '../../solver/index';
import type { Setup } from '../scenario/setup';
import type { CutSpec } from '../store/cutSlice';

/**
 * E_Z at zero tilt for a tilt sweep at `at`: the pin's E_Z (from the model, or from an axis that
 * sets it), times cos(tilt) when the Setup is in physical units and so holds E_Z at its tilt.
 */
export function zeemanAtZeroTilt(
  input: MapInput,
  at: readonly [number, number],
  setup: Setup,
): number {
  const c = new PlaneCouplings(input).at(at[0], at[1]);
  // eta_0z = (oneBody 0z) - E_Z / 2 (public/notes.html#energy).
  const zeeman = -2 * (c.eta[3]! - (input.model.oneBody['0z'] ?? 0));
  const tilt = setup.physical?.tiltDeg;
  return tilt === undefined ? zeeman : zeeman * Math.cos((tilt * Math.PI) / 180);
}

/** The solver's path for what the user asked. */
export function cutPathOf(spec: CutSpec, input: MapInput, setup: Setup): CutPath {
  if (spec.kind === 'line') return { kind: 'line', from: spec.from, to: spec.to };
  if (spec.kind === 'tilt') {
    return { ...spec, kind: 'tilt', zeemanPerp: zeemanAtZeroTilt(input, spec.at, setup) };
  }
  return { kind: spec.kind, at: spec.at, from: spec.from, to: spec.to } as CutPath;
}
