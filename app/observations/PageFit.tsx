import { useEffect, useMemo, useRef, useState } from 'react';
import {
  DEFAULT_SWEEP_FIELD,
  FitCancelled,
  ModelError,
  errorLine,
  fitToJson,
  predictTilts,
  runFit,
  type FitOutcome,
  type FitProblem,
  type TiltPrediction,
} from '../../solver/index';
import { useFourfold } from '../store/index';
import { PAGE_FIT_SIDE, pageFitProblem, pageFitRunners, setupKey } from './browserFit';
import { AxisName } from '../readout/AxisName';

type FitState =
  | { readonly phase: 'idle' }
  | { readonly phase: 'running'; readonly progress: string }
  | { readonly phase: 'error'; readonly text: string }
  | {
      readonly phase: 'done';
      readonly key: string;
      readonly problem: FitProblem;
      readonly outcome: FitOutcome;
    };

const STAGE_WORDS = { maps: 'Maps', sweeps: 'tilt sweeps', fit: 'evaluations' } as const;

function number(v: number | null | undefined): string {
  return v === null || v === undefined ? '' : String(Number(v.toPrecision(4)));
}

/**
 * The fit of the kept observations over the Map's plane, run on the Map's workers (the same
 * code as `npm run fit`, on a grid of at most PAGE_FIT_SIDE pixels a side): each parameter with
 * its estimate, sigma and 2-sigma interval (or the interval alone where the data do not
 * constrain it), chi^2, and each row observed against predicted.
 */
export function PageFit() {
  const setup = useFourfold((s) => s.setup);
  const rows = setup.observations?.rows ?? [];
  const key = useMemo(() => setupKey(setup), [setup]);
  const [state, setState] = useState<FitState>({ phase: 'idle' });
  const job = useRef(0);
  useEffect(
    () => () => {
      job.current++;
    },
    [],
  );

  const start = async () => {
    const mine = ++job.current;
    let problem: FitProblem;
    try {
      problem = pageFitProblem(setup);
    } catch (error) {
      if (!(error instanceof ModelError)) throw error;
      setState({ phase: 'error', text: `${error.message}.` });
      return;
    }
    setState({ phase: 'running', progress: 'starting' });
    const stale = () => mine !== job.current;
    try {
      const outcome = await runFit(
        problem,
        pageFitRunners,
        DEFAULT_SWEEP_FIELD,
        (p) => {
          if (!stale())
            setState({ phase: 'running', progress: `${p.done} ${STAGE_WORDS[p.stage]}` });
        },
        stale,
      );
      if (stale()) return;
      setState({ phase: 'done', key, problem, outcome });
      // The Map's axes are the plane's numbers at the scenario's field (per tesla times B_perp).
      const scale = problem.plane.scaledFromTesla ?? 1;
      const { grid } = outcome;
      useFourfold.getState().setConsistency({
        key,
        x: grid.x.map((v) => v * scale),
        y: grid.y.map((v) => v * scale),
        held: grid.held,
        total: grid.total,
      });
    } catch (error) {
      if (error instanceof FitCancelled || stale()) return;
      setState({ phase: 'error', text: errorLine(error) });
    }
  };

  const status =
    state.phase === 'idle'
      ? `Fits the kept rows over the Map's plane (at most ${PAGE_FIT_SIDE} x ${PAGE_FIT_SIDE} pixels), couplings read per tesla of B\u22a5.`
      : state.phase === 'running'
        ? `Fitting: ${state.progress}\u2026`
        : state.phase === 'error'
          ? state.text
          : state.key === key
            ? 'Fitted.'
            : 'The setup or the rows changed since this fit: fit again.';

  return (
    <div className="page-fit">
      <div className="observations-actions">
        <button
          type="button"
          data-testid="observations-fit"
          disabled={rows.length === 0 || state.phase === 'running'}
          onClick={() => void start()}
        >
          Fit the rows
        </button>
        {state.phase === 'running' ? (
          <button
            type="button"
            data-testid="observations-fit-cancel"
            onClick={() => {
              job.current++;
              setState({ phase: 'idle' });
            }}
          >
            Cancel
          </button>
        ) : null}
      </div>
      <p
        className={`observations-message ${state.phase === 'error' ? 'error' : 'info'}`}
        role={state.phase === 'error' ? 'alert' : 'status'}
        data-testid="observations-fit-status"
        data-phase={state.phase === 'done' && state.key !== key ? 'stale' : state.phase}
      >
        {status}
      </p>
      {state.phase === 'done' ? (
        <FitTables problem={state.problem} outcome={state.outcome} />
      ) : null}
    </div>
  );
}

