import { csvText } from './csvText';
import { readCsvRecords } from './csvRows';
import { quoteInput } from './inputText';
import { ModelError, isPlainObject } from './model';
import { isPhaseLabel, parseStateCondition } from './stateCondition';

/**
 * What a sample showed (public/notes.html#observations), at a perpendicular field B_perp, a tilt
 * of the field from the normal and optionally a sublattice splitting Delta_V:
 * - `phase`: the state seen there, a label or a group condition (`value`, text);
 * - `transition_tilt`: the tilt in degrees at which the state changes when the field is tilted
 *   up from `tiltDeg` (0 when null), with its uncertainty `sigma` (degrees), optionally between
 *   the two labels of `pair`;
 * - `gap`: an activation gap in meV with its uncertainty.
 */
export type ObservationKind = 'phase' | 'transition_tilt' | 'gap';

export const OBSERVATION_KINDS: readonly ObservationKind[] = ['phase', 'transition_tilt', 'gap'];

export interface Observation {
  readonly bPerpTesla: number;
  /** Tilt of the field, degrees; for a transition the tilt its sweep starts from (null: 0). */
  readonly tiltDeg: number | null;
  /** Delta_V in meV; null: the model's own. */
  readonly valleyZeemanMeV: number | null;
  readonly kind: ObservationKind;
  /** A label or condition (phase), a tilt in degrees (transition) or a gap in meV. */
  readonly value: string | number;
  /** Uncertainty of a transition tilt (degrees) or gap (meV); null for a phase. */
  readonly sigma: number | null;
  /** The two labels a transition is between (lower tilt first), or null for any. */
  readonly pair: readonly [string, string] | null;
}

/** The CSV header's columns, in order (the command line's OBS.csv; `pair` is optional). */
export const OBSERVATION_COLUMNS = [
  'bPerp_T',
  'tilt_deg',
  'valleyZeeman_meV',
  'kind',
  'value',
  'sigma',
] as const;
export const PAIR_COLUMN = 'pair';

export type ObservationColumn = (typeof OBSERVATION_COLUMNS)[number] | typeof PAIR_COLUMN;

/** Most observation rows read at once (each distinct field and tilt costs a Map). */
export const MAX_OBSERVATIONS = 100;

/** Largest field, tilt and splitting accepted (as the Setup's physical units allow). */
const B_RANGE = { min: 0.01, max: 100 };
const MAX_TILT = 89.9;
const MAX_MEV = 1e4;

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** A typed cell as the text of one observation row: cell texts by column. */
export type ObservationCells = Readonly<Partial<Record<ObservationColumn, string>>>;

function fail(where: string, column: ObservationColumn, reason: string): never {
  throw new ModelError(`${where}, column ${column}: ${reason}`);
}

function numberCell(text: string, where: string, column: ObservationColumn): number | null {
  const t = text.trim();
  if (t === '') return null;
  const value = DECIMAL.test(t) ? Number(t) : NaN;
  if (!Number.isFinite(value)) fail(where, column, `expected a number, got ${quoteInput(t)}`);
  return value;
}

function required(value: number | null, where: string, column: ObservationColumn): number {
  if (value === null) fail(where, column, 'missing (this kind of row needs it)');
  return value;
}

/**
 * One observation from its cells (texts by column), validated. `where` names the row in
 * messages ("row 3"); every ModelError is one line "where, column C: reason".
 */
