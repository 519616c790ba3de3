import { useContext, useEffect, useState, type ChangeEvent, type ReactNode } from 'react';
import { formatEntry, parseEntry, type EntryRule } from './numberEntry';
import { ProblemReport } from './problemReport';

export interface NumberFieldProps {
  /** DOM id of the input; also the key of its problem report. */
  readonly id: string;
  /** Plain-text name of the field, used in the panel's problem line (e.g. "E_Z"). */
  readonly name: string;
  /** Visible label; without it give `ariaLabel`. */
  readonly label?: ReactNode;
  readonly ariaLabel?: string;
  /** The stored value. */
  readonly value: number;
  readonly rule: EntryRule;
  /** Writes an accepted number; returns why the store refused it, or null. */
  readonly onCommit: (value: number) => string | null;
  readonly disabled?: boolean;
  readonly testId?: string;
  /**
   * When this changes, a refused but well-formed entry is offered again (for example "to" once
   * "from" has moved away from it).
   */
  readonly revalidateOn?: unknown;
}

/**
 * A numeric entry with its own draft text. Every keystroke that gives an accepted number is
 * written at once; anything else (empty, not a number, not finite, out of range, refused by the
 * plane check) is flagged beside the field and not written, so the last valid Map stays.
 * Escape puts back the stored value.
 */
export function NumberField(props: NumberFieldProps) {
  const { id, name, label, ariaLabel, value, rule, onCommit, disabled, testId, revalidateOn } =
    props;
  const [draft, setDraft] = useState(() => formatEntry(value));
  const [error, setError] = useState<string | null>(null);
  const [shownValue, setShownValue] = useState(value);
  const [shownRevalidate, setShownRevalidate] = useState(revalidateOn);

  // The stored value changed elsewhere (slider, load, another field): show it, unless the
  // draft already says the same number (e.g. "1." while typing 1.5).
  if (!Object.is(value, shownValue)) {
    setShownValue(value);
    const entry = parseEntry(draft, rule);
    if (!entry.ok || entry.value !== value) {
      setDraft(formatEntry(value));
      setError(null);
    }
  }

  const report = useContext(ProblemReport);
  const problem = error === null || disabled ? null : `${name}: ${error}`;
  useEffect(() => {
    report(id, problem);
    return () => report(id, null);
  }, [report, id, problem]);

  useEffect(() => {
    if (Object.is(revalidateOn, shownRevalidate)) return;
    setShownRevalidate(revalidateOn);
    const entry = parseEntry(draft, rule);
    if (error !== null && entry.ok) setError(onCommit(entry.value));
  }, [revalidateOn, shownRevalidate, draft, rule, error, onCommit]);

  const onChange = (event: ChangeEvent<HTMLInputElement>) => {
    const text = event.currentTarget.value;
    setDraft(text);
    const entry = parseEntry(text, rule);
    setError(entry.ok ? onCommit(entry.value) : entry.message);
  };

  const errorId = `${id}-error`;
  return (
    <span className={`number-field${error !== null ? ' is-invalid' : ''}`}>
      {label !== undefined && <label htmlFor={id}>{label}</label>}
      <input
        id={id}
        type="text"
        value={draft}
        size={8}
        spellCheck={false}
        autoComplete="off"
        disabled={disabled}
        aria-label={ariaLabel}
        aria-invalid={error !== null ? true : undefined}
        aria-describedby={error !== null ? errorId : undefined}
        data-testid={testId}
        onChange={onChange}
        onKeyDown={(event) => {
          if (event.key === 'Escape') {
            setDraft(formatEntry(value));
            setError(null);
          }
        }}
      />
      {error !== null && (
        <span id={errorId} className="field-error" role="alert">
          {error}
        </span>
      )}
    </span>
  );
}
