import { joinBoundaries, type Boundary } from './boundaries';
import { coarseLayout, type CoarseBlock, type CoarseNodes } from './coarseNodes';
import { boundaryEdges, type Crossing } from './crossings';
import { solvePixelList, type CellRange, type PixelBlock } from './pixelBlock';
import { axisValue, type MapInput } from './plane';

/** A computed Map: grids are flat row-major arrays, `values[j nx + i]` at (x[i], y[j]). */
export interface PhaseMap {
  readonly input: MapInput;
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly labels: string[];
  readonly energy: Float64Array;
  /** o_k (k = 1..15) at [15 p + k - 1]. */
  readonly order: Float64Array;
  readonly gap: Float64Array;
  readonly boundaries: Boundary[];
  readonly crossings: Crossing[];
}

/** How far a pixel's data has come. */
export const PIXEL_EMPTY = 0;
/** Shown with the label of a nearby coarse node, not yet solved itself. */
export const PIXEL_PREVIEW = 1;
export const PIXEL_SOLVED = 2;

/**
 * A Map being assembled from stage results, in any order: full-resolution row-major grids
 * (`values[j nx + i]` at (x[i], y[j])) plus the coarse nodes. Shared by the CLI's one-shot run
 * and the browser's progressive one.
 */
export class MapGrid {
  readonly nx: number;
  readonly ny: number;
  x: Float64Array;
  y: Float64Array;
  readonly cols: Int32Array;
  readonly rows: Int32Array;
  /** Per pixel: PIXEL_EMPTY, PIXEL_PREVIEW or PIXEL_SOLVED. */
  readonly status: Uint8Array;
  readonly labels: string[];
  readonly energy: Float64Array;
  /** o_k (k = 1..15) at [15 p + k - 1]. */
  readonly order: Float64Array;
  readonly gap: Float64Array;
  readonly frames: Float64Array;
  readonly nodeFrames: Float64Array;
  readonly nodeLabels: string[];
  private nodesPlaced = 0;
  /** Pixels that failed the certificate and got a full search (see `solveCells`). */
  searched = 0;

  constructor(public input: MapInput) {
    const [nx, ny] = input.plane.resolution;
    this.nx = nx;
    this.ny = ny;
    this.x = Float64Array.from({ length: nx }, (_, i) => axisValue(input.plane.x, nx, i));
    this.y = Float64Array.from({ length: ny }, (_, j) => axisValue(input.plane.y, ny, j));
    const { cols, rows } = coarseLayout(input);
    this.cols = cols;
    this.rows = rows;
    const total = nx * ny;
    this.status = new Uint8Array(total);
    this.labels = new Array<string>(total).fill('');
    this.energy = new Float64Array(total).fill(NaN);
    this.order = new Float64Array(15 * total).fill(NaN);
    this.gap = new Float64Array(total).fill(NaN);
    this.frames = new Float64Array(32 * total);
    const nodes = cols.length * rows.length;
    this.nodeFrames = new Float64Array(32 * nodes);
    this.nodeLabels = new Array<string>(nodes).fill('');
  }

  /**
   * Starts over for another input of the same resolution, keeping the buffers (a 256 x 256 grid
   * holds 25 MB: allocating it anew for every slider step would stall the page). Every pixel and
   * node becomes empty; old numbers stay in the buffers but are never read as solved.
   */
  reset(input: MapInput): void {
    const [nx, ny] = input.plane.resolution;
    if (nx !== this.nx || ny !== this.ny) throw new Error('MapGrid.reset: the resolution differs');
    this.input = input;
    this.x = Float64Array.from({ length: nx }, (_, i) => axisValue(input.plane.x, nx, i));
    this.y = Float64Array.from({ length: ny }, (_, j) => axisValue(input.plane.y, ny, j));
    this.status.fill(PIXEL_EMPTY);
    this.labels.fill('');
    this.nodeLabels.fill('');
    this.nodesPlaced = 0;
    this.searched = 0;
  }

  get nodeCount(): number {
    return this.cols.length * this.rows.length;
  }

  /** Pixel index of coarse node `node`. */
  nodePixel(node: number): number {
    const a = node % this.cols.length;
    const b = Math.floor(node / this.cols.length);
    return this.rows[b]! * this.nx + this.cols[a]!;
  }

  /**
   * Stores solved coarse nodes, each also as its own pixel. With `previewRadius` > 0 the
   * unsolved pixels within that many pixels (max norm) of a node show its label meanwhile.
   */
  placeCoarse(block: CoarseBlock, previewRadius = 0): void {
    block.nodes.forEach((node, n) => {
      this.nodeFrames.set(block.frames.subarray(32 * n, 32 * n + 32), 32 * node);
      if (this.nodeLabels[node] === '') this.nodesPlaced++;
      this.nodeLabels[node] = block.labels[n]!;
      const p = this.nodePixel(node);
      this.setPixel(p, block.labels[n]!, block.energy[n]!, block.gap[n]!, block, n);
      if (previewRadius > 0) this.preview(p, block.labels[n]!, previewRadius);
    });
  }