export function observationFromCells(cells: ObservationCells, where: string): Observation {
  const kindText = (cells.kind ?? '').trim();
  if (!(OBSERVATION_KINDS as readonly string[]).includes(kindText)) {
    fail(where, 'kind', `expected phase, transition_tilt or gap, got ${quoteInput(kindText)}`);
  }
  const kind = kindText as ObservationKind;
  const b = required(numberCell(cells.bPerp_T ?? '', where, 'bPerp_T'), where, 'bPerp_T');
  if (b < B_RANGE.min || b > B_RANGE.max) {
    fail(where, 'bPerp_T', `expected a field from ${B_RANGE.min} to ${B_RANGE.max} T, got ${b}`);
  }
  const tilt = numberCell(cells.tilt_deg ?? '', where, 'tilt_deg');
  if (kind !== 'transition_tilt') required(tilt, where, 'tilt_deg');
  if (tilt !== null && (tilt < 0 || tilt > MAX_TILT)) {
    fail(where, 'tilt_deg', `expected a tilt from 0 to ${MAX_TILT} degrees, got ${tilt}`);
  }
  const valley = numberCell(cells.valleyZeeman_meV ?? '', where, 'valleyZeeman_meV');
  if (valley !== null && Math.abs(valley) > MAX_MEV) {
    fail(where, 'valleyZeeman_meV', `at most ${MAX_MEV} meV in magnitude, got ${valley}`);
  }
  const sigma = numberCell(cells.sigma ?? '', where, 'sigma');
  const pairText = (cells.pair ?? '').trim();
  if (kind !== 'transition_tilt' && pairText !== '') {
    fail(where, 'pair', 'only a transition_tilt row names a pair; leave it empty');
  }
  const valueText = (cells.value ?? '').trim();
  if (kind === 'phase') {
    if (sigma !== null) fail(where, 'sigma', 'a phase row has no uncertainty; leave it empty');
    if (valueText === '') fail(where, 'value', 'missing (the state seen: a label or a condition)');
    try {
      parseStateCondition(valueText);
    } catch (error) {
      if (error instanceof ModelError)
        fail(where, 'value', `${quoteInput(valueText)}: ${error.message}`);
      throw error;
    }
    return {
      bPerpTesla: b,
      tiltDeg: tilt,
      valleyZeemanMeV: valley,
      kind,
      value: valueText,
      sigma: null,
      pair: null,
    };
  }
  const value = required(numberCell(valueText, where, 'value'), where, 'value');
  if (sigma === null || sigma <= 0) {
    fail(
      where,
      'sigma',
      sigma === null
        ? 'missing (the uncertainty, > 0)'
        : `expected a positive uncertainty, got ${sigma}`,
    );
  }
  if (kind === 'transition_tilt') {
    if (value <= 0 || value > MAX_TILT) {
      fail(
        where,
        'value',
        `expected a transition tilt above 0 and at most ${MAX_TILT} degrees, got ${value}`,
      );
    }
    if (tilt !== null && tilt >= value) {
      fail(
        where,
        'tilt_deg',
        `the tilt the sweep starts from (${tilt}) must lie below the transition tilt ${value}; leave it empty to start at 0`,
      );
    }
    let pair: [string, string] | null = null;
    if (pairText !== '') {
      const parts = pairText.split('/').map((p) => p.trim());
      if (parts.length !== 2 || !parts.every(isPhaseLabel) || parts[0] === parts[1]) {
        fail(
          where,
          'pair',
          `expected two different labels as A/B (lower tilt first), got ${quoteInput(pairText)}`,
        );
      }
      pair = [parts[0]!, parts[1]!];
    }
    return { bPerpTesla: b, tiltDeg: tilt, valleyZeemanMeV: valley, kind, value, sigma, pair };
  }
  if (value < 0 || value > MAX_MEV)
    fail(where, 'value', `expected a gap from 0 to ${MAX_MEV} meV, got ${value}`);
  return { bPerpTesla: b, tiltDeg: tilt, valleyZeemanMeV: valley, kind, value, sigma, pair: null };
}

/**
 * Observation rows from CSV text (RFC 4180): the header `bPerp_T,tilt_deg,valleyZeeman_meV,kind,
 * value,sigma` (optionally a seventh column `pair`), then one row per observation. Throws
 * ModelError with one line naming the row (counted from 1 below the header) and the column.
 */
