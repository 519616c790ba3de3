import { axisBottom, axisLeft, line, scaleLinear, select } from 'd3';
import { useEffect, useMemo, useRef } from 'react';
import { rangeFockRatio } from '../scenario/physical';
import type { PhysicalSetup, RangeSetup } from '../scenario/setup';

const WIDTH = 260;
const HEIGHT = 130;
const MARGIN = { top: 8, right: 10, bottom: 30, left: 36 };
const SAMPLES = 81;

/** Field range of the chart, tesla: up to 45 T (common practice for static fields), or B_perp. */
function fieldSpan(bPerp: number): [number, number] {
  return [0, Math.max(45, Math.ceil(bPerp * 1.2))];
}

/**
 * F/H of a range channel against B_perp (physical units: a in nm is fixed, l_B shrinks as
 * 1/sqrt(B_perp)), or against a/l_B (dimensionless), with the current point marked.
 */
export function RangeChart({
  range,
  physical,
}: {
  readonly range: RangeSetup;
  readonly physical: PhysicalSetup | null;
}) {
  const bottom = useRef<SVGGElement>(null);
  const left = useRef<SVGGElement>(null);
  const plotW = WIDTH - MARGIN.left - MARGIN.right;
  const plotH = HEIGHT - MARGIN.top - MARGIN.bottom;
  const chart = useMemo(() => {
    const span: [number, number] = physical
      ? fieldSpan(physical.bPerpTesla)
      : [0, Math.max(3, Math.ceil(range.range * 1.5))];
    const ratioAt = (t: number) =>
      physical
        ? rangeFockRatio(range, Math.max(t, 1e-3))
        : rangeFockRatio({ ...range, range: t }, null);
    const points: [number, number][] = [];
    for (let k = 0; k < SAMPLES; k++) {
      const t = span[0] + ((span[1] - span[0]) * k) / (SAMPLES - 1);
      points.push([t, ratioAt(t)]);
    }
    const current = physical ? physical.bPerpTesla : range.range;
    const x = scaleLinear().domain(span).range([0, plotW]);
    const y = scaleLinear().domain([0, 1]).range([plotH, 0]);
    const d =
      line<[number, number]>()
        .x((p) => x(p[0]))
        .y((p) => y(p[1]))(points) ?? '';
    return { x, y, d, current, currentRatio: ratioAt(current) };
  }, [range, physical, plotW, plotH]);

  useEffect(() => {
    select(bottom.current!).call(axisBottom(chart.x).ticks(5).tickSizeOuter(0));
    select(left.current!).call(axisLeft(chart.y).ticks(4).tickSizeOuter(0));
  }, [chart]);

  return (
    <svg
      className="range-chart"
      width={WIDTH}
      height={HEIGHT}
      role="img"
      aria-label={`F/H against ${physical ? 'B_perp' : 'a / l_B'}`}
      data-testid="range-chart"
      data-current={chart.current}
      data-ratio={chart.currentRatio}
    >
      <g transform={`translate(${MARGIN.left},${MARGIN.top})`}>
        <path className="range-curve" d={chart.d} />
        <circle
          className="range-marker"
          cx={chart.x(chart.current)}
          cy={chart.y(chart.currentRatio)}
          r={3.5}
        />
        <g ref={bottom} className="range-axis" transform={`translate(0,${plotH})`} />
        <g ref={left} className="range-axis" />
        <text className="range-title" x={plotW / 2} y={plotH + 26} textAnchor="middle">
          {physical ? 'B⊥ (T)' : 'a / l_B'}
        </text>
        <text
          className="range-title"
          transform={`translate(${-28},${plotH / 2}) rotate(-90)`}
          textAnchor="middle"
        >
          F / H
        </text>
      </g>
    </svg>
  );
}
