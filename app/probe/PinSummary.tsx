import { formatFixed } from '../format';
import { PhaseLabel } from '../notation/PhaseLabel';
import { AxisName } from '../readout/AxisName';
import { useFourfold } from '../store/index';
import { nearestCompetitor } from './pinComparison';
import './pinSummary.css';

/**
 * The selected pin's essentials beside the Map (its point, phase, energy, gap, Goldstone count
 * and nearest competitor), with a way to its full Probe below the workspace.
 */
export function PinSummary() {
  const selected = useFourfold((s) => s.probe.selected);
  const pin = useFourfold((s) => s.probe.pins.find((p) => p.id === s.probe.selected));
  const entry = useFourfold((s) =>
    s.probe.selected === null ? undefined : s.probe.results[s.probe.selected],
  );
  const plane = useFourfold((s) => s.map.grid?.input.plane ?? null);
  if (selected === null || pin === undefined) {
    return (
      <p className="pin-summary placeholder-note">
        Click the Map (or press Enter on it) to pin a point and open its Probe.
      </p>
    );
  }
  const report = entry?.status === 'ready' ? entry.report : null;
  const competitor = report === null ? null : nearestCompetitor(report);
  return (
    <section
      className="pin-summary"
      data-testid="pin-summary"
      aria-labelledby="pin-summary-heading"
    >
      <h3 id="pin-summary-heading">
        <span className="probe-pin-number">{selected}</span> Selected pin{' '}
        <span className="pin-summary-point">
          {plane ? <AxisName label={plane.x.label} /> : 'x'} = {formatFixed(pin.x, 4)},{' '}
          {plane ? <AxisName label={plane.y.label} /> : 'y'} = {formatFixed(pin.y, 4)}
        </span>
      </h3>
      {report !== null ? (
        <dl className="pin-summary-figures">
          <div>
            <dt>phase</dt>
            <dd data-testid="pin-summary-phase">
              <PhaseLabel label={report.state.phase} />
            </dd>
          </div>
          <div>
            <dt>energy</dt>
            <dd data-testid="pin-summary-energy" data-value={report.state.energy}>
              {formatFixed(report.state.energy, 6)}
            </dd>
          </div>
          <div>
            <dt>gap</dt>
            <dd data-testid="pin-summary-gap" data-value={report.state.gap}>
              {formatFixed(report.state.gap, 4)}
            </dd>
          </div>
          <div>
            <dt>Goldstone</dt>
            <dd data-testid="pin-summary-goldstone">{report.modes.goldstone}</dd>
          </div>
          <div className="pin-summary-wide">
            <dt>nearest competitor</dt>
            <dd data-testid="pin-summary-competitor">
              {competitor === null ? (
                'none met'
              ) : (
                <>
                  <PhaseLabel label={competitor.phase} whole /> +{formatFixed(competitor.above, 4)}
                </>
              )}
            </dd>
          </div>
        </dl>
      ) : (
        <p className="placeholder-note">
          {entry?.status === 'failed' ? 'could not be solved' : 'solving…'}
        </p>
      )}
      <button
        type="button"
        className="pin-summary-open"
        onClick={() =>
          document.getElementById('probe-heading')?.scrollIntoView({ behavior: 'smooth' })
        }
      >
        Full Probe below ↓
      </button>
    </section>
  );
}
