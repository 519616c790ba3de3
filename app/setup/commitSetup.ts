import { derivedSetup } from '../scenario/physical';
import { checkSetup } from '../scenario/setupCheck';
import type { Setup } from '../scenario/setup';
import { useFourfold } from '../store/index';

export type SetupPatch = Partial<Setup> | ((setup: Setup) => Partial<Setup>);

/**
 * Writes a change to the store only if the whole resulting setup can be mapped (checkSetup);
 * otherwise changes nothing, so the last valid Map stays. Derived values (E_Z from the field in
 * physical units, channels from interaction ranges) are brought in step first. Returns the refusal (one line that
 * names the field) or null. A functional patch sees the setup as it is at commit time.
 */
export function commitSetup(patch: SetupPatch): string | null {
  const { setup, updateSetup } = useFourfold.getState();
  const change = typeof patch === 'function' ? patch(setup) : patch;
  const keys = Object.keys(change) as (keyof Setup)[];
  if (keys.every((key) => Object.is(change[key], setup[key]))) return null;
  // Derived values (E_Z in physical units, range channels) follow every change.
  const next = derivedSetup({ ...setup, ...change });
  const problem = checkSetup(next);
  if (problem !== null) return problem;
  updateSetup(next);
  return null;
}
