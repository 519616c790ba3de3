import { couplingsFromArrays, energyOfOrder, type Couplings } from './couplings';
import { BISECTION_TOLERANCE, locateTransitions } from './crossings';
import { DEFAULT_DESCENT, descend } from './localMinimise';
import { searchGroundState } from './groundSearch';
import { ModelError } from './model';
import { ORDER_GROUPS, groupMagnitudes, orderAngles, presentGroupCount } from './orderParameters';
import { ORDER_TOLERANCE } from './phaseLabel';
import { PlaneCouplings, type MapInput } from './plane';
import { PixelScratch, summarise } from './stateSummary';
import { DescentWorkspace } from './tangentSpace';

/**
 * What a Cut follows through parameter space:
 * - `line`: a straight line in the plane's coordinates, from `from` to `to` (horizontal axis:
 *   the swept axis value when one coordinate stays, else the distance from `from`);
 * - `x`, `y`: one plane axis value from `from` to `to` at the pinned point `at` (the other axis
 *   stays at the pin);
 * - `zeeman`, `valleyZeeman`: E_Z or Delta_V from `from` to `to` at the pinned point, replacing
 *   whatever the model and the plane set (the couplings stay those of the pin);
 * - `tilt`: the tilt angle in degrees from `from` to `to` at fixed perpendicular field: the
 *   couplings stay, E_Z = zeemanPerp / cos(tilt) (public/notes.html#units), zeemanPerp being E_Z at
 *   zero tilt.
 */
export type CutPath =
  | {
      readonly kind: 'line';
      readonly from: readonly [number, number];
      readonly to: readonly [number, number];
    }
  | {
      readonly kind: 'x' | 'y';
      readonly at: readonly [number, number];
      readonly from: number;
      readonly to: number;
    }
  | {
      readonly kind: 'zeeman' | 'valleyZeeman';
      readonly at: readonly [number, number];
      readonly from: number;
      readonly to: number;
    }
  | {
      readonly kind: 'tilt';
      readonly at: readonly [number, number];
      readonly from: number;
      readonly to: number;
      readonly zeemanPerp: number;
    };

/** A located transition along a Cut. */
export interface CutTransition {
  /** Position along the cut, 0 at the start and 1 at the end. */
  readonly t: number;
  /**
   * The horizontal quantity there: the swept value (an axis value, E_Z, Delta_V, the tilt in
   * degrees), or along a line that changes both plane coordinates the distance from its start.
   */
  readonly s: number;
  /** Plane coordinates (the pin for sweeps of E_Z, Delta_V or tilt). */
  readonly x: number;
  readonly y: number;
  /** Labels before and after (in the direction of increasing t). */
  readonly between: readonly [string, string];
  readonly order: 'first' | 'continuous';
}

/** Profiles along a Cut, sample i at t = i / (n - 1); plain arrays, transferable. */
export interface CutResult {
  readonly path: CutPath;
  /**
   * The horizontal quantity: its label (model-file style: `E_Z`, `u_perp`, `theta` for the
   * tilt, or CUT_DISTANCE_LABEL for the distance along a slanted line) and its values at t = 0
   * and 1.
   */
  readonly axis: {
    readonly label: string;
    readonly unit: string;
    readonly from: number;
    readonly to: number;
  };
  readonly t: Float64Array;
  readonly s: Float64Array;
  readonly x: Float64Array;
  readonly y: Float64Array;
  /** Energy per flux quantum (public/notes.html#energy). */
  readonly energy: Float64Array;
  /** dE/ds along the horizontal quantity, exact (Hellmann-Feynman: dE/ds = dE[P]/ds at fixed P). */
  readonly slope: Float64Array;
  /** Magnitudes of the order-parameter groups (ORDER_GROUPS order), sample i at [8 i + g]. */
  readonly groups: Float64Array;
  /** Canting of the sublattice-A spin from the field axis, radians; NaN without a spin moment. */
  readonly canting: Float64Array;
  /** Quasiparticle gap (public/notes.html#gap; without E_X unless the model sets it). */
  readonly gap: Float64Array;
  readonly labels: string[];
  readonly transitions: CutTransition[];
}

