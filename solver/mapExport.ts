import { CHANNELS } from './channels';
import { csvComment, csvText } from './csvText';
import { modelToJson } from './model';
import { TOKEN_MEANINGS } from './phaseLabel';
import type { PhaseMap } from './mapGrid';
import { MEAN_FIELD_CAUTION, SOFTWARE_VERSION } from './version';

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

/** Meaning of every token that occurs in the labels, for legends. */
export function legendOf(
  labels: readonly string[],
): { label: string; pixels: number; meaning: string }[] {
  const counts = new Map<string, number>();
  for (const l of labels) counts.set(l, (counts.get(l) ?? 0) + 1);
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

/**
 * The `map` output document (README, Command line): grid coordinates, row-major labels
 * (`phase[j][i]` at (x[i], y[j])), energies, gaps, the 15 order parameters, refined boundaries,
 * plus the model, the plane, the version and the mean-field caution.
 */
export function mapToJson(map: PhaseMap): Record<string, unknown> {
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
    version: SOFTWARE_VERSION,
    caution: MEAN_FIELD_CAUTION,
  };
}

/** One grid row of `values` (row j, every `stride`-th value from `offset`) as a JSON array. */
function jsonRow(values: ArrayLike<number>, nx: number, j: number, stride = 1, offset = 0): string {
  const row: number[] = new Array<number>(nx);
  for (let i = 0; i < nx; i++) row[i] = values[(j * nx + i) * stride + offset]!;
  return JSON.stringify(row);
}

/** A JSON array written one element at a time. */
function* jsonArray(count: number, element: (k: number) => string): Generator<string> {
  yield '[';
  for (let k = 0; k < count; k++) yield k === 0 ? element(k) : `,${element(k)}`;
  yield ']';
}

/**
 * The `map` document of `mapToJson` as JSON text, in pieces of at most one grid row or one
 * boundary each, so that a file of any grid size (2048 x 2048 gives some 600 MB) is written with
 * little memory beyond the map itself: joined, the pieces are exactly
 * `JSON.stringify(mapToJson(map))`.
 */
export function* mapJsonPieces(map: PhaseMap): Generator<string> {
  const [nx, ny] = map.input.plane.resolution;
  const grid = (values: ArrayLike<number>, stride = 1, offset = 0) =>
    jsonArray(ny, (j) => jsonRow(values, nx, j, stride, offset));
  yield `{"x":${JSON.stringify(Array.from(map.x))},"y":${JSON.stringify(Array.from(map.y))}`;
  yield ',"phase":';
  yield* jsonArray(ny, (j) => JSON.stringify(map.labels.slice(j * nx, (j + 1) * nx)));
  yield ',"energy":';
  yield* grid(map.energy);
  yield ',"gap":';
  yield* grid(map.gap);
  yield ',"order":{';
  for (let k = 0; k < CHANNELS.length; k++) {
    yield `${k === 0 ? '' : ','}${JSON.stringify(CHANNELS[k])}:`;
    yield* grid(map.order, 15, k);
  }
  yield '},"boundaries":';
  yield* jsonArray(map.boundaries.length, (k) => JSON.stringify(map.boundaries[k]));
  yield (
    `,"phases":${JSON.stringify(legendOf(map.labels))}` +
    `,"model":${JSON.stringify(modelToJson(map.input.model))}` +
    `,"plane":${JSON.stringify(map.input.plane)}` +
    `,"version":${JSON.stringify(SOFTWARE_VERSION)}` +
    `,"caution":${JSON.stringify(MEAN_FIELD_CAUTION)}}`
  );
}

/**
 * One row per grid point: coordinates, label, energy, gap and the 15 order parameters, under the
 * caution and the model as `#` lines and a header; one piece per line. Text cells (the axis
 * names, the labels) are written by `csvText`; numbers as they are.
 */
export function* mapCsvPieces(map: PhaseMap): Generator<string> {
  const [nx, ny] = map.input.plane.resolution;
  const xName = csvText(map.input.plane.x.label || 'x');
  const yName = csvText(map.input.plane.y.label || 'y');
  yield `${csvComment(MEAN_FIELD_CAUTION)}\n`;
  yield `${csvComment(`fourfold ${SOFTWARE_VERSION}; model ${JSON.stringify(modelToJson(map.input.model))}`)}\n`;
  yield `${[xName, yName, 'phase', 'energy', 'gap', ...CHANNELS].join(',')}\n`;
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const p = j * nx + i;
      const order = Array.from(map.order.subarray(15 * p, 15 * p + 15), (v) => String(v));
      yield `${[map.x[i], map.y[j], csvText(map.labels[p]!), map.energy[p], map.gap[p], ...order].join(',')}\n`;
    }
  }
}

/** The Map's CSV (`mapCsvPieces`) as one string, for maps small enough to hold as one. */
export function mapToCsv(map: PhaseMap): string {
  return [...mapCsvPieces(map)].join('');
}
