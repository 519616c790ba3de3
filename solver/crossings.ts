import type { Couplings } from './couplings';
import { DEFAULT_DESCENT, descend } from './localMinimise';
import { DescentWorkspace } from './tangentSpace';
import { DEFAULT_MINIMISE, minimiseEnergy } from './minimise';
import { ORDER_GROUPS, presentGroupCount } from './orderParameters';
import { channelIndex } from './channels';
import { ORDER_TOLERANCE, phaseLabel } from './phaseLabel';
import { DEGENERACY_TOLERANCE, softDirections } from './degeneracy';
import { axisValue, PlaneCouplings, type MapInput } from './plane';
import { orderOfProjector, projectorOf } from './state';

/** A located transition on one pixel edge. */
export interface Crossing {
  /** Edge id: 2 p for the edge from pixel p to p + 1, 2 p + 1 from p to p + nx. */
  readonly edge: number;
  readonly x: number;
  readonly y: number;
  /** Labels on the near (p) and far side of the crossing. */
  readonly near: string;
  readonly far: string;
  readonly order: 'first' | 'continuous';
}

/** Order-parameter jump above which a transition counts as first order. */
export const FIRST_ORDER_JUMP = 1e-2;

/** An order-parameter jump at least this large is first order without a closer look. */
export const CLEAR_JUMP = 0.3;

/** How much narrower than the tolerance a bracket may get to type an unclear jump. */
const TYPING_NARROWING = 1e-3;

/** Relative bracket width (of the axis span) at which bisection stops. */
export const BISECTION_TOLERANCE = 1e-9;

/**
 * Stage 3: locate the transitions on the given edges. `endFrames` holds, per edge, the frames of
 * its near and far pixel (64 numbers); `endLabels` their labels. Bisection stops when the
 * bracket is narrower than `relativeTolerance` times the axis span.
 */
export function locateCrossings(
  input: MapInput,
  edges: Int32Array,
  endFrames: Float64Array,
  endLabels: readonly string[],
  relativeTolerance = BISECTION_TOLERANCE,
): Crossing[] {
  const [nx, ny] = input.plane.resolution;
  const nf = input.model.filling + 2;
  const planeCouplings = new PlaneCouplings(input);
  const out: Crossing[] = [];
  for (let e = 0; e < edges.length; e++) {
    const edge = edges[e]!;
    const pixel = edge >> 1;
    const vertical = (edge & 1) === 1;
    const i = pixel % nx;
    const j = Math.floor(pixel / nx);
    const x0 = axisValue(input.plane.x, nx, i);
    const y0 = axisValue(input.plane.y, ny, j);
    const x1 = vertical ? x0 : axisValue(input.plane.x, nx, i + 1);
    const y1 = vertical ? axisValue(input.plane.y, ny, j + 1) : y0;
    const near = endLabels[2 * e]!;
    const far = endLabels[2 * e + 1]!;
    const located = locateTransitions(
      (t) => planeCouplings.at(x0 + t * (x1 - x0), y0 + t * (y1 - y0)),
      nf,
      { frame: endFrames.slice(64 * e, 64 * e + 32), label: near },
      { frame: endFrames.slice(64 * e + 32, 64 * e + 64), label: far },
      relativeTolerance * (vertical ? ny : nx),
    );
    for (const transition of located) {
      const t = transition.t;
      out.push({
        edge,
        x: x0 + t * (x1 - x0),
        y: y0 + t * (y1 - y0),
        near: transition.near,
        far: transition.far,
        order: transition.order,
      });
    }
  }
  return out;
}

/** One end of a bracket: a converged frame (32 numbers) and its phase label. */
export interface BracketEnd {
  readonly frame: Float64Array;
  readonly label: string;
}

