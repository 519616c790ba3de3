import { useEffect, useState, type ChangeEvent } from 'react';
import {
  DEFAULT_FIT_OPTIONS,
  ModelError,
  OBSERVATION_COLUMNS,
  QUOTED_PATH_LENGTH,
  errorLine,
  observationCells,
  observationsToCsv,
  parseObservationsCsv,
  quoteInput,
} from '../../solver/index';
import { useFourfold } from '../store/index';
import { PageFit } from './PageFit';
import './observations.css';
import { AxisName } from '../readout/AxisName';

/** Largest observations file read (100 rows are a few kilobytes). */
const OBSERVATIONS_FILE_MAX_BYTES = 1_000_000;

const HEADER = `${OBSERVATION_COLUMNS.join(',')},pair\n`;

/**
 * A sample's observations (public/notes.html#observations): CSV rows typed, pasted or read from
 * a file, checked as `npm run fit` checks them, and kept with the scenario, the link and the
 * autosave. A bad row is named in one line and the text stays as typed.
 */
export function ObservationsPanel() {
  const observations = useFourfold((s) => s.setup.observations);
  const rows = observations?.rows ?? [];
  const [text, setText] = useState(() => (rows.length > 0 ? observationsToCsv(rows) : HEADER));
  const [message, setMessage] = useState<{ kind: 'info' | 'error'; text: string } | null>(null);
  // Rows kept here or loaded with a scenario, a link or the autosave: the text shows them.
  useEffect(() => {
    const kept = observations?.rows ?? [];
    setText(kept.length > 0 ? observationsToCsv(kept) : HEADER);
  }, [observations]);

  const keep = (csv: string, source: string) => {
    try {
      const parsed = parseObservationsCsv(csv);
      useFourfold.getState().updateSetup({
        observations: { rows: parsed, options: observations?.options ?? DEFAULT_FIT_OPTIONS },
      });
      setMessage({
        kind: 'info',
        text: `${parsed.length} ${parsed.length === 1 ? 'row' : 'rows'} kept${source}.`,
      });
    } catch (error) {
      if (!(error instanceof ModelError)) throw error;
      setMessage({ kind: 'error', text: `${error.message}; the rows kept are unchanged.` });
    }
  };

  const onFile = async (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    event.target.value = '';
    if (!file) return;
    const name = quoteInput(file.name, QUOTED_PATH_LENGTH);
    if (file.size > OBSERVATIONS_FILE_MAX_BYTES) {
      setMessage({ kind: 'error', text: `${name}: ${file.size} bytes is far more than 100 rows` });
      return;
    }
    let csv: string;
    try {
      csv = await file.text();
    } catch (error) {
      setMessage({ kind: 'error', text: `${name}: could not be read (${errorLine(error)})` });
      return;
    }
    setText(csv);
    keep(csv, ` from ${name}`);
  };

  return (
    <div className="observations" data-testid="observations">
      <p className="observations-note">
        One row per observation, as CSV with the header{' '}
        <code>bPerp_T,tilt_deg,valleyZeeman_meV,kind,value,sigma</code> and optionally{' '}
        <code>pair</code>; <code>kind</code> is <code>phase</code>, <code>transition_tilt</code> or{' '}
        <code>gap</code>. The rows ride with the scenario, the link and the autosave; the couplings
        of the Map's plane are read per tesla of <AxisName label="B_perp" /> (
        <code>npm run fit</code> reads a saved scenario the same way, README).
      </p>
      <textarea
        className="observations-text"
        aria-label="Observations as CSV"
        data-testid="observations-text"
        spellCheck={false}
        rows={6}
        value={text}
        onChange={(e) => setText(e.target.value)}
      />
      <div className="observations-actions">
        <button type="button" data-testid="observations-keep" onClick={() => keep(text, '')}>
          Keep these rows
        </button>
        <label className="observations-load">
          <input
            className="visually-hidden"
            type="file"
            accept=".csv,text/csv,text/plain"
            data-testid="observations-file"
            onChange={(e) => void onFile(e)}
          />
          Read a CSV file…
        </label>
        <button
          type="button"
          data-testid="observations-clear"
          disabled={rows.length === 0}
          onClick={() => {
            useFourfold.getState().updateSetup({ observations: undefined });
            setText(HEADER);
            setMessage({ kind: 'info', text: 'No rows kept.' });
          }}
        >
          Remove all rows
        </button>
      </div>
      {message !== null ? (
        <p
          className={`observations-message ${message.kind}`}
          role={message.kind === 'error' ? 'alert' : 'status'}
          data-testid="observations-message"
          data-kind={message.kind}
        >
          {message.text}
        </p>
      ) : null}
      <table className="observations-table" data-testid="observations-table">
        <caption>
          {rows.length === 0
            ? 'No observations kept'
            : `${rows.length} ${rows.length === 1 ? 'observation' : 'observations'} kept`}
        </caption>
        <thead>
          <tr>
            <th scope="col">row</th>
            <th scope="col">
              <AxisName label="B_perp" /> (T)
            </th>
            <th scope="col">tilt (°)</th>
            <th scope="col">
              <AxisName label="Delta_V" /> (meV)
            </th>
            <th scope="col">kind</th>
            <th scope="col">value</th>
            <th scope="col">σ</th>
            <th scope="col">pair</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row, k) => {
            const cells = observationCells(row);
            return (
              <tr key={k} data-testid={`observation-${k + 1}`}>
                <td>{k + 1}</td>
                <td>{cells.bPerp_T}</td>
                <td>{cells.tilt_deg}</td>
                <td>{cells.valleyZeeman_meV}</td>
                <td>{cells.kind}</td>
                <td>{cells.value}</td>
                <td>{cells.sigma}</td>
                <td>{cells.pair}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <PageFit />
    </div>
  );
}
