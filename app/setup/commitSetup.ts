import { CHANNELS } from '../../solver/index';
import { nameNextStep } from '../history/historyDriver';
import type { StepName } from '../history/setupHistory';
import { derivedSetup } from '../scenario/physical';
import { isListed } from '../scenario/scenario';
import { checkSetup } from '../scenario/setupCheck';
import type { Setup } from '../scenario/setup';
import { useFourfold } from '../store/index';
import { onePartChannels } from './sweep';

export type SetupPatch = Partial<Setup> | ((setup: Setup) => Partial<Setup>);

/**
 * The changed setup with `listedZero` in step: a channel of which an axis sets one part stays
 * listed when an edit sets it to zero (so its other part stays zero rather than starting to
 * follow the axis); only zero channels are named there.
 */
function keepListed(before: Setup, next: Setup): Setup {
  const onePart = onePartChannels(next);
  const listedZero = CHANNELS.filter((ch) => {
    const c = next.channels[ch];
    if (c.hartree !== 0 || c.fock !== 0) return false;
    return (next.listedZero ?? []).includes(ch) || (onePart.has(ch) && isListed(before, ch));
  });
  const out: Setup = { ...next };
  if (listedZero.length > 0) return { ...out, listedZero };
  delete (out as { listedZero?: Setup['listedZero'] }).listedZero;
  return out;
}

/**
 * Writes a change to the store only if the whole resulting setup can be mapped (checkSetup);
 * otherwise changes nothing, so the last valid Map stays. Derived values (E_Z from the field in
 * physical units, channels from interaction ranges) are brought in step first. Returns the refusal (one line that
 * names the field) or null. A functional patch sees the setup as it is at commit time. The
 * change is a step of the undo history, named `step` when given (else by what changed).
 */
export function commitSetup(patch: SetupPatch, step?: StepName): string | null {
  const { setup, replaceSetup } = useFourfold.getState();
  const change = typeof patch === 'function' ? patch(setup) : patch;
  const keys = Object.keys(change) as (keyof Setup)[];
  if (keys.every((key) => Object.is(change[key], setup[key]))) return null;
  // Derived values (E_Z in physical units, range channels) follow every change.
  const next = keepListed(setup, derivedSetup({ ...setup, ...change }));
  const problem = checkSetup(next);
  if (problem !== null) return problem;
  if (step !== undefined) nameNextStep(step);
  replaceSetup(next);
  return null;
}
