import { useState, type ChangeEvent, type FormEvent } from 'react';
import { AxisName } from '../readout/AxisName';
import { COUPLING_RULE, parseEntry } from '../setup/numberEntry';
import { useFourfold } from '../store/index';

/** Pins a point by its typed coordinates (for exact points, and without a pointer). */
export function PinEntry() {
  const plane = useFourfold((s) => s.map.grid?.input.plane ?? null);
  const [x, setX] = useState('');
  const [y, setY] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const xName = plane?.x.label ?? 'x';
  const yName = plane?.y.label ?? 'y';
  // The message is about the last submitted entries: editing either field retires it.
  const edit = (set: (text: string) => void) => (event: ChangeEvent<HTMLInputElement>) => {
    set(event.target.value);
    setProblem(null);
  };
  const submit = (event: FormEvent) => {
    event.preventDefault();
    const px = parseEntry(x, COUPLING_RULE);
    const py = parseEntry(y, COUPLING_RULE);
    if (!px.ok) return setProblem(`${xName}: ${px.message}`);
    if (!py.ok) return setProblem(`${yName}: ${py.message}`);
    setProblem(null);
    useFourfold.getState().addPin(px.value, py.value);
  };
  return (
    <form className="pin-entry" onSubmit={submit} aria-label="Pin a point by its coordinates">
      <label>
        <span className="pin-entry-name">{plane ? <AxisName label={plane.x.label} /> : 'x'}</span>
        <input
          value={x}
          onChange={edit(setX)}
          inputMode="decimal"
          size={8}
          data-testid="pin-entry-x"
        />
      </label>
      <label>
        <span className="pin-entry-name">{plane ? <AxisName label={plane.y.label} /> : 'y'}</span>
        <input
          value={y}
          onChange={edit(setY)}
          inputMode="decimal"
          size={8}
          data-testid="pin-entry-y"
        />
      </label>
      <button type="submit" data-testid="pin-entry-submit">
        Pin this point
      </button>
      {problem !== null && (
        <span className="pin-entry-problem" role="alert" data-testid="pin-entry-problem">
          {problem}
        </span>
      )}
    </form>
  );
}