/** A transition located inside [0, 1] by `bisectTransition`. */
export interface LocatedTransition {
  /** Midpoint of the final bracket. */
  readonly t: number;
  readonly order: 'first' | 'continuous';
  /** Frames at the final bracket's ends (near side, far side). */
  readonly frameNear: Float64Array;
  readonly frameFar: Float64Array;
  /**
   * A third phase met inside the bracket (not a degenerate member of the ends' families): the
   * search stopped there; `locateTransitions` splits the bracket at it.
   */
  readonly third?: { readonly t: number; readonly frame: Float64Array; readonly label: string };
}

/**
 * Scratch of `bisectTransition`, reused from call to call (a Map locates a transition on every
 * edge where the label changes, and the workspace alone is some twenty arrays). Never used by
 * two calls at once: the function does not call itself, and JavaScript runs one call at a time.
 */
const bisectionScratch = {
  p: new Float64Array(32),
  orderNear: new Float64Array(16),
  orderFar: new Float64Array(16),
  ws: new DescentWorkspace(),
  branchNear: new Float64Array(32),
  branchFar: new Float64Array(32),
  orderA: new Float64Array(16),
};

/**
 * Locates the transition between the states `nearEnd` (at t = 0) and `farEnd` (at t = 1) along
 * couplings `at(t)`, to a bracket narrower than `tolerance` (in t). Both branches are continued
 * from the bracket ends at every probe; when both are distinct local minima the root of their
 * energy difference is found by regula falsi, otherwise by bisection. Typed first order when the
 * order parameters jump by more than FIRST_ORDER_JUMP across the final bracket. `at` may reuse
 * one object between calls.
 */
