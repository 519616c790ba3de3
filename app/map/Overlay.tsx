import { axisBottom, axisLeft, axisRight, axisTop, line, scaleLinear, select } from 'd3';
import type { ScaleLinear } from 'd3';
import { memo, useEffect, useId, useMemo, useRef } from 'react';
import type { Boundary, Plane } from '../../solver/index';
import { CutLayer } from '../cut/CutLayer';
import { PinLayer } from '../probe/PinLayer';
import { useFourfold } from '../store/index';
import { ConsistencyLayer } from '../observations/ConsistencyLayer';
import { TiltTrajectoryLayer } from '../setup/TiltTrajectoryLayer';
import { SvgLabel } from '../notation/SvgLabel';
import { PLOT_MARGIN } from './plotFrame';
import { useShownExtent } from './shownExtent';

type Scale = ScaleLinear<number, number>;

export interface OverlayProps {
  /** Side of the square plot, CSS pixels. */
  readonly side: number;
}

type AxisRange = Pick<Plane['x'], 'from' | 'to'>;

/** Axis scales of the plot: x.from at the left edge, y.from at the bottom edge. */
function planeScales(plane: { x: AxisRange; y: AxisRange }, side: number): { x: Scale; y: Scale } {
  return {
    x: scaleLinear().domain([plane.x.from, plane.x.to]).range([0, side]),
    y: scaleLinear().domain([plane.y.from, plane.y.to]).range([side, 0]),
  };
}

/**
 * The vector layer over the region canvas: the plot frame, ticks on all four sides (numbers on
 * the left and bottom), typeset axis titles, the boundaries and the hover crosshair. It takes no
 * pointer events; the canvas underneath does.
 */
export function Overlay({ side }: OverlayProps) {
  const plane = useFourfold((s) => s.map.grid?.input.plane ?? null);
  // The scales follow the extent shown (the setup's, or a navigation's preview, while its map
  // is computed): everything drawn in axis coordinates lands where it belongs in it. They
  // change only when an end of the extent does (a slider drag brings a new plane object on
  // every job, for the same axes).
  const extent = useShownExtent();
  const scales = useMemo(
    () =>
      extent === null
        ? null
        : planeScales(
            {
              x: { from: extent.x[0], to: extent.x[1] },
              y: { from: extent.y[0], to: extent.y[1] },
            },
            side,
          ),
    [extent, side],
  );
  // Every axis of a physical setup is an energy in meV (couplings at the sample's field, E_Z,
  // Delta_V).
  const unit = useFourfold((s) => (s.setup.physical ? 'meV' : null));
  const clipId = `map-clip-${useId().replace(/[^A-Za-z0-9_-]/g, '')}`;
  if (plane === null || scales === null) return null;
  const width = PLOT_MARGIN.left + side + PLOT_MARGIN.right;
  const height = PLOT_MARGIN.top + side + PLOT_MARGIN.bottom;
  return (
    <svg className="map-overlay" width={width} height={height} aria-hidden="true">
      <defs>
        <clipPath id={clipId}>
          <rect width={side} height={side} />
        </clipPath>
      </defs>
      <g transform={`translate(${PLOT_MARGIN.left},${PLOT_MARGIN.top})`}>
        <g clipPath={`url(#${clipId})`}>
          <Boundaries x={scales.x} y={scales.y} />
          <ConsistencyLayer x={scales.x} y={scales.y} />
          <TiltTrajectoryLayer x={scales.x} y={scales.y} />
          <Crosshair x={scales.x} y={scales.y} side={side} />
          <CutLayer x={scales.x} y={scales.y} />
          <PinLayer x={scales.x} y={scales.y} />
          <ZoomBox side={side} />
        </g>
        <rect className="map-frame" width={side} height={side} />
        <Axes x={scales.x} y={scales.y} side={side} />
        <AxisTitleText
          label={plane.x.label}
          unit={unit}
          fallback="x"
          transform={`translate(${side / 2},${side + PLOT_MARGIN.bottom - 8})`}
        />
        <AxisTitleText
          label={plane.y.label}
          unit={unit}
          fallback="y"
          transform={`translate(${-PLOT_MARGIN.left + 15},${side / 2}) rotate(-90)`}
        />
      </g>
    </svg>
  );
}

