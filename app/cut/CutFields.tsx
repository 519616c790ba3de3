import { useState } from 'react';
import type { CutResult, Plane } from '../../solver/index';
import { COUPLING_RULE, type EntryRule } from '../setup/numberEntry';
import { MAX_APP_CUT_POINTS, type CutSpec, type SweepKind } from '../store/cutSlice';
import { useFourfold } from '../store/index';
import { CutNumberField } from './CutNumberField';
export const POINTS_RULE: EntryRule = { min: 2, max: MAX_APP_CUT_POINTS, integer: true };
const TILT_RULE: EntryRule = {
  min: -89.9,
  max: 89.9,
  tooLarge: 'below 90 degrees',
  tooSmall: 'above -90 degrees',
};

type Pair = readonly [number, number];

/** The plane's diagonal, a first line to offer before anything is drawn. */
function defaultLine(plane: Plane | null): { from: Pair; to: Pair } {
  if (plane === null) return { from: [-1, -1], to: [1, 1] };
  return { from: [plane.x.from, plane.y.from], to: [plane.x.to, plane.y.to] };
}

/** A sweep range to start from for each quantity. */
function defaultRange(kind: SweepKind, plane: Plane | null, zeeman: number): Pair {
  if (kind === 'x' && plane) return [plane.x.from, plane.x.to];
  if (kind === 'y' && plane) return [plane.y.from, plane.y.to];
  if (kind === 'zeeman') return [0, Math.max(1, 2 * Math.abs(zeeman))];
  if (kind === 'valleyZeeman') return [-1, 1];
  if (kind === 'tilt') return [0, 80];
  return [-1, 1];
}

/** What the shown Cut follows, for test drivers: `line:x0,y0:x1,y1` or `kind:from:to`. */
export function pathTag(result: CutResult | null): string | undefined {
  if (result === null) return undefined;
  const p = result.path;
  return p.kind === 'line'
    ? `line:${p.from.join(',')}:${p.to.join(',')}`
    : `${p.kind}:${p.from}:${p.to}`;
}

/** Chooses a straight line (typed, or drawn on the Map). */
export function LineFields({ spec, plane }: { spec: CutSpec | null; plane: Plane | null }) {
  const setCutSpec = useFourfold((s) => s.setCutSpec);
  const gesture = useFourfold((s) => s.view.mapGesture);
  const setMapGesture = useFourfold((s) => s.setMapGesture);
  const line = spec?.kind === 'line' ? spec : { kind: 'line' as const, ...defaultLine(plane) };
  const commit = (from: Pair, to: Pair): string | null => {
    if (from[0] === to[0] && from[1] === to[1]) return 'the end must differ from the start';
    setCutSpec({ kind: 'line', from, to });
    return null;
  };
  const xName = plane?.x.label || 'x';
  const yName = plane?.y.label || 'y';
  return (
    <div className="cut-line-fields">
      <fieldset>
        <legend>Start</legend>
        <CutNumberField
          label={xName}
          value={line.from[0]}
          rule={COUPLING_RULE}
          testId="cut-from-x"
          onCommit={(v) => commit([v, line.from[1]], line.to)}
        />
        <CutNumberField
          label={yName}
          value={line.from[1]}
          rule={COUPLING_RULE}
          testId="cut-from-y"
          onCommit={(v) => commit([line.from[0], v], line.to)}
        />
      </fieldset>
      <fieldset>
        <legend>End</legend>
        <CutNumberField
          label={xName}
          value={line.to[0]}
          rule={COUPLING_RULE}
          testId="cut-to-x"
          onCommit={(v) => commit(line.from, [v, line.to[1]])}
        />
        <CutNumberField
          label={yName}
          value={line.to[1]}
          rule={COUPLING_RULE}
          testId="cut-to-y"
          onCommit={(v) => commit(line.from, [line.to[0], v])}
        />
      </fieldset>
      <div className="cut-line-actions">
        {spec?.kind !== 'line' && (
          <button type="button" data-testid="cut-start" onClick={() => setCutSpec(line)}>
            Cut along this line
          </button>
        )}
        <button
          type="button"
          aria-pressed={gesture === 'cut'}
          data-testid="cut-draw"
          onClick={() => setMapGesture(gesture === 'cut' ? 'pin' : 'cut')}
        >
          {gesture === 'cut' ? 'Drawing on the Map (Esc stops)' : 'Draw on the Map'}
        </button>
      </div>
    </div>
  );
}

