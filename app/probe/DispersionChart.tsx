import { axisBottom, axisLeft, line, scaleLinear, select } from 'd3';
import { useEffect, useMemo, useRef } from 'react';
import type { ModeDispersion } from '../../solver/index';
import {
  ROTATION_NAMES,
  branchRuns,
  energyExtent,
  energyTitle,
  groupsPresent,
  rotationColour,
  wavevectorScale,
  wavevectorTitle,
  type DispersionUnits,
} from './dispersionSeries';
import { SvgLabel } from '../notation/SvgLabel';
import { AxisName } from '../readout/AxisName';

const WIDTH = 460;
const HEIGHT = 260;
const MARGIN = { top: 10, right: 12, bottom: 36, left: 50 };

/** Font size of the axis titles, CSS pixels (the stylesheet's .dispersion-title). */
const TITLE_FONT = 12;

/**
 * The dispersion chart of the Probe: every branch coloured by the rotation its mode performs
 * over a dark casing (as the exported figure), Goldstone branches marked at q = 0, the large-q
 * limits dotted, growth rates of an instability dashed below zero; the colours' legend below.
 */
export function DispersionChart({
  dispersion,
  units,
}: {
  readonly dispersion: ModeDispersion;
  readonly units: DispersionUnits;
}) {
  const bottom = useRef<SVGGElement>(null);
  const left = useRef<SVGGElement>(null);
  const plotW = WIDTH - MARGIN.left - MARGIN.right;
  const plotH = HEIGHT - MARGIN.top - MARGIN.bottom;
  const chart = useMemo(() => {
    const scale = wavevectorScale(units);
    const qs = dispersion.q.map((q) => q * scale);
    const x = scaleLinear()
      .domain([qs[0] ?? 0, qs[qs.length - 1] ?? 1])
      .range([0, plotW]);
    const y = scaleLinear().domain(energyExtent(dispersion)).range([plotH, 0]);
    const path = (values: readonly number[], from: number, to: number, sign = 1) =>
      line<number>()
        .x((k) => x(qs[k]!))
        .y((k) => y(sign * values[k]!))(
        Array.from({ length: to - from + 1 }, (_, k) => from + k),
      ) ?? '';
    const casing = dispersion.branches.map((b) => path(b, 0, b.length - 1)).join('');
    const runs = branchRuns(dispersion).map((run) => ({
      d: path(dispersion.branches[run.branch]!, run.from, run.to),
      colour: rotationColour(run.group),
    }));
    const growth = dispersion.growth
      .filter((g) => g.some((w) => w > 0))
      .map((g) => path(g, 0, g.length - 1, -1));
    const limits = [...new Set(dispersion.particleHole.map((w) => Number(w.toPrecision(12))))];
    return { x, y, casing, runs, growth, limits };
  }, [dispersion, units, plotW, plotH]);

  useEffect(() => {
    select(bottom.current!).call(axisBottom(chart.x).ticks(6).tickSizeOuter(0));
    select(left.current!).call(axisLeft(chart.y).ticks(5).tickSizeOuter(0));
  }, [chart]);

  return (
    <>
      <svg
        className="dispersion-chart"
        viewBox={`0 0 ${WIDTH} ${HEIGHT}`}
        width={WIDTH}
        height={HEIGHT}
        role="img"
        aria-label="Collective modes against the wavevector"
        data-testid="dispersion-chart"
        data-branches={dispersion.branches.length}
      >
        <defs>
          <clipPath id="dispersion-chart-plot">
            <rect width={plotW} height={plotH} />
          </clipPath>
        </defs>
        <g transform={`translate(${MARGIN.left},${MARGIN.top})`}>
          <g clipPath="url(#dispersion-chart-plot)">
            {chart.limits.map((w) => (
              <line
                key={w}
                className="dispersion-limit"
                x1={0}
                x2={plotW}
                y1={chart.y(w)}
                y2={chart.y(w)}
              />
            ))}
            {chart.y.domain()[0]! < 0 && (
              <line className="dispersion-zero" x1={0} x2={plotW} y1={chart.y(0)} y2={chart.y(0)} />
            )}
            <path className="dispersion-casing" d={chart.casing} />
            {chart.runs.map((run, k) => (
              <path key={k} className="dispersion-branch" d={run.d} stroke={run.colour} />
            ))}
            {chart.growth.map((d, k) => (
              <path key={k} className="dispersion-growth" d={d} data-testid="dispersion-growth" />
            ))}
          </g>
          {dispersion.q[0] === 0 &&
            dispersion.goldstone.map((g, b) =>
              g ? (
                <circle
                  key={b}
                  className="dispersion-goldstone"
                  data-testid="dispersion-goldstone-mark"
                  cx={chart.x(0)}
                  cy={chart.y(dispersion.branches[b]![0]!)}
                  r={4}
                />
              ) : null,
            )}
          <rect className="dispersion-frame" width={plotW} height={plotH} />
          <g ref={bottom} className="dispersion-axis" transform={`translate(0,${plotH})`} />
          <g ref={left} className="dispersion-axis" />
          <text className="dispersion-title" x={plotW / 2} y={plotH + 31} textAnchor="middle">
            <SvgLabel label={wavevectorTitle(units)} fontSize={TITLE_FONT} />
          </text>
          <text
            className="dispersion-title"
            transform={`translate(${-38},${plotH / 2}) rotate(-90)`}
            textAnchor="middle"
          >
            <SvgLabel label={energyTitle(units)} fontSize={TITLE_FONT} />
          </text>
        </g>
      </svg>
      <ul className="dispersion-legend" data-testid="dispersion-legend">
        {groupsPresent(dispersion).map((group) => (
          <li key={group} data-group={group}>
            <span className="dispersion-swatch" style={{ background: rotationColour(group) }} />{' '}
            <AxisName label={ROTATION_NAMES[group]} />
          </li>
        ))}
      </ul>
    </>
  );
}
