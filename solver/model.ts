import { CHANNELS, channelIndex, type Channel } from './channels';
import { describeInput as describe, fieldKey } from './inputText';

/** Filling factor nu of the zero-energy Landau level; it holds nu + 2 electrons per flux quantum. */
export type Filling = -1 | 0 | 1;

/** Hartree (direct) and Fock (exchange) couplings of one channel, energies per flux quantum. */
export interface ChannelCoupling {
  readonly hartree: number;
  readonly fock: number;
}

/**
 * One Hartree-Fock problem (public/notes.html#energy): couplings per channel, Zeeman energy E_Z
 * (full spin splitting), sublattice splitting Delta_V (positive lowers K, sublattice A), optional
 * extra one-body terms `sum c_ab G_ab`, the Coulomb exchange E_X (only shifts the gap) and the
 * Coulomb scale e^2 / (eps l_B) (only the finite-wavevector modes use it).
 * All energies in one unit of the user's choice.
 */
export interface Model {
  readonly filling: Filling;
  readonly channels: Readonly<Partial<Record<Channel, ChannelCoupling>>>;
  readonly zeeman: number;
  readonly valleyZeeman: number;
  readonly oneBody: Readonly<Partial<Record<Channel, number>>>;
  readonly exchange: number | undefined;
  /**
   * Coulomb scale e^2 / (eps l_B) of the SU(4)-symmetric interaction, >= 0, for the collective
   * modes at finite wavevector (public/notes.html#dispersion); undefined when the model sets none.
   */
  readonly coulomb?: number | undefined;
}

/** The first line of an error's message (or of its text), for a one-line report. */
export function errorLine(error: unknown): string {
  const text = error instanceof Error ? error.message : String(error);
  return text.split('\n', 1)[0]!;
}

/** A bad input; the message is one line that names the offending field. */
export class ModelError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ModelError';
  }
}

const MODEL_FIELDS = new Set([
  'filling',
  'channels',
  'zeeman',
  'valleyZeeman',
  'oneBody',
  'exchange',
  'coulomb',
  'plane',
  'name',
  'description',
  'fourfold',
]);

export function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** A finite number, or a ModelError naming `field`. */
export function finiteNumber(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new ModelError(`${field}: expected a finite number, got ${describe(value)}`);
  }
  if (Math.abs(value) > MAX_MAGNITUDE) {
    throw new ModelError(
      `${field}: ${value} is beyond the supported range (magnitude at most ${MAX_MAGNITUDE})`,
    );
  }
  return value;
}

/**
 * Largest magnitude of any number of a model or plane (and of any coupling a plane reaches):
 * energies, gradients and Hessians are sums of a few products of such numbers, which then stay
 * far from overflow in double precision (largest about 1.8e308).
 */
export const MAX_MAGNITUDE = 1e200;

function channelName(name: string, field: string): Channel {
  if (channelIndex(name) < 0) {
    const hint = name === '00' ? ' (00 is the SU(4)-symmetric part, not a channel)' : '';
    throw new ModelError(
      `${field}.${fieldKey(name)}: unknown channel${hint}; use two letters from 0 x y z, valley first, e.g. ${CHANNELS.slice(3, 6).join(', ')}`,
    );
  }
  return name as Channel;
}

function parseCoupling(value: unknown, field: string): ChannelCoupling {
  if (typeof value === 'number') {
    const fock = finiteNumber(value, field);
    return { hartree: fock, fock };
  }
  if (!isPlainObject(value)) {
    throw new ModelError(
      `${field}: expected { "fock": number, "hartree"?: number }, got ${describe(value)}`,
    );
  }
  for (const key of Object.keys(value)) {
    if (key !== 'hartree' && key !== 'fock') {
      throw new ModelError(
        `${field}.${fieldKey(key)}: unknown field; a channel has "fock" and optionally "hartree"`,
      );
    }
  }
  if (!('fock' in value)) {
    throw new ModelError(
      `${field}.fock: missing; a channel needs "fock" ("hartree" alone is not enough)`,
    );
  }
  const fock = finiteNumber(value.fock, `${field}.fock`);
  const hartree = 'hartree' in value ? finiteNumber(value.hartree, `${field}.hartree`) : fock;
  return { hartree, fock };
}

