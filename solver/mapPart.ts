import type { Crossing } from './crossings';
import type { EdgeRow, MapRowBlock } from './mapBands';
import type { MapProvenance } from './mapExport';
import { ModelError, isPlainObject, modelToJson } from './model';
import { parseMapInput, type MapInput } from './plane';
import { MEAN_FIELD_CAUTION, SOFTWARE_VERSION } from './version';

/**
 * A part of a Map (`map --shard K/N`): one JSON document written a line at a time, so that a
 * part of any size is written and read back with little memory, each line a JSON value of its
 * own (README, "Large Maps, shards and series"):
 *
 *     {"fourfold":"map part","format":1,"shard":[K,N],"rows":[j0,j1],"model":...,"plane":...,
 *      "version":...,"caution":...,
 *     "pixels":[
 *     {"j":j0,"phase":[...],"energy":[...],"gap":[...],"order":[...]},     one line per row
 *     ...
 *     ],
 *     "seams":[
 *     {"j":j0,"phase":[...],"frames":[...]},                               first row, if j0 > 0
 *     {"j":j1-1,"phase":[...],"frames":[...]}                              last row, if j1 < ny
 *     ],
 *     "crossings":[
 *     {"edge":...,"x":...,"y":...,"near":...,"far":...,"order":...},       one line per crossing
 *     ...
 *     ],
 *     "complete":true}
 *
 * `order` holds the 15 order parameters of each pixel in turn. Numbers are written as
 * JSON.stringify writes them, which reads back to the same double; a value that is not finite
 * (JSON has no NaN) is written as the string "NaN", "Infinity" or "-Infinity". The seam rows'
 * frames (32 numbers per pixel) let `merge` locate the crossings on the edges between parts, so
 * that boundaries across a seam come out whole and every number equals the single run's.
 */

/** Marks a part file; `MAP_PART_FORMAT` its layout. */
export const MAP_PART_KIND = 'map part';
export const MAP_PART_FORMAT = 1;

/** Which piece of the Map a part holds: shard k of n, pixel rows [j0, j1). */
export interface PartPlace {
  readonly shard: readonly [number, number];
  readonly rows: readonly [number, number];
}

/** The first line of a part: what it belongs to (the Map) and where it sits. */
export function partHeader(
  input: MapInput,
  place: PartPlace,
  provenance: MapProvenance = {},
): string {
  return (
    `{"fourfold":${JSON.stringify(MAP_PART_KIND)},"format":${MAP_PART_FORMAT}` +
    `,"shard":${JSON.stringify(place.shard)},"rows":${JSON.stringify(place.rows)}` +
    partIdentity(input, provenance) +
    `,"version":${JSON.stringify(SOFTWARE_VERSION)},"caution":${JSON.stringify(MEAN_FIELD_CAUTION)},\n`
  );
}

/** The fields that parts of one Map share: the model, the plane and the series value. */
function partIdentity(input: MapInput, provenance: MapProvenance): string {
  return (
    `,"model":${JSON.stringify(modelToJson(input.model))},"plane":${JSON.stringify(input.plane)}` +
    (provenance.series === undefined ? '' : `,"series":${JSON.stringify(provenance.series)}`)
  );
}

/** Numbers as JSON, with values JSON cannot hold as strings. */
function partNumbers(values: ArrayLike<number>): string {
  const out = Array.from(values) as (number | string)[];
  for (let k = 0; k < out.length; k++) {
    if (!Number.isFinite(out[k] as number)) out[k] = String(out[k]);
  }
  return JSON.stringify(out);
}

/** Reads numbers written by `partNumbers`. */
function readNumbers(value: unknown, length: number, what: string): Float64Array {
  if (!Array.isArray(value) || value.length !== length) {
    throw new ModelError(`${what}: expected ${length} numbers`);
  }
  const out = new Float64Array(length);
  for (let k = 0; k < length; k++) {
    const v = value[k] as unknown;
    if (typeof v === 'number') out[k] = v;
    else if (v === 'NaN' || v === 'Infinity' || v === '-Infinity') out[k] = Number(v);
    else throw new ModelError(`${what}: entry ${k} is not a number`);
  }
  return out;
}

function readLabels(value: unknown, length: number, what: string): string[] {
  if (
    !Array.isArray(value) ||
    value.length !== length ||
    !value.every((v) => typeof v === 'string')
  ) {
    throw new ModelError(`${what}: expected ${length} labels`);
  }
  return value as string[];
}

/** The opening of the pixel rows, after the header. */
export const PART_PIXELS_OPEN = '"pixels":[\n';

/** The lines of the finished pixel rows of a block, each a JSON object of one row. */
export function* partRowLines(block: MapRowBlock, nx: number, last: number): Generator<string> {
  for (let r = 0; r < block.rows; r++) {
    const j = block.j0 + r;
    const n = r * nx;
    yield (
      `{"j":${j},"phase":${JSON.stringify(block.labels.slice(n, n + nx))}` +
      `,"energy":${partNumbers(block.energy.subarray(n, n + nx))}` +
      `,"gap":${partNumbers(block.gap.subarray(n, n + nx))}` +
      `,"order":${partNumbers(block.order.subarray(15 * n, 15 * (n + nx)))}}` +
      (j === last ? '\n' : ',\n')
    );
  }
}

