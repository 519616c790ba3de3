import { useEffect, useState, type ReactNode } from 'react';
import {
  DEFAULT_WAVEVECTORS,
  ELEMENTARY_CHARGE,
  REDUCED_PLANCK,
  dispersionToCsv,
  dispersionToJson,
  errorLine,
  modelAtPoint,
  parseMapInput,
  wavevectorGrid,
  type DispersionContext,
  type ModelDispersion,
  type ProbeReport,
} from '../../solver/index';
import { downloadText } from '../download';
import { formatFixed } from '../format';
import { physicalScales } from '../scenario/physical';
import { coulombOf, setupToScenario } from '../scenario/scenario';
import { commitSetup } from '../setup/commitSetup';
import { runSideTask } from '../sidePool';
import { useFourfold } from '../store/index';
import type { Pin } from '../store/probeSlice';
import { DispersionChart } from './DispersionChart';
import { probeKey } from './probeDriver';
import { dispersionFigureSvg } from './dispersionFigure';
import { ROTATION_NAMES, rotationColour, type DispersionUnits } from './dispersionSeries';
import { AxisName } from '../readout/AxisName';

type Status =
  | { readonly kind: 'running' }
  | { readonly kind: 'failed'; readonly message: string }
  | {
      readonly kind: 'done';
      readonly result: ModelDispersion;
      readonly context: DispersionContext;
      readonly units: DispersionUnits;
    };

/** Metres per second of 1 meV nm / hbar (a velocity in meV nm, hbar = 1). */
const METRES_PER_SECOND_PER_MEV_NM = (1e-3 * ELEMENTARY_CHARGE * 1e-9) / REDUCED_PLANCK;

/**
 * Whether the panel is open, kept across its remounts: the Probe's details are replaced while a
 * pin is solved again (after every setup change, the Coulomb scale's included).
 */
let panelOpen = false;

const Q = wavevectorGrid(
  DEFAULT_WAVEVECTORS.from,
  DEFAULT_WAVEVECTORS.to,
  DEFAULT_WAVEVECTORS.count,
);

/**
 * The collective modes at finite wavevector of the selected pin (public/notes.html#dispersion),
 * under the q = 0 modes: opened on demand, computed on the Map's worker pool as a side task,
 * again whenever the pin's Probe is. The Coulomb scale e^2/(eps l_B) is typed here in
 * dimensionless units (kept in the scenario as the model's `coulomb`) and follows from B_perp and
 * eps_r in physical units.
 */
export function DispersionPanel({ pin, report }: { pin: Pin; report: ProbeReport }) {
  const [open, setOpen] = useState(panelOpen);
  const physical = useFourfold((s) => s.setup.physical ?? null);
  const coulomb = useFourfold((s) => coulombOf(s.setup));
  const [status, setStatus] = useState<Status | null>(null);

  useEffect(() => {
    if (!open || coulomb === undefined) return;
    let current = true;
    const setup = useFourfold.getState().setup;
    let json: string;
    let context: DispersionContext;
    try {
      const scenario = setupToScenario(setup);
      const model = modelAtPoint(parseMapInput(scenario), pin.x, pin.y);
      json = JSON.stringify(scenario);
      context = {
        model,
        phase: report.state.phase,
        ...(setup.physical
          ? {
              energyUnit: 'meV',
              magneticLengthNm: physicalScales(setup.physical).magneticLengthNm,
            }
          : {}),
      };
    } catch (error) {
      setStatus({ kind: 'failed', message: errorLine(error) });
      return;
    }
    // Computed for the Probe on screen only once that Probe is of the current scenario (a change
    // solves the pin again first), so that its q = 0 modes are the ones listed above.
    if (useFourfold.getState().probe.results[pin.id]?.key !== probeKey(pin, json)) {
      setStatus({ kind: 'running' });
      return;
    }
    const units: DispersionUnits = {
      ...(context.energyUnit !== undefined ? { energyUnit: context.energyUnit } : {}),
      ...(context.magneticLengthNm !== undefined
        ? { magneticLengthNm: context.magneticLengthNm }
        : {}),
    };
    setStatus({ kind: 'running' });
    runSideTask((api) => api.modes(json, pin.x, pin.y, Q))
      .then((result) => {
        if (current)
          setStatus({ kind: 'done', result, context: { ...context, phase: result.phase }, units });
      })
      .catch((error: unknown) => {
        if (current) {
          setStatus({
            kind: 'failed',
            message: `The modes could not be computed: ${errorLine(error)}`,
          });
        }
      });
    return () => {
      current = false;
    };
  }, [open, coulomb, report, pin]);

  const shown = open && coulomb !== undefined ? status : null;
  return (
    <details
      className="probe-card probe-dispersion"
      data-testid="dispersion"
      open={open}
      onToggle={(event) => {
        panelOpen = (event.currentTarget as HTMLDetailsElement).open;
        setOpen(panelOpen);
      }}
    >
      <summary>
        <h3>Collective modes at finite q</h3>
      </summary>
      <CoulombEntry physical={physical !== null} coulomb={coulomb} />
      <p
        className="placeholder-note"
        data-testid="dispersion-status"
        data-status={coulomb === undefined ? 'waiting' : shown === null ? 'idle' : shown.kind}
      >
        {coulomb === undefined
          ? 'Give the Coulomb scale to compute the dispersion.'
          : shown?.kind === 'running'
            ? 'Computing the modes along q…'
            : shown?.kind === 'failed'
              ? shown.message
              : ''}
      </p>
      {shown?.kind === 'done' && (
        <DispersionResult
          result={shown.result}
          context={shown.context}
          units={shown.units}
          pin={pin}
        />
      )}
      <p className="probe-note">
        Time-dependent Hartree-Fock about this uniform state, within the n = 0 level (
        <a href="notes.html#dispersion">model notes</a>). It leaves out Landau-level mixing,
        disorder, the finite thickness of the layer and any screening (no gate here; the command
        line takes one), and the decay of the modes; the anisotropic channels&apos; q dependence is
        read from their Hartree and Fock couplings.
      </p>
    </details>
  );
}

