import { CHANNELS, type Channel } from './channels';
import { quoteInput } from './inputText';
import { ModelError, modelToJson } from './model';
import type { MapInput } from './plane';

/**
 * A series of Maps: the same model and plane, one quantity set to each of a list of values
 * (README, "Large Maps, shards and series"). The quantity is E_Z (`zeeman`), Delta_V
 * (`valleyZeeman`), one part of a channel (`CH.fock`, `CH.hartree`) or the Hartree-to-Fock ratio
 * of one or more channels (`ratio:CH`, `ratio:x0+y0`).
 */
export type SeriesQuantity =
  | { readonly kind: 'zeeman' }
  | { readonly kind: 'valleyZeeman' }
  | { readonly kind: 'part'; readonly channel: Channel; readonly part: 'hartree' | 'fock' }
  | { readonly kind: 'ratio'; readonly channels: readonly Channel[] };

/** Most maps in one series. */
export const MAX_SERIES_VALUES = 100;

function channelOf(name: string, text: string): Channel {
  if (!(CHANNELS as readonly string[]).includes(name)) {
    throw new ModelError(
      `--vary ${quoteInput(text)}: ${quoteInput(name, 16)} is not a channel (${CHANNELS.join(', ')})`,
    );
  }
  return name as Channel;
}

/** Reads `--vary`: zeeman, valleyZeeman, CH.fock, CH.hartree or ratio:CH[+CH...]. */
export function parseSeriesQuantity(text: string): SeriesQuantity {
  if (text === 'zeeman' || text === 'valleyZeeman') return { kind: text };
  if (text.startsWith('ratio:')) {
    const names = text.slice('ratio:'.length).split('+');
    const channels = names.map((name) => channelOf(name, text));
    if (new Set(channels).size !== channels.length) {
      throw new ModelError(`--vary ${quoteInput(text)}: a channel is named twice`);
    }
    return { kind: 'ratio', channels };
  }
  const [channel, part, ...rest] = text.split('.');
  if (rest.length === 0 && (part === 'fock' || part === 'hartree')) {
    return { kind: 'part', channel: channelOf(channel!, text), part };
  }
  throw new ModelError(
    `--vary: expected zeeman, valleyZeeman, CH.fock, CH.hartree or ratio:CH (CH a channel such as x0), got ${quoteInput(text)}`,
  );
}

/** `--vary` as written back (`parseSeriesQuantity` reads it). */
export function seriesQuantityName(quantity: SeriesQuantity): string {
  switch (quantity.kind) {
    case 'part':
      return `${quantity.channel}.${quantity.part}`;
    case 'ratio':
      return `ratio:${quantity.channels.join('+')}`;
    default:
      return quantity.kind;
  }
}

/** How a panel names the quantity (typeset by the figure: E_Z, Delta_V, H_x0/F_x0). */
export function seriesQuantityLabel(quantity: SeriesQuantity): string {
  switch (quantity.kind) {
    case 'zeeman':
      return 'E_Z';
    case 'valleyZeeman':
      return 'Delta_V';
    case 'part':
      return `${quantity.part === 'fock' ? 'F' : 'H'}_${quantity.channel}`;
    case 'ratio':
      return `H/F (${quantity.channels.join(', ')})`;
  }
}

function finite(text: string, whole: string): number {
  const v = text.trim() === '' ? NaN : Number(text);
  if (!Number.isFinite(v)) {
    throw new ModelError(
      `--values: ${quoteInput(text)} is not a finite number (in ${quoteInput(whole)})`,
    );
  }
  return v;
}

/**
 * Reads `--values`: a list `v1,v2,...`, or `from:to:n` for n values evenly spaced from `from` to
 * `to` (both included), at most MAX_SERIES_VALUES of them.
 */
