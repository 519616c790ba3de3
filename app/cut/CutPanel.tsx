import { useEffect, useState } from 'react';
import { useContentWidth } from '../useContentWidth';
import { MeanFieldCautions } from '../probe/MeanFieldCautions';
import { useFourfold } from '../store/index';
import { CutCharts } from './CutCharts';
import { startCutDriver } from './cutDriver';
import { CutNumberField } from './CutNumberField';
import './cut.css';
import { LineFields, POINTS_RULE, SweepFields, pathTag } from './CutFields';
import { Exports, Transitions } from './CutResults';

/**
 * The Cut: a straight line through the Map (typed or dragged) or a sweep of one quantity at a
 * pinned point, its profiles along one horizontal axis, the located transitions, exports and the
 * cautions.
 */
export function CutPanel() {
  useEffect(() => startCutDriver(), []);
  const spec = useFourfold((s) => s.cut.spec);
  const n = useFourfold((s) => s.cut.n);
  const status = useFourfold((s) => s.cut.status);
  const problem = useFourfold((s) => s.cut.problem);
  const ms = useFourfold((s) => s.cut.ms);
  const result = useFourfold((s) => s.cut.result);
  const plane = useFourfold((s) => s.map.grid?.input.plane ?? null);
  const setCutSpec = useFourfold((s) => s.setCutSpec);
  const setCutPoints = useFourfold((s) => s.setCutPoints);
  const [mode, setMode] = useState<'line' | 'sweep'>(
    spec !== null && spec.kind !== 'line' ? 'sweep' : 'line',
  );
  const [ref, width] = useContentWidth();
  // A line drawn on the Map switches the panel to lines.
  useEffect(() => {
    if (spec?.kind === 'line') setMode('line');
  }, [spec]);

  return (
    <div className="cut" data-testid="cut" ref={ref}>
      <div className="cut-controls">
        <div className="cut-mode" role="radiogroup" aria-label="What the Cut follows">
          {(
            [
              ['line', 'Line through the Map'],
              ['sweep', 'Sweep at a pin'],
            ] as const
          ).map(([value, text]) => (
            <label key={value}>
              <input
                type="radio"
                name="cut-mode"
                value={value}
                checked={mode === value}
                data-testid={`cut-mode-${value}`}
                onChange={() => setMode(value)}
              />
              {text}
            </label>
          ))}
        </div>
        {mode === 'line' ? (
          <LineFields spec={spec} plane={plane} />
        ) : (
          <SweepFields spec={spec} plane={plane} />
        )}
        <div className="cut-run">
          <CutNumberField
            label="samples"
            value={n}
            rule={POINTS_RULE}
            testId="cut-points"
            onCommit={(v) => {
              setCutPoints(v);
              return null;
            }}
          />
          {spec !== null && (
            <button type="button" data-testid="cut-clear" onClick={() => setCutSpec(null)}>
              Clear the Cut
            </button>
          )}
          <p
            className="cut-status"
            data-testid="cut-status"
            data-status={status}
            data-path={pathTag(result)}
            aria-live="polite"
          >
            {status === 'running'
              ? 'Computing the Cut…'
              : status === 'done' && ms !== null && result !== null
                ? `${result.t.length} samples and ${result.transitions.length} transition(s) in ${Math.round(ms)} ms.`
                : status === 'idle'
                  ? 'Type or draw a line, or sweep a quantity at a pinned point.'
                  : ''}
          </p>
        </div>
        {problem !== null && (
          <p className="cut-problem" role="alert" data-testid="cut-problem">
            {problem}
          </p>
        )}
      </div>
      {result !== null && (
        <>
          <Transitions />
          <CutCharts cut={result} width={width} />
          <Exports />
          <aside className="cut-cautions">
            <p>
              The quasiparticle gap is the Hartree-Fock gap of a uniform state: an upper estimate of
              a transport gap. Transitions are located between samples; a phase narrower than the
              sample spacing that no neighbour reaches is not seen.
            </p>
            <MeanFieldCautions />
          </aside>
        </>
      )}
    </div>
  );
}
