import { CUT_DISTANCE_LABEL, cutToCsv, cutToJson, parseMapInput } from '../../solver/index';
import { cutAxisSymbol } from '../figure/cutSeries';
import { downloadText } from '../download';
import { cutFigureSvg } from '../figure/cutFigure';
import { AxisName } from '../readout/AxisName';
import { setupToScenario } from '../scenario/scenario';
import { useFourfold } from '../store/index';

/** The transitions along the shown Cut, located and typed (test hooks on each item). */
export function Transitions() {
  const result = useFourfold((s) => s.cut.result);
  const plane = useFourfold((s) => s.map.grid?.input.plane ?? null);
  if (result === null) return null;
  if (result.transitions.length === 0)
    return <p className="cut-note">No transition along this cut.</p>;
  return (
    <ol className="cut-transitions" aria-label="Transitions along the Cut">
      {result.transitions.map((tr, k) => (
        <li
          key={k}
          data-testid="cut-transition"
          data-t={tr.t}
          data-s={tr.s}
          data-x={tr.x}
          data-y={tr.y}
          data-order={tr.order}
          data-between={tr.between.join('|')}
        >
          <strong>
            {tr.between[0]} → {tr.between[1]}
          </strong>{' '}
          {tr.order === 'first' ? 'first order' : 'continuous'} at{' '}
          <AxisName label={cutAxisSymbol(result)} /> = {tr.s.toPrecision(10)}
          {result.axis.unit === 'deg' ? '°' : ''}
          {result.path.kind === 'line' && result.axis.label === CUT_DISTANCE_LABEL && (
            <>
              : <AxisName label={plane?.x.label ?? 'x'} /> = {tr.x.toPrecision(10)},{' '}
              <AxisName label={plane?.y.label ?? 'y'} /> = {tr.y.toPrecision(10)}
            </>
          )}
        </li>
      ))}
    </ol>
  );
}

/** Figure (SVG), CSV and JSON of the shown Cut. */
export function Exports() {
  const result = useFourfold((s) => s.cut.result);
  if (result === null) return null;
  // The setup as it is at the click (not subscribed: it changes on every slider step).
  const input = (): ReturnType<typeof parseMapInput> | null => {
    try {
      return parseMapInput(setupToScenario(useFourfold.getState().setup));
    } catch {
      return null;
    }
  };
  return (
    <div className="cut-exports">
      <button
        type="button"
        data-testid="cut-export-svg"
        onClick={() => {
          const i = input();
          downloadText(
            'fourfold-cut.svg',
            cutFigureSvg(result, { plane: i?.plane }),
            'image/svg+xml',
          );
        }}
      >
        Figure (SVG)
      </button>
      <button
        type="button"
        data-testid="cut-export-csv"
        onClick={() => {
          const i = input();
          if (i) downloadText('fourfold-cut.csv', cutToCsv(result, i), 'text/csv');
        }}
      >
        Data (CSV)
      </button>
      <button
        type="button"
        data-testid="cut-export-json"
        onClick={() => {
          const i = input();
          if (i)
            downloadText(
              'fourfold-cut.json',
              JSON.stringify(cutToJson(result, i), null, 1),
              'application/json',
            );
        }}
      >
        Data (JSON)
      </button>
    </div>
  );
}
