import type { SetupHistory } from '../history/setupHistory';
import type { Setup } from '../scenario/setup';
import { extentOf, sameExtent, type PlaneExtent } from './planeExtent';

/** Whether two setups' axes sweep the same quantities (only then is an extent worth restoring). */
function sameAxes(a: Pick<Setup, 'x' | 'y'>, b: Pick<Setup, 'x' | 'y'>): boolean {
  return (
    a.x.quantity === b.x.quantity &&
    a.y.quantity === b.y.quantity &&
    a.x.label === b.x.label &&
    a.y.label === b.y.label
  );
}

/**
 * The extent to go back to from `setup` (the Map's "previous extent"): the latest step of the
 * history before the shown one whose axes sweep the same quantities over another extent. A step
 * that itself went back continues from before the step it went back to, so that going back
 * again and again walks back through the extents instead of toggling between two. Null when
 * there is none.
 */
export function previousExtentStep(
  history: SetupHistory,
  setup: Pick<Setup, 'x' | 'y'>,
): { extent: PlaneExtent; step: number } | null {
  const shown = history.steps[history.index];
  if (shown === undefined) return null;
  const current = extentOf(setup);
  let k = (shown.kind === 'extent-back' ? shown.backTo : undefined) ?? history.index;
  for (k -= 1; k >= 0; k--) {
    const candidate = history.steps[k]!.setup;
    if (!sameAxes(candidate, setup)) continue;
    const extent = extentOf(candidate);
    if (!sameExtent(extent, current)) return { extent, step: k };
  }
  return null;
}
