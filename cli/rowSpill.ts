import { closeSync, openSync, readSync, writeSync } from 'node:fs';
import {
  MAP_QUANTITIES,
  type Boundary,
  type MapInput,
  type MapRowBlock,
  type MapRows,
} from '../solver/index';
import { fileError, removeTemporary, siblingPath, temporaryFile } from './outputFile';

/**
 * A Map's numbers on disk while its JSON is being written: the JSON holds every row of the energy,
 * then every row of the gap, then of each order parameter, so rows that arrive band by band
 * wait here, not in memory. One temporary file beside the output, quantity q of pixel p at
 * 8 (q nx ny + p) bytes (native doubles), then the label of each pixel as a 16-bit index into
 * the labels seen. Read back a grid row at a time through `MapRows`; removed by `close`.
 */
export class RowSpill implements MapRows {
  private readonly path: string;
  private fd: number | undefined;
  private readonly nx: number;
  private readonly ny: number;
  private readonly labelIndex = new Map<string, number>();
  private readonly labelNames: string[] = [];
  readonly counts = new Map<string, number>();
  boundaries: readonly Boundary[] = [];

  constructor(
    readonly input: MapInput,
    private readonly out: string,
  ) {
    [this.nx, this.ny] = input.plane.resolution;
    this.path = temporaryFile(siblingPath(out, 'rows'));
    try {
      this.fd = openSync(this.path, 'w+');
    } catch (error) {
      removeTemporary(this.path);
      throw fileError(error, '--out', out, 'write beside');
    }
  }

  private writeAt(bytes: Uint8Array, position: number): void {
    try {
      for (let done = 0; done < bytes.length;) {
        done += writeSync(this.fd!, bytes, done, bytes.length - done, position + done);
      }
    } catch (error) {
      throw fileError(error, '--out', this.out, 'write beside');
    }
  }

  private readAt(bytes: Uint8Array, position: number): void {
    for (let done = 0; done < bytes.length;) {
      const read = readSync(this.fd!, bytes, done, bytes.length - done, position + done);
      if (read === 0) throw new Error('RowSpill: a row was read before it was written');
      done += read;
    }
  }

  /** Stores finished pixel rows. */
  add(block: MapRowBlock): void {
    const { nx, ny } = this;
    const count = block.rows * nx;
    const start = block.j0 * nx;
    const values = new Float64Array(count);
    for (let q = 0; q < MAP_QUANTITIES; q++) {
      if (q === 0) values.set(block.energy.subarray(0, count));
      else if (q === 1) values.set(block.gap.subarray(0, count));
      else for (let n = 0; n < count; n++) values[n] = block.order[15 * n + q - 2]!;
      this.writeAt(new Uint8Array(values.buffer), 8 * (q * nx * ny + start));
    }
    const labels = new Uint16Array(count);
    for (let n = 0; n < count; n++) {
      const label = block.labels[n]!;
      let index = this.labelIndex.get(label);
      if (index === undefined) {
        index = this.labelNames.length;
        this.labelIndex.set(label, index);
        this.labelNames.push(label);
      }
      labels[n] = index;
      this.counts.set(label, (this.counts.get(label) ?? 0) + 1);
    }
    this.writeAt(new Uint8Array(labels.buffer), 8 * MAP_QUANTITIES * nx * ny + 2 * start);
  }

  labelRow(j: number): string[] {
    const { nx, ny } = this;
    const indices = new Uint16Array(nx);
    this.readAt(new Uint8Array(indices.buffer), 8 * MAP_QUANTITIES * nx * ny + 2 * j * nx);
    return Array.from(indices, (k) => this.labelNames[k]!);
  }

  valueRow(quantity: number, j: number): Float64Array {
    const { nx, ny } = this;
    const row = new Float64Array(nx);
    this.readAt(new Uint8Array(row.buffer), 8 * (quantity * nx * ny + j * nx));
    return row;
  }

  close(): void {
    if (this.fd !== undefined) closeSync(this.fd);
    this.fd = undefined;
    removeTemporary(this.path);
  }
}
