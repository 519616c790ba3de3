import { useMemo, type ReactNode } from 'react';
import {
  MIXING_CAUTION,
  PHYSICAL_RULES,
  physicalScales,
  toDimensionlessUnits,
  toPhysicalUnits,
  withPhysical,
} from '../scenario/physical';
import type { PhysicalSetup } from '../scenario/setup';
import { AxisName } from '../readout/AxisName';
import { useFourfold } from '../store/index';
import { commitSetup } from './commitSetup';
import { NumberField } from './NumberField';
import { sampleAt } from './samplePlacement';
import { tiltTrajectory } from './tiltTrajectory';
import './units.css';

type PhysicalNumber = 'bPerpTesla' | 'tiltDeg' | 'gFactor' | 'epsilonR' | 'tiltMaxDeg';

function commitPhysical(change: Partial<PhysicalSetup>): string | null {
  return commitSetup((s) => (s.physical ? withPhysical(s, { ...s.physical, ...change }) : {}));
}

function switchUnits(physical: boolean): void {
  commitSetup((s) => {
    if (physical) return toPhysicalUnits(s);
    // Spell out the removed keys: a patch only overwrites the keys it holds.
    return { physical: undefined, ranges: undefined, ...toDimensionlessUnits(s) };
  });
}

const FIELDS: readonly {
  key: PhysicalNumber;
  name: string;
  label: ReactNode;
  unit: string;
  testId: string;
}[] = [
  {
    key: 'bPerpTesla',
    name: 'B_perp',
    label: (
      <>
        <var>B</var>
        <sub>⊥</sub>
      </>
    ),
    unit: 'T',
    testId: 'physical-bperp',
  },
  { key: 'tiltDeg', name: 'tilt', label: <var>θ</var>, unit: '°', testId: 'physical-tilt' },
  { key: 'gFactor', name: 'g', label: <var>g</var>, unit: '', testId: 'physical-g' },
  {
    key: 'tiltMaxDeg',
    name: 'largest tilt',
    label: (
      <>
        <var>θ</var>
        <sub>max</sub>
      </>
    ),
    unit: '°',
    testId: 'physical-tilt-max',
  },
  {
    key: 'epsilonR',
    name: 'eps_r',
    label: (
      <>
        <var>ε</var>
        <sub>r</sub>
      </>
    ),
    unit: '',
    testId: 'physical-epsilon',
  },
];

function PhysicalEntry({ spec }: { readonly spec: (typeof FIELDS)[number] }) {
  const value = useFourfold((s) => s.setup.physical?.[spec.key] ?? NaN);
  return (
    <div className="physical-entry">
      <NumberField
        id={`setup-${spec.testId}`}
        name={spec.name}
        label={spec.label}
        value={value}
        rule={PHYSICAL_RULES[spec.key]}
        testId={spec.testId}
        onCommit={(v) => commitPhysical({ [spec.key]: v })}
      />
      {spec.unit !== '' && <span className="physical-unit">{spec.unit}</span>}
    </div>
  );
}

function format(value: number, digits = 4): string {
  return Number(value.toPrecision(digits)).toString();
}

/** One derived quantity: full precision in data-value for tests, four digits on screen. */
function Derived({
  testId,
  label,
  value,
  unit,
  title,
}: {
  testId: string;
  label: ReactNode;
  value: number;
  unit: string;
  title: string;
}) {
  return (
    <>
      <dt title={title}>{label}</dt>
      <dd data-testid={testId} data-value={value} title={title}>
        {format(value)} {unit}
      </dd>
    </>
  );
}

/** E_Z, l_B, Coulomb scale, E_X, E_1 and the mixing ratio of the current physical setup. */
function DerivedScales({ physical }: { readonly physical: PhysicalSetup }) {
  const scales = physicalScales(physical);
  return (
    <>
      <dl className="derived-scales" data-testid="physical-derived">
        <Derived
          testId="derived-zeeman"
          label={
            <>
              <var>E</var>
              <sub>Z</sub>
            </>
          }
          value={scales.zeemanMeV}
          unit="meV"
          title="g μ_B B_perp / cos θ, the full spin splitting (model notes: Units and field scaling)"
        />
        <Derived
          testId="derived-magnetic-length"
          label={
            <>
              <var>l</var>
              <sub>B</sub>
            </>
          }
          value={scales.magneticLengthNm}
          unit="nm"
          title="sqrt(ħ / e B_perp)"
        />
        <Derived
          testId="derived-coulomb"
          label={
            <>
              <var>e</var>
              <sup>2</sup>/<var>ε</var>
              <var>l</var>
              <sub>B</sub>
            </>
          }
          value={scales.coulombMeV}
          unit="meV"
          title="Coulomb scale e² / (4π ε0 ε_r l_B)"
        />
        <Derived
          testId="derived-exchange"
          label={
            <>
              <var>E</var>
              <sub>X</sub>
            </>
          }
          value={scales.exchangeMeV}
          unit="meV"
          title="exchange energy of a filled n = 0 level, sqrt(π/2) e² / (4π ε0 ε_r l_B) (Kallin and Halperin, PRB 30, 5655 (1984))"
        />
        <Derived
          testId="derived-landau-level"
          label={
            <>
              <var>E</var>
              <sub>1</sub>
            </>
          }
          value={scales.landauLevelMeV}
          unit="meV"
          title="n = 1 Landau level sqrt(2) ħ v_F / l_B, v_F = 1.0e6 m/s (Castro Neto et al., RMP 81, 109 (2009))"
        />
        <Derived
          testId="derived-mixing"
          label="mixing"
          value={scales.mixing}
          unit=""
          title="Landau-level mixing ratio (e² / 4π ε0 ε_r l_B) / (ħ v_F / l_B); it does not depend on the field"
        />
      </dl>
      {scales.mixing >= MIXING_CAUTION && (
        <p className="setup-caution" data-testid="mixing-caution">
          Landau-level mixing ratio {format(scales.mixing, 3)} is not small (≥ {MIXING_CAUTION},
          common practice): mixing with other levels, which Hartree-Fock within n = 0 leaves out,
          can move the boundaries. A larger ε<sub>r</sub> reduces it.
        </p>
      )}
    </>
  );
}