const SWEEP_NAMES: Record<SweepKind, string> = {
  x: 'x axis',
  y: 'y axis',
  zeeman: 'E_Z',
  valleyZeeman: 'Delta_V',
  tilt: 'tilt angle (deg)',
};

/** Chooses a sweep of one quantity at a pinned point. */
export function SweepFields({ spec, plane }: { spec: CutSpec | null; plane: Plane | null }) {
  const pins = useFourfold((s) => s.probe.pins);
  const selected = useFourfold((s) => s.probe.selected);
  const zeeman = useFourfold((s) => s.setup.zeeman);
  const setCutSpec = useFourfold((s) => s.setCutSpec);
  const sweep = spec !== null && spec.kind !== 'line' ? spec : null;
  const [kind, setKind] = useState<SweepKind>(sweep?.kind ?? 'tilt');
  const pin = pins.find((p) => p.id === selected) ?? pins[pins.length - 1];
  if (pins.length === 0 && sweep === null) {
    return (
      <p className="placeholder-note" data-testid="cut-sweep-needs-pin">
        Click the Map to pin a point, then sweep a quantity there.
      </p>
    );
  }
  const at: Pair = sweep?.at ?? [pin!.x, pin!.y];
  const range: Pair =
    sweep && sweep.kind === kind ? [sweep.from, sweep.to] : defaultRange(kind, plane, zeeman);
  const commit = (next: { kind?: SweepKind; at?: Pair; from?: number; to?: number }) => {
    const k = next.kind ?? kind;
    const [from, to] =
      next.kind !== undefined && next.kind !== kind
        ? defaultRange(k, plane, zeeman)
        : [next.from ?? range[0], next.to ?? range[1]];
    if (from === to) return 'the end must differ from the start';
    setCutSpec({ kind: k, at: next.at ?? at, from, to });
    return null;
  };
  const rule = kind === 'tilt' ? TILT_RULE : COUPLING_RULE;
  const name = (k: SweepKind): string =>
    k === 'x' ? plane?.x.label || 'x' : k === 'y' ? plane?.y.label || 'y' : SWEEP_NAMES[k];
  return (
    <div className="cut-sweep-fields">
      <label className="cut-field">
        <span className="cut-field-label">At</span>
        <select
          data-testid="cut-sweep-pin"
          value={pins.some((p) => p.x === at[0] && p.y === at[1]) ? `${at[0]},${at[1]}` : 'kept'}
          onChange={(event) => {
            const p = pins.find((q) => `${q.x},${q.y}` === event.target.value);
            if (p) commit({ at: [p.x, p.y] });
          }}
        >
          {!pins.some((p) => p.x === at[0] && p.y === at[1]) && (
            <option value="kept">
              ({at[0].toPrecision(4)}, {at[1].toPrecision(4)})
            </option>
          )}
          {pins.map((p) => (
            <option key={p.id} value={`${p.x},${p.y}`}>
              pin {p.id} ({p.x.toPrecision(4)}, {p.y.toPrecision(4)})
            </option>
          ))}
        </select>
      </label>
      <label className="cut-field">
        <span className="cut-field-label">Sweep</span>
        <select
          data-testid="cut-sweep-kind"
          value={kind}
          onChange={(event) => {
            const k = event.target.value as SweepKind;
            setKind(k);
            if (sweep !== null) commit({ kind: k });
          }}
        >
          {(Object.keys(SWEEP_NAMES) as SweepKind[]).map((k) => (
            <option key={k} value={k}>
              {name(k)}
            </option>
          ))}
        </select>
      </label>
      <CutNumberField
        label="from"
        value={range[0]}
        rule={rule}
        testId="cut-sweep-from"
        onCommit={(v) => commit({ from: v })}
      />
      <CutNumberField
        label="to"
        value={range[1]}
        rule={rule}
        testId="cut-sweep-to"
        onCommit={(v) => commit({ to: v })}
      />
      {sweep === null && (
        <button type="button" data-testid="cut-start-sweep" onClick={() => commit({})}>
          Sweep
        </button>
      )}
      {kind === 'tilt' && (
        <p className="cut-note">
          Tilt at fixed perpendicular field: the couplings stay and E<sub>Z</sub> = E<sub>Z⊥</sub> /
          cos θ (E<sub>Z⊥</sub>, the Zeeman energy at zero tilt, from the Setup).
        </p>
      )}
    </div>
  );
}
