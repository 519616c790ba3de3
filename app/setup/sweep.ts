import { useMemo } from 'react';
import { axisTargets } from '../scenario/scenario';
import type { AxisSetup, Setup } from '../scenario/setup';
import { useFourfold } from '../store/index';

export type AxisName = 'x' | 'y';

/** Target names (`x0.fock`, `zeeman`, ...) an axis sets; the values it gives them do not matter here. */
export function axisTargetNames(axis: AxisSetup): string[] {
  return Object.keys(axisTargets(axis, { ratios: { uPerp: 1, uZ: 1 } }));
}

/**
 * Which axis sets each swept target. A swept target's value in the Setup is not used: the axis
 * replaces it across the plane (the model file's plane, as `npm run map` reads it).
 */
export function sweptTargets(
  setup: Pick<Setup, 'x' | 'y'>,
): ReadonlyMap<string, AxisName | 'x and y'> {
  const out = new Map<string, AxisName | 'x and y'>();
  for (const name of axisTargetNames(setup.x)) out.set(name, 'x');
  for (const name of axisTargetNames(setup.y)) out.set(name, out.has(name) ? 'x and y' : 'y');
  return out;
}

/** The swept targets of the current plane. */
export function useSweptTargets(): ReadonlyMap<string, AxisName | 'x and y'> {
  const x = useFourfold((s) => s.setup.x);
  const y = useFourfold((s) => s.setup.y);
  return useMemo(() => sweptTargets({ x, y }), [x, y]);
}