/** The Coulomb scale: typed in dimensionless units, derived from the sample in physical ones. */
function CoulombEntry({ physical, coulomb }: { physical: boolean; coulomb: number | undefined }) {
  const [draft, setDraft] = useState(coulomb === undefined ? '' : String(coulomb));
  const [problem, setProblem] = useState<string | null>(null);
  const [shown, setShown] = useState(coulomb);
  // The scale changed elsewhere (a scenario loaded): show it, unless the draft says it already.
  if (!Object.is(coulomb, shown)) {
    setShown(coulomb);
    if (draft.trim() === '' ? coulomb !== undefined : Number(draft) !== coulomb) {
      setDraft(coulomb === undefined ? '' : String(coulomb));
      setProblem(null);
    }
  }
  if (physical) {
    return (
      <p className="probe-note" data-testid="dispersion-coulomb-derived" data-value={coulomb}>
        Coulomb scale e²/(4πε₀ε<sub>r</sub>l<sub>B</sub>) = {formatFixed(coulomb ?? NaN, 4)} meV,
        from <AxisName label="B_perp" /> and ε<sub>r</sub> in the Setup.
      </p>
    );
  }
  // Checked as typed, written on Enter or when the field is left: each write solves the pin
  // again (the scale is part of the scenario).
  const check = (text: string): number | null | undefined => {
    const trimmed = text.trim();
    if (trimmed === '') return undefined;
    const value = Number(trimmed);
    return Number.isFinite(value) && value >= 0 ? value : null;
  };
  const edit = (text: string) => {
    setDraft(text);
    setProblem(check(text) === null ? 'expected a number ≥ 0' : null);
  };
  const commit = () => {
    const value = check(draft);
    if (value === null || Object.is(value, coulomb)) return;
    setProblem(commitSetup({ coulomb: value }));
  };
  return (
    <p className="dispersion-coulomb">
      <label>
        Coulomb scale e²/(ε l<sub>B</sub>){' '}
        <input
          type="text"
          inputMode="decimal"
          size={8}
          value={draft}
          data-testid="dispersion-coulomb"
          aria-invalid={problem !== null}
          onChange={(event) => edit(event.target.value)}
          onBlur={commit}
          onKeyDown={(event) => {
            if (event.key === 'Enter') commit();
          }}
        />
      </label>{' '}
      <span className="probe-note">
        in the unit of the couplings (<AxisName label="E_X" /> = √(π/2) × this)
      </span>
      {problem !== null && (
        <span className="probe-problem" role="alert">
          {' '}
          Coulomb scale: {problem}
        </span>
      )}
    </p>
  );
}