/** Most samples along one Cut. */
export const MAX_CUT_POINTS = 10000;

/** About this many samples get a full global search; the rest continue their neighbours. */
const SEARCHED_SAMPLES = 24;

/** A path reduced to couplings at t, plane coordinates and the horizontal quantity. */
interface Track {
  readonly at: (t: number) => Couplings;
  readonly point: (t: number) => [number, number];
  readonly s: (t: number) => number;
  /** dE/ds of the state with order parameters `o` at t (fixed P). */
  readonly slope: (t: number, o: Float64Array) => number;
  readonly axis: CutResult['axis'];
}

function finite(value: number, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new ModelError(`${field}: expected a finite number, got ${String(value)}`);
  }
  return value;
}

/** Couplings of the pin with E_Z or Delta_V replaced (one-body terms on the same matrix stay). */
function pinnedTrack(input: MapInput, at: readonly [number, number], slot: 3 | 12) {
  const pin = new PlaneCouplings(input).at(at[0], at[1]);
  const arrays = { hartree: pin.hartree.slice(), fock: pin.fock.slice(), eta: pin.eta.slice() };
  const fixed = input.model.oneBody[slot === 3 ? '0z' : 'z0'] ?? 0;
  const nf = input.model.filling + 2;
  const exchange = input.model.exchange ?? 0;
  // eta_0z = -E_Z / 2 and eta_z0 = -Delta_V / 2 (public/notes.html#energy).
  return (value: number): Couplings => {
    arrays.eta[slot] = fixed - value / 2;
    return couplingsFromArrays(nf, arrays, exchange);
  };
}

/** Label of the horizontal axis of a line that changes both plane coordinates. */
export const CUT_DISTANCE_LABEL = 'distance';

/**
 * The horizontal quantity of a straight line through the plane, from (x0, y0) to (x1, y1): the
 * swept axis value when only one plane coordinate changes (a line at fixed u_z runs along u_perp,
 * from x0 to x1), otherwise the distance from the start in the axes' own units,
 * sqrt(dx^2 + dy^2), from 0 to the line's length.
 */
function physicalAxis(
  plane: MapInput['plane'],
  x0: number,
  y0: number,
  x1: number,
  y1: number,
): CutResult['axis'] {
  if (y0 === y1) return { label: plane.x.label || 'x', unit: '', from: x0, to: x1 };
  if (x0 === x1) return { label: plane.y.label || 'y', unit: '', from: y0, to: y1 };
  return { label: CUT_DISTANCE_LABEL, unit: '', from: 0, to: Math.hypot(x1 - x0, y1 - y0) };
}

