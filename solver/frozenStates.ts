import { DEGENERACY_TOLERANCE } from './degeneracy';
import type { PlaneCouplings } from './plane';
import { seedLibrary } from './seeds';

/** Extra states per cell besides the seed library (its corners and relaxed seed states). */
export const MAX_CELL_STATES = 24;

/**
 * Fixed states whose energies bound the ground state from above anywhere in a plane: the exact
 * states of the seed library and a cell's own states (its corner nodes, and seed states relaxed
 * at points of the cell). At a fixed projector the
 * energy is linear in the couplings, hence affine in the plane's axis values, so each state's
 * energy at a pixel costs two multiply-adds (three numbers per state, computed once). A pixel
 * whose continued state lies above any of them is certainly not at the global minimum: that is
 * the Map's per-pixel certificate.
 */
export class FrozenStates {
  /** Affine coefficients [e0, ex, ey] per state: library seeds first, then the cell's corners. */
  private coefficients: Float64Array;
  private readonly seedCount: number;
  private readonly seedFrames: Float64Array[];
  private readonly cornerFrames: Float64Array[] = [];
  /** Indices of the states that can beat a pixel of the current cell (see `forCell`). */
  private active: Int32Array;
  private activeCount = 0;
  /** The current cell's rectangle of axis values (see `forCell`). */
  private cell = new Float64Array(4);

  constructor(private readonly plane: PlaneCouplings) {
    // Every structured seed twice: its exact state, and the nudged one the search descends from
    // (which ranks states that sit at a saddle, and gain most by relaxing, higher).
    const library = seedLibrary(plane.nf);
    this.seedCount = 2 * library.length;
    this.seedFrames = [...library.map((s) => s.exact ?? s.frame), ...library.map((s) => s.frame)];
    this.coefficients = new Float64Array(3 * (this.seedCount + MAX_CELL_STATES));
    const scratch = new Float64Array(3);
    library.forEach((seed, s) => {
      this.coefficients.set(plane.affineEnergy(seed.exactOrder, scratch), 3 * s);
      this.coefficients.set(plane.affineEnergy(seed.order, scratch), 3 * (library.length + s));
    });
    this.active = new Int32Array(this.seedCount + MAX_CELL_STATES);
  }

  /**
   * Index of the seed state lowest at (x, y), among the exact states (`nudged` false) or among
   * the nudged ones.
   */
  lowestSeed(x: number, y: number, nudged: boolean): number {
    const k = this.coefficients;
    const half = this.seedCount / 2;
    let best = 0;
    let bestEnergy = Infinity;
    for (let s = nudged ? half : 0; s < (nudged ? this.seedCount : half); s++) {
      const e = k[3 * s]! + k[3 * s + 1]! * x + k[3 * s + 2]! * y;
      if (e < bestEnergy) {
        bestEnergy = e;
        best = s;
      }
    }
    return best;
  }

  /** The frame of seed state `s`. */
  seedFrame(s: number): Float64Array {
    return this.seedFrames[s]!;
  }

  /**
   * Prepares the checks for one cell: the rectangle [x0, x1] x [y0, y1] of axis values that its
   * pixels cover, and the order parameters (index 0..15) and frames of its own states (its
   * corners first, at most MAX_CELL_STATES). Keeps only the states that can fall below every
   * corner state somewhere in the rectangle.
   */
  forCell(
    x0: number,
    x1: number,
    y0: number,
    y1: number,
    cornerOrders: readonly ArrayLike<number>[],
    cornerFrames: readonly Float64Array[],
  ): void {
    const n = this.seedCount;
    const k = this.coefficients;
    const scratch = new Float64Array(3);
    this.cell.set([x0, x1, y0, y1]);
    this.cornerFrames.length = 0;
    cornerOrders.forEach((order, corner) => {
      k.set(this.plane.affineEnergy(order, scratch), 3 * (n + corner));
      this.cornerFrames.push(cornerFrames[corner]!);
    });
    const total = n + cornerOrders.length;
    const extreme = (s: number, wantMax: boolean): number => {
      const e0 = k[3 * s]!;
      const ex = k[3 * s + 1]!;
      const ey = k[3 * s + 2]!;
      const a = e0 + ex * x0 + ey * y0;
      const b = e0 + ex * x1 + ey * y0;
      const c = e0 + ex * x0 + ey * y1;
      const d = e0 + ex * x1 + ey * y1;
      return wantMax ? Math.max(a, b, c, d) : Math.min(a, b, c, d);
    };
    // After the check, every pixel lies at or below each of the cell's states (to the
    // tolerance), so no pixel of the cell is above the lowest of their maxima over the rectangle.
    let ceiling = Infinity;
    for (let s = n; s < total; s++) ceiling = Math.min(ceiling, extreme(s, true));
    this.activeCount = 0;
    for (let s = 0; s < total; s++) {
      if (s >= n || extreme(s, false) < ceiling) this.active[this.activeCount++] = s;
    }
  }

  /**
   * Whether no kept state lies below the fixed state of affine energy `rigid` ([e0, ex, ey], as
   * `PlaneCouplings.affineEnergy`) anywhere in the current cell: their differences are affine
   * too, so non-negative at the rectangle's four corners means non-negative inside, and
   * `below` would find nothing at any of its pixels.
   */
  noneBelowOverCell(rigid: Float64Array): boolean {
    const k = this.coefficients;
    const [x0, x1, y0, y1] = this.cell;
    for (let a = 0; a < this.activeCount; a++) {
      const s = this.active[a]!;
      const d0 = k[3 * s]! - rigid[0]!;
      const dx = k[3 * s + 1]! - rigid[1]!;
      const dy = k[3 * s + 2]! - rigid[2]!;
      for (const x of [x0!, x1!]) {
        for (const y of [y0!, y1!]) if (!(d0 + dx * x + dy * y >= 0)) return false;
      }
    }
    return true;
  }

  /**
   * The frame of the lowest kept state whose energy at (x, y) is below `energy` by more than
   * the degeneracy tolerance of `scale`, or undefined when none is.
   */
  below(x: number, y: number, energy: number, scale: number): Float64Array | undefined {
    const k = this.coefficients;
    let threshold = energy - DEGENERACY_TOLERANCE * scale;
    let best = -1;
    for (let a = 0; a < this.activeCount; a++) {
      const s = this.active[a]!;
      const e = k[3 * s]! + k[3 * s + 1]! * x + k[3 * s + 2]! * y;
      if (e < threshold) {
        threshold = e;
        best = s;
      }
    }
    if (best < 0) return undefined;
    return best < this.seedCount ? this.seedFrames[best] : this.cornerFrames[best - this.seedCount];
  }
}