function DispersionResult({
  result,
  context,
  units,
  pin,
}: {
  result: ModelDispersion;
  context: DispersionContext;
  units: DispersionUnits;
  pin: Pin;
}) {
  const d = result.dispersion;
  const lB = units.magneticLengthNm;
  const energy = units.energyUnit ?? '';
  const velocity = (v: number): ReactNode =>
    lB === undefined ? (
      <>
        v = {formatFixed(v, 5)} (energy × <AxisName label="l_B" />)
      </>
    ) : (
      `v = ${formatFixed(v * lB, 4)} meV nm (${formatFixed((v * lB * METRES_PER_SECOND_PER_MEV_NM) / 1000, 3)} km/s)`
    );
  const stiffness = (rho: number): ReactNode =>
    lB === undefined ? (
      <>
        ρ = {formatFixed(rho, 5)} (energy × <AxisName label="l_B^2" />)
      </>
    ) : (
      `ρ = ${formatFixed(rho * lB * lB, 4)} meV nm²`
    );
  return (
    <div className="dispersion-result" data-testid="dispersion-result">
      {!d.stable && (
        <p className="probe-warning" data-testid="dispersion-unstable">
          Unstable: a modulation lowers the energy at q = {d.unstableAt.slice(0, 3).join(', ')}
          {d.unstableAt.length > 3 ? ', …' : ''} (growth rates dashed below zero). The uniform state
          is not the Hartree-Fock ground state there.
        </p>
      )}
      <DispersionChart dispersion={d} units={units} />
      <table className="probe-table" data-testid="dispersion-table">
        <thead>
          <tr>
            <th scope="col">Branch</th>
            <th scope="col">Gap{energy && ` (${energy})`}</th>
            <th scope="col">Near q = 0</th>
            <th scope="col">q → ∞</th>
            <th scope="col">Rotates</th>
          </tr>
        </thead>
        <tbody>
          {d.gaps.map((gap, b) => {
            const group = d.rotates[b]![1] ?? d.rotates[b]![0] ?? null;
            return (
              <tr
                key={b}
                data-testid={`dispersion-branch-${b}`}
                data-gap={gap}
                data-goldstone={d.goldstone[b]}
              >
                <td>{b + 1}</td>
                <td>{d.goldstone[b] ? 'Goldstone (0)' : formatFixed(gap, 6)}</td>
                <td>
                  {d.velocities[b] !== null
                    ? velocity(d.velocities[b]!)
                    : d.stiffness[b] !== null
                      ? stiffness(d.stiffness[b]!)
                      : '—'}
                </td>
                <td>{formatFixed(d.particleHole[b]!, 5)}</td>
                <td>
                  <span
                    className="dispersion-swatch"
                    style={{ background: rotationColour(group) }}
                  />{' '}
                  {group === null ? '—' : <AxisName label={ROTATION_NAMES[group]} />}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="probe-note">
        Gap: ω at q = 0 (the q = 0 modes above). Goldstone branches rise linearly, ω ≈ v q, or
        quadratically, ω ≈ ρ q²; a gapped branch as ω ≈ gap + ρ q². q → ∞: the particle-hole energy
        with <AxisName label="E_X" /> = {formatFixed(d.exchange, 4)}
        {energy && ` ${energy}`}. Open circles mark Goldstone branches; dotted lines the large-q
        limits.
      </p>
      <div className="probe-exports">
        <button
          type="button"
          data-testid="dispersion-export-svg"
          onClick={() =>
            downloadText(
              `fourfold-modes-${pin.id}.svg`,
              dispersionFigureSvg(d, context, units),
              'image/svg+xml',
            )
          }
        >
          Figure (SVG)
        </button>
        <button
          type="button"
          data-testid="dispersion-export-csv"
          onClick={() =>
            downloadText(`fourfold-modes-${pin.id}.csv`, dispersionToCsv(d, context), 'text/csv')
          }
        >
          Data (CSV)
        </button>
        <button
          type="button"
          data-testid="dispersion-export-json"
          onClick={() =>
            downloadText(
              `fourfold-modes-${pin.id}.json`,
              `${JSON.stringify(dispersionToJson(d, context))}\n`,
              'application/json',
            )
          }
        >
          Data (JSON)
        </button>
      </div>
    </div>
  );
}
