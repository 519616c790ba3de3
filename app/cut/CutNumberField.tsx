import { useId } from 'react';
import { AxisName } from '../readout/AxisName';
import { NumberField } from '../setup/NumberField';
import type { EntryRule } from '../setup/numberEntry';

export interface CutNumberFieldProps {
  readonly label: string;
  readonly value: number;
  readonly rule: EntryRule;
  /** Takes an accepted number; returns why it is refused (e.g. end equals start), or null. */
  readonly onCommit: (value: number) => string | null;
  readonly testId?: string;
}

/**
 * A number typed for the Cut: the Setup's numeric entry (an accepted number is committed on each
 * keystroke, anything else flagged beside the field and not committed, so the last Cut stays;
 * Escape puts back the stored value), with its label above it, typeset as the app's other
 * symbols (u_perp as u⊥; a plain word stays as it is).
 */
export function CutNumberField({ label, value, rule, onCommit, testId }: CutNumberFieldProps) {
  const id = useId();
  return (
    <span className="cut-field cut-number">
      <NumberField
        id={id}
        name={label}
        label={
          <span className="cut-field-label">
            <AxisName label={label} />
          </span>
        }
        value={value}
        rule={rule}
        onCommit={onCommit}
        testId={testId}
      />
    </span>
  );
}
