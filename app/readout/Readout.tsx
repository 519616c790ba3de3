import {
  CHANNELS,
  ORDER_GROUPS,
  ORDER_TOLERANCE,
  couplingsOf,
  isSymmetry,
  modelAtPoint,
  PIXEL_SOLVED,
  groupMagnitudes,
  orderAngles,
} from '../../solver/index';
import { formatDegrees, formatFixed } from '../format';
import { useFourfold } from '../store/index';
import { channelExplanation, groupExplanation, tokenExplanation } from '../notation/explanations';
import { PhaseLabel } from '../notation/PhaseLabel';
import { Term } from '../notation/Term';
import { AxisName } from './AxisName';
import { ObservationsHere } from '../observations/ObservationsHere';

const DEGREES = 180 / Math.PI;
/** Index of tau_z (x) 1, the generator of valley rotations (channel z0). */
const VALLEY_ROTATION = 12;

/**
 * The state under the pointer: position, phase label, energy, gap, and the order parameters
 * grouped as in public/notes.html#order-parameters with the angles that mean something (canting,
 * bond phase).
 */
export function Readout() {
  const hover = useFourfold((s) => s.view.hover);
  const grid = useFourfold((s) => s.map.grid);
  const phase = useFourfold((s) => s.map.phase);
  const unit = useFourfold((s) => (s.setup.physical ? ' (meV)' : ''));
  // Redraw when the grid under the pointer is refined.
  useFourfold((s) => s.map.version);
  if (!grid || !hover || hover.i >= grid.nx || hover.j >= grid.ny) {
    return (
      <section className="readout" data-testid="readout" aria-live="polite">
        <p className="placeholder">Point at the map to read the state there.</p>
      </section>
    );
  }
  const p = hover.j * grid.nx + hover.i;
  const exchange = grid.input.model.exchange ?? 0;
  // Inside regions pixels are solved when asked for, once the boundary cells are done (a
  // single descent from the nearest coarse node; the grid keeps the result).
  if (phase === 'boundaries' || phase === 'verifying' || phase === 'done') grid.solvePixelNow(p);
  const { x: ax, y: ay } = grid.input.plane;
  const label = grid.labels[p] ?? '';
  const solved = grid.status[p] === PIXEL_SOLVED;
  const order = new Float64Array(16);
  for (let k = 1; k < 16; k++) order[k] = grid.order[15 * p + k - 1]!;
  const magnitudes = groupMagnitudes(order);
  const angles = orderAngles(order, ORDER_TOLERANCE);
  const neelInPlane = magnitudes[ORDER_GROUPS.findIndex((g) => g.key === 'neelInPlane')]!;
  const bond = magnitudes[ORDER_GROUPS.findIndex((g) => g.key === 'bondOrder')]!;
  return (
    <section className="readout" data-testid="readout" aria-live="polite">
      <dl className="readout-position">
        <div>
          <dt>
            <AxisName label={ax.label} explain />
          </dt>
          <dd data-testid="readout-x" data-value={grid.x[hover.i]}>
            {formatFixed(grid.x[hover.i]!, 4)}
          </dd>
        </div>
        <div>
          <dt>
            <AxisName label={ay.label} explain />
          </dt>
          <dd data-testid="readout-y" data-value={grid.y[hover.j]}>
            {formatFixed(grid.y[hover.j]!, 4)}
          </dd>
        </div>
      </dl>
      <p className="readout-phase">
        <strong data-testid="readout-phase">
          <PhaseLabel label={label} />
        </strong>
        <span className="readout-meaning">
          {label === '' ? '' : label.split('+').map(tokenExplanation).join('; ')}
        </span>
      </p>
      <ObservationsHere x={grid.x[hover.i]!} y={grid.y[hover.j]!} />
      {!solved ? (
        <p className="placeholder">Coarse preview: this pixel is still being solved.</p>
      ) : (
        <>
          <dl className="figures">
            <div>
              <dt>Energy per flux quantum{unit}</dt>
              <dd data-testid="readout-energy" data-value={grid.energy[p]}>
                {formatFixed(grid.energy[p]!, 6)}
              </dd>
            </div>
            <div>
              <dt title="Lowest empty minus highest occupied Hartree-Fock level; an upper estimate of transport gaps">
                Quasiparticle gap*{unit}
              </dt>
              <dd data-testid="readout-gap" data-value={grid.gap[p]}>
                {formatFixed(grid.gap[p]!, 6)}
              </dd>
              {exchange > 0 && (
                <dd className="readout-note" data-testid="readout-gap-exchange">
                  includes the Coulomb exchange <AxisName label="E_X" /> ={' '}
                  {formatFixed(exchange, 4)}
                </dd>
              )}
              {grid.gap[p]! < 0 && (
                <dd className="readout-warning" data-testid="readout-gap-negative">
                  Negative: an occupied level lies above an empty one (no Aufbau), so this uniform
                  state is unstable to separated particle-hole pairs.
                </dd>
              )}
            </div>
            {neelInPlane > ORDER_TOLERANCE && (
              <div>
                <dt>
                  Canting angle <AxisName label="theta_c" explain /> from the field
                </dt>
                <dd data-testid="readout-canting">
                  {formatFixed(angles.canting * DEGREES, 2)}° (cos <AxisName label="theta_c" /> ={' '}
                  {formatFixed(Math.cos(angles.canting), 4)})
                </dd>
              </div>
            )}
            {bond > ORDER_TOLERANCE && (
              <div>
                <dt>Bond-order phase arg(o_x0 + i o_y0)</dt>
                <dd data-testid="readout-bond-phase">{formatDegrees(angles.bondPhase, 2)}°</dd>
                {isSymmetry(
                  couplingsOf(modelAtPoint(grid.input, grid.x[hover.i]!, grid.y[hover.j]!)),
                  VALLEY_ROTATION,
                ) && (
                  <dd className="readout-note">
                    any phase is equivalent here: valley rotation about τ<sub>z</sub> is a symmetry
                    of the model
                  </dd>
                )}
              </div>
            )}
          </dl>
          <table className="group-table">
            {/* The readout lives only while the pointer is over the Map: no link here (the
                header's Model notes link leads to the same heading). */}
            <caption>Order parameters by symmetry group (Model notes: Order parameters)</caption>
            <tbody>
              {ORDER_GROUPS.map((g, k) => {
                const present = magnitudes[k]! > ORDER_TOLERANCE;
                return (
                  <tr key={g.key} className={present ? 'present' : undefined}>
                    <th scope="row">
                      <Term explain={groupExplanation(g.key)}>{g.title}</Term>{' '}
                      <span className="token">{g.token}</span>
                    </th>
                    <td data-testid={`readout-group-${g.key}`}>{formatFixed(magnitudes[k]!, 4)}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
          <details className="raw-order-details">
            <summary>All 15 expectation values</summary>
            <ul className="raw-order" aria-label="All 15 expectation values">
              {CHANNELS.map((ch, k) => (
                <li key={ch} data-testid={`readout-order-${ch}`} data-value={order[k + 1]}>
                  <Term explain={channelExplanation(ch)}>{ch}</Term> {formatFixed(order[k + 1]!, 6)}
                </li>
              ))}
            </ul>
          </details>
          <p className="footnote">
            * The quasiparticle gap is a mean-field upper estimate; transport gaps are smaller.
          </p>
        </>
      )}
    </section>
  );
}
