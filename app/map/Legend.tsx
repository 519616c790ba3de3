import { useEffect, useMemo, useRef, useState } from 'react';
import { useFourfold } from '../store/index';
import { formatShare, legendEntries } from './legendEntries';
import { Swatch } from './Swatch';

/**
 * The Map's key: one row per label present, largest area first (swatch, label, what its tokens
 * mean, share of the plot), then the two boundary line styles.
 */
export function Legend() {
  // The grid is filled in place, and every job fills another one: `version` says when the labels
  // on screen changed. Counting 65k labels on every update would compete with the workers:
  // recount at most a few times a second (a slider drag swaps grids dozens of times a second),
  // and at once when a map is finished.
  const version = useThrottled(
    useFourfold((s) => s.map.version),
    useFourfold((s) => s.map.phase) === 'done' ? 0 : 300,
  );
  const hasGrid = useFourfold((s) => s.map.grid !== null);
  const entries = useMemo(() => {
    const grid = useFourfold.getState().map.grid;
    return grid === null ? [] : legendEntries(grid.labels);
    // The grid is read when `version` (or its presence) changes, not on every swap.
  }, [version, hasGrid]);
  const pending = 1 - entries.reduce((sum, entry) => sum + entry.share, 0);
  return (
    <section className="legend" data-testid="legend" aria-label="Map legend">
      {entries.length === 0 ? (
        <p className="legend-empty">No regions computed yet.</p>
      ) : (
        <ul className="legend-list">
          {entries.map((entry) => (
            <li
              key={entry.label}
              className="legend-entry"
              data-testid="legend-entry"
              data-label={entry.label}
            >
              <Swatch colours={entry.colours} />
              <span className="legend-label">{entry.label}</span>
              <span className="legend-share">{formatShare(entry.share)}</span>
              <span className="legend-meaning">{entry.meaning}</span>
            </li>
          ))}
        </ul>
      )}
      {entries.length > 0 && pending > 1e-9 && (
        <p className="legend-pending">not computed yet: {formatShare(pending)}</p>
      )}
      <dl className="legend-lines">
        <div>
          <dt>
            <LineSample dashed={false} />
          </dt>
          <dd>first-order boundary</dd>
        </div>
        <div>
          <dt>
            <LineSample dashed={true} />
          </dt>
          <dd>continuous boundary</dd>
        </div>
      </dl>
    </section>
  );
}

function LineSample({ dashed }: { dashed: boolean }) {
  return (
    <svg className="legend-line-sample" width={30} height={10} aria-hidden="true">
      <path className={dashed ? 'legend-line legend-line-dashed' : 'legend-line'} d="M1,5H29" />
    </svg>
  );
}

/** `value`, updated at most once per `ms` (immediately when `ms` is 0). */
function useThrottled<T>(value: T, ms: number): T {
  const [shown, setShown] = useState(value);
  const last = useRef(0);
  useEffect(() => {
    const wait = last.current + ms - performance.now();
    if (wait <= 0) {
      last.current = performance.now();
      setShown(value);
      return;
    }
    const timer = setTimeout(() => {
      last.current = performance.now();
      setShown(value);
    }, wait);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return shown;
}