export function bisectTransition(
  at: (t: number) => Couplings,
  nf: number,
  nearEnd: BracketEnd,
  farEnd: BracketEnd,
  tolerance: number,
): LocatedTransition {
  const { p, orderNear, orderFar, ws, branchNear, branchFar, orderA } = bisectionScratch;
  // Branches are continued without leaving saddles (a branch that has become a saddle is not
  // the ground state), converged tightly and polished so that soft modes near a continuous
  // transition do not blur the labels.
  const branch = { ...DEFAULT_DESCENT, escapeSaddles: false, polishSteps: 1 };
  const near = nearEnd.label;
  const far = farEnd.label;
  let lo = 0;
  let hi = 1;
  let frameNear: Float64Array = Float64Array.from(nearEnd.frame);
  let frameFar: Float64Array = Float64Array.from(farEnd.frame);
  // Energy difference of the two branches (near minus far) at the bracket ends, when both
  // are distinct local minima there: a first-order transition is its root.
  let gapLo: number | undefined;
  let gapHi: number | undefined;
  let third: { t: number; frame: Float64Array; label: string } | undefined;
  // A continuous transition: the groups one end breaks and the other does not. In mean field
  // their squared magnitude m grows linearly away from the transition, so the last two probes
  // on the broken side extrapolate to its position (a secant step, much faster than halving).
  const broken = brokenChannels(nearEnd.frame, farEnd.frame, nf);
  const brokenLabel = broken === undefined ? undefined : broken.nearBroken ? near : far;
  const samples: { t: number; m: number }[] = [];
  let sampleCount = 0;
  const probe = (t: number): void => {
    if (third !== undefined) return;
    const c = at(t);
    branchNear.set(frameNear);
    branchFar.set(frameFar);
    const a = descend(c, branchNear, branch, ws);
    orderA.set(ws.order);
    const b = descend(c, branchFar, branch, ws);
    let frame: Float64Array;
    let difference: number | undefined;
    // Two distinct critical points (minima, or a branch that has become a saddle beyond the
    // transition, as a rigid state past a level crossing is): the root of their energy
    // difference is the first-order transition, found by regula falsi below.
    const critical = 1e-9 * c.scale;
    if (!(a.converged && b.converged) && a.gradient <= critical && b.gradient <= critical) {
      let distance = 0;
      for (let k = 1; k < 16; k++)
        distance = Math.max(distance, Math.abs(orderA[k]! - ws.order[k]!));
      if (distance > FIRST_ORDER_JUMP) difference = a.energy - b.energy;
    }
    if (a.converged && b.converged) {
      let distance = 0;
      for (let k = 1; k < 16; k++)
        distance = Math.max(distance, Math.abs(orderA[k]! - ws.order[k]!));
      if (distance > FIRST_ORDER_JUMP) {
        difference = a.energy - b.energy;
        frame = a.energy <= b.energy ? branchNear : branchFar;
      } else if (Math.abs(a.energy - b.energy) <= 1e-12 * c.scale) {
        // One basin, energies equal to rounding: near a continuous transition the broken
        // branch relaxes only as fast as its quartic energy allows and stops with a residual
        // order parameter while the symmetric state is already a minimum. The simpler state
        // wins (the symmetric one is not a minimum on the broken side: it fails the curvature
        // test of `descend` there).
        const groupsB = presentGroupCount(ws.order, ORDER_TOLERANCE);
        frame = presentGroupCount(orderA, ORDER_TOLERANCE) <= groupsB ? branchNear : branchFar;
      } else frame = a.energy < b.energy ? branchNear : branchFar;
    } else if (a.converged) frame = branchNear;
    else if (b.converged) frame = branchFar;
    else {
      frame = minimiseEnergy(c, DEFAULT_MINIMISE, {
        warmStarts: [frameNear, frameFar],
        gradientTolerance: 1e-12,
        polishSteps: 1,
      }).frame;
    }
    orderOfProjector(projectorOf(frame, nf, p), orderNear);
    let label = phaseLabel(orderNear, c);
    if (label !== near && label !== far) {
      const degenerate =
        a.converged &&
        b.converged &&
        Math.abs(a.energy - b.energy) <= DEGENERACY_TOLERANCE * c.scale;
      if (degenerate || softDirections(c, frame) > 0) {
        // Within rounding of a line where the two end states are degenerate (for H = F,
        // uZ = uPerp joins KD and CDW by a valley rotation) a descent may stop part-way along
        // the flat direction: the state belongs to the end it is closer to.
        label = closerEnd(orderNear, frameNear, frameFar, nf) ? near : far;
      } else {
        // A third phase inside the bracket: the caller splits the bracket there.
        third = { t, frame: Float64Array.from(frame), label };
        return;
      }
    }
    if (broken !== undefined && label === brokenLabel) {
      let m = 0;
      for (const k of broken.channels) m += orderNear[k]! * orderNear[k]!;
      samples.push({ t, m });
      sampleCount++;
      if (samples.length > 3) samples.shift();
    }
    if (label === near) {
      lo = t;
      frameNear = Float64Array.from(frame);
      gapLo = difference !== undefined && difference < 0 ? difference : undefined;
    } else {
      hi = t;
      frameFar = Float64Array.from(frame);
      gapHi = difference !== undefined && difference > 0 ? difference : undefined;
    }
  };
  // The secant's root, when it lies inside the bracket or on the bracket's broken end (where
  // the transition sits when a probe hit it exactly); elsewhere the bracket is halved.
  const secantRoot = (): number => {
    const n = samples.length;
    const s1 = samples[n - 2]!;
    const s2 = samples[n - 1]!;
    if (n === 3) {
      // Inverse quadratic interpolation t(m) through three samples, at m = 0 (as in Brent's
      // method; Brent, Algorithms for Minimization without Derivatives, Prentice-Hall (1973)):
      // it follows the curvature of m(t) that makes a secant overshoot.
      const s0 = samples[0]!;
      if (s0.m !== s1.m && s0.m !== s2.m) {
        return (
          (s0.t * s1.m * s2.m) / ((s0.m - s1.m) * (s0.m - s2.m)) +
          (s1.t * s0.m * s2.m) / ((s1.m - s0.m) * (s1.m - s2.m)) +
          (s2.t * s0.m * s1.m) / ((s2.m - s0.m) * (s2.m - s1.m))
        );
      }
    }
    return s2.t - (s2.m * (s2.t - s1.t)) / (s2.m - s1.m);
  };
  // Each pair of samples is used once: when its probes both land on the symmetric side (the
  // bending curve makes the secant overshoot that way), the next step halves the bracket.
  let usedSamples = -1;
  const secantInside = (): boolean => {
    if (usedSamples === sampleCount) return false;
    const root = secantRoot();
    const brokenAtHigh = brokenLabel === far;
    return (root > lo && root < hi) || (brokenAtHigh ? root <= lo : root >= hi);
  };
  for (let guard = 0; hi - lo > tolerance && guard < 200 && third === undefined; guard++) {
    if (gapLo !== undefined && gapHi !== undefined) {
      // Regula falsi on the branch energy difference, then two probes just either side of
      // the estimate to close the bracket; fall back to bisection if it did not halve.
      const width = hi - lo;
      const estimate = lo + (width * gapLo) / (gapLo - gapHi);
      const margin = 0.01 * tolerance;
      probe(Math.min(hi - margin, Math.max(lo + margin, estimate - 0.4 * tolerance)));
      if (hi - lo > tolerance) {
        const second = Math.min(hi - margin, Math.max(lo + margin, estimate + 0.4 * tolerance));
        if (second > lo && second < hi) probe(second);
      }
      if (hi - lo > width / 2) probe((lo + hi) / 2);
    } else if (
      samples.length >= 2 &&
      samples[samples.length - 2]!.m !== samples[samples.length - 1]!.m &&
      secantInside()
    ) {
      // Secant on m(t) through the two latest broken-side probes, then two probes just either
      // side of its root; bisection where that did not halve the bracket.
      const width = hi - lo;
      const estimate = secantRoot();
      usedSamples = sampleCount;
      const margin = 0.01 * tolerance;
      const clamp = (u: number): number => Math.min(hi - margin, Math.max(lo + margin, u));
      probe(clamp(estimate - 0.4 * tolerance));
      if (hi - lo > tolerance) {
        const second = clamp(estimate + 0.4 * tolerance);
        if (second > lo && second < hi) probe(second);
      }
      if (hi - lo > width / 2) probe((lo + hi) / 2);
    } else {
      probe((lo + hi) / 2);
    }
  }
  const jumpAcross = (): number => {
    orderOfProjector(projectorOf(frameNear, nf, p), orderNear);
    orderOfProjector(projectorOf(frameFar, nf, p), orderFar);
    let largest = 0;
    for (let k = 1; k < 16; k++) {
      largest = Math.max(largest, Math.abs(orderNear[k]! - orderFar[k]!));
    }
    return largest;
  };
  // In mean field a continuous transition's order parameter grows as the square root of the
  // distance, so across a coarse bracket (the browser's) it can step by more than
  // FIRST_ORDER_JUMP. A step that is not clearly first order is measured again on a bracket up
  // to a thousand times narrower: a square-root onset shrinks about thirty-fold there, a
  // genuine jump stays.
  if (third !== undefined) {
    return { t: third.t, order: 'first', frameNear, frameFar, third };
  }
  let jump = jumpAcross();
  const fine = tolerance * TYPING_NARROWING;
  for (
    let guard = 0;
    jump > FIRST_ORDER_JUMP && jump < CLEAR_JUMP && hi - lo > fine && guard < 40 && !third;
    guard++
  ) {
    probe((lo + hi) / 2);
    jump = jumpAcross();
  }
  return {
    t: (lo + hi) / 2,
    order: jump > FIRST_ORDER_JUMP ? 'first' : 'continuous',
    frameNear,
    frameFar,
  };
}

