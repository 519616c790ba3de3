import { formatFixed } from '../format';
import { useFourfold } from '../store/index';

/**
 * The selected pin in a few numbers beside the Map, with a way down to its full Probe: the
 * Probe itself sits below the workspace, out of view while the user is pinning points.
 */
export function PinSummary() {
  const selected = useFourfold((s) => s.probe.selected);
  const entry = useFourfold((s) =>
    s.probe.selected === null ? undefined : s.probe.results[s.probe.selected],
  );
  if (selected === null) {
    return (
      <p className="pin-summary placeholder-note">
        Click the Map to pin a point and open its Probe.
      </p>
    );
  }
  return (
    <div className="pin-summary" data-testid="pin-summary">
      <p>
        <span className="probe-pin-number">{selected}</span>{' '}
        {entry?.status === 'ready' ? (
          <>
            <strong>{entry.report.state.phase}</strong>, E ={' '}
            {formatFixed(entry.report.state.energy, 6)}, gap{' '}
            {formatFixed(entry.report.state.gap, 4)}, {entry.report.modes.goldstone} Goldstone
          </>
        ) : entry?.status === 'failed' ? (
          'could not be solved'
        ) : (
          'solving…'
        )}
      </p>
      <button
        type="button"
        onClick={() =>
          document.getElementById('probe-heading')?.scrollIntoView({ behavior: 'smooth' })
        }
      >
        Open the Probe ↓
      </button>
    </div>
  );
}