/** The seam rows, then the crossings, then the end: everything after the pixel rows. */
export function* partEndLines(
  seams: readonly EdgeRow[],
  crossings: readonly Crossing[],
): Generator<string> {
  yield '],\n"seams":[\n';
  for (let k = 0; k < seams.length; k++) {
    const s = seams[k]!;
    yield (
      `{"j":${s.j},"phase":${JSON.stringify(s.labels)},"frames":${partNumbers(s.frames)}}` +
      (k + 1 < seams.length ? ',\n' : '\n')
    );
  }
  yield '],\n"crossings":[\n';
  for (let k = 0; k < crossings.length; k++) {
    const c = crossings[k]!;
    const line = JSON.stringify({
      edge: c.edge,
      x: c.x,
      y: c.y,
      near: c.near,
      far: c.far,
      order: c.order,
    });
    yield line + (k + 1 < crossings.length ? ',\n' : '\n');
  }
  yield '],\n"complete":true}\n';
}

/** A part's first line, read back. */
export interface PartHeader {
  readonly input: MapInput;
  readonly place: PartPlace;
  /** The model, plane and series value as written: parts of one Map have the same. */
  readonly identity: string;
  readonly series?: Readonly<Record<string, unknown>>;
  readonly version: string;
}

function isIntegerPair(value: unknown): value is [number, number] {
  return Array.isArray(value) && value.length === 2 && value.every((v) => Number.isInteger(v));
}

/**
 * Reads a part's first line. Throws a one-line ModelError naming what is wrong; a file that is
 * not a part at all says so.
 */
export function readPartHeader(line: string): PartHeader {
  let json: unknown;
  try {
    json = JSON.parse(line.endsWith(',') ? `${line.slice(0, -1)}}` : line);
  } catch {
    json = undefined;
  }
  if (!isPlainObject(json) || json.fourfold !== MAP_PART_KIND) {
    throw new ModelError('not a part of a Map (map --shard K/N writes those)');
  }
  if (json.format !== MAP_PART_FORMAT) {
    throw new ModelError(
      `part format ${String(json.format)}; this version reads format ${MAP_PART_FORMAT}`,
    );
  }
  if (typeof json.version !== 'string') throw new ModelError('version: missing');
  const { shard, rows } = json;
  if (!isIntegerPair(shard) || shard[0] < 1 || shard[0] > shard[1]) {
    throw new ModelError('shard: expected [K, N] with 1 <= K <= N');
  }
  if (!isIntegerPair(rows) || rows[0] < 0 || rows[1] <= rows[0]) {
    throw new ModelError('rows: expected [first, end] pixel rows');
  }
  if (!isPlainObject(json.model)) throw new ModelError('model: missing');
  if (json.series !== undefined && !isPlainObject(json.series)) {
    throw new ModelError('series: expected an object');
  }
  const input = parseMapInput({ ...json.model, plane: json.plane });
  const series = json.series as Readonly<Record<string, unknown>> | undefined;
  return {
    input,
    place: { shard, rows },
    identity: partIdentity(input, { series }),
    series,
    version: json.version,
  };
}

/** A pixel row line, read back (`nx` pixels). */
export function readPartRow(line: string, nx: number): MapRowBlock {
  const json = parseLine(line, 'a pixel row');
  if (!Number.isInteger(json.j)) throw new ModelError('a pixel row without its row number j');
  const what = `row ${String(json.j)}`;
  return {
    j0: json.j as number,
    rows: 1,
    labels: readLabels(json.phase, nx, `${what} phase`),
    energy: readNumbers(json.energy, nx, `${what} energy`),
    gap: readNumbers(json.gap, nx, `${what} gap`),
    order: readNumbers(json.order, 15 * nx, `${what} order`),
  };
}

/** A seam row line, read back. */
export function readPartSeam(line: string, nx: number): EdgeRow {
  const json = parseLine(line, 'a seam row');
  if (!Number.isInteger(json.j)) throw new ModelError('a seam row without its row number j');
  const what = `seam row ${String(json.j)}`;
  return {
    j: json.j as number,
    labels: readLabels(json.phase, nx, `${what} phase`),
    frames: readNumbers(json.frames, 32 * nx, `${what} frames`),
  };
}

/** A crossing line, read back. */
export function readPartCrossing(line: string): Crossing {
  const c = parseLine(line, 'a crossing');
  if (
    !Number.isInteger(c.edge) ||
    typeof c.x !== 'number' ||
    typeof c.y !== 'number' ||
    typeof c.near !== 'string' ||
    typeof c.far !== 'string' ||
    (c.order !== 'first' && c.order !== 'continuous')
  ) {
    throw new ModelError('a crossing: expected edge, x, y, near, far and order');
  }
  return {
    edge: c.edge as number,
    x: c.x,
    y: c.y,
    near: c.near,
    far: c.far,
    order: c.order,
  };
}

/** One line of a part as a JSON object (without the separator that follows it). */
function parseLine(line: string, what: string): Record<string, unknown> {
  const text = line.endsWith(',') ? line.slice(0, -1) : line;
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    json = undefined;
  }
  if (!isPlainObject(json)) throw new ModelError(`${what}: not a JSON object`);
  return json;
}
