import { FitCancelled } from './conditionMap';
import type { Observation } from './observations';
import { predictedTilt, tiltResidual, type TiltSweep } from './tiltSweep';

/**
 * The transition tilts that one tilt-sweep condition predicts over the pixel grid, for each row
 * of that condition, without a sweep at every pixel (public/notes.html#observations):
 *
 * 1. a sweep at every `stride`-th pixel (about 17 per side, and the last row and column);
 * 2. a cell between four evaluated pixels is looked at more closely where it matters: where the
 *    edge of some row's 2-sigma band (|residual| = 2) may pass through it, or where its corners
 *    disagree on whether the transition exists. Its centre is swept; where that differs from
 *    the bilinear value of the corners by more than REFINE_TOLERANCE sigma (a kink, a change of
 *    the states involved) the cell is split in four and each part looked at again, down to
 *    `minStride` pixels;
 * 3. every other pixel takes the bilinear value of its smallest cell's corners (the nearest
 *    corner's where a corner has no transition).
 *
 * Values are interpolated as 1 / cos(tilt), the transition's E_Z per unit of E_Z at zero tilt:
 * where Delta_V is zero a model scaled by s has its transitions at s times the E_Z, so this is
 * smooth along rays from the origin, and exactly linear for the ferromagnet / canted
 * antiferromagnet transition at E_Z = 4 |u_perp| (public/notes.html#closed-forms).
 *
 * The result at a pixel is exact where it was swept and within REFINE_TOLERANCE sigma of it near
 * the band edges elsewhere, so which pixels lie within 2 sigma is decided to that accuracy.
 */
export interface SweepFieldOptions {
  /** Smallest cell side (pixels) that is still split; 1 sweeps every pixel where it matters. */
  readonly minStride: number;
  /** Most sweeps in all (a guard on cost); refinement stops there. */
  readonly maxSweeps: number;
  /** Pixels per call of `sweepAt` (a task). */
  readonly chunk: number;
}

export const DEFAULT_SWEEP_FIELD: SweepFieldOptions = { minStride: 1, maxSweeps: 20000, chunk: 8 };

/** Residual error (in sigma) the bilinear value may have near a band edge. */
export const REFINE_TOLERANCE = 0.1;

/** Margin (in sigma) around |residual| = 2 within which a cell is looked at. */
const BAND_MARGIN = 0.5;

export interface SweepField {
  /** Per row (in the order given): predicted transition tilt per pixel, NaN where none. */
  readonly predicted: Float64Array[];
  /** Per row: residual (predicted - observed) / sigma per pixel (`tiltResidual`). */
  readonly residual: Float64Array[];
  /** Pixels swept. */
  readonly sweeps: number;
  /** Whether the refinement stopped at `maxSweeps`. */
  readonly truncated: boolean;
}

/** Pixel indices 0, s, 2s, ... and n - 1. */
function line(n: number, stride: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < n; i += stride) out.push(i);
  if (out[out.length - 1] !== n - 1) out.push(n - 1);
  return out;
}

interface Cell {
  readonly i0: number;
  readonly j0: number;
  readonly i1: number;
  readonly j1: number;
}

/**
 * The field of `rows` (all transition rows of one sweep condition) over an nx x ny grid with
 * pixel-centre coordinates `xs`, `ys`. `sweepAt(points)` sweeps at the given (x, y) pairs and
 * resolves in order; `cancelled` is asked between rounds.
 */
