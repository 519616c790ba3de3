import type { ScaleLinear } from 'd3';
import { memo, useId, useMemo } from 'react';
import { useFourfold } from '../store/index';
import { setupKey } from './browserFit';

type Scale = ScaleLinear<number, number>;

/**
 * Where every kept observation holds, from the last fit in the page: its grid's consistent
 * pixels hatched over the Map (public/notes.html#observations), in the Map's axis scales. Drawn
 * only while the setup is the one fitted.
 */
export const ConsistencyLayer = memo(function ConsistencyLayer({
  x,
  y,
}: {
  readonly x: Scale;
  readonly y: Scale;
}) {
  const consistency = useFourfold((s) => s.view.consistency);
  const setup = useFourfold((s) => s.setup);
  const key = useMemo(() => setupKey(setup), [setup]);
  const patternId = `consistent-${useId().replace(/[^A-Za-z0-9_-]/g, '')}`;
  if (consistency === null || consistency.key !== key) return null;
  const { x: xs, y: ys, held, total } = consistency;
  const nx = xs.length;
  const half = (values: Float64Array, scale: Scale) =>
    values.length > 1 ? Math.abs(scale(values[1]!) - scale(values[0]!)) / 2 : 0;
  const hx = half(xs, x);
  const hy = half(ys, y);
  const rects = [];
  for (let p = 0; p < held.length; p++) {
    if (held[p] !== total) continue;
    const cx = x(xs[p % nx]!);
    const cy = y(ys[Math.floor(p / nx)]!);
    rects.push(<rect key={p} x={cx - hx} y={cy - hy} width={2 * hx} height={2 * hy} />);
  }
  return (
    <g
      className="consistency-layer"
      data-testid="consistency-layer"
      data-consistent={rects.length}
      data-pixels={held.length}
      data-total={total}
    >
      <defs>
        <pattern
          id={patternId}
          patternUnits="userSpaceOnUse"
          width={6}
          height={6}
          patternTransform="rotate(45)"
        >
          <line className="consistency-hatch" x1={0} y1={0} x2={0} y2={6} />
        </pattern>
      </defs>
      <g fill={`url(#${patternId})`}>{rects}</g>
    </g>
  );
});
