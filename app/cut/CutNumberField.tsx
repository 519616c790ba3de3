import { useId, useState, type ChangeEvent } from 'react';
import { formatEntry, parseEntry, type EntryRule } from '../setup/numberEntry';

export interface CutNumberFieldProps {
  readonly label: string;
  readonly value: number;
  readonly rule: EntryRule;
  /** Takes an accepted number; returns why it is refused (e.g. end equals start), or null. */
  readonly onCommit: (value: number) => string | null;
  readonly testId?: string;
}

/**
 * A number typed for the Cut, with its own draft text: an accepted number is committed on each
 * keystroke; anything else is flagged beside the field in one line and not committed, so the
 * last Cut stays. Escape puts back the stored value.
 */
export function CutNumberField({ label, value, rule, onCommit, testId }: CutNumberFieldProps) {
  const id = useId();
  const [draft, setDraft] = useState(() => formatEntry(value));
  const [shown, setShown] = useState(value);
  const [error, setError] = useState<string | null>(null);
  if (!Object.is(value, shown)) {
    // Set elsewhere (a drag on the Map, a pin): show it unless the draft already means it.
    setShown(value);
    const entry = parseEntry(draft, rule);
    if (!entry.ok || entry.value !== value) {
      setDraft(formatEntry(value));
      setError(null);
    }
  }
  const onChange = (event: ChangeEvent<HTMLInputElement>) => {
    const text = event.target.value;
    setDraft(text);
    const entry = parseEntry(text, rule);
    if (!entry.ok) {
      setError(entry.message);
      return;
    }
    const refused = onCommit(entry.value);
    setError(refused);
  };
  return (
    <label className="cut-field" htmlFor={id}>
      <span className="cut-field-label">{label}</span>
      <input
        id={id}
        type="text"
        inputMode="decimal"
        spellCheck={false}
        value={draft}
        aria-invalid={error !== null}
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
        <span className="cut-field-error" role="alert">
          {label}: {error}
        </span>
      )}
    </label>
  );
}
