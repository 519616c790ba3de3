import { useMemo } from 'react';
import type { ProbeReport } from '../../solver/index';
import { downloadText } from '../download';
import { formatFixed } from '../format';
import { tokenExplanation } from '../notation/explanations';
import { PhaseLabel } from '../notation/PhaseLabel';
import { useFourfold } from '../store/index';
import type { Pin } from '../store/probeSlice';
import { LevelDiagram } from './LevelDiagram';
import { latticeSvg } from './latticeSvg';
import { currentComparison } from './PinComparison';
import { probeDocument } from './probeDocument';
import { DispersionPanel } from './DispersionPanel';
import { ModeList } from './ModeList';
import { OrientationDiscs } from './OrientationDiscs';
import { SpinorTable } from './SpinorTable';
import { AxisName } from '../readout/AxisName';

/** Every section of one pin's Probe. */
export function ProbeDetails({ pin, report }: { pin: Pin; report: ProbeReport }) {
  const state = report.state;
  const unit = useFourfold((s) => (s.setup.physical ? ' (meV)' : ''));
  const lattice = useMemo(() => latticeSvg(report, `Pin ${pin.id}`), [report, pin.id]);
  const meaning = state.phase.split('+').map(tokenExplanation).join('; ');
  return (
    <div
      className="probe-details"
      data-testid="probe-details"
      data-pin={pin.id}
      data-x={pin.x}
      data-y={pin.y}
      data-phase={state.phase}
    >
      <section className="probe-card probe-state">
        <h3>Ground state</h3>
        <p className="probe-label">
          <strong data-testid="probe-phase">
            <PhaseLabel label={state.phase} />
          </strong>
          <span>{meaning}</span>
        </p>
        <dl className="probe-figures">
          <div>
            <dt>Energy per flux quantum{unit}</dt>
            <dd data-testid="probe-energy" data-value={state.energy}>
              {formatFixed(state.energy, 9)}
            </dd>
          </div>
          <div>
            <dt>Quasiparticle gap*{unit}</dt>
            <dd data-testid="probe-gap" data-value={state.gap}>
              {formatFixed(state.gap, 6)}
            </dd>
          </div>
        </dl>
        <p className="probe-note">
          {report.exchange > 0 ? (
            <>
              The gap and the occupied levels include the Coulomb exchange <AxisName label="E_X" />{' '}
              = {formatFixed(report.exchange, 4)}.
            </>
          ) : (
            <>
              Without the Coulomb exchange <AxisName label="E_X" />: it lowers every occupied level
              alike and adds <AxisName label="E_X" /> to the gap (in physical units tick “add{' '}
              <AxisName label="E_X" /> to the quasiparticle gap”, or set "exchange" in the model
              file).
            </>
          )}
        </p>
        {!state.aufbau && (
          <p className="probe-warning" data-testid="probe-no-aufbau">
            The occupied levels are not the lowest ones (no Aufbau): with these Hartree-dominated
            couplings the state is unstable to separated particle-hole pairs, and the gap is
            negative.
          </p>
        )}
        <LevelDiagram levels={report.levels} />
        <p className="probe-note">
          * A mean-field upper estimate: transport gaps are smaller (disorder, textures such as
          skyrmions).
        </p>
      </section>

      <section className="probe-card probe-spinors">
        <h3>Occupied spinors</h3>
        <SpinorTable report={report} />
      </section>

      <section className="probe-card probe-orientation">
        <h3>Spin and valley</h3>
        <OrientationDiscs report={report} />
      </section>

      <section className="probe-card probe-lattice">
        <h3>On the lattice</h3>
        <div
          className="probe-lattice-picture"
          data-testid="probe-lattice"
          // Our own SVG text (numbers and solver labels, escaped), the same that is exported.
          dangerouslySetInnerHTML={{ __html: lattice.replace(/^<\?xml[^>]*>\s*/, '') }}
        />
      </section>

      <section className="probe-card probe-modes">
        <h3>Collective modes at q = 0</h3>
        <ModeList report={report} />
      </section>

      <DispersionPanel pin={pin} report={report} />

      <section className="probe-card probe-competitors">
        <h3>Competing minima</h3>
        <table className="probe-table" data-testid="probe-competitors">
          <thead>
            <tr>
              <th scope="col">State</th>
              <th scope="col">Energy</th>
              <th scope="col">Above ground</th>
              <th scope="col" title="Unstable directions of the energy (Morse index)">
                Stability
              </th>
            </tr>
          </thead>
          <tbody>
            {report.competitors.map((c, k) => (
              <tr key={k} data-phase={c.phase} data-above={c.above} data-unstable={c.unstable}>
                <td>
                  <PhaseLabel label={c.phase} whole />
                  {c.note !== '' && <span className="probe-family"> ({c.note})</span>}
                  {c.count > 1 && <span className="probe-family"> degenerate family</span>}
                </td>
                <td>{formatFixed(c.energy, 6)}</td>
                <td>{k === 0 ? 'ground' : `+${formatFixed(c.above, 6)}`}</td>
                <td
                  title={
                    c.unstable === 0
                      ? 'A local minimum of the energy'
                      : `A saddle point: ${c.unstable} unstable ${c.unstable === 1 ? 'direction' : 'directions'} (Morse index)`
                  }
                >
                  {c.unstable === 0 ? 'minimum' : `saddle (${c.unstable})`}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="probe-note">
          Local minima met from the whole seed library, and the saddle points of the symmetric state
          families (F, CDW, KD, AF, …) where those are not minima. A family with several members at
          one energy is a degenerate family.
        </p>
      </section>

      <div className="probe-exports">
        <button
          type="button"
          data-testid="probe-export-json"
          onClick={() =>
            downloadText(
              `fourfold-probe-${pin.id}.json`,
              probeDocument(report, { x: pin.x, y: pin.y }, currentComparison()),
              'application/json',
            )
          }
        >
          Save Probe (JSON)
        </button>
        <button
          type="button"
          data-testid="probe-export-lattice"
          onClick={() => downloadText(`fourfold-lattice-${pin.id}.svg`, lattice, 'image/svg+xml')}
        >
          Save lattice picture (SVG)
        </button>
      </div>
    </div>
  );
}