export async function computeSweepField(
  rows: readonly Observation[],
  xs: Float64Array,
  ys: Float64Array,
  sweepAt: (points: Float64Array) => Promise<TiltSweep[]>,
  options: SweepFieldOptions = DEFAULT_SWEEP_FIELD,
  cancelled: () => boolean = () => false,
): Promise<SweepField> {
  const nx = xs.length;
  const ny = ys.length;
  const known = new Map<number, Float64Array>();
  let truncated = false;
  const radians = Math.PI / 180;
  // Stored as 1 / cos(tilt) (NaN: no transition); `tiltOf` turns it back.
  const predict = (sweep: TiltSweep): Float64Array =>
    Float64Array.from(rows, (row) => {
      const tilt = predictedTilt(sweep, row.tiltDeg ?? 0, row.pair);
      return tilt === null ? NaN : 1 / Math.cos(tilt * radians);
    });
  const tiltOf = (w: number): number =>
    Number.isNaN(w) ? NaN : Math.acos(Math.min(1, 1 / w)) / radians;
  const residualOf = (r: number, w: number): number => {
    const row = rows[r]!;
    const tilt = tiltOf(w);
    return tiltResidual(
      Number.isNaN(tilt) ? null : tilt,
      row.value as number,
      row.sigma!,
      row.tiltDeg ?? 0,
    );
  };
  const evaluate = async (pixels: number[]): Promise<void> => {
    const todo = [...new Set(pixels)].filter((p) => !known.has(p));
    if (known.size + todo.length > options.maxSweeps) {
      truncated = true;
      todo.length = Math.max(0, options.maxSweeps - known.size);
    }
    const chunks: number[][] = [];
    for (let k = 0; k < todo.length; k += options.chunk)
      chunks.push(todo.slice(k, k + options.chunk));
    await Promise.all(
      chunks.map(async (chunk) => {
        if (cancelled()) return;
        const points = new Float64Array(2 * chunk.length);
        chunk.forEach((p, n) => {
          points[2 * n] = xs[p % nx]!;
          points[2 * n + 1] = ys[Math.floor(p / nx)]!;
        });
        const sweeps = await sweepAt(points);
        chunk.forEach((p, n) => known.set(p, predict(sweeps[n]!)));
      }),
    );
    if (cancelled()) throw new FitCancelled();
  };
  const at = (i: number, j: number) => known.get(j * nx + i);

  const stride = Math.max(1, Math.ceil(Math.max(nx, ny) / 16));
  const cols = line(nx, stride);
  const rowsOfGrid = line(ny, stride);
  await evaluate(rowsOfGrid.flatMap((j) => cols.map((i) => j * nx + i)));
  let open: Cell[] = [];
  for (let b = 0; b + 1 < rowsOfGrid.length; b++) {
    for (let a = 0; a + 1 < cols.length; a++) {
      open.push({ i0: cols[a]!, j0: rowsOfGrid[b]!, i1: cols[a + 1]!, j1: rowsOfGrid[b + 1]! });
    }
  }
  if (cols.length === 1 || rowsOfGrid.length === 1) open = [];
  const leaves: Cell[] = [];

  /** Whether the band edge of some row, or a change of kind, may lie inside the cell. */
  const matters = (c: Cell): boolean => {
    const corners = [at(c.i0, c.j0), at(c.i1, c.j0), at(c.i0, c.j1), at(c.i1, c.j1)];
    if (corners.some((v) => v === undefined)) return false;
    return rows.some((_, r) => {
      const values = corners.map((v) => v![r]!);
      const residuals = values.map((v) => residualOf(r, v));
      const missing = values.filter(Number.isNaN).length;
      const low = Math.min(...residuals);
      const high = Math.max(...residuals);
      const nearBand = low < 2 + BAND_MARGIN && high > -2 - BAND_MARGIN;
      const inside = residuals.every((v) => Math.abs(v) < 2 - BAND_MARGIN);
      return (missing > 0 && missing < 4) || (nearBand && !inside);
    });
  };
  const bilinear = (c: Cell, i: number, j: number, r: number): number => {
    const u = c.i1 === c.i0 ? 0 : (i - c.i0) / (c.i1 - c.i0);
    const v = c.j1 === c.j0 ? 0 : (j - c.j0) / (c.j1 - c.j0);
    const a = at(c.i0, c.j0)![r]!;
    const b = at(c.i1, c.j0)![r]!;
    const d = at(c.i0, c.j1)![r]!;
    const e = at(c.i1, c.j1)![r]!;
    if ([a, b, d, e].some(Number.isNaN)) {
      // No transition at some corner: the nearest corner's value.
      return [a, b, d, e][(v < 0.5 ? 0 : 2) + (u < 0.5 ? 0 : 1)]!;
    }
    return (1 - v) * ((1 - u) * a + u * b) + v * ((1 - u) * d + u * e);
  };

  while (open.length > 0) {
    const look = open.filter((c) => Math.max(c.i1 - c.i0, c.j1 - c.j0) > 1 && matters(c));
    const looked = new Set(look);
    for (const c of open) if (!looked.has(c)) leaves.push(c);
    const centre = (c: Cell) =>
      [Math.floor((c.i0 + c.i1) / 2), Math.floor((c.j0 + c.j1) / 2)] as const;
    await evaluate(look.map((c) => centre(c)[1] * nx + centre(c)[0]));
    const split: Cell[] = [];
    for (const c of look) {
      const [ci, cj] = centre(c);
      const exact = at(ci, cj);
      const smooth =
        exact !== undefined &&
        rows.every((row, r) => {
          const guess = bilinear(c, ci, cj, r);
          const value = exact[r]!;
          if (Number.isNaN(guess) || Number.isNaN(value))
            return Number.isNaN(guess) === Number.isNaN(value);
          return Math.abs(tiltOf(guess) - tiltOf(value)) <= REFINE_TOLERANCE * row.sigma!;
        });
      const small = Math.max(c.i1 - c.i0, c.j1 - c.j0) <= options.minStride;
      if (smooth || small || exact === undefined) leaves.push(c);
      else {
        const is = [...new Set([c.i0, ci, c.i1])];
        const js = [...new Set([c.j0, cj, c.j1])];
        for (let b = 0; b + 1 < js.length; b++) {
          for (let a = 0; a + 1 < is.length; a++) {
            split.push({ i0: is[a]!, j0: js[b]!, i1: is[a + 1]!, j1: js[b + 1]! });
          }
        }
      }
    }
    await evaluate(
      split.flatMap((c) => [
        c.j0 * nx + c.i0,
        c.j0 * nx + c.i1,
        c.j1 * nx + c.i0,
        c.j1 * nx + c.i1,
      ]),
    );
    const corners = (c: Cell) => [
      c.j0 * nx + c.i0,
      c.j0 * nx + c.i1,
      c.j1 * nx + c.i0,
      c.j1 * nx + c.i1,
    ];
    open = split.filter((c) => corners(c).every((p) => known.has(p)));
    const kept = new Set(open);
    for (const c of split) if (!kept.has(c)) leaves.push(c);
  }

  const predicted = rows.map(() => new Float64Array(nx * ny).fill(NaN));
  // Largest cells first, so that the finer cells' values win on shared edges.
  leaves.sort((a, b) => (b.i1 - b.i0) * (b.j1 - b.j0) - (a.i1 - a.i0) * (a.j1 - a.j0));
  for (const c of leaves) {
    if (
      [at(c.i0, c.j0), at(c.i1, c.j0), at(c.i0, c.j1), at(c.i1, c.j1)].some((v) => v === undefined)
    )
      continue;
    for (let j = c.j0; j <= c.j1; j++) {
      for (let i = c.i0; i <= c.i1; i++) {
        rows.forEach((_, r) => (predicted[r]![j * nx + i] = bilinear(c, i, j, r)));
      }
    }
  }
  for (const [p, values] of known) rows.forEach((_, r) => (predicted[r]![p] = values[r]!));
  const residual = predicted.map((values, r) => Float64Array.from(values, (v) => residualOf(r, v)));
  for (const values of predicted)
    for (let p = 0; p < values.length; p++) values[p] = tiltOf(values[p]!);
  return { predicted, residual, sweeps: known.size, truncated };
}