export function parseSeriesValues(text: string): number[] {
  let values: number[];
  if (text.includes(':')) {
    const parts = text.split(':');
    if (parts.length !== 3) {
      throw new ModelError(`--values: expected from:to:n, got ${quoteInput(text)}`);
    }
    const from = finite(parts[0]!, text);
    const to = finite(parts[1]!, text);
    const n = Number(parts[2]);
    if (!Number.isInteger(n) || n < 2 || n > MAX_SERIES_VALUES) {
      throw new ModelError(
        `--values: n in from:to:n must be an integer from 2 to ${MAX_SERIES_VALUES}, got ${quoteInput(parts[2]!)}`,
      );
    }
    if (from === to) throw new ModelError('--values: from and to must differ in from:to:n');
    values = Array.from({ length: n }, (_, k) =>
      k === n - 1 ? to : from + ((to - from) * k) / (n - 1),
    );
  } else {
    values = text.split(',').map((v) => finite(v, text));
    if (values.length > MAX_SERIES_VALUES) {
      throw new ModelError(`--values: at most ${MAX_SERIES_VALUES} values, got ${values.length}`);
    }
  }
  if (new Set(values).size !== values.length) {
    throw new ModelError(`--values: a value is given twice in ${quoteInput(text)}`);
  }
  return values;
}

type ChannelJson = { hartree: number; fock: number };

/**
 * Refuses a quantity that the plane's axes set (each map would be the same) and a ratio that
 * changes nothing (the channels' Fock parts are zero and no axis sets them).
 */
export function checkSeriesQuantity(input: MapInput, quantity: SeriesQuantity): void {
  const name = seriesQuantityName(quantity);
  const axisSetting = (target: string): string | undefined =>
    (['x', 'y'] as const).find((a) => input.plane[a].targets[target] !== undefined);
  const target = quantity.kind === 'part' ? `${quantity.channel}.${quantity.part}` : quantity.kind;
  if (quantity.kind !== 'ratio') {
    const axis = axisSetting(target);
    if (axis !== undefined) {
      throw new ModelError(
        `--vary ${name}: the plane's ${axis} axis sets ${target}, so every map would be the same`,
      );
    }
    return;
  }
  for (const channel of quantity.channels) {
    const fock = input.model.channels[channel]?.fock ?? 0;
    if (fock === 0 && axisSetting(`${channel}.fock`) === undefined) {
      throw new ModelError(
        `--vary ${name}: ${channel} has no Fock part and no axis sets one, so its ratio changes nothing`,
      );
    }
  }
}

/**
 * The model file (model and plane) of the map at `value`:
 * - zeeman, valleyZeeman: that field;
 * - CH.fock, CH.hartree: that part of channel CH; a channel not listed in `channels` is listed
 *   with the value (its Hartree part then follows, as a missing `hartree` does in a file, when
 *   the Fock part is varied; the Fock part is 0 when the Hartree part is);
 * - ratio:CH: the Hartree part of CH becomes value times its Fock part, in `channels` and on
 *   each axis that sets CH.fock (CH.hartree = value times that coefficient), as the app's ratio
 *   of a coupling does.
 */
export function seriesDocument(
  input: MapInput,
  quantity: SeriesQuantity,
  value: number,
): Record<string, unknown> {
  const model = modelToJson(input.model);
  const channels = { ...(model.channels as Record<string, ChannelJson>) };
  const plane = {
    ...input.plane,
    x: { ...input.plane.x, targets: { ...input.plane.x.targets } },
    y: { ...input.plane.y, targets: { ...input.plane.y.targets } },
  };
  switch (quantity.kind) {
    case 'zeeman':
    case 'valleyZeeman':
      model[quantity.kind] = value;
      break;
    case 'part': {
      const listed = channels[quantity.channel];
      channels[quantity.channel] =
        listed !== undefined
          ? { ...listed, [quantity.part]: value }
          : quantity.part === 'fock'
            ? { hartree: value, fock: value }
            : { hartree: value, fock: 0 };
      break;
    }
    case 'ratio':
      for (const channel of quantity.channels) {
        const fock = channels[channel]?.fock ?? 0;
        channels[channel] = { hartree: value * fock, fock };
        for (const axis of [plane.x, plane.y]) {
          const c = axis.targets[`${channel}.fock`];
          if (c !== undefined) axis.targets[`${channel}.hartree`] = value * c;
        }
      }
      break;
  }
  return { ...model, channels, plane };
}

/** What a series map's files say of it (`series` in the JSON and in a part's first line). */
export function seriesProvenance(
  quantity: SeriesQuantity,
  value: number,
  index: number,
  count: number,
): Record<string, unknown> {
  return { vary: seriesQuantityName(quantity), value, index, of: count };
}