/** A transition of `locateTransitions`: where, of which kind, and between which labels. */
export interface EdgeTransition {
  readonly t: number;
  readonly order: 'first' | 'continuous';
  readonly near: string;
  readonly far: string;
}

/** Deepest nesting of brackets split at a third phase. */
const MAX_SPLITS = 6;

/**
 * Every transition between `nearEnd` (t = 0) and `farEnd` (t = 1), in order of t: where a probe
 * of the bisection meets a third phase (not a member of a degenerate family of the ends), the
 * bracket is split there and each part is located on its own, so a narrow phase between two
 * grid points gives its two transitions, each typed with its own pair of labels.
 */
export function locateTransitions(
  at: (t: number) => Couplings,
  nf: number,
  nearEnd: BracketEnd,
  farEnd: BracketEnd,
  tolerance: number,
): EdgeTransition[] {
  const out: EdgeTransition[] = [];
  const visit = (t0: number, t1: number, a: BracketEnd, b: BracketEnd, depth: number): void => {
    const width = t1 - t0;
    const located = bisectTransition((u) => at(t0 + u * width), nf, a, b, tolerance / width);
    const third = located.third;
    if (third === undefined || depth >= MAX_SPLITS) {
      out.push({ t: t0 + located.t * width, order: located.order, near: a.label, far: b.label });
      return;
    }
    const middle = { frame: third.frame, label: third.label };
    const tm = t0 + third.t * width;
    visit(t0, tm, a, middle, depth + 1);
    visit(tm, t1, middle, b, depth + 1);
  };
  visit(0, 1, nearEnd, farEnd, 0);
  return out;
}

