import { mkdirSync, readdirSync, statSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import {
  ModelError,
  QUOTED_PATH_LENGTH,
  checkSeriesQuantity,
  errorLine,
  mapJsonProvenance,
  parseMapInput,
  parseSeriesQuantity,
  parseSeriesValues,
  partHeader,
  quoteInput,
  seriesDocument,
  seriesProvenance,
  seriesQuantityLabel,
  seriesQuantityName,
  wholeMapProblem,
  type MapInput,
  type MapProvenance,
} from '../solver/index';
import type { MapFigureOptions, FigureMap } from '../app/figure/mapFigure';
import { CliError } from './cliError';
import { fileFramedBy, readMapOutline } from './mapFileOutline';
import { runMapRows, shardPlace, type Shard, type StageRunner } from './mapRun';
import { mapFileSink, partSink } from './mapSinks';
import { mergeParts, orderParts, readPartFile } from './mergeParts';
import { writeWholeFile } from './outputFile';

export interface SeriesOptions {
  readonly vary: string;
  readonly values: string;
  /** A folder (maps as map-01.json, ... and the figure series.svg) or FIGURE.svg. */
  readonly out: string;
  readonly shard?: Shard;
  readonly column?: 'single' | 'double';
  readonly title?: string;
  /** Starts the worker threads (only when a map is to be computed). */
  readonly runner: () => Promise<StageRunner & { close(): Promise<void> }>;
  readonly figureDrawer: () => Promise<(map: FigureMap, options: MapFigureOptions) => string>;
}

/** One map of a series: its input, its file and what the file says about it. */
interface SeriesMap {
  readonly value: number;
  readonly input: MapInput;
  readonly provenance: MapProvenance;
  readonly path: string;
}

/** Where a series writes: the figure and each map's JSON (beside the figure, numbered). */
function seriesFiles(
  out: string,
  count: number,
): { figure: string; dir: string; map: (k: number) => string } {
  const digits = String(count).length < 2 ? 2 : String(count).length;
  const number = (k: number) => String(k + 1).padStart(digits, '0');
  if (/\.svg$/i.test(out)) {
    const dir = dirname(out);
    const stem = basename(out).replace(/\.svg$/i, '');
    return { figure: out, dir, map: (k) => join(dir, `${stem}-${number(k)}.json`) };
  }
  return {
    figure: join(out, 'series.svg'),
    dir: out,
    map: (k) => join(out, `map-${number(k)}.json`),
  };
}

/** The part file of shard K/N of a series map. */
function partPath(mapPath: string, [k, n]: Shard): string {
  return mapPath.replace(/\.json$/, `.part-${k}-of-${n}.json`);
}

/** Whether a part file is whole and holds shard `shard` of this map. */
function partIsDone(map: SeriesMap, shard: Shard): boolean {
  const path = partPath(map.path, shard);
  const header = partHeader(
    map.input,
    { shard, rows: shardPlace(map.input, shard).rows },
    map.provenance,
  );
  return fileFramedBy(path, header, '"complete":true}\n');
}

/** Whether the map's JSON is whole and of this map (model, plane, value, version). */
function mapIsDone(map: SeriesMap): boolean {
  return fileFramedBy(map.path, '{"x":[', mapJsonProvenance(map.input, map.provenance));
}

/** Shard counts N for which the folder holds parts of this map (finished or not). */
function partCounts(map: SeriesMap): number[] {
  const stem = basename(map.path).replace(/\.json$/, '');
  const pattern = new RegExp(
    `^${stem.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\.part-(\\d+)-of-(\\d+)\\.json$`,
  );
  const counts = new Set<number>();
  for (const name of readdirSync(dirname(map.path))) {
    const match = pattern.exec(name);
    if (match) counts.add(Number(match[2]));
  }
  return [...counts].sort((a, b) => a - b);
}

/**
 * `series`: one Map per value of the varied quantity. Without --shard each map's JSON is written
 * (a map whose file is already whole and of the same map is kept; parts of it left by sharded
 * runs are completed and merged), then the figure of small multiples. With --shard K/N, piece K
 * of every map is written beside its map (`map-01.part-K-of-N.json`); finished pieces are kept.
 */
export async function runSeries(json: unknown, options: SeriesOptions): Promise<void> {
  let quantity;
  let values: number[];
  try {
    quantity = parseSeriesQuantity(options.vary);
    values = parseSeriesValues(options.values);
  } catch (error) {
    throw new CliError(errorLine(error), 2);
  }
  const base = parseMapInput(json);
  try {
    checkSeriesQuantity(base, quantity);
  } catch (error) {
    throw new CliError(errorLine(error), 2);
  }
  // The figure holds every map's labels: a larger grid is computed in pieces and merged by hand.
  const tooLarge =
    options.shard === undefined &&
    wholeMapProblem(
      base.plane,
      'a series draws in its figure',
      "series --shard K/N writes each map's pieces, and merge joins one map's pieces into its JSON or CSV",
    );
  if (tooLarge) throw new CliError(tooLarge, 2);
  const files = seriesFiles(options.out, values.length);
  try {
    mkdirSync(files.dir, { recursive: true });
    if (!statSync(files.dir).isDirectory()) throw new Error('not a folder');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code ?? 'not a folder';
    throw new CliError(
      `--out ${quoteInput(files.dir, QUOTED_PATH_LENGTH)}: cannot make the folder (${code})`,
    );
  }
  const maps: SeriesMap[] = values.map((value, k) => {
    let input: MapInput;
    try {
      input = parseMapInput(seriesDocument(base, quantity, value));
    } catch (error) {
      throw new ModelError(`--values ${value}: ${errorLine(error)}`);
    }
    return {
      value,
      input,
      provenance: { series: seriesProvenance(quantity, value, k + 1, values.length) },
      path: files.map(k),
    };
  });
  if (options.shard !== undefined) {
    for (const map of maps) shardPlace(map.input, options.shard);
  }

  let runner: (StageRunner & { close(): Promise<void> }) | undefined;
  const threads = async () => (runner ??= await options.runner());
  try {
    if (options.shard !== undefined) {
      for (const map of maps) {
        if (!partIsDone(map, options.shard)) await computePart(map, options.shard, await threads());
      }
      return;
    }
    for (const map of maps) {
      if (mapIsDone(map)) continue;
      const n = partCounts(map).find((count) =>
        Array.from({ length: count }, (_, k) => partIsDone(map, [k + 1, count])).some(Boolean),
      );
      if (n !== undefined) {
        for (let k = 1; k <= n; k++) {
          if (!partIsDone(map, [k, n])) await computePart(map, [k, n], await threads());
        }
        const parts = orderParts(
          Array.from({ length: n }, (_, k) => readPartFile(partPath(map.path, [k + 1, n]))),
        );
        mergeParts(
          parts,
          mapFileSink(map.input, map.path, { format: 'json', provenance: map.provenance }),
        );
      } else {
        const sink = mapFileSink(map.input, map.path, {
          format: 'json',
          provenance: map.provenance,
        });
        await runMapRows(map.input, await threads(), sink);
      }
    }
  } finally {
    await runner?.close();
  }
  // The figure, from the maps' files (those just written and those kept).
  const { seriesFigureSvg } = await import('../app/figure/seriesFigure');
  const panels = maps.map((map) => ({
    value: map.value,
    map: { input: map.input, ...readMapOutline(map.path) },
  }));
  writeWholeFile(
    files.figure,
    seriesFigureSvg(panels, {
      column: options.column,
      title: options.title,
      quantity: seriesQuantityLabel(quantity),
      vary: seriesQuantityName(quantity),
    }),
  );
}

async function computePart(map: SeriesMap, shard: Shard, runner: StageRunner): Promise<void> {
  const place = shardPlace(map.input, shard);
  const sink = partSink(
    map.input,
    partPath(map.path, shard),
    { shard, rows: place.rows },
    map.provenance,
  );
  await runMapRows(map.input, runner, sink, place.cellRows);
}
