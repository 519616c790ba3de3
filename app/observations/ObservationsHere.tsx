import { useMemo } from 'react';
import { useFourfold } from '../store/index';
import { setupKey } from './browserFit';

/** The pixel of a grid of centres `values` (evenly spaced) nearest to `v`, or -1 outside. */
function nearest(values: Float64Array, v: number): number {
  const n = values.length;
  if (n === 0) return -1;
  const step = n > 1 ? values[1]! - values[0]! : 1;
  const k = Math.round((v - values[0]!) / step);
  return k < 0 || k >= n ? -1 : k;
}

/**
 * How many of the kept observations hold at the plane point (x, y), from the last fit in the
 * page (its grid's nearest pixel), while the setup is the one fitted.
 */
export function ObservationsHere({ x, y }: { readonly x: number; readonly y: number }) {
  const consistency = useFourfold((s) => s.view.consistency);
  const setup = useFourfold((s) => s.setup);
  const key = useMemo(() => setupKey(setup), [setup]);
  if (consistency === null || consistency.key !== key) return null;
  const i = nearest(consistency.x, x);
  const j = nearest(consistency.y, y);
  if (i < 0 || j < 0) return null;
  const held = consistency.held[j * consistency.x.length + i]!;
  return (
    <p
      className="readout-observations"
      data-testid="readout-observations"
      data-held={held}
      data-total={consistency.total}
    >
      Observations that hold here: {held} of {consistency.total}
      {held === consistency.total ? ' (hatched)' : ''}
    </p>
  );
}