function FitTables({ problem, outcome }: { problem: FitProblem; outcome: FitOutcome }) {
  const json = fitToJson(problem, outcome) as { caution: string };
  const { fit } = outcome;
  // The point the predictions are given at, in the Map's axis units.
  const scale = problem.plane.scaledFromTesla ?? 1;
  const [px, py] = [fit.point[0]! * scale, fit.point[1]! * scale];
  return (
    <>
      <div className="observations-actions">
        <button
          type="button"
          data-testid="fit-pin"
          data-x={px}
          data-y={py}
          onClick={() => useFourfold.getState().addPin(px, py)}
        >
          Pin the fitted point
        </button>
        <span className="observations-note">
          its Probe, and a Cut sweep at the pin, are then one click away
        </span>
      </div>
      <table className="observations-table" data-testid="fit-parameters">
        <caption>
          chi² {number(fit.chi2)} for {fit.dof} degrees of freedom
        </caption>
        <thead>
          <tr>
            <th scope="col">parameter</th>
            <th scope="col">estimate</th>
            <th scope="col">σ</th>
            <th scope="col">2σ interval</th>
          </tr>
        </thead>
        <tbody>
          {fit.parameters.map((p, d) => (
            <tr key={d} data-testid={`fit-parameter-${d}`} data-sigma={p.sigma ?? 'null'}>
              <td>
                <AxisName label={p.label} /> (meV/T)
              </td>
              <td>{p.estimate === null ? 'not constrained' : number(p.estimate)}</td>
              <td>{p.sigma === null ? '\u2013' : number(p.sigma)}</td>
              <td data-lo={p.interval[0]} data-hi={p.interval[1]}>
                {number(p.interval[0])} to {number(p.interval[1])}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <table className="observations-table" data-testid="fit-rows">
        <caption>Each row at the estimate</caption>
        <thead>
          <tr>
            <th scope="col">row</th>
            <th scope="col">kind</th>
            <th scope="col">observed</th>
            <th scope="col">predicted</th>
            <th scope="col">residual (σ)</th>
            <th scope="col">holds</th>
          </tr>
        </thead>
        <tbody>
          {problem.rows.map((row, k) => {
            const p = fit.predictions[k]!;
            const shown = (v: string | number | null) =>
              typeof v === 'number' ? number(v) : (v ?? 'none');
            return (
              <tr key={k} data-testid={`fit-row-${k + 1}`}>
                <td>{k + 1}</td>
                <td>{row.kind}</td>
                <td>{shown(row.value)}</td>
                <td>{shown(p.predicted)}</td>
                <td>{p.residual === null ? '' : number(p.residual)}</td>
                <td>{p.holds ? 'yes' : 'no'}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {problem.rows.some((row) => row.kind === 'transition_tilt') ? (
        <TiltPredictions problem={problem} outcome={outcome} />
      ) : null}
      <p className="observations-note" data-testid="fit-caution">
        {/* The solver's caution names B_perp, E_Z and mu_B as the CLI prints them: typeset. */}
        <AxisName label={json.caution} />
      </p>
    </>
  );
}

/** The transition tilts the fit predicts at a field the user types, with their bands. */
function TiltPredictions({ problem, outcome }: { problem: FitProblem; outcome: FitOutcome }) {
  const [field, setField] = useState(() =>
    String(Math.max(...problem.rows.map((row) => row.bPerpTesla))),
  );
  const [result, setResult] = useState<TiltPrediction[] | string | null>(null);
  const predict = async () => {
    const b = Number(field);
    if (field.trim() === '' || !Number.isFinite(b) || b < 0.01 || b > 100) {
      setResult(
        `B\u22a5: expected a field from 0.01 to 100 T, got ${JSON.stringify(field.slice(0, 40))}`,
      );
      return;
    }
    setResult(null);
    try {
      setResult(await predictTilts(problem, outcome.fit, b, pageFitRunners.rows));
    } catch (error) {
      setResult(errorLine(error));
    }
  };
  return (
    <div className="observations-actions" data-testid="fit-predictions">
      <label>
        Transition tilt at <AxisName label="B_perp" /> (T){' '}
        <input
          type="text"
          inputMode="decimal"
          size={6}
          value={field}
          data-testid="fit-predict-field"
          onChange={(e) => setField(e.target.value)}
        />
      </label>
      <button type="button" data-testid="fit-predict" onClick={() => void predict()}>
        Predict
      </button>
      {typeof result === 'string' ? (
        <p className="observations-message error" role="alert" data-testid="fit-predict-error">
          {result}
        </p>
      ) : result !== null ? (
        <ul className="observations-note" data-testid="fit-prediction-list">
          {result.map((p, k) => (
            <li key={k} data-testid={`fit-prediction-${k + 1}`} data-tilt={p.tiltDeg ?? 'null'}>
              {p.pair?.join(' to ') ?? 'first transition'} at {p.bPerpTesla} T:{' '}
              {p.tiltDeg === null
                ? 'no such transition'
                : `${number(p.tiltDeg)}\u00b0${p.sigmaDeg === null ? ' (band: depends on a parameter that is not constrained)' : ` \u00b1 ${number(p.sigmaDeg)}\u00b0`}`}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
