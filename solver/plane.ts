import { channelIndex, type Channel } from './channels';
import {
  couplingArrays,
  couplingsFromArrays,
  energyOfOrder,
  type CouplingArrays,
  type Couplings,
} from './couplings';
import { describeInput, fieldKey } from './inputText';
import {
  MAX_MAGNITUDE,
  ModelError,
  finiteNumber,
  isPlainObject,
  occupiedCount,
  parseModel,
  type ChannelCoupling,
  type Model,
} from './model';

/**
 * A two-coupling plane (a model file's `plane`): an axis value t sets every target to
 * coefficient * t (targets `CH.hartree`, `CH.fock`, `zeeman`, `valleyZeeman`). When both axes
 * name the same target their contributions add. Where the axes set only one part of a channel
 * the other part follows `planeTargets`.
 */
export interface Axis {
  readonly label: string;
  readonly from: number;
  readonly to: number;
  readonly targets: Readonly<Record<string, number>>;
}

export interface Plane {
  readonly x: Axis;
  readonly y: Axis;
  /** [nx, ny] grid points, sampled at cell centres. */
  readonly resolution: readonly [number, number];
}

export interface MapInput {
  readonly model: Model;
  readonly plane: Plane;
}

/** Smallest axis span accepted (a normal double-precision number, with room to spare). */
export const MIN_SPAN = 1e-250;

/**
 * Largest grid side accepted. The command line computes a Map in bands of at most 128 pixel rows
 * (`computeMapRows`) and streams its JSON and CSV, so its memory grows with the grid's width,
 * not its area: at 8192 a band holds some 150 MB and one shard's run peaks near 0.5 GB.
 */
export const MAX_RESOLUTION = 8192;

/**
 * Largest grid side of a Map held whole in memory (a 2048 x 2048 Map holds 4 million states):
 * its figure, a series with its figure of small multiples, a fit's Maps.
 */
export const MAX_WHOLE_RESOLUTION = 2048;

/**
 * Why a plane's grid is too large for `what` (something that holds the whole Map, such as "a
 * figure draws"), as one line naming the side, its value and MAX_WHOLE_RESOLUTION, followed by
 * `instead`; null when it is not.
 */
export function wholeMapProblem(plane: Plane, what: string, instead: string): string | null {
  const k = plane.resolution.findIndex((side) => side > MAX_WHOLE_RESOLUTION);
  if (k < 0) return null;
  return `plane.resolution[${k}]: ${plane.resolution[k]} is more than ${what} (at most ${MAX_WHOLE_RESOLUTION} per side); ${instead}`;
}

function parseTarget(name: string, field: string): void {
  if (name === 'zeeman' || name === 'valleyZeeman') return;
  const [channel, part, extra] = name.split('.');
  if (
    extra !== undefined ||
    channel === undefined ||
    channelIndex(channel) < 0 ||
    (part !== 'hartree' && part !== 'fock')
  ) {
    throw new ModelError(
      `${field}.${fieldKey(name)}: unknown target; use CH.hartree, CH.fock (CH a channel such as x0), zeeman or valleyZeeman`,
    );
  }
}