function trackOf(input: MapInput, path: CutPath): Track {
  const { plane } = input;
  if (path.kind === 'line' || path.kind === 'x' || path.kind === 'y') {
    const [x0, y0, x1, y1] =
      path.kind === 'line'
        ? [path.from[0], path.from[1], path.to[0], path.to[1]]
        : path.kind === 'x'
          ? [path.from, path.at[1], path.to, path.at[1]]
          : [path.at[0], path.from, path.at[0], path.to];
    [x0, y0, x1, y1].forEach((v, k) => finite(v, `cut.${['x0', 'y0', 'x1', 'y1'][k]}`));
    if (x0 === x1 && y0 === y1) throw new ModelError('cut: the end points coincide');
    const planeCouplings = new PlaneCouplings(input);
    // Each PlaneCouplings overwrites one result object: the end points keep their own.
    const start = new PlaneCouplings(input).at(x0, y0);
    const end = new PlaneCouplings(input).at(x1, y1);
    const axis = physicalAxis(plane, x0, y0, x1, y1);
    const span = axis.to - axis.from;
    return {
      // (1 - t) a + t b: exactly the end points at t = 0 and 1.
      at: (t) => planeCouplings.at((1 - t) * x0 + t * x1, (1 - t) * y0 + t * y1),
      point: (t) => [(1 - t) * x0 + t * x1, (1 - t) * y0 + t * y1],
      s: (t) => (1 - t) * axis.from + t * axis.to,
      // The couplings are linear in t, so at fixed P the energy is too: its slope along s is
      // the difference of the end values over the span of s.
      slope: (_t, o) => (energyOfOrder(end, o) - energyOfOrder(start, o)) / span,
      axis,
    };
  }
  finite(path.at[0], 'cut.at.x');
  finite(path.at[1], 'cut.at.y');
  finite(path.from, 'cut.from');
  finite(path.to, 'cut.to');
  if (path.from === path.to) throw new ModelError('cut.to: must differ from cut.from');
  const pin: [number, number] = [path.at[0], path.at[1]];
  const value = (t: number): number => (1 - t) * path.from + t * path.to;
  if (path.kind === 'tilt') {
    const zeemanPerp = finite(path.zeemanPerp, 'cut.zeemanPerp');
    for (const [angle, field] of [
      [path.from, 'cut.from'],
      [path.to, 'cut.to'],
    ] as const) {
      if (Math.abs(angle) >= 90) {
        throw new ModelError(`${field}: a tilt angle must lie strictly between -90 and 90 degrees`);
      }
    }
    const radians = Math.PI / 180;
    const at = pinnedTrack(input, path.at, 3);
    return {
      at: (t) => at(zeemanPerp / Math.cos(value(t) * radians)),
      point: () => pin,
      s: value,
      // dE/dtheta = (dE/dE_Z) dE_Z/dtheta = (-o_0z / 2) E_Z_perp sin(theta) / cos^2(theta), per degree.
      slope: (t, o) => {
        const theta = value(t) * radians;
        return ((-o[3]! / 2) * zeemanPerp * Math.sin(theta) * radians) / Math.cos(theta) ** 2;
      },
      axis: { label: 'theta', unit: 'deg', from: path.from, to: path.to },
    };
  }
  const slot = path.kind === 'zeeman' ? 3 : 12;
  const at = pinnedTrack(input, path.at, slot);
  return {
    at: (t) => at(value(t)),
    point: () => pin,
    s: value,
    // dE/dE_Z = -o_0z / 2, dE/dDelta_V = -o_z0 / 2 (public/notes.html#energy).
    slope: (_t, o) => -o[slot]! / 2,
    axis: {
      label: path.kind === 'zeeman' ? 'E_Z' : 'Delta_V',
      unit: '',
      from: path.from,
      to: path.to,
    },
  };
}

function checkCount(n: number): void {
  if (!Number.isInteger(n) || n < 2 || n > MAX_CUT_POINTS) {
    throw new ModelError(
      `cut.n: expected an integer from 2 to ${MAX_CUT_POINTS}, got ${String(n)}`,
    );
  }
}

/** Throws the ModelError that `computeCut` would throw for these arguments, without solving. */
export function checkCut(input: MapInput, path: CutPath, n: number): void {
  checkCount(n);
  trackOf(input, path);
}

/**
 * Profiles of the ground state along a Cut through `input`'s plane, at n evenly spaced samples:
 * about SEARCHED_SAMPLES of them get a full global search, every sample is reached by continuing
 * its neighbours' states forwards and backwards (one descent each way, warm), and keeps the
 * lowest (the simplest among states degenerate to rounding). Each change of label between
 * neighbours is located by bisection to BISECTION_TOLERANCE of the cut length and typed first
 * order or continuous (`bisectTransition`). A phase narrower than the sample spacing that no
 * continued branch reaches is not seen.
 */
