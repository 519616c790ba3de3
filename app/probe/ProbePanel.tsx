import { formatFixed } from '../format';
import { phaseExplanation } from '../notation/explanations';
import { AxisName } from '../readout/AxisName';
import { useFourfold } from '../store/index';
import type { Pin } from '../store/probeSlice';
import './probe.css';
import { PinComparison } from './PinComparison';
import { PinEntry } from './PinEntry';
import { ProbeDetails } from './ProbeDetails';

/** The Probe: the pinned points (select, remove) and the ground state of the selected one. */
export function ProbePanel() {
  const pins = useFourfold((s) => s.probe.pins);
  const selected = useFourfold((s) => s.probe.selected);
  const entry = useFourfold((s) =>
    s.probe.selected === null ? undefined : s.probe.results[s.probe.selected],
  );
  const pin = pins.find((p) => p.id === selected);
  return (
    <div className="probe" data-testid="probe">
      <PinEntry />
      {pins.length === 0 ? (
        <p className="placeholder-note">
          Click a point of the Map to pin it: its ground state is inspected here. Several points can
          be pinned and compared.
        </p>
      ) : (
        <PinList pins={pins} selected={selected} />
      )}
      <PinComparison />
      {pin !== undefined &&
        (entry === undefined || entry.status === 'pending' ? (
          <p className="placeholder-note" data-testid="probe-pending">
            Solving the point…
          </p>
        ) : entry.status === 'failed' ? (
          <p className="probe-problem" role="alert">
            {entry.message}
          </p>
        ) : (
          <ProbeDetails pin={pin} report={entry.report} />
        ))}
    </div>
  );
}

function PinList({ pins, selected }: { pins: readonly Pin[]; selected: number | null }) {
  const results = useFourfold((s) => s.probe.results);
  const plane = useFourfold((s) => s.map.grid?.input.plane ?? null);
  const { selectPin, removePin } = useFourfold.getState();
  return (
    <ul className="probe-pins" aria-label="Pinned points">
      {pins.map((pin) => {
        const entry = results[pin.id];
        const label = entry?.status === 'ready' ? entry.report.state.phase : '…';
        const meaning = entry?.status === 'ready' ? phaseExplanation(label) : undefined;
        return (
          <li
            key={pin.id}
            className={pin.id === selected ? 'probe-pin probe-pin-selected' : 'probe-pin'}
            data-testid={`probe-pin-${pin.id}`}
          >
            <button
              type="button"
              className="probe-pin-select"
              aria-pressed={pin.id === selected}
              title={meaning}
              onClick={() => selectPin(pin.id)}
            >
              <span className="probe-pin-number">{pin.id}</span>
              <span className="probe-pin-point">
                {plane ? <AxisName label={plane.x.label} /> : 'x'} = {formatFixed(pin.x, 4)},{' '}
                {plane ? <AxisName label={plane.y.label} /> : 'y'} = {formatFixed(pin.y, 4)}
              </span>
              <span className="probe-pin-label">{label}</span>
            </button>
            <button
              type="button"
              className="probe-pin-remove"
              aria-label={`Remove pin ${pin.id}`}
              data-testid={`probe-remove-${pin.id}`}
              onClick={() => removePin(pin.id)}
            >
              ×
            </button>
          </li>
        );
      })}
    </ul>
  );
}
