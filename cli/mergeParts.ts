import { statSync } from 'node:fs';
import {
  ModelError,
  QUOTED_PATH_LENGTH,
  SOFTWARE_VERSION,
  PART_PIXELS_OPEN,
  errorLine,
  locateCrossings,
  quoteInput,
  readPartCrossing,
  readPartHeader,
  readPartRow,
  readPartSeam,
  seamEdges,
  type Crossing,
  type EdgeRow,
  type MapInput,
  type PartHeader,
} from '../solver/index';
import { CliError } from './cliError';
import { fileLines } from './lineReader';
import { shardPlace } from './mapRun';
import type { MapSink } from './mapSinks';

/** A part file and its first line. */
export interface PartFile {
  readonly path: string;
  readonly header: PartHeader;
}

function named(path: string): string {
  return quoteInput(path, QUOTED_PATH_LENGTH);
}

/** A problem of one part file, as one line naming it (exit code 1). */
function partError(path: string, message: string): CliError {
  return new CliError(`${named(path)}: ${message}`);
}

/** Reads a part's first line; refuses a file that is not a readable part. */
export function readPartFile(path: string): PartFile {
  let first: string | undefined;
  try {
    if (statSync(path).isDirectory()) throw partError(path, 'is a directory');
    const lines = fileLines(path);
    first = lines.next().value ?? undefined;
    lines.return(undefined);
  } catch (error) {
    if (error instanceof CliError) throw error;
    const code = (error as NodeJS.ErrnoException).code;
    throw partError(path, code === 'ENOENT' ? 'no such file' : `cannot read (${code ?? 'error'})`);
  }
  if (first === undefined) throw partError(path, 'empty (not a part of a Map)');
  try {
    return { path, header: readPartHeader(first.replace(/^\ufeff/, '')) };
  } catch (error) {
    throw partError(path, errorLine(error));
  }
}

/**
 * Puts parts in shard order after checking that they are every piece of one Map: the same
 * model, plane (and series value), version and number of shards, each shard once, none missing,
 * each covering the rows its shard number gives. Refuses with one line otherwise.
 */
export function orderParts(parts: readonly PartFile[]): PartFile[] {
  const first = parts[0]!;
  const [, n] = first.header.place.shard;
  for (const part of parts) {
    const { header } = part;
    if (header.version !== SOFTWARE_VERSION) {
      throw partError(
        part.path,
        `written by fourfold ${quoteInput(header.version)}; merge parts with the version that wrote them (this is ${SOFTWARE_VERSION})`,
      );
    }
    if (header.identity !== first.header.identity) {
      throw partError(
        part.path,
        `not a part of the same Map as ${named(first.path)} (another model, plane or series value)`,
      );
    }
    if (header.place.shard[1] !== n) {
      throw partError(
        part.path,
        `one of ${header.place.shard[1]} parts, while ${named(first.path)} is one of ${n}`,
      );
    }
  }
  const byShard = new Map<number, PartFile>();
  for (const part of parts) {
    const k = part.header.place.shard[0];
    const twin = byShard.get(k);
    if (twin !== undefined) {
      throw partError(part.path, `part ${k} of ${n} again (also ${named(twin.path)})`);
    }
    byShard.set(k, part);
  }
  const missing: number[] = [];
  for (let k = 1; k <= n; k++) if (!byShard.has(k)) missing.push(k);
  if (missing.length > 0) {
    const list = missing.length > 6 ? `${missing.slice(0, 6).join(', ')}, ...` : missing.join(', ');
    throw new CliError(
      `merge: ${missing.length === 1 ? 'part' : 'parts'} ${list} of ${n} ${missing.length === 1 ? 'is' : 'are'} missing (give all ${n} parts)`,
    );
  }
  const ordered = Array.from({ length: n }, (_, k) => byShard.get(k + 1)!);
  for (const part of ordered) {
    const { rows } = shardPlace(part.header.input, part.header.place.shard);
    const [j0, j1] = part.header.place.rows;
    if (rows[0] !== j0 || rows[1] !== j1) {
      throw partError(
        part.path,
        `rows ${j0} to ${j1 - 1} do not match part ${part.header.place.shard.join(' of ')}`,
      );
    }
  }
  return ordered;
}

/**
 * Streams one part into the sink: its pixel rows, then its seam rows and crossings, which it
 * returns. Refuses a part that is cut short or not laid out as `map --shard` writes it.
 */
function streamPart(
  part: PartFile,
  input: MapInput,
  sink: MapSink,
): { crossings: Crossing[]; first?: EdgeRow; last?: EdgeRow } {
  const [nx, ny] = input.plane.resolution;
  const [j0, j1] = part.header.place.rows;
  const lines = fileLines(part.path);
  let number = 0;
  const next = (): string => {
    const { value, done } = lines.next();
    number++;
    if (done) {
      throw partError(
        part.path,
        `incomplete: ends after line ${number - 1} (was its run stopped?)`,
      );
    }
    return value;
  };
  const expect = (text: string) => {
    if (next() !== text)
      throw partError(part.path, `line ${number}: expected ${JSON.stringify(text)}`);
  };
  try {
    next();
    expect(PART_PIXELS_OPEN.trimEnd());
    for (let j = j0; j < j1; j++) {
      const row = readPartRow(next(), nx);
      if (row.j0 !== j) throw new ModelError(`holds row ${row.j0} where row ${j} belongs`);
      sink.rows(row);
    }
    expect('],');
    expect('"seams":[');
    const seams: EdgeRow[] = [];
    for (let line = next(); line !== '],'; line = next()) seams.push(readPartSeam(line, nx));
    const wanted = [j0 > 0 ? j0 : -1, j1 < ny ? j1 - 1 : -1].filter((j) => j >= 0);
    if (seams.map((s) => s.j).join() !== wanted.join()) {
      throw new ModelError(
        `seam rows ${seams.map((s) => s.j).join(', ') || 'none'}, expected ${wanted.join(', ') || 'none'}`,
      );
    }
    expect('"crossings":[');
    const crossings: Crossing[] = [];
    for (let line = next(); line !== '],'; line = next()) crossings.push(readPartCrossing(line));
    expect('"complete":true}');
    return {
      crossings,
      first: j0 > 0 ? seams[0] : undefined,
      last: j1 < ny ? seams[seams.length - 1] : undefined,
    };
  } catch (error) {
    if (error instanceof CliError) throw error;
    throw partError(part.path, `line ${number}: ${errorLine(error)}`);
  } finally {
    lines.return(undefined);
  }
}

/**
 * Writes the whole Map from its parts (in shard order, see `orderParts`) into `sink`: the pixel
 * rows part after part, then every crossing: those the parts located and those on the edges
 * across each seam, located here from the seam rows' states exactly as the single run locates
 * them, so the file is the one `map` writes.
 */
export function mergeParts(parts: readonly PartFile[], sink: MapSink): void {
  const { input } = parts[0]!.header;
  const [nx] = input.plane.resolution;
  try {
    const crossings: Crossing[] = [];
    let above: EdgeRow | undefined;
    for (const part of parts) {
      const piece = streamPart(part, input, sink);
      if (above !== undefined) {
        const { edges, endFrames, endLabels } = seamEdges(above, piece.first!, nx);
        crossings.push(...locateCrossings(input, edges, endFrames, endLabels));
      }
      crossings.push(...piece.crossings);
      above = piece.last;
    }
    // Ascending by edge, as the single run lists them (a stable sort keeps an edge's own order).
    crossings.sort((a, b) => a.edge - b.edge);
    sink.finish({ crossings });
  } catch (error) {
    sink.abandon();
    throw error;
  }
}
