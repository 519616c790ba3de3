import { useMemo } from 'react';
import { planeTargets, type Channel } from '../../solver/index';
import { axisTargets, setupToMapInput } from '../scenario/scenario';
import type { AxisSetup, Setup } from '../scenario/setup';
import { useFourfold } from '../store/index';

export type AxisName = 'x' | 'y';

/** Target names (`x0.fock`, `zeeman`, ...) an axis sets; the values it gives them do not matter here. */
export function axisTargetNames(axis: AxisSetup): string[] {
  return Object.keys(axisTargets(axis, { ratios: { uPerp: 1, uZ: 1 } }));
}

/**
 * Which axis sets each swept target, with the solver's rule for a channel of which an axis
 * sets one part (`planeTargets`: the Hartree part of a channel that is not listed follows its
 * Fock target). A swept target's value in the Setup is not used: the axis replaces it across
 * the plane (the model file's plane, as `npm run map` reads it).
 */
export function sweptTargets(setup: Setup): ReadonlyMap<string, AxisName | 'x and y'> {
  const targets = planeTargets(setupToMapInput(setup));
  const out = new Map<string, AxisName | 'x and y'>();
  for (const name of Object.keys(targets.x)) out.set(name, 'x');
  for (const name of Object.keys(targets.y)) out.set(name, out.has(name) ? 'x and y' : 'y');
  return out;
}

/**
 * Channels of which the axes name only one part: whether the channel is listed decides what
 * the other part does there (see `Setup.listedZero`).
 */
export function onePartChannels(setup: Pick<Setup, 'x' | 'y'>): Set<Channel> {
  const named = new Set([...axisTargetNames(setup.x), ...axisTargetNames(setup.y)]);
  const out = new Set<Channel>();
  for (const name of named) {
    const [channel, part] = name.split('.');
    if (part === undefined) continue;
    const other = part === 'fock' ? 'hartree' : 'fock';
    if (!named.has(`${channel}.${other}`)) out.add(channel as Channel);
  }
  return out;
}

/** The swept targets of the current plane. */
export function useSweptTargets(): ReadonlyMap<string, AxisName | 'x and y'> {
  // Only the axes and which channels are listed matter: a field slider does not recompute it.
  const x = useFourfold((s) => s.setup.x);
  const y = useFourfold((s) => s.setup.y);
  const channels = useFourfold((s) => s.setup.channels);
  const listedZero = useFourfold((s) => s.setup.listedZero);
  return useMemo(
    () => sweptTargets({ ...useFourfold.getState().setup, x, y, channels, listedZero }),
    [x, y, channels, listedZero],
  );
}
