import type { Boundary } from './boundaries';
import { CHANNELS } from './channels';
import { csvComment, csvText } from './csvText';
import { modelToJson } from './model';
import { TOKEN_MEANINGS } from './phaseLabel';
import type { PhaseMap } from './mapGrid';
import { axisValue, type MapInput } from './plane';
import { MEAN_FIELD_CAUTION, SOFTWARE_VERSION } from './version';

/** A legend entry: a label, its pixel count and what its tokens mean. */
export interface LegendEntry {
  readonly label: string;
  readonly pixels: number;
  readonly meaning: string;
}

/** Legend entries from pixel counts per label: most pixels first, ties by label. */
export function legendOfCounts(counts: ReadonlyMap<string, number>): LegendEntry[] {
  return [...counts.entries()]
    .sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1))
    .map(([label, pixels]) => ({
      label,
      pixels,
      meaning: label
        .split('+')
        .map((t) => TOKEN_MEANINGS[t] ?? t)
        .join('; '),
    }));
}

/** Meaning of every token that occurs in the labels, for legends. */
export function legendOf(labels: readonly string[]): LegendEntry[] {
  return legendOfCounts(labelCounts(labels));
}

/** Pixels per label. */
export function labelCounts(labels: readonly string[]): Map<string, number> {
  const counts = new Map<string, number>();
  for (const l of labels) counts.set(l, (counts.get(l) ?? 0) + 1);
  return counts;
}

/**
 * Where a Map's numbers are read from a grid row at a time: a `PhaseMap` in memory
 * (`phaseMapRows`) or a file. Quantity 0 is the energy, 1 the gap, 2 + k order parameter k
 * (CHANNELS order).
 */
export interface MapRows {
  readonly input: MapInput;
  labelRow(j: number): readonly string[];
  valueRow(quantity: number, j: number): ArrayLike<number>;
  /** Pixels per label over the whole grid. */
  readonly counts: ReadonlyMap<string, number>;
  readonly boundaries: readonly Boundary[];
}

/** Quantities per pixel in `MapRows.valueRow`: energy, gap and the 15 order parameters. */
export const MAP_QUANTITIES = 2 + CHANNELS.length;

/** A Map in memory, read a row at a time. */
export function phaseMapRows(map: PhaseMap): MapRows {
  const [nx] = map.input.plane.resolution;
  return {
    input: map.input,
    labelRow: (j) => map.labels.slice(j * nx, (j + 1) * nx),
    valueRow: (quantity, j) => {
      if (quantity === 0) return map.energy.subarray(j * nx, (j + 1) * nx);
      if (quantity === 1) return map.gap.subarray(j * nx, (j + 1) * nx);
      const row = new Float64Array(nx);
      for (let i = 0; i < nx; i++) row[i] = map.order[15 * (j * nx + i) + quantity - 2]!;
      return row;
    },
    counts: labelCounts(map.labels),
    boundaries: map.boundaries,
  };
}

/**
 * What a file says about where its Map comes from besides the model, plane, version and caution:
 * the value of a series (`series`), written after the plane.
 */
export interface MapProvenance {
  readonly series?: Readonly<Record<string, unknown>>;
}

/** The grid coordinates (cell centres) of an axis. */
function axisValues(input: MapInput, which: 'x' | 'y'): number[] {
  const n = input.plane.resolution[which === 'x' ? 0 : 1];
  return Array.from({ length: n }, (_, i) => axisValue(input.plane[which], n, i));
}

function rows(
  values: ArrayLike<number>,
  nx: number,
  ny: number,
  stride = 1,
  offset = 0,
): number[][] {
  const out: number[][] = [];
  for (let j = 0; j < ny; j++) {
    const row: number[] = new Array<number>(nx);
    for (let i = 0; i < nx; i++) row[i] = values[(j * nx + i) * stride + offset]!;
    out.push(row);
  }
  return out;
}

/**
 * The `map` output document (README, Command line): grid coordinates, row-major labels
 * (`phase[j][i]` at (x[i], y[j])), energies, gaps, the 15 order parameters, refined boundaries,
 * plus the model, the plane, the version and the mean-field caution.
 */
export function mapToJson(map: PhaseMap, provenance: MapProvenance = {}): Record<string, unknown> {
  const [nx, ny] = map.input.plane.resolution;
  const order: Record<string, number[][]> = {};
  CHANNELS.forEach((name, k) => (order[name] = rows(map.order, nx, ny, 15, k)));
  const phase: string[][] = [];
  for (let j = 0; j < ny; j++) phase.push(map.labels.slice(j * nx, (j + 1) * nx));
  return {
    x: Array.from(map.x),
    y: Array.from(map.y),
    phase,
    energy: rows(map.energy, nx, ny),
    gap: rows(map.gap, nx, ny),
    order,
    boundaries: map.boundaries,
    phases: legendOf(map.labels),
    model: modelToJson(map.input.model),
    plane: map.input.plane,
    ...(provenance.series === undefined ? {} : { series: provenance.series }),
    version: SOFTWARE_VERSION,
    caution: MEAN_FIELD_CAUTION,
  };
}

/** A JSON array written one element at a time. */
function* jsonArray(count: number, element: (k: number) => string): Generator<string> {
  yield '[';
  for (let k = 0; k < count; k++) yield k === 0 ? element(k) : `,${element(k)}`;
  yield ']';
}

/** A row of numbers as JSON.stringify writes a number[] (non-finite values as null). */
function jsonNumbers(values: ArrayLike<number>): string {
  return JSON.stringify(Array.from(values));
}

/**
 * The end of a Map's JSON document after its boundaries: the legend, the model, the plane, what
 * else it comes from, the version and the caution.
 */
