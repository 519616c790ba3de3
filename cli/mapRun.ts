import {
  cellRowCount,
  cellRowPixels,
  computeMapRows,
  shardCellRows,
  type MapInput,
  type MapStages,
} from '../solver/index';
import { CliError } from './cliError';
import type { MapSink } from './mapSinks';

/** Worker threads (or a stand-in) to run the Map's stages on. */
export interface StageRunner {
  readonly stages: MapStages;
  readonly size: number;
}

/** Shard `k` of `n`, as `--shard K/N` gives it. */
export type Shard = readonly [number, number];

/** Reads `--shard K/N` (1 <= K <= N <= 1000). */
export function parseShard(text: string, quote: (text: string) => string): Shard {
  const match = /^(\d+)\/(\d+)$/.exec(text.trim());
  const k = match ? Number(match[1]) : NaN;
  const n = match ? Number(match[2]) : NaN;
  if (!(k >= 1 && k <= n && n <= 1000)) {
    throw new CliError(
      `--shard: expected K/N with 1 <= K <= N <= 1000 (piece K of N, counted from 1), got ${quote(text)}`,
      2,
    );
  }
  return [k, n];
}

/** Pixel rows and rows of coarse cells of a shard; refuses more shards than cell rows. */
export function shardPlace(
  input: MapInput,
  [k, n]: Shard,
): { cellRows: [number, number]; rows: [number, number] } {
  const count = cellRowCount(input);
  if (n > count) {
    const [nx, ny] = input.plane.resolution;
    throw new CliError(
      count === 1
        ? `--shard ${k}/${n}: a ${nx} x ${ny} map has 1 row of coarse cells to share out; use 1 shard`
        : `--shard ${k}/${n}: a ${nx} x ${ny} map has ${count} rows of coarse cells to share out; use at most ${count} shards`,
      2,
    );
  }
  const cellRows = shardCellRows(input, k, n);
  return { cellRows, rows: cellRowPixels(input, cellRows) };
}

/**
 * Computes the rows of coarse cells `cellRows` (default all) into `sink`, band after band; the
 * sink's file gets its name only when everything is in it.
 */
export async function runMapRows(
  input: MapInput,
  runner: StageRunner,
  sink: MapSink,
  cellRows?: readonly [number, number],
): Promise<void> {
  try {
    const end = await computeMapRows(input, runner.stages, {
      parts: runner.size,
      cellRows,
      onRows: (block) => sink.rows(block),
    });
    sink.finish(end);
  } catch (error) {
    sink.abandon();
    throw error;
  }
}