function parseAxis(json: unknown, field: string): Axis {
  if (!isPlainObject(json)) throw new ModelError(`${field}: expected an axis object`);
  for (const key of Object.keys(json)) {
    if (!['label', 'from', 'to', 'targets'].includes(key)) {
      throw new ModelError(
        `${field}.${fieldKey(key)}: unknown field; an axis has label, from, to, targets`,
      );
    }
  }
  const label = json.label === undefined ? '' : json.label;
  if (typeof label !== 'string') throw new ModelError(`${field}.label: expected a string`);
  const from = finiteNumber(json.from, `${field}.from`);
  const to = finiteNumber(json.to, `${field}.to`);
  if (from === to) throw new ModelError(`${field}.to: must differ from ${field}.from`);
  // Grid points must be distinct numbers: a span that rounding swallows would put them all at
  // one point (or, below the smallest normal number, give no usable step at all).
  const span = Math.abs(to - from);
  if (span < 1e-12 * Math.max(Math.abs(from), Math.abs(to)) || span < MIN_SPAN) {
    throw new ModelError(
      `${field}: the range ${from} to ${to} is too narrow to resolve (its span must be at least 1e-12 of its ends and at least ${MIN_SPAN})`,
    );
  }
  if (!isPlainObject(json.targets) || Object.keys(json.targets).length === 0) {
    throw new ModelError(`${field}.targets: expected a non-empty object of target coefficients`);
  }
  const targets: Record<string, number> = {};
  for (const [name, coefficient] of Object.entries(json.targets)) {
    parseTarget(name, `${field}.targets`);
    const value = finiteNumber(coefficient, `${field}.targets.${name}`);
    const reach = Math.abs(value) * Math.max(Math.abs(from), Math.abs(to));
    if (reach > MAX_MAGNITUDE) {
      throw new ModelError(
        `${field}.targets.${name}: coefficient ${value} times the axis end reaches ${reach.toPrecision(3)}, beyond the supported range (magnitude at most ${MAX_MAGNITUDE})`,
      );
    }
    targets[name] = value;
  }
  return Object.freeze({ label, from, to, targets: Object.freeze(targets) });
}

function parseSide(value: unknown, field: string): number {
  if (
    typeof value !== 'number' ||
    !Number.isInteger(value) ||
    value < 2 ||
    value > MAX_RESOLUTION
  ) {
    throw new ModelError(
      `${field}: expected an integer from 2 to ${MAX_RESOLUTION}, got ${describeInput(value)}`,
    );
  }
  return value;
}

export function parsePlane(json: unknown, field = 'plane'): Plane {
  if (!isPlainObject(json))
    throw new ModelError(`${field}: missing or not an object (a map needs a plane)`);
  for (const key of Object.keys(json)) {
    if (!['x', 'y', 'resolution'].includes(key)) {
      throw new ModelError(
        `${field}.${fieldKey(key)}: unknown field; a plane has x, y, resolution`,
      );
    }
  }
  const x = parseAxis(json.x, `${field}.x`);
  const y = parseAxis(json.y, `${field}.y`);
  let resolution: [number, number] = [256, 256];
  if (json.resolution !== undefined) {
    const r = json.resolution;
    if (typeof r === 'number') resolution = [parseSide(r, `${field}.resolution`), r];
    else if (Array.isArray(r) && r.length === 2) {
      resolution = [
        parseSide(r[0], `${field}.resolution[0]`),
        parseSide(r[1], `${field}.resolution[1]`),
      ];
    } else throw new ModelError(`${field}.resolution: expected [nx, ny]`);
  }
  return Object.freeze({
    x,
    y,
    resolution: Object.freeze(resolution) as readonly [number, number],
  });
}

/** Model plus plane from one document (the model file of `map`). */
export function parseMapInput(json: unknown): MapInput {
  const model = parseModel(json);
  const input = { model, plane: parsePlane((json as Record<string, unknown>).plane) };
  planeTargets(input);
  return input;
}

/** The targets each axis sets per unit of its value, once the rule of `planeTargets` is applied. */
export interface PlaneTargets {
  readonly x: Readonly<Record<string, number>>;
  readonly y: Readonly<Record<string, number>>;
}

/**
 * The targets the axes set, with the rule for a channel of which the axes set only one part
 * (the same rule as the model file's channels):
 * - the other part is the model's own value in `channels`;
 * - a channel absent from `channels` follows "a missing hartree equals fock": its Hartree part
 *   follows the axes' Fock targets (each axis that sets `CH.fock` also sets `CH.hartree` with
 *   the same coefficient);
 * - `CH.hartree` set for a channel absent from `channels` with no `CH.fock` target anywhere is
 *   an error, as "hartree alone" is in a channel (ModelError naming the target).
 * Two axes that name the same target add their contributions.
 */
