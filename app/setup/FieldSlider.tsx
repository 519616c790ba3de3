import { useFourfold } from '../store/index';
import { commitSetup } from './commitSetup';
import { COUPLING_RULE } from './numberEntry';
import { NumberField } from './NumberField';
import { QuantityLabel } from './QuantityLabel';
import { useSweptTargets } from './sweep';

type FieldQuantity = 'zeeman' | 'valleyZeeman';

/** Slider range of each field (the numeric entry goes to ±ENTRY_BOUND). */
export const FIELD_SLIDERS: Readonly<
  Record<FieldQuantity, { min: number; max: number; step: number; testId: string; name: string }>
> = {
  zeeman: { min: 0, max: 3, step: 0.01, testId: 'zeeman', name: 'E_Z' },
  valleyZeeman: { min: -2, max: 2, step: 0.01, testId: 'valley-zeeman', name: 'Delta_V' },
};

const MEANING: Readonly<Record<FieldQuantity, string>> = {
  zeeman: 'Zeeman energy, the full spin splitting (grows with the total field, so with tilt)',
  valleyZeeman: 'sublattice splitting from the substrate; positive lowers sublattice A',
};

/**
 * E_Z or Delta_V: a slider that writes on every input event (live dragging) and a numeric entry
 * that may go beyond the slider's range. Disabled while an axis of the plane sweeps it.
 */
export function FieldSlider({ quantity }: { readonly quantity: FieldQuantity }) {
  const spec = FIELD_SLIDERS[quantity];
  const value = useFourfold((s) => s.setup[quantity]);
  const sweptBy = useSweptTargets().get(quantity);
  const swept = sweptBy !== undefined;
  const id = `setup-${spec.testId}`;
  const noteId = `${id}-note`;
  return (
    <div className={`field-slider${swept ? ' is-swept' : ''}`}>
      <label htmlFor={`${id}-range`} className="field-name">
        <QuantityLabel quantity={quantity} />
      </label>
      <input
        id={`${id}-range`}
        type="range"
        min={spec.min}
        max={spec.max}
        step={spec.step}
        value={value}
        disabled={swept}
        data-testid={spec.testId}
        aria-describedby={noteId}
        onChange={(event) => commitSetup({ [quantity]: Number(event.currentTarget.value) })}
      />
      <NumberField
        id={`${id}-entry`}
        name={spec.name}
        ariaLabel={`${spec.name} value`}
        value={value}
        rule={COUPLING_RULE}
        disabled={swept}
        testId={`${spec.testId}-entry`}
        onCommit={(v) => commitSetup({ [quantity]: v })}
      />
      <span id={noteId} className="setup-hint field-note">
        {swept
          ? `swept along ${sweptBy}`
          : value < spec.min || value > spec.max
            ? `beyond the slider's ${spec.min} to ${spec.max}`
            : MEANING[quantity]}
      </span>
    </div>
  );
}

/**
 * The two fields of the Setup: Zeeman energy and sublattice splitting. In physical units E_Z
 * follows from B_perp, tilt and g (Units), and Delta_V is in meV.
 */
export function FieldSliders() {
  const physical = useFourfold((s) => s.setup.physical !== undefined);
  return (
    <fieldset className="setup-group">
      <legend>Fields{physical && <span className="setup-hint"> (meV)</span>}</legend>
      {!physical && <FieldSlider quantity="zeeman" />}
      <FieldSlider quantity="valleyZeeman" />
      {physical && (
        <p className="setup-hint">
          <var>E</var>
          <sub>Z</sub> follows from <var>B</var>
          <sub>⊥</sub>, the tilt and <var>g</var> (Units).
        </p>
      )}
    </fieldset>
  );
}
