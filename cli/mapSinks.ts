import {
  CHANNELS,
  PART_PIXELS_OPEN,
  joinBoundaries,
  mapCsvHead,
  mapCsvRow,
  mapRowsJsonPieces,
  partEndLines,
  partHeader,
  partRowLines,
  wholeMapProblem,
  type Boundary,
  type Crossing,
  type EdgeRow,
  type MapInput,
  type MapProvenance,
  type MapRowBlock,
  type PartPlace,
} from '../solver/index';
import type { FigureMap, MapFigureOptions } from '../app/figure/mapFigure';
import { CliError } from './cliError';
import { OutputFile, writeWholeFile } from './outputFile';
import { RowSpill } from './rowSpill';

/** The end of a run: its crossings (ascending by edge) and its first and last pixel rows. */
export interface MapEnd {
  readonly crossings: readonly Crossing[];
  readonly first?: EdgeRow;
  readonly last?: EdgeRow;
}

/**
 * Where a Map's finished pixel rows go, in order, as they are computed or read from parts; then
 * its crossings. `finish` writes the file under its name; `abandon` leaves nothing behind.
 */
export interface MapSink {
  rows(block: MapRowBlock): void;
  finish(end: MapEnd): void;
  abandon(): void;
}

export type MapFormat = 'json' | 'csv' | 'svg';

/** What a whole Map's file is written with: its format and, for a figure, its options. */
export interface MapFileOptions {
  readonly format: MapFormat;
  readonly figure?: MapFigureOptions;
  readonly provenance?: MapProvenance;
  /** Draws the figure (`mapFigureSvg`, loaded with d3 only for an SVG output). */
  readonly drawFigure?: (map: FigureMap, options: MapFigureOptions) => string;
}

/** Checks that rows arrive in order, each once, and says when all have. */
class RowOrder {
  private next = 0;
  constructor(
    private readonly first: number,
    private readonly end: number,
  ) {
    this.next = first;
  }

  take(block: MapRowBlock): void {
    if (block.j0 !== this.next || block.j0 + block.rows > this.end) {
      throw new Error(`Map rows out of order: got row ${block.j0}, expected ${this.next}`);
    }
    this.next += block.rows;
  }

  complete(): void {
    if (this.next !== this.end) throw new Error(`Map rows missing from row ${this.next}`);
  }
}

/** The labels of every pixel, kept for a figure (the only per-pixel data it needs). */
class LabelGrid {
  readonly labels: string[];
  constructor(
    private readonly nx: number,
    ny: number,
  ) {
    this.labels = new Array<string>(nx * ny).fill('');
  }

  take(block: MapRowBlock): void {
    const p = block.j0 * this.nx;
    for (let n = 0; n < block.labels.length; n++) this.labels[p + n] = block.labels[n]!;
  }
}

/**
 * The sink of a whole Map's file: JSON through a spill file of its rows (the JSON holds each
 * quantity's rows in turn), CSV straight to the file a row at a time, SVG from the labels alone.
 */
export function mapFileSink(input: MapInput, path: string, options: MapFileOptions): MapSink {
  const [nx, ny] = input.plane.resolution;
  const order = new RowOrder(0, ny);
  const figure = options.format === 'svg';
  // A figure is drawn from every pixel's label, held in memory: grids up to 2048 per side.
  const tooLarge =
    figure &&
    wholeMapProblem(
      input.plane,
      'a figure draws',
      'write .json or .csv, or draw the figure of a coarser grid',
    );
  if (tooLarge) throw new CliError(tooLarge, 2);
  const labels = figure ? new LabelGrid(nx, ny) : undefined;
  const spill = options.format === 'json' ? new RowSpill(input, path) : undefined;
  let csv: OutputFile | undefined;
  if (options.format === 'csv') {
    try {
      csv = new OutputFile(path);
      csv.write(mapCsvHead(input, options.provenance));
    } catch (error) {
      spill?.close();
      throw error;
    }
  }
  const quantities = Array.from({ length: 2 + CHANNELS.length }, () => new Float64Array(nx));
  return {
    rows(block) {
      order.take(block);
      labels?.take(block);
      spill?.add(block);
      if (csv !== undefined) {
        for (let r = 0; r < block.rows; r++) {
          const n = r * nx;
          quantities[0]!.set(block.energy.subarray(n, n + nx));
          quantities[1]!.set(block.gap.subarray(n, n + nx));
          for (let k = 0; k < CHANNELS.length; k++) {
            const row = quantities[2 + k]!;
            for (let i = 0; i < nx; i++) row[i] = block.order[15 * (n + i) + k]!;
          }
          csv.writeAll(mapCsvRow(input, block.j0 + r, block.labels.slice(n, n + nx), quantities));
        }
      }
    },
    finish(end) {
      order.complete();
      const boundaries: Boundary[] = joinBoundaries(end.crossings, nx, ny);
      const map: FigureMap | undefined = labels && { input, labels: labels.labels, boundaries };
      if (csv !== undefined) csv.commit();
      if (spill !== undefined) {
        spill.boundaries = boundaries;
        try {
          writeWholeFile(path, mapRowsJsonPieces(spill, options.provenance));
        } finally {
          spill.close();
        }
      }
      if (options.format === 'svg') {
        writeWholeFile(path, options.drawFigure!(map!, options.figure ?? {}));
      }
    },
    abandon() {
      csv?.abandon();
      spill?.close();
    },
  };
}

/** The sink of a part (`map --shard K/N`): its lines as the rows come (see solver/mapPart.ts). */
export function partSink(
  input: MapInput,
  path: string,
  place: PartPlace,
  provenance: MapProvenance = {},
): MapSink {
  const [nx, ny] = input.plane.resolution;
  const [j0, j1] = place.rows;
  const order = new RowOrder(j0, j1);
  const file = new OutputFile(path);
  file.write(partHeader(input, place, provenance));
  file.write(PART_PIXELS_OPEN);
  return {
    rows(block) {
      order.take(block);
      file.writeAll(partRowLines(block, nx, j1 - 1));
    },
    finish(end) {
      order.complete();
      const seams: EdgeRow[] = [];
      if (j0 > 0) seams.push(end.first!);
      if (j1 < ny) seams.push(end.last!);
      file.writeAll(partEndLines(seams, end.crossings));
      file.commit();
    },
    abandon() {
      file.abandon();
    },
  };
}
