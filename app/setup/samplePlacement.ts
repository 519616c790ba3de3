import type { Channel } from '../../solver/index';
import { axisTargets, isListed } from '../scenario/scenario';
import type { Setup } from '../scenario/setup';
import { onePartChannels } from './sweep';

/**
 * The value every target of the plane takes at the point (x, y): coefficient * t, summed over
 * the axes that name it (the model file's plane).
 */
export function targetValuesAt(setup: Setup, x: number, y: number): Map<string, number> {
  const values = new Map<string, number>();
  for (const [axis, t] of [
    [setup.x, x],
    [setup.y, y],
  ] as const) {
    for (const [target, coefficient] of Object.entries(axisTargets(axis, setup))) {
      values.set(target, (values.get(target) ?? 0) + coefficient * t);
    }
  }
  return values;
}

/**
 * The sample's own values put at the plane point (x, y): every target the axes set takes
 * coefficient * t there, as the Map does at that point (the model file's plane), so the tilt path
 * starts from it. E_Z is left alone: in physical units it follows B_perp, the tilt and g.
 * Returns the changed parts of the setup (channels, Delta_V).
 */
export function sampleAt(
  setup: Setup,
  x: number,
  y: number,
): Pick<Setup, 'channels' | 'valleyZeeman'> {
  const channels = { ...setup.channels };
  let valleyZeeman = setup.valleyZeeman;
  const onePart = onePartChannels(setup);
  for (const [target, value] of targetValuesAt(setup, x, y)) {
    if (target === 'valleyZeeman') valleyZeeman = value;
    else if (target !== 'zeeman') {
      const [ch, part] = target.split('.') as [Channel, 'fock' | 'hartree'];
      // Giving a channel that is not listed a value would list it, and so change what its
      // other part does across the Map (`Setup.listedZero`): it keeps its zero.
      if (onePart.has(ch) && !isListed(setup, ch)) continue;
      channels[ch] = { ...channels[ch], [part]: value };
    }
  }
  return { channels, valleyZeeman };
}
