import { axisBottom, axisLeft, line, scaleLinear, select, type ScaleLinear } from 'd3';
import { memo, useCallback, useEffect, useMemo, useRef, type PointerEvent } from 'react';
import { CUT_DISTANCE_LABEL, type CutResult } from '../../solver/index';
import { labelText } from '../notation/labelPieces';
import { SvgLabel } from '../notation/SvgLabel';
import {
  curveRuns,
  cutAxisSymbol,
  cutAxisTitle,
  cutPanels,
  panelExtent,
  phaseSegments,
  type CutChartPanel,
} from '../figure/cutSeries';
import { labelColours } from '../figure/palette';
import { AxisName } from '../readout/AxisName';
import { useFourfold } from '../store/index';

type Scale = ScaleLinear<number, number>;

/** Chart geometry, CSS pixels. */
const MARGIN = { left: 52, right: 16, top: 4, bottom: 40 };
const STRIP = 20;
const PANEL = 92;
const GAP = 20;

/** Panel captions as the app shows them, plain text (the figure typesets the axis titles). */
function panelName(panel: CutChartPanel): string {
  switch (panel.key) {
    case 'energy':
      return 'energy E';
    case 'slope':
      return labelText(panel.title);
    case 'groups':
      return 'order parameters |o|';
    case 'canting':
      return `canting angle ${labelText('theta_c')} (degrees)`;
    default:
      return 'quasiparticle gap';
  }
}

/** Index of the sample nearest to `s` along a monotonic sample list. */
function nearestSample(values: Float64Array, s: number): number {
  let best = 0;
  for (let i = 1; i < values.length; i++) {
    if (Math.abs(values[i]! - s) < Math.abs(values[best]! - s)) best = i;
  }
  return best;
}

function LeftAxis({ y, count }: { y: Scale; count: number }) {
  const ref = useRef<SVGGElement>(null);
  useEffect(() => {
    select(ref.current!).call(axisLeft(y).ticks(count).tickSizeOuter(0));
  }, [y, count]);
  return <g ref={ref} className="cut-axis" />;
}

function BottomAxis({ x, at, labels }: { x: Scale; at: number; labels: boolean }) {
  const ref = useRef<SVGGElement>(null);
  useEffect(() => {
    const axis = axisBottom(x).ticks(6).tickSizeOuter(0);
    if (!labels) axis.tickFormat(() => '');
    select(ref.current!).call(axis);
  }, [x, labels]);
  return <g ref={ref} className="cut-axis" transform={`translate(0,${at})`} />;
}

/**
 * One chart panel: its curves (broken at first-order transitions), frame, axis and title. The
 * vertical axis spans the panel's finite values.
 */
const ChartPanel = memo(function ChartPanel({
  cut,
  panel,
  x,
  top,
  width,
  last,
}: {
  cut: CutResult;
  panel: CutChartPanel;
  x: Scale;
  top: number;
  width: number;
  last: boolean;
}) {
  const y = useMemo(
    () =>
      scaleLinear()
        .domain(panelExtent(panel))
        .range([top + PANEL, top]),
    [panel, top],
  );
  const paths = useMemo(() => {
    const runs = curveRuns(cut);
    return panel.series.map((s) => {
      const curve = line<number>()
        .defined((i) => Number.isFinite(s.values[i]!))
        .x((i) => x(cut.s[i]!))
        .y((i) => y(s.values[i]!));
      const d = runs
        .map(([a, b]) => curve(Array.from({ length: b - a + 1 }, (_, k) => a + k)) ?? '')
        .join('');
      return { key: s.key, d, colour: s.colour, dash: s.dash, label: s.label };
    });
  }, [cut, panel, x, y]);
  return (
    <g className={`cut-panel cut-panel-${panel.key}`} data-testid={`cut-panel-${panel.key}`}>
      {paths.map((p) => (
        <path
          key={p.key}
          d={p.d}
          className="cut-curve"
          stroke={p.colour}
          strokeDasharray={
            p.dash === ''
              ? undefined
              : p.dash
                  .split(' ')
                  .map((v) => Number(v) * 1.6)
                  .join(' ')
          }
        >
          <title>{p.label}</title>
        </path>
      ))}
      <rect className="cut-frame" y={top} width={width} height={PANEL} />
      <LeftAxis y={y} count={3} />
      <BottomAxis x={x} at={top + PANEL} labels={last} />
      <text className="cut-panel-title" x={0} y={top - 5}>
        {panelName(panel)}
      </text>
    </g>
  );
});

/**
 * The Cut's profiles as d3 line charts stacked over one horizontal axis: a strip of phase
 * segments in the Map's colours, energy, dE/ds, the order-parameter groups, the canting angle and
 * the quasiparticle gap. Each located transition is a vertical line through every panel (first
 * order solid, continuous dashed). The pointer shows the nearest sample's values.
 */
