/**
 * Bounds of a typed number. Values are dimensionless or in the user's energy unit, so the
 * bound is generous: it only keeps slips such as an extra digit block out of the solver.
 */
export interface EntryRule {
  readonly min: number;
  readonly max: number;
  readonly integer?: boolean;
  /** Message beside the field when the value is above `max` (default "at most max"). */
  readonly tooLarge?: string;
  /** Message when below `min` (default "at least min"). */
  readonly tooSmall?: string;
}

/** Bound on any coupling, field, ratio or axis end typed in the Setup. */
export const ENTRY_BOUND = 1000;

export const COUPLING_RULE: EntryRule = { min: -ENTRY_BOUND, max: ENTRY_BOUND };

export type Entry =
  { readonly ok: true; readonly value: number } | { readonly ok: false; readonly message: string };

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;
const NON_FINITE = /^[+-]?(nan|inf|infinity|∞)$/i;

/** The number a field's text stands for, or a short message saying why it is not accepted. */
export function parseEntry(text: string, rule: EntryRule): Entry {
  // Accept the typographic minus that the app itself prints.
  const t = text.trim().replace(/^\u2212/, '-');
  if (t === '') return { ok: false, message: 'enter a number' };
  if (NON_FINITE.test(t)) return { ok: false, message: 'must be a finite number' };
  if (!DECIMAL.test(t)) return { ok: false, message: 'not a number' };
  const value = Number(t);
  if (!Number.isFinite(value)) return { ok: false, message: 'must be a finite number' };
  if (rule.integer && !Number.isInteger(value))
    return { ok: false, message: 'must be a whole number' };
  if (value > rule.max) return { ok: false, message: rule.tooLarge ?? `at most ${rule.max}` };
  if (value < rule.min) return { ok: false, message: rule.tooSmall ?? `at least ${rule.min}` };
  return { ok: true, value };
}

/** A stored value as editable text: 12 significant digits, no "-0". */
export function formatEntry(value: number): string {
  const rounded = Number(value.toPrecision(12));
  return Object.is(rounded, -0) ? '0' : String(rounded);
}

/** A value as read-only text, with the typographic minus. */
export function formatDisplay(value: number): string {
  return formatEntry(value).replace(/^-/, '\u2212');
}