export function planeTargets(input: MapInput): PlaneTargets {
  const { model, plane } = input;
  const named = new Set([...Object.keys(plane.x.targets), ...Object.keys(plane.y.targets)]);
  const follows = (axis: Axis): Record<string, number> => {
    const out: Record<string, number> = { ...axis.targets };
    for (const [name, coefficient] of Object.entries(axis.targets)) {
      const [channel, part] = name.split('.');
      if (part !== 'fock' || model.channels[channel as Channel] !== undefined) continue;
      if (!named.has(`${channel}.hartree`)) out[`${channel}.hartree`] = coefficient;
    }
    return out;
  };
  for (const [which, axis] of [
    ['x', plane.x],
    ['y', plane.y],
  ] as const) {
    for (const name of Object.keys(axis.targets)) {
      const [channel, part] = name.split('.');
      if (part !== 'hartree' || model.channels[channel as Channel] !== undefined) continue;
      if (!named.has(`${channel}.fock`)) {
        throw new ModelError(
          `plane.${which}.targets.${name}: a Hartree part alone; ${channel} is not in channels and no axis sets ${channel}.fock (add channels.${channel} or a ${channel}.fock target)`,
        );
      }
    }
  }
  return { x: follows(plane.x), y: follows(plane.y) };
}

/** Grid coordinate i of an axis with n points: the centre of cell i. */
export function axisValue(axis: Axis, n: number, i: number): number {
  return axis.from + ((i + 0.5) * (axis.to - axis.from)) / n;
}

/**
 * Builds couplings at plane points. Everything in Couplings is linear in the targets, so the
 * base model and the two axis directions are reduced once and each point costs a few dozen
 * multiply-adds. `at` returns the same object each call, overwritten: use it before the next.
 */
export class PlaneCouplings {
  private readonly base: Couplings;
  private readonly dx: Couplings;
  private readonly dy: Couplings;
  private readonly point: {
    -readonly [K in keyof Couplings]: Couplings[K];
  };
  /** Occupied flavours per flux quantum, Nf = nu + 2. */
  readonly nf: number;
  /** The point `point` holds (NaN before the first call). */
  private lastX = NaN;
  private lastY = NaN;
  /**
   * The indices k at which an axis moves a coupling (every other entry of `point` keeps the
   * base value it was built with), and the largest base coupling among the others.
   */
  private readonly moving: Int32Array;
  private readonly fixedScale: number;

  constructor(readonly input: MapInput) {
    const nf = occupiedCount(input.model);
    this.nf = nf;
    const exchange = input.model.exchange ?? 0;
    const baseArrays = couplingArrays(input.model);
    const targetSlot = (
      name: string,
    ): { array: keyof CouplingArrays; index: number; factor: number } => {
      if (name === 'zeeman') return { array: 'eta', index: 3, factor: -0.5 };
      if (name === 'valleyZeeman') return { array: 'eta', index: 12, factor: -0.5 };
      const [channel, part] = name.split('.');
      return { array: part as 'hartree' | 'fock', index: channelIndex(channel!), factor: 1 };
    };
    const targets = planeTargets(input);
    const names = new Set([...Object.keys(targets.x), ...Object.keys(targets.y)]);
    // A target is set by the axes, replacing the model's own value (a oneBody term on the same
    // matrix stays: it is separate from E_Z and Delta_V).
    for (const name of names) {
      const slot = targetSlot(name);
      baseArrays[slot.array][slot.index] =
        slot.array === 'eta' ? (input.model.oneBody[slot.index === 3 ? '0z' : 'z0'] ?? 0) : 0;
    }
    const direction = (axisTargets: Readonly<Record<string, number>>): CouplingArrays => {
      const arrays: CouplingArrays = {
        hartree: new Float64Array(16),
        fock: new Float64Array(16),
        eta: new Float64Array(16),
      };
      for (const [name, coefficient] of Object.entries(axisTargets)) {
        const slot = targetSlot(name);
        arrays[slot.array][slot.index] =
          arrays[slot.array][slot.index]! + coefficient * slot.factor;
      }
      return arrays;
    };
    this.base = couplingsFromArrays(nf, baseArrays, exchange);
    this.dx = couplingsFromArrays(nf, direction(targets.x), 0);
    this.dy = couplingsFromArrays(nf, direction(targets.y), 0);
    this.point = couplingsFromArrays(nf, baseArrays, exchange);
    const { base, dx, dy } = this;
    const moving: number[] = [];
    let fixedScale = 0;
    for (let k = 0; k < 16; k++) {
      const moves = [dx, dy].some(
        (d) => d.hartree[k] !== 0 || d.fock[k] !== 0 || d.eta[k] !== 0 || d.kappa[k] !== 0,
      );
      if (moves) moving.push(k);
      else if (k > 0) {
        fixedScale = Math.max(
          fixedScale,
          Math.abs(base.hartree[k]!),
          Math.abs(base.fock[k]!),
          Math.abs(base.eta[k]!),
        );
      }
    }
    this.moving = Int32Array.from(moving);
    this.fixedScale = fixedScale;
  }