export function mapJsonEnding(
  input: MapInput,
  counts: ReadonlyMap<string, number>,
  provenance: MapProvenance = {},
): string {
  return (
    `,"phases":${JSON.stringify(legendOfCounts(counts))}` + mapJsonProvenance(input, provenance)
  );
}

/** The last fields of a Map's JSON document: model, plane, series value, version and caution. */
export function mapJsonProvenance(input: MapInput, provenance: MapProvenance = {}): string {
  return (
    `,"model":${JSON.stringify(modelToJson(input.model))}` +
    `,"plane":${JSON.stringify(input.plane)}` +
    (provenance.series === undefined ? '' : `,"series":${JSON.stringify(provenance.series)}`) +
    `,"version":${JSON.stringify(SOFTWARE_VERSION)}` +
    `,"caution":${JSON.stringify(MEAN_FIELD_CAUTION)}}`
  );
}

/**
 * The `map` document as JSON text from a Map read row by row, in pieces of at most one grid row
 * or one boundary each, so that a file of any grid size (2048 x 2048 gives some 1.5 GB) is
 * written with little memory: joined, the pieces of an in-memory Map are exactly
 * `JSON.stringify(mapToJson(map))`.
 */
export function* mapRowsJsonPieces(
  map: MapRows,
  provenance: MapProvenance = {},
): Generator<string> {
  const [, ny] = map.input.plane.resolution;
  yield `{"x":${JSON.stringify(axisValues(map.input, 'x'))},"y":${JSON.stringify(axisValues(map.input, 'y'))}`;
  yield ',"phase":';
  yield* jsonArray(ny, (j) => JSON.stringify(map.labelRow(j)));
  yield ',"energy":';
  yield* jsonArray(ny, (j) => jsonNumbers(map.valueRow(0, j)));
  yield ',"gap":';
  yield* jsonArray(ny, (j) => jsonNumbers(map.valueRow(1, j)));
  yield ',"order":{';
  for (let k = 0; k < CHANNELS.length; k++) {
    yield `${k === 0 ? '' : ','}${JSON.stringify(CHANNELS[k])}:`;
    yield* jsonArray(ny, (j) => jsonNumbers(map.valueRow(2 + k, j)));
  }
  yield '},"boundaries":';
  yield* jsonArray(map.boundaries.length, (k) => JSON.stringify(map.boundaries[k]));
  yield mapJsonEnding(map.input, map.counts, provenance);
}

/** `mapRowsJsonPieces` of a Map in memory. */
export function mapJsonPieces(map: PhaseMap, provenance: MapProvenance = {}): Generator<string> {
  return mapRowsJsonPieces(phaseMapRows(map), provenance);
}

/**
 * The `#` lines (the caution; version and model; plane; a series map's value) and the header
 * above a Map's CSV rows.
 */
export function mapCsvHead(input: MapInput, provenance: MapProvenance = {}): string {
  const xName = csvText(input.plane.x.label || 'x');
  const yName = csvText(input.plane.y.label || 'y');
  return (
    `${csvComment(MEAN_FIELD_CAUTION)}\n` +
    `${csvComment(`fourfold ${SOFTWARE_VERSION}; model ${JSON.stringify(modelToJson(input.model))}`)}\n` +
    `${csvComment(`plane ${JSON.stringify(input.plane)}`)}\n` +
    (provenance.series === undefined
      ? ''
      : `${csvComment(`series ${JSON.stringify(provenance.series)}`)}\n`) +
    `${[xName, yName, 'phase', 'energy', 'gap', ...CHANNELS].join(',')}\n`
  );
}

/**
 * The CSV lines of grid row j, one piece per line: coordinates, label, energy, gap and the 15
 * order parameters of each point. `quantities[q]` is `valueRow(q, j)`.
 */
export function* mapCsvRow(
  input: MapInput,
  j: number,
  labels: readonly string[],
  quantities: readonly ArrayLike<number>[],
): Generator<string> {
  const [nx, ny] = input.plane.resolution;
  const y = axisValue(input.plane.y, ny, j);
  const cells = new Array<number | string>(2 + 3 + CHANNELS.length);
  cells[1] = y;
  for (let i = 0; i < nx; i++) {
    cells[0] = axisValue(input.plane.x, nx, i);
    cells[2] = csvText(labels[i]!);
    cells[3] = quantities[0]![i]!;
    cells[4] = quantities[1]![i]!;
    for (let k = 0; k < CHANNELS.length; k++) cells[5 + k] = String(quantities[2 + k]![i]!);
    yield `${cells.join(',')}\n`;
  }
}

/**
 * One row per grid point: coordinates, label, energy, gap and the 15 order parameters, under the
 * caution, the model and the plane as `#` lines and a header; one piece per line. Text cells
 * (the axis names, the labels) are written by `csvText`; numbers as they are.
 */
export function* mapRowsCsvPieces(map: MapRows): Generator<string> {
  const [, ny] = map.input.plane.resolution;
  yield mapCsvHead(map.input);
  for (let j = 0; j < ny; j++) {
    const quantities = Array.from({ length: MAP_QUANTITIES }, (_, q) => map.valueRow(q, j));
    yield* mapCsvRow(map.input, j, map.labelRow(j), quantities);
  }
}

/** `mapRowsCsvPieces` of a Map in memory. */
export function mapCsvPieces(map: PhaseMap): Generator<string> {
  return mapRowsCsvPieces(phaseMapRows(map));
}

/** The Map's CSV (`mapCsvPieces`) as one string, for maps small enough to hold as one. */
export function mapToCsv(map: PhaseMap): string {
  return [...mapCsvPieces(map)].join('');
}
