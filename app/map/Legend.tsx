import { memo, useEffect, useMemo, useState } from 'react';
import { PhaseLabel } from '../notation/PhaseLabel';
import { useFourfold } from '../store/index';
import { formatShare, legendEntries } from './legendEntries';
import { Swatch } from './Swatch';

/**
 * The Map's key: one row per label present, largest area first (swatch, label, what its tokens
 * mean, share of the plot), then the two boundary line styles.
 */
export function Legend() {
  const version = useRecountVersion();
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
            <LegendRow
              key={entry.label}
              label={entry.label}
              colours={entry.colours.join(' ')}
              share={formatShare(entry.share)}
              meaning={entry.meaning}
            />
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

/**
 * One label's row. Its props are strings, so a recount re-renders only the rows whose shown
 * share changed (a live Map recounts several times a second).
 */
const LegendRow = memo(function LegendRow({
  label,
  colours,
  share,
  meaning,
}: {
  label: string;
  /** The swatch colours, space-separated. */
  colours: string;
  share: string;
  meaning: string;
}) {
  return (
    <li className="legend-entry" data-testid="legend-entry" data-label={label}>
      <Swatch colours={colours.split(' ')} />
      <span className="legend-label">
        <PhaseLabel label={label} />
      </span>
      <span className="legend-share">{share}</span>
      <span className="legend-meaning">{meaning}</span>
    </li>
  );
});

function LineSample({ dashed }: { dashed: boolean }) {
  return (
    <svg className="legend-line-sample" width={30} height={10} aria-hidden="true">
      <path className={dashed ? 'legend-line legend-line-dashed' : 'legend-line'} d="M1,5H29" />
    </svg>
  );
}

/** Recount the legend at most this often (ms) while a map refines. */
const RECOUNT_MS = 300;

/**
 * The map's `version` (it says when the labels on screen changed: the grid is filled in place,
 * and every job fills another one), passed on at most every RECOUNT_MS while the map refines and
 * at once when it is done. Counting 65k labels on every update would compete with the workers,
 * and the legend re-renders only when this value changes, not on every update of the map.
 */
function useRecountVersion(): number {
  const [shown, setShown] = useState(() => useFourfold.getState().map.version);
  useEffect(() => {
    let last = 0;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const update = () => {
      timer = undefined;
      last = performance.now();
      setShown(useFourfold.getState().map.version);
    };
    const unsubscribe = useFourfold.subscribe(({ map }, { map: before }) => {
      if (map.version === before.version && map.phase === before.phase) return;
      if (map.phase === 'done') {
        clearTimeout(timer);
        update();
      } else if (timer === undefined) {
        timer = setTimeout(update, Math.max(0, last + RECOUNT_MS - performance.now()));
      }
    });
    update();
    return () => {
      unsubscribe();
      clearTimeout(timer);
    };
  }, []);
  return shown;
}
