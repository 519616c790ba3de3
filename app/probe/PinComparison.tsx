import { Fragment } from 'react';
import { downloadText } from '../download';
import { formatFixed } from '../format';
import { groupExplanation, phaseExplanation, symbolExplanation } from '../notation/explanations';
import { PhaseLabel } from '../notation/PhaseLabel';
import { Term } from '../notation/Term';
import { AxisName } from '../readout/AxisName';
import { useFourfold } from '../store/index';
import {
  COMPARISON_ROWS,
  comparisonCsv,
  comparisonDocument,
  comparisonJson,
  nearestCompetitor,
  referencePin,
  rowDifference,
  type ComparedPin,
  type ComparisonRow,
} from './pinComparison';
import './pinCompare.css';

/** The pins of the store with their Probes where ready. */
function comparedPins(
  pins: readonly ComparedPin['pin'][],
  results: ReturnType<typeof useFourfold.getState>['probe']['results'],
): ComparedPin[] {
  return pins.map((pin) => {
    const entry = results[pin.id];
    return { pin, report: entry?.status === 'ready' ? entry.report : null };
  });
}

/**
 * The comparison of the pins as they stand, for the Probe's JSON (`probeDocument`); undefined
 * with fewer than two pins.
 */
export function currentComparison(): object | undefined {
  const { probe, view } = useFourfold.getState();
  if (probe.pins.length < 2) return undefined;
  return comparisonDocument(comparedPins(probe.pins, probe.results), view.compareReference);
}

/** What each compared quantity is, on hover and focus. */
function rowExplanation(row: ComparisonRow): string | null {
  if (row.key === 'phase')
    return 'The phase label of the ground state (Model notes: Phase labels).';
  if (row.key.startsWith('group-')) {
    return groupExplanation(row.key.slice(6) as Parameters<typeof groupExplanation>[0]);
  }
  if (row.key === 'canting') return symbolExplanation('theta_c');
  if (row.key === 'goldstone') {
    return 'Zero-frequency pairs of the q = 0 collective modes (Model notes: Collective modes at q = 0).';
  }
  if (row.key === 'competitor') {
    return 'How far above the ground state the lowest state of another family lies (Model notes: What the Probe reports): small near a first-order transition.';
  }
  if (row.key === 'gap') {
    return 'Lowest empty minus highest occupied Hartree-Fock level: a mean-field upper estimate of a transport gap.';
  }
  return null;
}

function rowName(row: ComparisonRow) {
  if (row.key === 'canting') {
    return (
      <>
        canting angle <AxisName label="theta_c" /> (°)
      </>
    );
  }
  return row.name;
}

function valueText(row: ComparisonRow, value: string | number | null): string {
  if (value === null) return '–';
  if (typeof value === 'string') return value;
  return formatFixed(value, row.digits);
}

function differenceText(row: ComparisonRow, difference: string | number | null): string {
  if (difference === null) return '–';
  if (typeof difference === 'string') return difference;
  const text = formatFixed(difference, row.digits);
  return text === '0' || text.startsWith('-') ? text : `+${text}`;
}

/**
 * All pins side by side: for each, the phase, energy, gap, the order-parameter groups, canting
 * angle, Goldstone count and the height of the nearest competitor, with a difference column
 * against a chosen pin beside every other pin's values. Exported as CSV and JSON (and with the
 * Probe's JSON).
 */
export function PinComparison() {
  const pins = useFourfold((s) => s.probe.pins);
  const results = useFourfold((s) => s.probe.results);
  const chosen = useFourfold((s) => s.view.compareReference);
  const setReference = useFourfold((s) => s.setCompareReference);
  if (pins.length < 2) return null;
  const compared = comparedPins(pins, results);
  const reference = referencePin(compared, chosen)!;
  const refId = reference.pin.id;
  return (
    <section className="pin-compare" data-testid="pin-compare" data-reference={refId}>
      <div className="pin-compare-head">
        <h3>Pins side by side</h3>
        <label className="pin-compare-reference">
          differences against{' '}
          <select
            data-testid="compare-reference"
            value={refId}
            onChange={(event) => setReference(Number(event.currentTarget.value))}
          >
            {pins.map((pin) => (
              <option key={pin.id} value={pin.id}>
                pin {pin.id}
              </option>
            ))}
          </select>
        </label>
      </div>
      <div className="pin-compare-scroll">
        <table className="probe-table pin-compare-table">
          <thead>
            <tr>
              <th scope="col">quantity</th>
              {compared.map(({ pin }) => (
                <th
                  key={pin.id}
                  scope="colgroup"
                  colSpan={pin.id === refId ? 1 : 2}
                  className={pin.id === refId ? 'pin-compare-ref' : undefined}
                >
                  <span className="probe-pin-number">{pin.id}</span>
                  {pin.id === refId ? ' reference' : ''}
                </th>
              ))}
            </tr>
            <tr className="pin-compare-sub">
              <th scope="col" />
              {compared.map(({ pin }) => (
                <Fragment key={pin.id}>
                  <th scope="col">value</th>
                  {pin.id !== refId && <th scope="col">− pin {refId}</th>}
                </Fragment>
              ))}
            </tr>
          </thead>
          <tbody>
            {COMPARISON_ROWS.map((row) => {
              const refValue = reference.report === null ? null : row.value(reference.report);
              return (
                <tr key={row.key} data-row={row.key}>
                  <th scope="row">
                    <Term explain={rowExplanation(row)}>{rowName(row)}</Term>
                  </th>
                  {compared.map(({ pin, report }) => {
                    const value = report === null ? null : row.value(report);
                    const difference = rowDifference(value, refValue);
                    const competitor =
                      row.key === 'competitor' && report !== null
                        ? nearestCompetitor(report)
                        : null;
                    return (
                      <Fragment key={pin.id}>
                        <td
                          data-testid={`compare-${row.key}-${pin.id}`}
                          data-value={value ?? undefined}
                          className={pin.id === refId ? 'pin-compare-ref' : undefined}
                        >
                          {report === null ? (
                            '…'
                          ) : row.key === 'phase' && typeof value === 'string' ? (
                            <Term explain={phaseExplanation(value)}>{value}</Term>
                          ) : (
                            valueText(row, value)
                          )}
                          {competitor !== null && (
                            <span className="pin-compare-note">
                              {' '}
                              (<PhaseLabel label={competitor.phase} whole />)
                            </span>
                          )}
                        </td>
                        {pin.id !== refId && (
                          <td
                            className="pin-compare-diff"
                            data-testid={`compare-diff-${row.key}-${pin.id}`}
                            data-value={difference ?? undefined}
                          >
                            {report === null ? '…' : differenceText(row, difference)}
                          </td>
                        )}
                      </Fragment>
                    );
                  })}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <div className="probe-exports">
        <button
          type="button"
          data-testid="compare-export-csv"
          onClick={() =>
            downloadText('fourfold-pins.csv', comparisonCsv(compared, refId), 'text/csv')
          }
        >
          Save comparison (CSV)
        </button>
        <button
          type="button"
          data-testid="compare-export-json"
          onClick={() =>
            downloadText('fourfold-pins.json', comparisonJson(compared, refId), 'application/json')
          }
        >
          Save comparison (JSON)
        </button>
      </div>
    </section>
  );
}