/** d3 axes drawn into their groups; tick count follows the plot size. */
function Axes({ x, y, side }: { x: Scale; y: Scale; side: number }) {
  const bottom = useRef<SVGGElement>(null);
  const left = useRef<SVGGElement>(null);
  const top = useRef<SVGGElement>(null);
  const right = useRef<SVGGElement>(null);
  useEffect(() => {
    const count = Math.max(4, Math.round(side / 80));
    const blank = (): string => '';
    select(bottom.current!).call(axisBottom(x).ticks(count).tickSizeOuter(0));
    select(left.current!).call(axisLeft(y).ticks(count).tickSizeOuter(0));
    select(top.current!).call(axisTop(x).ticks(count).tickSizeOuter(0).tickFormat(blank));
    select(right.current!).call(axisRight(y).ticks(count).tickSizeOuter(0).tickFormat(blank));
  }, [x, y, side]);
  return (
    <g className="map-axes">
      <g ref={bottom} className="map-axis" transform={`translate(0,${side})`} />
      <g ref={left} className="map-axis" />
      <g ref={top} className="map-axis map-axis-mirror" />
      <g ref={right} className="map-axis map-axis-mirror" transform={`translate(${side},0)`} />
    </g>
  );
}

/** An axis title as SVG text in the app's notation, then the unit. */
function AxisTitleText({
  label,
  unit,
  fallback,
  transform,
}: {
  label: string;
  /** Unit of the axis values (meV in physical units), or null when dimensionless. */
  unit: string | null;
  fallback: string;
  transform: string;
}) {
  return (
    <text className="map-axis-title" transform={transform} textAnchor="middle">
      {/* 15 px: the title's font size in map.css. */}
      <SvgLabel
        label={label || fallback}
        fontSize={15}
        suffix={unit === null ? undefined : ` (${unit})`}
      />
    </text>
  );
}

/** Boundaries in axis coordinates: first order solid, continuous dashed, each over a halo. */
const Boundaries = memo(function Boundaries({ x, y }: { x: Scale; y: Scale }) {
  const boundaries = useFourfold((s) => s.map.boundaries);
  const path = useMemo(
    () =>
      line<readonly [number, number]>()
        .x((p) => x(p[0]))
        .y((p) => y(p[1])),
    [x, y],
  );
  return (
    <g className="map-boundaries">
      {boundaries.map((b: Boundary, n) => {
        const d = b.points.length >= 2 ? path(b.points) : null;
        if (d === null) return null;
        const kind = b.order === 'first' ? 'map-boundary-first' : 'map-boundary-continuous';
        return (
          <g key={n} className={kind} data-order={b.order} data-between={b.between.join('|')}>
            <path className="map-boundary-halo" d={d} />
            <path className="map-boundary-line" d={d} />
          </g>
        );
      })}
    </g>
  );
});

/** The box being dragged to zoom to (plot fractions), dashed. */
function ZoomBox({ side }: { side: number }) {
  const box = useFourfold((s) => s.view.zoomBox);
  if (box === null) return null;
  const x = Math.min(box.from.fx, box.to.fx) * side;
  const y = Math.min(box.from.fy, box.to.fy) * side;
  const w = Math.abs(box.to.fx - box.from.fx) * side;
  const h = Math.abs(box.to.fy - box.from.fy) * side;
  return (
    <g className="map-zoom-box" data-testid="map-zoom-box">
      <rect className="map-zoom-box-halo" x={x} y={y} width={w} height={h} />
      <rect className="map-zoom-box-line" x={x} y={y} width={w} height={h} />
    </g>
  );
}

/** Thin lines through the centre of the hovered pixel, and the pixel's outline. */
function Crosshair({ x, y, side }: { x: Scale; y: Scale; side: number }) {
  const hover = useFourfold((s) => s.view.hover);
  const grid = useFourfold((s) => s.map.grid);
  if (hover === null || grid === null || hover.i >= grid.nx || hover.j >= grid.ny) return null;
  const cx = x(grid.x[hover.i]!);
  const cy = y(grid.y[hover.j]!);
  const w = Math.max(6, side / grid.nx);
  const h = Math.max(6, side / grid.ny);
  return (
    <g className="map-crosshair" data-testid="map-crosshair" data-i={hover.i} data-j={hover.j}>
      {(
        [
          ['across', `M${cx},0V${cy - h}M${cx},${cy + h}V${side}`],
          ['along', `M0,${cy}H${cx - w}M${cx + w},${cy}H${side}`],
        ] as const
      ).map(([key, d]) => (
        <g key={key}>
          <path className="map-crosshair-halo" d={d} />
          <path className="map-crosshair-line" d={d} />
        </g>
      ))}
      <rect className="map-crosshair-halo" x={cx - w / 2} y={cy - h / 2} width={w} height={h} />
      <rect className="map-crosshair-line" x={cx - w / 2} y={cy - h / 2} width={w} height={h} />
    </g>
  );
}
