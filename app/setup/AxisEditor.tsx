import { useState } from 'react';
import { CHANNELS } from '../../solver/index';
import type { AxisQuantity, AxisSetup } from '../scenario/setup';
import { useFourfold } from '../store/index';
import { commitSetup } from './commitSetup';
import { COUPLING_RULE, formatDisplay } from './numberEntry';
import { NumberField } from './NumberField';
import { QuantityLabel, quantityText } from './QuantityLabel';
import { axisTargetNames, type AxisName } from './sweep';

/** Range an axis starts with when it is switched to a quantity. */
export function defaultRange(quantity: AxisQuantity): readonly [number, number] {
  return quantity === 'zeeman' ? [0, 3] : [-2, 2];
}

const CHOICES: readonly AxisQuantity[] = ['uPerp', 'uZ', 'zeeman', 'valleyZeeman'];

function otherName(name: AxisName): AxisName {
  return name === 'x' ? 'y' : 'x';
}

function commitAxis(name: AxisName, change: (axis: AxisSetup) => AxisSetup): string | null {
  return commitSetup((s) => ({ [name]: change(s[name]) }));
}

function switchQuantity(name: AxisName, quantity: AxisQuantity): string | null {
  return commitSetup((s) => {
    const [from, to] = defaultRange(quantity);
    let hartreeRatio = 1;
    if (quantity !== 'custom' && (CHANNELS as readonly string[]).includes(quantity)) {
      const c = s.channels[quantity as (typeof CHANNELS)[number]];
      if (c.fock !== 0) hartreeRatio = c.hartree / c.fock;
    }
    return { [name]: { quantity, from, to, hartreeRatio } };
  });
}

function targetsText(targets: Readonly<Record<string, number>>): string {
  return Object.entries(targets)
    .map(([target, coefficient]) => `${target} × ${formatDisplay(coefficient)}`)
    .join(', ');
}

/** One axis of the Map's plane: what it sweeps and over which range. */
export function AxisEditor({ name }: { readonly name: AxisName }) {
  const axis = useFourfold((s) => s.setup[name]);
  const other = useFourfold((s) => s.setup[otherName(name)]);
  const ratios = useFourfold((s) => s.setup.ratios);
  const [quantityError, setQuantityError] = useState<string | null>(null);
  const taken = new Set(axisTargetNames(other));
  const overlaps = (quantity: AxisQuantity) =>
    quantity !== axis.quantity &&
    axisTargetNames({ ...axis, quantity }).some((target) => taken.has(target));
  const option = (quantity: AxisQuantity) => (
    <option key={quantity} value={quantity} disabled={overlaps(quantity)}>
      {quantityText(quantity)}
      {overlaps(quantity) ? ` (on ${otherName(name)})` : ''}
    </option>
  );
  const id = `plane-${name}`;
  const isChannel = (CHANNELS as readonly string[]).includes(axis.quantity);

  return (
    <fieldset className="axis-editor" data-testid={`axis-${name}`}>
      <legend>
        <var>{name}</var> axis: <QuantityLabel quantity={axis.quantity} customLabel={axis.label} />
      </legend>
      <div className="axis-row">
        <label htmlFor={`${id}-quantity`}>sweeps</label>
        <select
          id={`${id}-quantity`}
          value={axis.quantity}
          data-testid={`${id}-quantity`}
          aria-invalid={quantityError !== null ? true : undefined}
          onChange={(event) =>
            setQuantityError(switchQuantity(name, event.currentTarget.value as AxisQuantity))
          }
        >
          {CHOICES.map(option)}
          <optgroup label="single channel">{CHANNELS.map(option)}</optgroup>
          {axis.quantity === 'custom' && (
            <option value="custom">{quantityText('custom', axis.label)}</option>
          )}
        </select>
        {quantityError !== null && (
          <span className="field-error" role="alert">
            {quantityError}
          </span>
        )}
      </div>
      {axis.quantity === 'custom' && (
        <p className="setup-hint custom-targets" data-testid={`${id}-targets`}>
          Sets {targetsText(axis.targets ?? {})} per unit (read-only; choose a quantity to replace
          it).
        </p>
      )}
      <div className="axis-row">
        <NumberField
          id={`${id}-from`}
          name={`${name} from`}
          label="from"
          value={axis.from}
          rule={COUPLING_RULE}
          testId={`${id}-from`}
          revalidateOn={axis.to}
          onCommit={(from) =>
            from === axis.to
              ? 'same as “to”; an axis needs two different ends'
              : commitAxis(name, (a) => ({ ...a, from }))
          }
        />
        <NumberField
          id={`${id}-to`}
          name={`${name} to`}
          label="to"
          value={axis.to}
          rule={COUPLING_RULE}
          testId={`${id}-to`}
          revalidateOn={axis.from}
          onCommit={(to) =>
            to === axis.from
              ? 'same as “from”; an axis needs two different ends'
              : commitAxis(name, (a) => ({ ...a, to }))
          }
        />
      </div>
      {isChannel && (
        <div className="axis-row">
          <NumberField
            id={`${id}-ratio`}
            name={`${name} Hartree/Fock`}
            label={
              <>
                <var>H</var> / <var>F</var>
              </>
            }
            value={axis.hartreeRatio}
            rule={COUPLING_RULE}
            testId={`${id}-ratio`}
            onCommit={(hartreeRatio) => commitAxis(name, (a) => ({ ...a, hartreeRatio }))}
          />
          <span className="setup-hint">
            the axis value is the Fock coupling; Hartree = ratio × value
          </span>
        </div>
      )}
      {(axis.quantity === 'uPerp' || axis.quantity === 'uZ') && (
        <p className="setup-hint">
          The axis value is the Fock coupling; Hartree = {formatDisplay(ratios[axis.quantity])} ×
          value (the ratio under Common couplings).
        </p>
      )}
    </fieldset>
  );
}
