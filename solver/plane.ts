import { channelIndex } from './channels';
import {
  couplingArrays,
  couplingsFromArrays,
  type CouplingArrays,
  type Couplings,
} from './couplings';
import {
  ModelError,
  finiteNumber,
  isPlainObject,
  occupiedCount,
  parseModel,
  type Model,
} from './model';

/**
 * A two-coupling plane (interfaces.md `map`): an axis value t sets every target to
 * coefficient * t (targets `CH.hartree`, `CH.fock`, `zeeman`, `valleyZeeman`). When both axes
 * name the same target their contributions add.
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

/** Largest grid side accepted (a 2048 x 2048 map holds 4 million states). */
export const MAX_RESOLUTION = 2048;

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
      `${field}.${name}: unknown target; use CH.hartree, CH.fock (CH a channel such as x0), zeeman or valleyZeeman`,
    );
  }
}

function parseAxis(json: unknown, field: string): Axis {
  if (!isPlainObject(json)) throw new ModelError(`${field}: expected an axis object`);
  for (const key of Object.keys(json)) {
    if (!['label', 'from', 'to', 'targets'].includes(key)) {
      throw new ModelError(`${field}.${key}: unknown field; an axis has label, from, to, targets`);
    }
  }
  const label = json.label === undefined ? '' : json.label;
  if (typeof label !== 'string') throw new ModelError(`${field}.label: expected a string`);
  const from = finiteNumber(json.from, `${field}.from`);
  const to = finiteNumber(json.to, `${field}.to`);
  if (from === to) throw new ModelError(`${field}.to: must differ from ${field}.from`);
  if (!isPlainObject(json.targets) || Object.keys(json.targets).length === 0) {
    throw new ModelError(`${field}.targets: expected a non-empty object of target coefficients`);
  }
  const targets: Record<string, number> = {};
  for (const [name, coefficient] of Object.entries(json.targets)) {
    parseTarget(name, `${field}.targets`);
    targets[name] = finiteNumber(coefficient, `${field}.targets.${name}`);
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
      `${field}: expected an integer from 2 to ${MAX_RESOLUTION}, got ${String(value)}`,
    );
  }
  return value;
}

export function parsePlane(json: unknown, field = 'plane'): Plane {
  if (!isPlainObject(json))
    throw new ModelError(`${field}: missing or not an object (a map needs a plane)`);
  for (const key of Object.keys(json)) {
    if (!['x', 'y', 'resolution'].includes(key)) {
      throw new ModelError(`${field}.${key}: unknown field; a plane has x, y, resolution`);
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
  return { model, plane: parsePlane((json as Record<string, unknown>).plane) };
}

/** Grid coordinate i of an axis with n points: the centre of cell i. */
export function axisValue(axis: Axis, n: number, i: number): number {
  return axis.from + ((i + 0.5) * (axis.to - axis.from)) / n;
}

/** Builds couplings at plane points, reusing scratch arrays. */
export class PlaneCouplings {
  private readonly base: CouplingArrays;
  private readonly work: CouplingArrays;
  private readonly nf: number;
  private readonly exchange: number;
  private readonly slots: {
    array: 'hartree' | 'fock' | 'eta';
    index: number;
    x: number;
    y: number;
  }[] = [];

  constructor(readonly input: MapInput) {
    this.base = couplingArrays(input.model);
    this.work = couplingArrays(input.model);
    this.nf = occupiedCount(input.model);
    this.exchange = input.model.exchange ?? 0;
    const slot = (name: string) => {
      if (name === 'zeeman') return { array: 'eta' as const, index: 3, factor: -0.5 };
      if (name === 'valleyZeeman') return { array: 'eta' as const, index: 12, factor: -0.5 };
      const [channel, part] = name.split('.');
      return { array: part as 'hartree' | 'fock', index: channelIndex(channel!), factor: 1 };
    };
    const all = new Set([
      ...Object.keys(input.plane.x.targets),
      ...Object.keys(input.plane.y.targets),
    ]);
    for (const name of all) {
      const s = slot(name);
      this.slots.push({
        array: s.array,
        index: s.index,
        x: (input.plane.x.targets[name] ?? 0) * s.factor,
        y: (input.plane.y.targets[name] ?? 0) * s.factor,
      });
    }
  }

  /** Couplings at axis values (x, y). */
  at(x: number, y: number): Couplings {
    const { base, work } = this;
    work.hartree.set(base.hartree);
    work.fock.set(base.fock);
    work.eta.set(base.eta);
    // A target is set by the axes, replacing the model's own value.
    for (const s of this.slots) work[s.array][s.index] = 0;
    for (const s of this.slots)
      work[s.array][s.index] = work[s.array][s.index]! + s.x * x + s.y * y;
    if (this.slots.some((s) => s.array === 'eta' && s.index === 3)) {
      // zeeman targets replace E_Z but keep any oneBody 0z term of the model.
      work.eta[3] = work.eta[3]! + (this.input.model.oneBody['0z'] ?? 0);
    }
    if (this.slots.some((s) => s.array === 'eta' && s.index === 12)) {
      work.eta[12] = work.eta[12]! + (this.input.model.oneBody['z0'] ?? 0);
    }
    return couplingsFromArrays(this.nf, work, this.exchange);
  }
}
