import {
  CHANNELS,
  ModelError,
  channelIndex,
  isPlainObject,
  parseMapInput,
  type Channel,
  type MapInput,
} from '../../solver/index';
import { physicalFromScenario, physicalToScenario } from './physicalScenario';
import { zeroChannels, type AxisQuantity, type AxisSetup, type Setup } from './setup';

/** The scenario document: the CLI's model file with its plane (what `map` reads). */
export type ScenarioJson = Record<string, unknown>;

/** Axis label written into the plane (model-file style), per quantity. */
export const AXIS_LABELS: Readonly<Record<Exclude<AxisQuantity, 'custom'>, string>> = {
  uPerp: 'u_perp',
  uZ: 'u_z',
  zeeman: 'E_Z',
  valleyZeeman: 'Delta_V',
  ...(Object.fromEntries(CHANNELS.map((ch) => [ch, `u_${ch}`])) as Record<Channel, string>),
};

/** Targets that an axis sets per unit of its value (the model file's plane). */
export function axisTargets(axis: AxisSetup, setup: Pick<Setup, 'ratios'>): Record<string, number> {
  switch (axis.quantity) {
    case 'uPerp': {
      const r = setup.ratios.uPerp;
      return { 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': r, 'y0.hartree': r };
    }
    case 'uZ':
      return { 'z0.fock': 1, 'z0.hartree': setup.ratios.uZ };
    case 'zeeman':
      return { zeeman: 1 };
    case 'valleyZeeman':
      return { valleyZeeman: 1 };
    case 'custom':
      return { ...(axis.targets ?? {}) };
    default:
      return { [`${axis.quantity}.fock`]: 1, [`${axis.quantity}.hartree`]: axis.hartreeRatio };
  }
}

export function axisLabel(axis: AxisSetup): string {
  return axis.quantity === 'custom' ? (axis.label ?? '') : AXIS_LABELS[axis.quantity];
}

function round(v: number): number {
  return Number(v.toPrecision(12));
}

/** The scenario document of a setup (model with every nonzero channel, plus the plane). */
export function setupToScenario(setup: Setup): ScenarioJson {
  const channels: Record<string, { hartree: number; fock: number }> = {};
  for (const ch of CHANNELS) {
    const c = setup.channels[ch];
    if (c.hartree !== 0 || c.fock !== 0) channels[ch] = { hartree: c.hartree, fock: c.fock };
  }
  const axis = (a: AxisSetup) => {
    const targets: Record<string, number> = {};
    for (const [k, v] of Object.entries(axisTargets(a, setup))) targets[k] = round(v);
    return { label: axisLabel(a), from: a.from, to: a.to, targets };
  };
  const document: ScenarioJson = {
    filling: setup.filling,
    channels,
    zeeman: setup.zeeman,
    valleyZeeman: setup.valleyZeeman,
    plane: { x: axis(setup.x), y: axis(setup.y), resolution: [...setup.resolution] },
  };
  return { ...document, ...physicalToScenario(setup) };
}

/** The validated solver input of a setup; throws ModelError naming the bad field. */
export function setupToMapInput(setup: Setup): MapInput {
  return parseMapInput(setupToScenario(setup));
}

function sameTargets(a: Record<string, number>, b: Readonly<Record<string, number>>): boolean {
  const ka = Object.keys(a).filter((k) => a[k] !== 0);
  const kb = Object.keys(b).filter((k) => b[k] !== 0);
  return ka.length === kb.length && ka.every((k) => Math.abs(a[k]! - (b[k] ?? NaN)) < 1e-12);
}

/**
 * Recognises a model-file axis as one of our quantities (with its Hartree ratio), or keeps
 * it as a custom axis with its own label and targets.
 */
function axisFromPlane(
  axis: { label: string; from: number; to: number; targets: Readonly<Record<string, number>> },
  ratios: { uPerp: number; uZ: number },
): { axis: AxisSetup; ratios: { uPerp: number; uZ: number } } {
  const t = axis.targets;
  const base = { from: axis.from, to: axis.to, hartreeRatio: 1 };
  const only = (keys: string[]) =>
    Object.keys(t).every((k) => keys.includes(k)) && keys.every((k) => k in t);
  if (only(['zeeman']) && t.zeeman === 1) return { axis: { ...base, quantity: 'zeeman' }, ratios };
  if (only(['valleyZeeman']) && t.valleyZeeman === 1)
    return { axis: { ...base, quantity: 'valleyZeeman' }, ratios };
  const r = t['x0.hartree'] ?? 0;
  if (sameTargets(axisTargets({ ...base, quantity: 'uPerp' }, { ratios: { uPerp: r, uZ: 0 } }), t))
    return { axis: { ...base, quantity: 'uPerp' }, ratios: { ...ratios, uPerp: r } };
  const rz = t['z0.hartree'] ?? 0;
  if (sameTargets(axisTargets({ ...base, quantity: 'uZ' }, { ratios: { uPerp: 0, uZ: rz } }), t))
    return { axis: { ...base, quantity: 'uZ' }, ratios: { ...ratios, uZ: rz } };
  const keys = Object.keys(t);
  const ch = keys[0]?.split('.')[0];
  if (
    ch !== undefined &&
    channelIndex(ch) > 0 &&
    t[`${ch}.fock`] === 1 &&
    keys.every((k) => k === `${ch}.fock` || k === `${ch}.hartree`)
  ) {
    const hartreeRatio = t[`${ch}.hartree`] ?? 0;
    return { axis: { ...base, quantity: ch as Channel, hartreeRatio }, ratios };
  }
  return {
    axis: { ...base, quantity: 'custom', label: axis.label, targets: { ...t } },
    ratios,
  };
}

/**
 * A setup from a scenario document (a model file with a plane). Validates it fully first and
 * throws ModelError with a one-line message naming the field; returns nothing partial.
 */
export function scenarioToSetup(json: unknown): Setup {
  if (!isPlainObject(json)) throw new ModelError('scenario: expected a JSON object');
  if (json.plane === undefined) throw new ModelError('plane: missing (a scenario needs a plane)');
  const input = parseMapInput(json);
  const { model, plane } = input;
  if (Object.keys(model.oneBody).length > 0)
    throw new ModelError('oneBody: extra one-body terms are not supported in the app yet');
  const channels = zeroChannels();
  for (const ch of CHANNELS) {
    const c = model.channels[ch];
    if (c) channels[ch] = { hartree: c.hartree, fock: c.fock };
  }
  const ratio = (c: { hartree: number; fock: number }) => (c.fock !== 0 ? c.hartree / c.fock : 1);
  let ratios = { uPerp: ratio(channels.x0), uZ: ratio(channels.z0) };
  const x = axisFromPlane(plane.x, ratios);
  ratios = x.ratios;
  const y = axisFromPlane(plane.y, ratios);
  ratios = y.ratios;
  const setup: Setup = {
    filling: model.filling,
    channels,
    zeeman: model.zeeman,
    valleyZeeman: model.valleyZeeman,
    ratios,
    x: x.axis,
    y: y.axis,
    resolution: [plane.resolution[0], plane.resolution[1]],
  };
  return physicalFromScenario(json, setup, model.exchange);
}
