import type { ScaleLinear } from 'd3';
import { memo } from 'react';
import { useFourfold } from '../store/index';
import './cut.css';

type Scale = ScaleLinear<number, number>;

/** A filled arrowhead at (x1, y1) pointing from (x0, y0), 10 px long. */
function arrowHead(x0: number, y0: number, x1: number, y1: number): string {
  const length = Math.hypot(x1 - x0, y1 - y0) || 1;
  const ux = (x1 - x0) / length;
  const uy = (y1 - y0) / length;
  const bx = x1 - 10 * ux;
  const by = y1 - 10 * uy;
  return `M${x1},${y1}L${bx - 4.5 * uy},${by + 4.5 * ux}L${bx + 4.5 * uy},${by - 4.5 * ux}Z`;
}

/**
 * The Cut on the Map, in the overlay's axis scales: the line (or, for a sweep of E_Z, Delta_V or
 * tilt, the pinned point) from a square at its start to an arrowhead at its end, a mark at each located transition (filled: first
 * order, open: continuous), the sample hovered in the charts, and the line being dragged.
 */
export const CutLayer = memo(function CutLayer({ x, y }: { x: Scale; y: Scale }) {
  const result = useFourfold((s) => s.cut.result);
  const spec = useFourfold((s) => s.cut.spec);
  const hover = useFourfold((s) => s.cut.hover);
  const draft = useFourfold((s) => s.cut.draft);
  const shown = spec === null ? null : result;
  const n = shown?.t.length ?? 0;
  const ends =
    shown && n > 0
      ? ([
          [shown.x[0]!, shown.y[0]!],
          [shown.x[n - 1]!, shown.y[n - 1]!],
        ] as const)
      : null;
  const isPoint = ends !== null && ends[0][0] === ends[1][0] && ends[0][1] === ends[1][1];
  return (
    <g className="map-cut" data-testid="map-cut">
      {ends && !isPoint && (
        <>
          <path
            className="map-cut-halo"
            d={`M${x(ends[0][0])},${y(ends[0][1])}L${x(ends[1][0])},${y(ends[1][1])}`}
          />
          <path
            className="map-cut-line"
            data-testid="map-cut-line"
            d={`M${x(ends[0][0])},${y(ends[0][1])}L${x(ends[1][0])},${y(ends[1][1])}`}
          />
          <rect
            className="map-cut-start"
            x={x(ends[0][0]) - 3.5}
            y={y(ends[0][1]) - 3.5}
            width={7}
            height={7}
          />
          <path
            className="map-cut-end"
            d={arrowHead(x(ends[0][0]), y(ends[0][1]), x(ends[1][0]), y(ends[1][1]))}
          />
        </>
      )}
      {ends && isPoint && (
        <circle className="map-cut-point" cx={x(ends[0][0])} cy={y(ends[0][1])} r={5} />
      )}
      {shown &&
        !isPoint &&
        shown.transitions.map((tr, k) => (
          <circle
            key={k}
            className={tr.order === 'first' ? 'map-cut-mark-first' : 'map-cut-mark-continuous'}
            data-testid="map-cut-mark"
            cx={x(tr.x)}
            cy={y(tr.y)}
            r={4.5}
          />
        ))}
      {shown && hover !== null && hover < n && !isPoint && (
        <circle className="map-cut-hover" cx={x(shown.x[hover]!)} cy={y(shown.y[hover]!)} r={4} />
      )}
      {draft && (
        <path
          className="map-cut-draft"
          data-testid="map-cut-draft"
          d={`M${x(draft.from[0])},${y(draft.from[1])}L${x(draft.to[0])},${y(draft.to[1])}`}
        />
      )}
    </g>
  );
});