export function CutCharts({ cut, width }: { cut: CutResult; width: number }) {
  const hover = useFourfold((s) => s.cut.hover);
  const panels = useMemo(() => cutPanels(cut), [cut]);
  const plotWidth = Math.max(200, width - MARGIN.left - MARGIN.right);
  const x = useMemo(
    () => scaleLinear().domain([cut.axis.from, cut.axis.to]).range([0, plotWidth]),
    [cut, plotWidth],
  );
  const segments = useMemo(() => phaseSegments(cut), [cut]);
  const plotsTop = STRIP + GAP;
  const plotsBottom = plotsTop + panels.length * (PANEL + GAP) - GAP;
  const height = MARGIN.top + plotsBottom + MARGIN.bottom;

  const onPointerMove = useCallback(
    (event: PointerEvent<SVGRectElement>) => {
      const box = event.currentTarget.getBoundingClientRect();
      const s = x.invert(event.clientX - box.left);
      useFourfold.getState().setCutHover(nearestSample(cut.s, s));
    },
    [cut, x],
  );
  const onPointerLeave = useCallback(() => useFourfold.getState().setCutHover(null), []);
  const groups = panels.find((p) => p.key === 'groups');

  return (
    <div className="cut-charts">
      <svg width={MARGIN.left + plotWidth + MARGIN.right} height={height} role="img">
        <title>Profiles along the Cut</title>
        <g transform={`translate(${MARGIN.left},${MARGIN.top})`}>
          <g className="cut-strip">
            {segments.map((seg, k) => {
              const x0 = Math.min(x(seg.from), x(seg.to));
              const x1 = Math.max(x(seg.from), x(seg.to));
              const colours = labelColours(seg.label);
              const h = STRIP / colours.length;
              return (
                <g key={k} data-testid="cut-segment" data-label={seg.label}>
                  {colours.map((c, m) => (
                    <rect key={m} x={x0} y={m * h} width={x1 - x0} height={h} fill={c} />
                  ))}
                  {x1 - x0 > 8 * seg.label.length + 6 && (
                    <text className="cut-strip-label" x={(x0 + x1) / 2} y={STRIP / 2} dy="0.35em">
                      {seg.label}
                    </text>
                  )}
                </g>
              );
            })}
            <rect className="cut-frame" width={plotWidth} height={STRIP} />
          </g>
          {panels.map((panel, k) => (
            <ChartPanel
              key={panel.key}
              cut={cut}
              panel={panel}
              x={x}
              top={plotsTop + k * (PANEL + GAP)}
              width={plotWidth}
              last={k === panels.length - 1}
            />
          ))}
          <g className="cut-markers">
            {cut.transitions.map((tr, k) => (
              <path
                key={k}
                className={tr.order === 'first' ? 'cut-marker-first' : 'cut-marker-continuous'}
                data-testid="cut-marker"
                data-order={tr.order}
                d={`M${x(tr.s)},0V${plotsBottom}`}
              >
                <title>
                  {`${tr.between[0]} to ${tr.between[1]} (${tr.order === 'first' ? 'first order' : 'continuous'})`}
                </title>
              </path>
            ))}
          </g>
          {hover !== null && hover < cut.t.length && (
            <path className="cut-hover-line" d={`M${x(cut.s[hover]!)},0V${plotsBottom}`} />
          )}
          <text
            className="cut-axis-title"
            x={plotWidth / 2}
            y={plotsBottom + MARGIN.bottom - 6}
            textAnchor="middle"
          >
            <SvgLabel label={cutAxisTitle(cut)} fontSize={12} />
          </text>
          <rect
            className="cut-hover-target"
            width={plotWidth}
            height={plotsBottom}
            onPointerMove={onPointerMove}
            onPointerLeave={onPointerLeave}
          />
        </g>
      </svg>
      {groups && (
        <ul className="cut-legend" aria-label="Order-parameter curves">
          {groups.series.map((s) => (
            <li key={s.key}>
              <svg width="28" height="10" aria-hidden="true">
                <path
                  d="M1,5H27"
                  stroke={s.colour}
                  strokeWidth="2"
                  strokeDasharray={
                    s.dash === ''
                      ? undefined
                      : s.dash
                          .split(' ')
                          .map((v) => Number(v) * 1.6)
                          .join(' ')
                  }
                />
              </svg>
              {s.label}
            </li>
          ))}
          {groups.zeroGroups && groups.zeroGroups.length > 0 && (
            <li className="cut-legend-zero">Zero along the cut: {groups.zeroGroups.join(', ')}</li>
          )}
        </ul>
      )}
      <CutReadout cut={cut} sample={hover} />
      <p className="cut-axis-note" data-testid="cut-axis-note" data-label={cut.axis.label}>
        Horizontal axis: <AxisName label={cutAxisTitle(cut)} explain />
        {cut.axis.label === CUT_DISTANCE_LABEL
          ? ', from the start of the line, in the units of the Map’s axes (both change along it)'
          : cut.path.kind === 'line'
            ? ', the one axis that changes along the line'
            : ''}
        .
      </p>
    </div>
  );
}

/** Values at the hovered sample (or a hint when the pointer is elsewhere). */
function CutReadout({ cut, sample }: { cut: CutResult; sample: number | null }) {
  const panels = useMemo(() => cutPanels(cut), [cut]);
  if (sample === null || sample >= cut.t.length) {
    return (
      <p className="cut-readout cut-readout-empty" data-testid="cut-readout">
        Move the pointer over the charts to read the values.
      </p>
    );
  }
  const fmt = (v: number): string => (Number.isFinite(v) ? v.toPrecision(6) : '–');
  return (
    <dl className="cut-readout" data-testid="cut-readout" data-sample={sample}>
      <div>
        <dt>
          <AxisName label={cutAxisSymbol(cut)} />
        </dt>
        <dd>{fmt(cut.s[sample]!)}</dd>
      </div>
      <div>
        <dt>phase</dt>
        <dd data-testid="cut-readout-phase">{cut.labels[sample]}</dd>
      </div>
      {panels.flatMap((panel) =>
        panel.series.map((s) => (
          <div key={s.key}>
            <dt>{panel.key === 'slope' ? panelName(panel) : s.label}</dt>
            <dd>{fmt(s.values[sample]!)}</dd>
          </div>
        )),
      )}
    </dl>
  );
}