export function computeCut(input: MapInput, path: CutPath, n: number): CutResult {
  checkCount(n);
  const track = trackOf(input, path);
  const nf = input.model.filling + 2;
  const tAt = (i: number): number => i / (n - 1);
  const stride = Math.max(1, Math.ceil((n - 1) / SEARCHED_SAMPLES));
  const searched = new Map<number, Float64Array>();
  for (let i = 0; i < n; i += stride) searched.set(i, searchGroundState(track.at(tAt(i))).frame);
  if (!searched.has(n - 1)) searched.set(n - 1, searchGroundState(track.at(1)).frame);

  const ws = new DescentWorkspace();
  const options = { ...DEFAULT_DESCENT };
  const candidate = new Float64Array(32);
  interface Pick {
    frame: Float64Array;
    energy: number;
    converged: boolean;
    groups: number;
  }
  const better = (a: Pick, b: Pick, scale: number): boolean =>
    (a.converged && !b.converged) ||
    (a.converged === b.converged &&
      (a.energy < b.energy - 1e-12 * scale ||
        (Math.abs(a.energy - b.energy) <= 1e-12 * scale && a.groups < b.groups)));
  const settle = (c: Couplings, from: Float64Array): Pick => {
    candidate.set(from);
    const r = descend(c, candidate, options, ws);
    return {
      frame: Float64Array.from(candidate),
      energy: r.energy,
      converged: r.converged,
      groups: presentGroupCount(ws.order, ORDER_TOLERANCE),
    };
  };
  // One sweep in each direction: each sample continues the previous one's choice and, where
  // a full search ran, takes its result if lower.
  const sweep = (order: number[]): Pick[] => {
    const out: Pick[] = new Array<Pick>(n);
    let previous: Float64Array | undefined;
    for (const i of order) {
      const c = track.at(tAt(i));
      const found = searched.get(i);
      let best = previous ? settle(c, previous) : undefined;
      if (found) {
        const own = settle(c, found);
        if (best === undefined || better(own, best, c.scale)) best = own;
      }
      out[i] = best!;
      previous = best!.frame;
    }
    return out;
  };
  const indices = Array.from({ length: n }, (_, i) => i);
  const forward = sweep(indices);
  const backward = sweep([...indices].reverse());

  const result: CutResult = {
    path,
    axis: track.axis,
    t: new Float64Array(n),
    s: new Float64Array(n),
    x: new Float64Array(n),
    y: new Float64Array(n),
    energy: new Float64Array(n),
    slope: new Float64Array(n),
    groups: new Float64Array(ORDER_GROUPS.length * n),
    canting: new Float64Array(n),
    gap: new Float64Array(n),
    labels: new Array<string>(n),
    transitions: [],
  };
  const frames: Float64Array[] = [];
  const scratch = new PixelScratch();
  for (let i = 0; i < n; i++) {
    const t = tAt(i);
    const c = track.at(t);
    const pick = better(backward[i]!, forward[i]!, c.scale) ? backward[i]! : forward[i]!;
    frames.push(pick.frame);
    const summary = summarise(c, pick.frame, nf, scratch);
    const o = scratch.order;
    const [x, y] = track.point(t);
    result.t[i] = t;
    result.s[i] = track.s(t);
    result.x[i] = x;
    result.y[i] = y;
    result.energy[i] = summary.energy;
    result.slope[i] = track.slope(t, o);
    result.groups.set(groupMagnitudes(o), ORDER_GROUPS.length * i);
    result.canting[i] = orderAngles(o).canting;
    result.gap[i] = summary.gap;
    result.labels[i] = summary.label;
  }
  for (let i = 0; i + 1 < n; i++) {
    const near = result.labels[i]!;
    const far = result.labels[i + 1]!;
    if (near === far) continue;
    const t0 = tAt(i);
    const t1 = tAt(i + 1);
    const located = locateTransitions(
      (u) => track.at(t0 + u * (t1 - t0)),
      nf,
      { frame: frames[i]!, label: near },
      { frame: frames[i + 1]!, label: far },
      BISECTION_TOLERANCE * (n - 1),
    );
    for (const transition of located) {
      const t = t0 + transition.t * (t1 - t0);
      const [x, y] = track.point(t);
      result.transitions.push({
        t,
        s: track.s(t),
        x,
        y,
        between: [transition.near, transition.far],
        order: transition.order,
      });
    }
  }
  return result;
}