/** What the tilt path on the Map shows, and whether it is exact. */
function TiltNote() {
  const setup = useFourfold((s) => s.setup);
  const path = useMemo(() => tiltTrajectory(setup), [setup]);
  // The selected Probe pin can be taken as the sample whose tilt path is drawn.
  const pin = useFourfold((s) => s.probe.pins.find((p) => p.id === s.probe.selected));
  const max = setup.physical?.tiltMaxDeg ?? 0;
  const deltaV = <AxisName label="Delta_V" />;
  const zeeman = <AxisName label="E_Z" />;
  const field = <AxisName label="B_perp" />;
  let text: ReactNode;
  if (path === null) {
    text = (
      <>
        The tilt path is drawn on the Map when its axes are couplings, {deltaV} or {zeeman}.
      </>
    );
  } else if (path.kind === 'zeeman') {
    text = (
      <>
        On the Map: the sample&apos;s path along {zeeman} as the tilt goes from 0° to {max}° at
        fixed {field} (filled dot: the current tilt).
      </>
    );
  } else {
    text = (
      <>
        On the Map: the sample&apos;s path as the tilt goes from 0° to {max}° at fixed {field}, a
        ray towards the origin (the state depends on the couplings over {zeeman} only).
        {!path.exact && (
          <>
            {' '}
            Dotted, a guide only: {deltaV} or couplings off the axes stay fixed on the Map but would
            scale along the ray, or the sample lies beside the plane (a Hartree part off the axis
            ratio).
          </>
        )}
      </>
    );
  }
  return (
    <>
      <p className="setup-hint" data-testid="tilt-note">
        {text}
      </p>
      {path !== null && pin !== undefined && (
        <button
          type="button"
          className="setup-inline-button"
          data-testid="tilt-sample-at-pin"
          onClick={() => commitSetup(sampleAt(setup, pin.x, pin.y))}
        >
          Put the sample at pin {pin.id}
        </button>
      )}
    </>
  );
}

/**
 * Units of the Setup: dimensionless, or physical (field in tesla, couplings in meV/T, energies
 * in meV), with the scales they imply shown live. Switching keeps the Map: energies are read as
 * meV and B_perp is chosen so that E_Z stays.
 */
export function UnitsFields() {
  // Only the units: a slider drag in the Setup changes the rest of the setup many times a second.
  const physical = useFourfold((s) => s.setup.physical ?? null);
  return (
    <fieldset className="setup-group" data-testid="units">
      <legend>Units</legend>
      <div className="choices">
        <label className="choice">
          <input
            type="radio"
            name="setup-units"
            checked={physical === null}
            data-testid="units-dimensionless"
            onChange={() => switchUnits(false)}
          />
          dimensionless
        </label>
        <label className="choice">
          <input
            type="radio"
            name="setup-units"
            checked={physical !== null}
            data-testid="units-physical"
            onChange={() => switchUnits(true)}
          />
          physical (T, meV)
        </label>
      </div>
      {physical !== null && (
        <>
          <div className="physical-entries">
            {FIELDS.map((spec) => (
              <PhysicalEntry key={spec.key} spec={spec} />
            ))}
          </div>
          <DerivedScales physical={physical} />
          <label className="choice">
            <input
              type="checkbox"
              checked={physical.exchangeInGap}
              data-testid="physical-exchange-in-gap"
              onChange={(event) => commitPhysical({ exchangeInGap: event.currentTarget.checked })}
            />
            <span>
              add <var>E</var>
              <sub>X</sub> to the quasiparticle gap
            </span>
          </label>
          <TiltNote />
          <p className="setup-hint">
            Couplings are in meV per tesla of <var>B</var>
            <sub>⊥</sub> (contact couplings grow with it); <var>E</var>
            <sub>Z</sub> follows the total field <var>B</var>
            <sub>⊥</sub> / cos <var>θ</var>; Δ<sub>V</sub>, the axes and the Map are in meV.
          </p>
        </>
      )}
    </fieldset>
  );
}
