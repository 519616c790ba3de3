import type { ScaleLinear } from 'd3';
import { memo, useMemo } from 'react';
import { useFourfold } from '../store/index';
import { tiltTrajectory } from './tiltTrajectory';
import './tiltTrajectory.css';

type Scale = ScaleLinear<number, number>;

/**
 * The sample's path on the Map under a tilt sweep at fixed B_perp (physical units only): a ray
 * towards the origin when the axes are couplings, a segment along E_Z when an axis is E_Z (see
 * `tiltTrajectory` for what each means). Open circles mark 0° and the largest tilt, the filled
 * one the current tilt. Drawn in the Map's SVG overlay, in its axis scales.
 */
export const TiltTrajectoryLayer = memo(function TiltTrajectoryLayer({
  x,
  y,
}: {
  readonly x: Scale;
  readonly y: Scale;
}) {
  const setup = useFourfold((s) => s.setup);
  const path = useMemo(() => tiltTrajectory(setup), [setup]);
  if (path === null || setup.physical === undefined) return null;
  const d = path.points.map((p, k) => `${k === 0 ? 'M' : 'L'}${x(p[0])},${y(p[1])}`).join('');
  const start = path.points[0]!;
  const end = path.points[path.points.length - 1]!;
  const label = (p: readonly [number, number], text: string) => (
    <text className="tilt-label" x={x(p[0]) + 6} y={y(p[1]) - 6}>
      {text}
    </text>
  );
  return (
    <g
      className={`tilt-trajectory${path.exact ? '' : ' is-approximate'}`}
      data-testid="tilt-trajectory"
      data-kind={path.kind}
      data-exact={path.exact}
      data-start={start.join(',')}
      data-end={end.join(',')}
      data-current={path.current.join(',')}
    >
      <path className="tilt-halo" d={d} />
      <path className="tilt-line" d={d} />
      <circle className="tilt-end" cx={x(start[0])} cy={y(start[1])} r={3.5} />
      <circle className="tilt-end" cx={x(end[0])} cy={y(end[1])} r={3.5} />
      <circle className="tilt-now" cx={x(path.current[0])} cy={y(path.current[1])} r={4.5} />
      {label(start, '0°')}
      {label(end, `${setup.physical.tiltMaxDeg}°`)}
    </g>
  );
});