export function parseObservationsCsv(text: string): Observation[] {
  const records = readCsvRecords(text);
  const header = records[0];
  const expected = OBSERVATION_COLUMNS.join(',');
  if (header === undefined) throw new ModelError(`header: missing; the first line is ${expected}`);
  const names = header.cells.map((c) => c.trim());
  const withPair = names.length === OBSERVATION_COLUMNS.length + 1 && names[6] === PAIR_COLUMN;
  if (!withPair && names.join(',') !== expected) {
    throw new ModelError(
      `header: expected ${expected} (optionally ,${PAIR_COLUMN}), got ${quoteInput(header.cells.join(','))}`,
    );
  }
  if (withPair && names.slice(0, 6).join(',') !== expected) {
    throw new ModelError(
      `header: expected ${expected},${PAIR_COLUMN}, got ${quoteInput(header.cells.join(','))}`,
    );
  }
  const rows = records.slice(1);
  if (rows.length > MAX_OBSERVATIONS) {
    throw new ModelError(`${rows.length} rows; at most ${MAX_OBSERVATIONS} observations at once`);
  }
  return rows.map((record, k) => {
    const where = `row ${k + 1} (line ${record.line})`;
    if (record.cells.length !== names.length) {
      throw new ModelError(`${where}: expected ${names.length} cells, got ${record.cells.length}`);
    }
    const cells: Partial<Record<ObservationColumn, string>> = {};
    names.forEach((name, n) => (cells[name as ObservationColumn] = record.cells[n]!));
    return observationFromCells(cells, where);
  });
}

/** The cells of an observation as text (what the CSV and the app's table show). */
export function observationCells(o: Observation): Record<ObservationColumn, string> {
  const n = (v: number | null) => (v === null ? '' : String(v));
  return {
    bPerp_T: String(o.bPerpTesla),
    tilt_deg: n(o.tiltDeg),
    valleyZeeman_meV: n(o.valleyZeemanMeV),
    kind: o.kind,
    value: String(o.value),
    sigma: n(o.sigma),
    pair: o.pair === null ? '' : o.pair.join('/'),
  };
}

/** Observations as CSV text (RFC 4180, LF line ends); the `pair` column only when one is set. */
export function observationsToCsv(rows: readonly Observation[]): string {
  const columns: ObservationColumn[] = [...OBSERVATION_COLUMNS];
  if (rows.some((o) => o.pair !== null)) columns.push(PAIR_COLUMN);
  const lines = [columns.join(',')];
  for (const o of rows) {
    const cells = observationCells(o);
    lines.push(columns.map((c) => csvText(cells[c])).join(','));
  }
  return `${lines.join('\n')}\n`;
}

/**
 * Observations as a scenario document holds them (`fourfold.observations.rows`): one object per
 * row keyed by the CSV's column names, numbers as numbers and empty cells as null.
 */
export function observationsToJson(rows: readonly Observation[]): Record<string, unknown>[] {
  return rows.map((o) => ({
    bPerp_T: o.bPerpTesla,
    tilt_deg: o.tiltDeg,
    valleyZeeman_meV: o.valleyZeemanMeV,
    kind: o.kind,
    value: o.value,
    sigma: o.sigma,
    ...(o.pair !== null ? { pair: o.pair.join('/') } : {}),
  }));
}

/** Observations from their JSON form (`observationsToJson`); ModelError naming row and column. */
export function observationsFromJson(json: unknown, field: string): Observation[] {
  if (!Array.isArray(json)) throw new ModelError(`${field}: expected a list of rows`);
  if (json.length > MAX_OBSERVATIONS) {
    throw new ModelError(`${field}: ${json.length} rows; at most ${MAX_OBSERVATIONS}`);
  }
  return json.map((row: unknown, k) => {
    const where = `${field} row ${k + 1}`;
    if (!isPlainObject(row)) throw new ModelError(`${where}: expected an object`);
    const cells: Partial<Record<ObservationColumn, string>> = {};
    for (const [key, value] of Object.entries(row)) {
      if (![...OBSERVATION_COLUMNS, PAIR_COLUMN].includes(key as ObservationColumn)) {
        throw new ModelError(`${where}: unknown column ${quoteInput(key, 16)}`);
      }
      if (value !== null && typeof value !== 'number' && typeof value !== 'string') {
        fail(where, key as ObservationColumn, 'expected a number, a text or null');
      }
      cells[key as ObservationColumn] = value === null ? '' : String(value);
    }
    return observationFromCells(cells, where);
  });
}