/**
 * Validates a model document (the model file of the README) and returns an immutable plain-data
 * model.
 * A bare number for a channel means hartree = fock. Throws ModelError with a one-line message.
 */
export function parseModel(json: unknown, where = ''): Model {
  const prefix = where === '' ? '' : `${where}.`;
  if (!isPlainObject(json)) {
    throw new ModelError(`${where || 'model'}: expected a JSON object, got ${describe(json)}`);
  }
  for (const key of Object.keys(json)) {
    if (!MODEL_FIELDS.has(key)) {
      throw new ModelError(
        `${prefix}${fieldKey(key)}: unknown field; a model has filling, channels, zeeman, valleyZeeman, oneBody, exchange, coulomb, plane`,
      );
    }
  }
  if (!('filling' in json)) throw new ModelError(`${prefix}filling: missing; give -1, 0 or 1`);
  const filling = json.filling;
  if (filling !== -1 && filling !== 0 && filling !== 1) {
    throw new ModelError(`${prefix}filling: expected -1, 0 or 1, got ${describe(filling)}`);
  }
  const channels: Partial<Record<Channel, ChannelCoupling>> = {};
  if ('channels' in json) {
    const raw = json.channels;
    if (!isPlainObject(raw)) {
      throw new ModelError(
        `${prefix}channels: expected an object of channels, got ${describe(raw)}`,
      );
    }
    for (const [name, value] of Object.entries(raw)) {
      const channel = channelName(name, `${prefix}channels`);
      channels[channel] = Object.freeze(parseCoupling(value, `${prefix}channels.${name}`));
    }
  }
  const oneBody: Partial<Record<Channel, number>> = {};
  if ('oneBody' in json) {
    const raw = json.oneBody;
    if (!isPlainObject(raw)) {
      throw new ModelError(
        `${prefix}oneBody: expected an object of channel coefficients, got ${describe(raw)}`,
      );
    }
    for (const [name, value] of Object.entries(raw)) {
      const channel = channelName(name, `${prefix}oneBody`);
      oneBody[channel] = finiteNumber(value, `${prefix}oneBody.${name}`);
    }
  }
  const zeeman = 'zeeman' in json ? finiteNumber(json.zeeman, `${prefix}zeeman`) : 0;
  const valleyZeeman =
    'valleyZeeman' in json ? finiteNumber(json.valleyZeeman, `${prefix}valleyZeeman`) : 0;
  const exchange =
    'exchange' in json ? finiteNumber(json.exchange, `${prefix}exchange`) : undefined;
  const coulomb = 'coulomb' in json ? coulombScale(json.coulomb, `${prefix}coulomb`) : undefined;
  return Object.freeze({
    filling,
    channels: Object.freeze(channels),
    zeeman,
    valleyZeeman,
    oneBody: Object.freeze(oneBody),
    exchange,
    ...(coulomb !== undefined ? { coulomb } : {}),
  });
}

/** The Coulomb scale e^2 / (eps l_B): a finite number >= 0, or a ModelError naming `field`. */
export function coulombScale(value: unknown, field: string): number {
  const c = finiteNumber(value, field);
  if (c < 0) {
    throw new ModelError(`${field}: expected e^2/(eps l_B) >= 0 in the model's unit, got ${c}`);
  }
  return c;
}

/** Number of electrons per flux quantum in the n = 0 level: nu + 2. */
export function occupiedCount(model: Pick<Model, 'filling'>): number {
  return model.filling + 2;
}

/** The model as a JSON document of the format parseModel reads. */
export function modelToJson(model: Model): Record<string, unknown> {
  const channels: Record<string, { hartree: number; fock: number }> = {};
  for (const name of CHANNELS) {
    const c = model.channels[name];
    if (c) channels[name] = { hartree: c.hartree, fock: c.fock };
  }
  const out: Record<string, unknown> = {
    filling: model.filling,
    channels,
    zeeman: model.zeeman,
    valleyZeeman: model.valleyZeeman,
  };
  if (Object.keys(model.oneBody).length > 0) out.oneBody = { ...model.oneBody };
  if (model.exchange !== undefined) out.exchange = model.exchange;
  if (model.coulomb !== undefined) out.coulomb = model.coulomb;
  return out;
}