  private preview(p: number, label: string, radius: number): void {
    const i0 = p % this.nx;
    const j0 = Math.floor(p / this.nx);
    for (let j = Math.max(0, j0 - radius); j < Math.min(this.ny, j0 + radius); j++) {
      for (let i = Math.max(0, i0 - radius); i < Math.min(this.nx, i0 + radius); i++) {
        const q = j * this.nx + i;
        if (this.status[q] !== PIXEL_SOLVED) {
          this.status[q] = PIXEL_PREVIEW;
          this.labels[q] = label;
        }
      }
    }
  }

  private setPixel(
    p: number,
    label: string,
    energy: number,
    gap: number,
    source: { order: Float64Array; frames: Float64Array },
    n: number,
  ): void {
    this.status[p] = PIXEL_SOLVED;
    this.labels[p] = label;
    this.energy[p] = energy;
    this.gap[p] = gap;
    this.order.set(source.order.subarray(15 * n, 15 * n + 15), 15 * p);
    this.frames.set(source.frames.subarray(32 * n, 32 * n + 32), 32 * p);
  }

  get coarseComplete(): boolean {
    return this.nodesPlaced === this.nodeCount;
  }

  /** The full coarse grid; call once every node is placed. */
  coarseNodes(): CoarseNodes {
    if (!this.coarseComplete) throw new Error('MapGrid: coarse nodes are not all solved yet');
    return { cols: this.cols, rows: this.rows, frames: this.nodeFrames, labels: this.nodeLabels };
  }

  /**
   * The part of the coarse grid that cells [a0, a1) x [b0, b1) need: nodes a0..a1, b0..b1, as
   * a grid of its own (cell (a, b) of the result is cell (a0 + a, b0 + b) here).
   */
  coarseWindow({ a0, b0, a1, b1 }: CellRange): CoarseNodes {
    const width = this.cols.length;
    const frames = new Float64Array(32 * (a1 - a0 + 1) * (b1 - b0 + 1));
    const labels: string[] = [];
    let n = 0;
    for (let b = b0; b <= b1; b++) {
      for (let a = a0; a <= a1; a++, n++) {
        const node = b * width + a;
        frames.set(this.nodeFrames.subarray(32 * node, 32 * node + 32), 32 * n);
        labels.push(this.nodeLabels[node]!);
      }
    }
    return {
      cols: this.cols.slice(a0, a1 + 1),
      rows: this.rows.slice(b0, b1 + 1),
      frames,
      labels,
    };
  }

  /**
   * Stores the pixels of a block; returns whether any of them changed its label from what the
   * grid showed there before (a preview or an earlier result).
   */
  placePixels(block: PixelBlock): boolean {
    let changed = false;
    for (let r = 0; r < block.height; r++) {
      for (let c = 0; c < block.width; c++) {
        const n = r * block.width + c;
        const p = (block.j0 + r) * this.nx + block.i0 + c;
        if (this.labels[p] !== block.labels[n]) changed = true;
        this.setPixel(p, block.labels[n]!, block.energy[n]!, block.gap[n]!, block, n);
      }
    }
    this.searched += block.searched[0]!;
    return changed;
  }

  /** Stores the results of `solvePixelList` for the pixels it was given. */
  placePixelList(pixels: Int32Array, block: PixelBlock): void {
    pixels.forEach((p, n) =>
      this.setPixel(p, block.labels[n]!, block.energy[n]!, block.gap[n]!, block, n),
    );
    this.searched += block.searched[0]!;
  }

  /**
   * Solves pixel p here and now unless it is solved (one descent from the nearest coarse node:
   * meant for pixels inside regions, once the cells holding boundaries are done).
   */
  solvePixelNow(p: number): void {
    if (this.status[p] === PIXEL_SOLVED || !this.coarseComplete) return;
    const pixels = Int32Array.of(p);
    this.placePixelList(pixels, solvePixelList(this.input, this.coarseNodes(), pixels));
  }

  /** Edges between differently labelled pixels (ids as in `Crossing`). */
  boundaryEdges(): Int32Array {
    return boundaryEdges(this.labels, this.nx, this.ny);
  }

  /** The end states of the given edges, as `locateCrossings` takes them. */
  edgeEnds(edges: Int32Array): { endFrames: Float64Array; endLabels: string[] } {
    const endFrames = new Float64Array(64 * edges.length);
    const endLabels: string[] = [];
    edges.forEach((edge, e) => {
      const p = edge >> 1;
      const q = (edge & 1) === 1 ? p + this.nx : p + 1;
      endFrames.set(this.frames.subarray(32 * p, 32 * p + 32), 64 * e);
      endFrames.set(this.frames.subarray(32 * q, 32 * q + 32), 64 * e + 32);
      endLabels.push(this.labels[p]!, this.labels[q]!);
    });
    return { endFrames, endLabels };
  }

  /** The finished Map (every pixel solved) with its located crossings. */
  phaseMap(crossings: Crossing[]): PhaseMap {
    return {
      input: this.input,
      x: this.x,
      y: this.y,
      labels: this.labels,
      energy: this.energy,
      order: this.order,
      gap: this.gap,
      boundaries: joinBoundaries(crossings, this.nx, this.ny),
      crossings,
    };
  }
}
