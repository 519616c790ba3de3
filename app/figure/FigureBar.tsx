import { useState } from 'react';
import { errorLine, mapCsvPieces, mapJsonPieces, textChunks } from '../../solver/index';
import { useFourfold } from '../store/index';
import { completeMap } from './completeMap';
import { downloadBlob, downloadText } from '../download';
import { svgToPng } from './download';
import { tiltTrajectory } from '../setup/tiltTrajectory';
import type { Setup } from '../scenario/setup';
import { mapFigureSvg, type FigureTiltPath } from './mapFigure';
import './figure.css';
import { setupKey } from '../observations/browserFit';
import { SeriesOption } from './SeriesOption';

/** PNG resolutions offered, pixels per inch (300 and 600 are common journal minimums). */
const DPI_CHOICES = [150, 300, 600] as const;

/** Longest title accepted, characters. */
const MAX_TITLE = 200;

/** The sample's tilt path of a physical setup, as the figure draws it (none otherwise). */
function figureTiltPath(setup: Setup): FigureTiltPath | undefined {
  const path = tiltTrajectory(setup);
  if (path === null || !setup.physical) return undefined;
  return { points: path.points, fromDeg: 0, toDeg: setup.physical.tiltMaxDeg, exact: path.exact };
}

/**
 * The Figure: exports the Map on screen as a paper-ready SVG (the same function as the CLI's
 * `map --out X.svg`), as a PNG at a chosen resolution, and its data as CSV or JSON (region
 * pixels are solved first). Column width, title and pins (marked when shown) apply to the
 * figures, and to the series of Maps (`SeriesOption`).
 */
export function FigureBar() {
  const ready = useFourfold((s) => s.map.phase === 'done' && s.map.grid !== null);
  const [column, setColumn] = useState<'single' | 'double'>('single');
  const [title, setTitle] = useState('');
  const [withPins, setWithPins] = useState(true);
  const [dpi, setDpi] = useState<number>(300);
  const [busy, setBusy] = useState<string | null>(null);
  const [message, setMessage] = useState<string | null>(null);

  const figure = (): string => {
    const s = useFourfold.getState();
    const grid = s.map.grid;
    if (grid === null) throw new Error('no Map yet');
    return mapFigureSvg(
      { input: grid.input, labels: grid.labels, boundaries: s.map.boundaries },
      {
        column,
        title: title.slice(0, MAX_TITLE),
        pins: withPins ? s.probe.pins : [],
        tiltPath: figureTiltPath(s.setup),
        ...(s.setup.physical ? { unit: 'meV' } : {}),
        ...(s.view.consistency !== null && s.view.consistency.key === setupKey(s.setup)
          ? { consistent: s.view.consistency }
          : {}),
      },
    );
  };

  const run = async (what: string, task: () => Promise<void> | void) => {
    setBusy(what);
    setMessage(null);
    try {
      await task();
    } catch (error) {
      setMessage(`${what} export failed: ${errorLine(error)}`);
    } finally {
      setBusy(null);
    }
  };

  const exportSvg = () =>
    run('SVG', () => downloadText('fourfold-map.svg', figure(), 'image/svg+xml'));
  const exportPng = () =>
    run('PNG', async () => downloadBlob('fourfold-map.png', await svgToPng(figure(), dpi)));
  const exportData = (format: 'csv' | 'json') =>
    run(format.toUpperCase(), async () => {
      const s = useFourfold.getState();
      const grid = s.map.grid;
      if (grid === null) throw new Error('no Map yet');
      const job = s.map.job;
      const map = await completeMap(
        grid,
        s.map.boundaries,
        (fraction) =>
          setBusy(`${format.toUpperCase()}: solving pixels ${Math.round(100 * fraction)}%`),
        () => useFourfold.getState().map.job === job && useFourfold.getState().map.grid === grid,
      );
      // Built from the writers' pieces (as the CLI streams them), never one huge string.
      const pieces = format === 'csv' ? mapCsvPieces(map) : mapJsonPieces(map);
      downloadBlob(
        `fourfold-map.${format}`,
        new Blob([...textChunks(pieces)], {
          type: format === 'csv' ? 'text/csv' : 'application/json',
        }),
      );
    });

  const disabled = !ready || busy !== null;
  return (
    <section className="figure-bar" aria-label="Figure export" data-testid="figure-bar">
      <h3 className="figure-heading">Figure</h3>
      <div className="figure-options">
        <label>
          Width
          <select
            value={column}
            onChange={(e) => setColumn(e.target.value === 'double' ? 'double' : 'single')}
            data-testid="figure-column"
          >
            <option value="single">one column (8.6 cm)</option>
            <option value="double">two columns (17.8 cm)</option>
          </select>
        </label>
        <label className="figure-title">
          Title
          <input
            type="text"
            value={title}
            maxLength={MAX_TITLE}
            placeholder="none (E_Z, u_perp typeset)"
            onChange={(e) => setTitle(e.target.value)}
            data-testid="figure-title"
          />
        </label>
        <label className="figure-check">
          <input
            type="checkbox"
            checked={withPins}
            onChange={(e) => setWithPins(e.target.checked)}
            data-testid="figure-pins"
          />
          mark pins
        </label>
      </div>
      <div className="figure-actions">
        <button type="button" onClick={exportSvg} disabled={disabled} data-testid="export-svg">
          SVG
        </button>
        <span className="figure-png">
          <button type="button" onClick={exportPng} disabled={disabled} data-testid="export-png">
            PNG
          </button>
          <select
            value={dpi}
            onChange={(e) => setDpi(Number(e.target.value))}
            aria-label="PNG resolution"
            data-testid="export-dpi"
          >
            {DPI_CHOICES.map((d) => (
              <option key={d} value={d}>
                {d} dpi
              </option>
            ))}
          </select>
        </span>
        <button
          type="button"
          onClick={() => exportData('csv')}
          disabled={disabled}
          data-testid="export-csv"
        >
          CSV
        </button>
        <button
          type="button"
          onClick={() => exportData('json')}
          disabled={disabled}
          data-testid="export-json"
        >
          JSON
        </button>
        <span className="figure-status" role="status" data-testid="figure-status">
          {busy ?? (ready ? '' : 'available when the Map is finished')}
        </span>
      </div>
      {message !== null && (
        <p className="figure-message" role="alert">
          {message}
        </p>
      )}
      <SeriesOption column={column} title={title.slice(0, MAX_TITLE)} />
    </section>
  );
}