/**
 * Channels of the order-parameter groups present at exactly one end (and whether that end is
 * the near one), when only one end has groups the other lacks: the order parameter of a
 * continuous transition between them. Undefined otherwise.
 */
function brokenChannels(
  near: Float64Array,
  far: Float64Array,
  nf: number,
): { channels: number[]; nearBroken: boolean } | undefined {
  const p = new Float64Array(32);
  const on = orderOfProjector(projectorOf(near, nf, p), new Float64Array(16));
  const of = orderOfProjector(projectorOf(far, nf, p), new Float64Array(16));
  const onlyNear: number[] = [];
  const onlyFar: number[] = [];
  for (const group of ORDER_GROUPS) {
    const indices = group.channels.map(channelIndex);
    const size = (o: Float64Array): number => Math.hypot(...indices.map((k) => o[k]!));
    const inNear = size(on) > ORDER_TOLERANCE;
    const inFar = size(of) > ORDER_TOLERANCE;
    if (inNear && !inFar) onlyNear.push(...indices);
    if (inFar && !inNear) onlyFar.push(...indices);
  }
  if (onlyNear.length > 0 && onlyFar.length === 0) return { channels: onlyNear, nearBroken: true };
  if (onlyFar.length > 0 && onlyNear.length === 0) return { channels: onlyFar, nearBroken: false };
  return undefined;
}

/** Whether `order` lies closer (max norm) to the state of frame `a` than to that of `b`. */
function closerEnd(order: Float64Array, a: Float64Array, b: Float64Array, nf: number): boolean {
  const p = new Float64Array(32);
  const oa = orderOfProjector(projectorOf(a, nf, p), new Float64Array(16));
  const ob = orderOfProjector(projectorOf(b, nf, p), new Float64Array(16));
  let da = 0;
  let db = 0;
  for (let k = 1; k < 16; k++) {
    da = Math.max(da, Math.abs(order[k]! - oa[k]!));
    db = Math.max(db, Math.abs(order[k]! - ob[k]!));
  }
  return da <= db;
}

/** Edges (ids as in Crossing) between differently labelled neighbours, ascending. */
export function boundaryEdges(labels: readonly string[], nx: number, ny: number): Int32Array {
  const out: number[] = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const p = j * nx + i;
      if (i + 1 < nx && labels[p] !== labels[p + 1]) out.push(2 * p);
      if (j + 1 < ny && labels[p] !== labels[p + nx]) out.push(2 * p + 1);
    }
  }
  return Int32Array.from(out);
}
