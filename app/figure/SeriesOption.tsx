import { useEffect, useRef, useState } from 'react';
import {
  CHANNELS,
  MapRunStopped,
  checkSeriesQuantity,
  errorLine,
  parseMapInput,
  parseSeriesQuantity,
  parseSeriesValues,
  type SeriesQuantity,
} from '../../solver/index';
import { downloadText } from '../download';
import { setupToScenario } from '../scenario/scenario';
import { useFourfold } from '../store/index';
import { computeSeriesFigure } from './seriesMaps';

/** Most panels the page computes in one series (the CLI's `series` takes up to 100). */
export const MAX_PAGE_SERIES = 12;

/** Panel resolutions offered, pixels per side: small enough for a browser to finish soon. */
const RESOLUTIONS = [32, 64, 96] as const;

/** What varies, as the CLI's `--vary` names it (a channel's choices add the channel). */
const KINDS = [
  { value: 'zeeman', text: 'E_Z' },
  { value: 'valleyZeeman', text: 'Delta_V' },
  { value: 'fock', text: 'Fock part of' },
  { value: 'hartree', text: 'Hartree part of' },
  { value: 'ratio', text: 'H/F ratio of' },
] as const;
type Kind = (typeof KINDS)[number]['value'];

/** The CLI's `--vary` text of a choice. */
function varyText(kind: Kind, channel: string): string {
  if (kind === 'fock' || kind === 'hartree') return `${channel}.${kind}`;
  if (kind === 'ratio') return `ratio:${channel}`;
  return kind;
}

/** A solver message about `--vary` or `--values`, worded for the page's fields. */
function pageMessage(error: unknown): string {
  return errorLine(error)
    .replace(/^--vary\b/, 'Series')
    .replace(/^--values\b/, 'Values');
}

type Phase = 'idle' | 'running' | 'done' | 'cancelled' | 'failed';

/**
 * The Figure's series: one Map per value of a chosen quantity (the CLI's `series`), computed on
 * the Map's worker pool behind the Map on screen, then downloaded as the small-multiples SVG.
 */
export function SeriesOption({ column, title }: { column: 'single' | 'double'; title: string }) {
  const [kind, setKind] = useState<Kind>('zeeman');
  const [channel, setChannel] = useState<string>('x0');
  const [valuesText, setValuesText] = useState('');
  const [resolution, setResolution] = useState<number>(64);
  const [phase, setPhase] = useState<Phase>('idle');
  const [status, setStatus] = useState('');
  const [message, setMessage] = useState<string | null>(null);
  const cancelled = useRef(false);
  useEffect(
    () => () => {
      cancelled.current = true;
    },
    [],
  );

  const start = async () => {
    setMessage(null);
    let quantity: SeriesQuantity;
    let values: number[];
    let document: Record<string, unknown>;
    try {
      quantity = parseSeriesQuantity(varyText(kind, channel));
      if (valuesText.trim() === '') throw new Error('Values: give v1,v2,... or from:to:n');
      values = parseSeriesValues(valuesText.trim());
      if (values.length > MAX_PAGE_SERIES) {
        throw new Error(
          `Values: at most ${MAX_PAGE_SERIES} panels here, got ${values.length} (the CLI's series takes more)`,
        );
      }
      document = setupToScenario(useFourfold.getState().setup) as Record<string, unknown>;
      checkSeriesQuantity(parseMapInput(document), quantity);
    } catch (error) {
      setMessage(pageMessage(error));
      return;
    }
    cancelled.current = false;
    setPhase('running');
    setStatus(`map 1 of ${values.length}`);
    try {
      const svg = await computeSeriesFigure(
        { document, quantity, values, resolution, column, title },
        {
          stopped: () => cancelled.current,
          progress: (done, of, fraction) =>
            setStatus(
              done < of
                ? `map ${done + 1} of ${of} (${Math.round(100 * fraction)}%)`
                : `${of} maps done`,
            ),
        },
      );
      downloadText('fourfold-series.svg', svg, 'image/svg+xml');
      setPhase('done');
      setStatus(`${values.length} maps done, figure downloaded`);
    } catch (error) {
      if (error instanceof MapRunStopped || cancelled.current) {
        setPhase('cancelled');
        setStatus('series cancelled');
      } else {
        setPhase('failed');
        setStatus('');
        setMessage(`Series failed: ${errorLine(error)}`);
      }
    }
  };

  const running = phase === 'running';
  const needsChannel = kind === 'fock' || kind === 'hartree' || kind === 'ratio';
  return (
    <div className="figure-series" data-testid="figure-series">
      <span className="figure-series-name">Series</span>
      <label>
        vary
        <select
          value={kind}
          disabled={running}
          onChange={(e) => setKind(e.target.value as Kind)}
          data-testid="series-vary"
        >
          {KINDS.map((k) => (
            <option key={k.value} value={k.value}>
              {k.text}
            </option>
          ))}
        </select>
      </label>
      {needsChannel && (
        <select
          value={channel}
          disabled={running}
          onChange={(e) => setChannel(e.target.value)}
          aria-label="Channel"
          data-testid="series-channel"
        >
          {CHANNELS.map((c) => (
            <option key={c} value={c}>
              {c}
            </option>
          ))}
        </select>
      )}
      <label className="figure-series-values">
        values
        <input
          type="text"
          value={valuesText}
          disabled={running}
          placeholder="0.1,0.3,0.5 or 0.1:0.7:4"
          onChange={(e) => setValuesText(e.target.value)}
          data-testid="series-values"
        />
      </label>
      <label>
        panels
        <select
          value={resolution}
          disabled={running}
          onChange={(e) => setResolution(Number(e.target.value))}
          data-testid="series-resolution"
        >
          {RESOLUTIONS.map((r) => (
            <option key={r} value={r}>
              {r} x {r}
            </option>
          ))}
        </select>
      </label>
      {running ? (
        <button
          type="button"
          onClick={() => {
            cancelled.current = true;
            setStatus('cancelling…');
          }}
          data-testid="series-cancel"
        >
          Cancel
        </button>
      ) : (
        <button type="button" onClick={() => void start()} data-testid="series-start">
          Series SVG
        </button>
      )}
      <span className="figure-status" role="status" data-testid="series-status" data-phase={phase}>
        {status}
      </span>
      {message !== null && (
        <p className="figure-message" role="alert" data-testid="series-message">
          {message}
        </p>
      )}
    </div>
  );
}