  /**
   * The energy of a fixed state (order parameters `order`, index 0..15) over the plane is affine
   * in the axis values, since the energy at fixed P is linear in the couplings: returns
   * [e0, ex, ey] with E(x, y) = e0 + ex x + ey y.
   */
  affineEnergy(order: ArrayLike<number>, out: Float64Array = new Float64Array(3)): Float64Array {
    out[0] = energyOfOrder(this.base, order);
    out[1] = energyOfOrder(this.dx, order);
    out[2] = energyOfOrder(this.dy, order);
    return out;
  }

  /** Couplings at axis values (x, y). */
  at(x: number, y: number): Couplings {
    const { base, dx, dy, point } = this;
    // The Map asks for one pixel's couplings several times in a row.
    if (x === this.lastX && y === this.lastY) return point;
    this.lastX = x;
    this.lastY = y;
    let scale = this.fixedScale;
    const moving = this.moving;
    for (let n = 0; n < moving.length; n++) {
      const k = moving[n]!;
      point.hartree[k] = base.hartree[k]! + x * dx.hartree[k]! + y * dy.hartree[k]!;
      point.fock[k] = base.fock[k]! + x * dx.fock[k]! + y * dy.fock[k]!;
      point.eta[k] = base.eta[k]! + x * dx.eta[k]! + y * dy.eta[k]!;
      point.kappa[k] = base.kappa[k]! + x * dx.kappa[k]! + y * dy.kappa[k]!;
      if (k > 0) {
        scale = Math.max(
          scale,
          Math.abs(point.hartree[k]!),
          Math.abs(point.fock[k]!),
          Math.abs(point.eta[k]!),
        );
      }
    }
    point.c0 = base.c0 + x * dx.c0 + y * dy.c0;
    point.identityShift = base.identityShift + x * dx.identityShift + y * dy.identityShift;
    point.scale = Math.max(scale, 1e-300);
    return point;
  }
}

/**
 * The model a plane point stands for (the model file's plane, as `npm run map` reads it): every target set to
 * coefficient * t, summed over the axes that name it (with the rule of `planeTargets` for a
 * channel of which the axes set one part); everything else from the input's model.
 */
export function modelAtPoint(input: MapInput, x: number, y: number): Model {
  const channels: Partial<Record<Channel, ChannelCoupling>> = { ...input.model.channels };
  let zeeman = input.model.zeeman;
  let valleyZeeman = input.model.valleyZeeman;
  const targets = planeTargets(input);
  const set = new Map<string, number>();
  for (const [axisTargets, t] of [
    [targets.x, x],
    [targets.y, y],
  ] as const) {
    for (const [name, coefficient] of Object.entries(axisTargets)) {
      set.set(name, (set.get(name) ?? 0) + coefficient * t);
    }
  }
  for (const [name, value] of set) {
    if (name === 'zeeman') zeeman = value;
    else if (name === 'valleyZeeman') valleyZeeman = value;
    else {
      const [channel, part] = name.split('.') as [Channel, 'hartree' | 'fock'];
      const old = channels[channel] ?? { hartree: 0, fock: 0 };
      channels[channel] = { ...old, [part]: value };
    }
  }
  return { ...input.model, channels, zeeman, valleyZeeman };
}
