import {
  MEAN_FIELD_CAUTION,
  ORDER_GROUPS,
  SOFTWARE_VERSION,
  csvComment,
  csvText,
  type Competitor,
  type ProbeReport,
} from '../../solver/index';
import type { Pin } from '../store/probeSlice';

/**
 * The nearest competitor of a Probe: the lowest state of another family than the ground state's
 * (its height above the ground state says how close the transition is), or null when the search
 * met none.
 */
export function nearestCompetitor(report: ProbeReport): Competitor | null {
  return report.competitors.find((_, k) => k > 0) ?? null;
}

/** One quantity compared across the pins. */
export interface ComparisonRow {
  readonly key: string;
  /** Plain-text name ('energy per flux quantum', 'Neel in plane (CAF)'). */
  readonly name: string;
  /** Unit ('' for none, 'deg'). */
  readonly unit: string;
  /** Decimals shown (the export keeps every digit). */
  readonly digits: number;
  /** The value for one pin: a label, a number, or null where it means nothing. */
  readonly value: (report: ProbeReport) => string | number | null;
}

const DEGREES = 180 / Math.PI;

/**
 * What the comparison lists for each pin, in order: the phase, energy, gap, every
 * order-parameter group (public/notes.html#order-parameters), the canting angle, the Goldstone
 * count and the height of the nearest competitor.
 */
export const COMPARISON_ROWS: readonly ComparisonRow[] = [
  { key: 'phase', name: 'phase', unit: '', digits: 0, value: (r) => r.state.phase },
  {
    key: 'energy',
    name: 'energy per flux quantum',
    unit: '',
    digits: 6,
    value: (r) => r.state.energy,
  },
  { key: 'gap', name: 'quasiparticle gap', unit: '', digits: 6, value: (r) => r.state.gap },
  ...ORDER_GROUPS.map((g): ComparisonRow => ({
    key: `group-${g.key}`,
    name: `${g.title} (${g.token})`,
    unit: '',
    digits: 4,
    value: (r) => r.state.groups[g.key] ?? null,
  })),
  {
    key: 'canting',
    name: 'canting angle theta_c',
    unit: 'deg',
    digits: 2,
    value: (r) => (r.state.angles.canting === null ? null : r.state.angles.canting * DEGREES),
  },
  {
    key: 'goldstone',
    name: 'Goldstone modes',
    unit: '',
    digits: 0,
    value: (r) => r.modes.goldstone,
  },
  {
    key: 'competitor',
    name: 'nearest competitor, height above the ground state',
    unit: '',
    digits: 6,
    value: (r) => nearestCompetitor(r)?.above ?? null,
  },
];

/** The difference of one row's value from the reference pin's: a number, 'same'/'differs' for labels, or null. */
export function rowDifference(
  value: string | number | null,
  reference: string | number | null,
): string | number | null {
  if (value === null || reference === null) return null;
  if (typeof value === 'number' && typeof reference === 'number') return value - reference;
  return value === reference ? 'same' : 'differs';
}

/** The pins compared: each with its Probe (null while it is being solved or failed). */
export interface ComparedPin {
  readonly pin: Pin;
  readonly report: ProbeReport | null;
}

/** The reference of the differences: the chosen pin if it is one of them, else the first. */
export function referencePin(
  pins: readonly ComparedPin[],
  chosen: number | null,
): ComparedPin | null {
  return pins.find((p) => p.pin.id === chosen) ?? pins[0] ?? null;
}

/**
 * The comparison as plain data, for the Probe's JSON: each row's value for every pin and its
 * difference from the reference pin (the reference's own difference is null).
 */
export function comparisonDocument(pins: readonly ComparedPin[], chosen: number | null) {
  const reference = referencePin(pins, chosen);
  const refReport = reference?.report ?? null;
  return {
    reference: reference?.pin.id ?? null,
    pins: pins.map(({ pin, report }) => ({
      id: pin.id,
      x: pin.x,
      y: pin.y,
      solved: report !== null,
    })),
    rows: COMPARISON_ROWS.map((row) => {
      const refValue = refReport === null ? null : row.value(refReport);
      return {
        key: row.key,
        name: row.name,
        unit: row.unit,
        values: pins.map(({ report }) => (report === null ? null : row.value(report))),
        differences: pins.map(({ pin, report }) =>
          report === null || pin.id === reference?.pin.id
            ? null
            : rowDifference(row.value(report), refValue),
        ),
      };
    }),
  };
}

/** The comparison as a JSON file of its own: the document with the version and the caution. */
export function comparisonJson(pins: readonly ComparedPin[], chosen: number | null): string {
  const document = {
    format: 'fourfold-pin-comparison',
    version: SOFTWARE_VERSION,
    caution: MEAN_FIELD_CAUTION,
    ...comparisonDocument(pins, chosen),
  };
  return `${JSON.stringify(document, null, 2)}\n`;
}

/**
 * The comparison as CSV (RFC 4180, text cells through `csvText`): one row per quantity, a value
 * column per pin and, for every pin but the reference, a difference column; the caution, the
 * version and each pin's point as `#` lines above the header.
 */
export function comparisonCsv(pins: readonly ComparedPin[], chosen: number | null): string {
  const doc = comparisonDocument(pins, chosen);
  const others = doc.pins.filter((p) => p.id !== doc.reference);
  const header = [
    'quantity',
    'unit',
    ...doc.pins.map((p) => `pin ${p.id}`),
    ...others.map((p) => `pin ${p.id} - pin ${doc.reference}`),
  ];
  const cell = (v: string | number | null) =>
    v === null ? '' : typeof v === 'number' ? String(v) : csvText(v);
  const lines = [
    csvComment(MEAN_FIELD_CAUTION),
    csvComment(
      `fourfold ${SOFTWARE_VERSION}; pins compared, differences against pin ${doc.reference}`,
    ),
    ...doc.pins.map((p) => csvComment(`pin ${p.id} at x = ${p.x}, y = ${p.y}`)),
    header.map(csvText).join(','),
    ...doc.rows.map((row) =>
      [
        csvText(row.key),
        csvText(row.unit),
        ...row.values.map(cell),
        ...doc.pins
          .map((p, k) => (p.id === doc.reference ? undefined : row.differences[k]!))
          .filter((v) => v !== undefined)
          .map((v) => cell(v as string | number | null)),
      ].join(','),
    ),
  ];
  return lines.join('\n') + '\n';
}
